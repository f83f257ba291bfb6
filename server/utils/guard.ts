// The one guard module: every team route calls requireMember first. Pages only hide what a role cannot do.
import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { roleAtLeast, type Role } from '../../shared/roles'
import { teamSlug } from '../../shared/schemas/common'

export interface TeamAccess {
  team: { id: number, slug: string, name: string, timeZone: string }
  role: Role
  user: CurrentUser
  /** The caller's address, for the audit events domain functions write (set by requireMember). */
  ip?: string
}

declare module 'h3' {
  interface H3EventContext {
    teamAccess?: TeamAccess
  }
}

export function requireUser(event: H3Event): CurrentUser {
  const user = event.context.currentUser
  if (!user) throw unauthorized()
  return user
}

/**
 * Signed out → 401; not a member (or no such team) → 404, so a team's existence is not revealed;
 * a role below `minimum` → 403.
 */
export async function requireMember(event: H3Event, minimum: Role = 'viewer'): Promise<TeamAccess> {
  const user = requireUser(event)
  let access = event.context.teamAccess
  if (!access) {
    const slug = teamSlug.safeParse(getRouterParam(event, 'team'))
    if (!slug.success) throw notFound('Team not found.')
    const found = await authCacheMembership(user.id, slug.data, async () => {
      const [row] = await useDb().select({
        id: tables.teams.id, slug: tables.teams.slug, name: tables.teams.name, timeZone: tables.teams.timeZone,
        role: tables.memberships.role,
      }).from(tables.teams)
        .innerJoin(tables.memberships, and(eq(tables.memberships.teamId, tables.teams.id), eq(tables.memberships.userId, user.id)))
        .where(eq(tables.teams.slug, slug.data)).limit(1)
      if (!row) return undefined
      const { role, ...team } = row
      return { team, role }
    })
    if (!found) throw notFound('Team not found.')
    // A copy: handlers may not change what the next request is given.
    const team = { ...found.team }
    const role = found.role
    access = { team, role, user, ip: clientAddress(event) }
    event.context.teamAccess = access
  }
  if (!roleAtLeast(access.role, minimum)) {
    throw forbidden(`This needs the ${minimum} role or higher; you are ${access.role === 'owner' ? 'an' : 'a'} ${access.role} in ${access.team.name}.`)
  }
  return access
}

/** Contributors may change only what they created; editors and owners change everything. */
export function assertCanEditOwn(access: TeamAccess, createdBy: number | null) {
  if (roleAtLeast(access.role, 'editor')) return
  if (access.role === 'contributor' && createdBy === access.user.id) return
  throw forbidden('Contributors can change only what they added themselves.')
}

/** The session cookie's name in production (server/middleware/0.production.ts). */
export const PRODUCTION_SESSION_COOKIE = '__Host-tallymark-session'

let cookieName: string | undefined

/**
 * The session cookie's name, worked out once: the per-request runtime config (useRuntimeConfig(event)) is a
 * fresh deep copy with the environment applied, about 3 ms of CPU on every request.
 */
export function sessionCookieName(): string {
  cookieName ??= useServerConfig().production ? PRODUCTION_SESSION_COOKIE : (useRuntimeConfig().session.name ?? 'nuxt-session')
  return cookieName
}
