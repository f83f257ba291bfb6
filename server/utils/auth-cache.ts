// A short-lived in-process memory of what every signed-in request reads: the unsealed session cookie, the
// user's session version, and the caller's membership of a team. It saves the two database round trips and
// the unsealing each request would otherwise cost.
//
// Safety: every write that changes one of these (role change, removal, leaving, sign out everywhere,
// password change or reset, profile and team edits) calls authCacheForgetUser / authCacheForgetTeam, so this
// instance sees it at once. Those calls may run inside the write's transaction, before it commits: for
// HOT_MS afterwards nothing is remembered about that user or team (a read in that window might still see the
// old row), and a read that started before a forget is never stored (the epoch check). Other instances keep
// what they remembered for at most `sessionCacheMs` (SESSION_CACHE_MS, at most 2 s): that is the bound on
// cross-instance staleness the README's security section states.
import type { Role } from '../../shared/roles'
import { useServerConfig } from './config'

export interface AuthCachedUser { id: number, email: string, name: string, sessionVersion: number }
export interface AuthCachedMembership { team: { id: number, slug: string, name: string, timeZone: string }, role: Role }
/** An unsealed session as h3 keeps it on the event (event.context.sessions[name]). */
export interface AuthCachedSession { id: string, createdAt: number, data: Record<string, unknown> }

interface Entry<T> { value: T, until: number }

// A transaction that wrote a change is assumed committed or rolled back by then (as the search change log assumes).
const HOT_MS = 10_000
// Bounds memory whatever the traffic: the oldest entries go first.
const MAX_ENTRIES = 20_000

const users = new Map<number, Entry<AuthCachedUser>>()
const memberships = new Map<number, Map<string, Entry<AuthCachedMembership>>>()
const sessions = new Map<string, Entry<AuthCachedSession>>()
const hotUsers = new Map<number, number>()
const hotTeams = new Map<number, number>()
let epoch = 0

function ttl(): number {
  return useServerConfig().sessionCacheMs
}

function fresh<T>(entry: Entry<T> | undefined, now: number): T | undefined {
  return entry && entry.until > now ? entry.value : undefined
}

function isHot(map: Map<number, number>, id: number, now: number): boolean {
  const until = map.get(id)
  if (until === undefined) return false
  if (until > now) return true
  map.delete(id)
  return false
}

function bounded<K, V>(map: Map<K, V>, key: K, value: V) {
  map.delete(key)
  map.set(key, value)
  if (map.size > MAX_ENTRIES) map.delete(map.keys().next().value as K)
}

/** The user row behind a session: remembered for the TTL unless a change to the user is under way. */
export async function authCacheUser(userId: number, load: () => Promise<AuthCachedUser | undefined>): Promise<AuthCachedUser | undefined> {
  const now = Date.now()
  const hit = fresh(users.get(userId), now)
  if (hit) return hit
  const seen = epoch
  const row = await load()
  if (row && ttl() > 0 && seen === epoch && !isHot(hotUsers, userId, Date.now())) bounded(users, userId, { value: row, until: Date.now() + ttl() })
  return row
}

/** The caller's membership of the team with this slug (undefined: not a member, never remembered). */
export async function authCacheMembership(userId: number, slug: string, load: () => Promise<AuthCachedMembership | undefined>): Promise<AuthCachedMembership | undefined> {
  const now = Date.now()
  const hit = fresh(memberships.get(userId)?.get(slug), now)
  if (hit) return hit
  const seen = epoch
  const found = await load()
  const later = Date.now()
  if (found && ttl() > 0 && seen === epoch && !isHot(hotUsers, userId, later) && !isHot(hotTeams, found.team.id, later)) {
    let mine = memberships.get(userId)
    if (!mine) {
      mine = new Map()
      bounded(memberships, userId, mine)
    }
    mine.set(slug, { value: found, until: later + ttl() })
  }
  return found
}

/**
 * A sealed cookie value always unseals to the same session (it is authenticated, and revocation is the
 * version check, not the cookie): a copy of the unsealed session, if this value was seen lately.
 */
export function authCacheSession(sealed: string): AuthCachedSession | undefined {
  const value = fresh(sessions.get(sealed), Date.now())
  return value && { id: value.id, createdAt: value.createdAt, data: structuredClone(value.data) }
}

export function authCacheRememberSession(sealed: string, session: AuthCachedSession) {
  if (ttl() <= 0) return
  bounded(sessions, sealed, { value: { id: session.id, createdAt: session.createdAt, data: structuredClone(session.data) }, until: Date.now() + ttl() })
}

/** Forget a user's session version and memberships, now and while the change commits. */
export function authCacheForgetUser(userId: number) {
  epoch++
  hotUsers.set(userId, Date.now() + HOT_MS)
  users.delete(userId)
  memberships.delete(userId)
}

/** Forget every membership of a team (its name or time zone changed). */
export function authCacheForgetTeam(teamId: number) {
  epoch++
  hotTeams.set(teamId, Date.now() + HOT_MS)
  for (const mine of memberships.values()) {
    for (const [slug, entry] of mine) if (entry.value.team.id === teamId) mine.delete(slug)
  }
}

/** For tests of this module: start from nothing. */
export function authCacheClear() {
  epoch++
  users.clear()
  memberships.clear()
  sessions.clear()
  hotUsers.clear()
  hotTeams.clear()
}
