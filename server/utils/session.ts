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
  // Before the write and again after it: inside a transaction, the cache also stays out of the way until it commits.
  authCacheForgetUser(userId)
  await db.update(tables.users).set({ sessionVersion: sql`${tables.users.sessionVersion} + 1` }).where(eq(tables.users.id, userId))
  authCacheForgetUser(userId)
}

let sessionSettingsRead = false

/** True once nuxt-auth-utils has read its session settings (it reads them on first use and keeps them). */
export function sessionSettingsTaken(): boolean {
  return sessionSettingsRead
}

/** The session in the cookie; an unsealed copy is reused for a short while (server/utils/auth-cache.ts). */
async function unsealedSession(event: H3Event) {
  const name = sessionCookieName()
  const sealed = getCookie(event, name)
  // h3 prefers a session header to the cookie: with one, it decides alone.
  const plain = sealed && !getRequestHeader(event, `x-${name.toLowerCase()}-session`)
  const known = plain ? authCacheSession(sealed) : undefined
  if (known) {
    const maxAge = useRuntimeConfig().session.maxAge
    // h3's own expiry check, which it skips for a session already on the event.
    if (!maxAge || Date.now() - known.createdAt <= maxAge * 1000) {
      event.context.sessions ??= Object.create(null)
      event.context.sessions![name] = known
    }
  }
  const session = await getUserSession(event)
  sessionSettingsRead = true
  if (plain && !known && session.user?.id) authCacheRememberSession(sealed, event.context.sessions![name] as AuthCachedSession)
  return session
}

/** Checks the cookie against the database: revoked, idle or too old sessions are cleared. */
export async function resolveSession(event: H3Event): Promise<CurrentUser | undefined> {
  const session = await unsealedSession(event)
  const userId = session.user?.id
  if (!userId) return undefined
  const cfg = useServerConfig()
  const now = Date.now()
  const row = await authCacheUser(userId, async () => {
    const [found] = await useDb().select({
      id: tables.users.id, email: tables.users.email, name: tables.users.name, sessionVersion: tables.users.sessionVersion,
    }).from(tables.users).where(eq(tables.users.id, userId)).limit(1)
    return found
  })
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
