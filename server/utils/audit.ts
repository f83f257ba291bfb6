// Explicit imports (not only Nitro's auto-imports): photos.ts, which tests load outside the server, imports this.
import { getRequestIP, type H3Event } from 'h3'
import { tables, useDb, type DbOrTx } from './db'
import type { TeamAccess } from './guard'

export type AuditAction
  = | 'auth.register' | 'auth.login' | 'auth.login_failed' | 'auth.locked' | 'auth.login_locked' | 'auth.logout_everywhere'
    | 'auth.password_changed' | 'auth.password_reset_requested' | 'auth.password_reset'
    | 'team.created' | 'team.updated' | 'invitation.created' | 'invitation.revoked' | 'invitation.accepted'
    | 'member.role_changed' | 'member.removed' | 'member.left' | 'member.sessions_ended' | 'member.unlocked'
    | 'entry.deleted' | 'entry.restored' | 'entry.purged' | 'photo.uploaded' | 'photo.deleted' | 'items.imported'
    | 'team.exported' | 'team.imported'

interface AuditFields {
  teamId?: number | null
  userId?: number | null
  targetType?: string
  targetId?: string | number
  detail?: Record<string, unknown>
}

export async function recordAudit(event: H3Event | null, action: AuditAction, fields: AuditFields, db: DbOrTx = useDb()) {
  await insertAudit(event ? clientAddress(event) : null, action, fields, db)
}

/** An event of a team route, written by a domain function from the guard's access: the team, the caller and their address. */
export async function recordTeamAudit(access: TeamAccess, action: AuditAction, fields: Omit<AuditFields, 'teamId' | 'userId'>, db: DbOrTx = useDb()) {
  await insertAudit(access.ip ?? null, action, { ...fields, teamId: access.team.id, userId: access.user.id }, db)
}

async function insertAudit(ip: string | null, action: AuditAction, fields: AuditFields, db: DbOrTx) {
  await db.insert(tables.auditEvents).values({
    action,
    teamId: fields.teamId ?? null,
    userId: fields.userId ?? null,
    targetType: fields.targetType ?? null,
    targetId: fields.targetId === undefined ? null : String(fields.targetId),
    ip,
    detail: fields.detail ?? null,
  })
}

export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: process.env.TRUST_PROXY === '1' }) ?? 'unknown'
}
