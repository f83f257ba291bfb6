import type { H3Event } from 'h3'

export type AuditAction
  = | 'auth.register' | 'auth.login' | 'auth.login_failed' | 'auth.locked' | 'auth.logout_everywhere'
    | 'auth.password_changed' | 'auth.password_reset_requested' | 'auth.password_reset'
    | 'team.created' | 'team.updated' | 'invitation.created' | 'invitation.revoked' | 'invitation.accepted'
    | 'member.role_changed' | 'member.removed' | 'member.left' | 'member.sessions_ended'

export async function recordAudit(event: H3Event | null, action: AuditAction, fields: {
  teamId?: number | null
  userId?: number | null
  targetType?: string
  targetId?: string | number
  detail?: Record<string, unknown>
}, db: DbOrTx = useDb()) {
  await db.insert(tables.auditEvents).values({
    action,
    teamId: fields.teamId ?? null,
    userId: fields.userId ?? null,
    targetType: fields.targetType ?? null,
    targetId: fields.targetId === undefined ? null : String(fields.targetId),
    ip: event ? clientAddress(event) : null,
    detail: fields.detail ?? null,
  })
}

export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: process.env.TRUST_PROXY === '1' }) ?? 'unknown'
}
