import type { H3Event } from 'h3'
import { eq, sql } from 'drizzle-orm'

export interface CurrentUser { id: number, email: string, name: string }

declare module 'h3' {
  interface H3EventContext {
    currentUser?: CurrentUser
  }
}

export async function startSession(event: H3Event, user: { id: number, sessionVersion: number }) {
  const now = Date.now()
  await replaceUserSession(event, { user: { id: user.id }, version: user.sessionVersion, issuedAt: now, seenAt: now })
}

/** Revokes every sealed session of a user: the version in their cookies no longer matches. */
export async function revokeSessions(userId: number, db: DbOrTx = useDb()) {
  await db.update(tables.users).set({ sessionVersion: sql`${tables.users.sessionVersion} + 1` }).where(eq(tables.users.id, userId))
}

/** Checks the cookie against the database: revoked, idle or too old sessions are cleared. */
export async function resolveSession(event: H3Event): Promise<CurrentUser | undefined> {
  const session = await getUserSession(event)
  if (!session.user?.id) return undefined
  const cfg = useServerConfig()
  const now = Date.now()
  const [row] = await useDb().select({
    id: tables.users.id, email: tables.users.email, name: tables.users.name, sessionVersion: tables.users.sessionVersion,
  }).from(tables.users).where(eq(tables.users.id, session.user.id)).limit(1)
  const idle = now - (session.seenAt ?? 0) > cfg.sessionIdleMinutes * 60_000
  const tooOld = now - (session.issuedAt ?? 0) > cfg.sessionMaxDays * 86_400_000
  if (!row || row.sessionVersion !== session.version || idle || tooOld) {
    await clearUserSession(event)
    return undefined
  }
  // Refresh the idle clock at most once a minute, so most requests do not re-seal the cookie.
  if (now - session.seenAt > 60_000) await setUserSession(event, { version: session.version, issuedAt: session.issuedAt, seenAt: now })
  return { id: row.id, email: row.email, name: row.name }
}
