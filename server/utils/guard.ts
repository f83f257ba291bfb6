// The one guard module: every team route calls requireMember first. Pages only hide what a role cannot do.
import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { roleAtLeast, type Role } from '../../shared/roles'
import { teamSlug } from '../../shared/schemas/common'

export interface TeamAccess {
  team: { id: number, slug: string, name: string, timeZone: string }
  role: Role
  user: CurrentUser
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
    const [row] = await useDb().select({
      id: tables.teams.id, slug: tables.teams.slug, name: tables.teams.name, timeZone: tables.teams.timeZone,
      role: tables.memberships.role,
    }).from(tables.teams)
      .innerJoin(tables.memberships, and(eq(tables.memberships.teamId, tables.teams.id), eq(tables.memberships.userId, user.id)))
      .where(eq(tables.teams.slug, slug.data)).limit(1)
    if (!row) throw notFound('Team not found.')
    const { role, ...team } = row
    access = { team, role, user }
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

export function sessionCookieName(event: H3Event): string {
  return useRuntimeConfig(event).session.name ?? 'nuxt-session'
}
