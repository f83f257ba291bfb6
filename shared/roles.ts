// Team roles, from most to least powerful. The server is the authority; pages only hide what a role cannot do.
export const ROLES = ['owner', 'editor', 'contributor', 'viewer'] as const
export type Role = typeof ROLES[number]

const RANK: Record<Role, number> = { owner: 4, editor: 3, contributor: 2, viewer: 1 }

/** True when `role` is at least as powerful as `minimum`. */
export function roleAtLeast(role: Role, minimum: Role): boolean {
  return RANK[role] >= RANK[minimum]
}

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  editor: 'Editor',
  contributor: 'Contributor',
  viewer: 'Viewer',
}

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  owner: 'Everything, including members and team settings.',
  editor: 'Creates and edits all reference entries and sales records.',
  contributor: 'Adds notes and sales records, and edits their own.',
  viewer: 'Reads everything, changes nothing.',
}

/** Which roles may an actor with `actorRole` hand out in invitations or role changes. */
export function assignableRoles(actorRole: Role): Role[] {
  return actorRole === 'owner' ? [...ROLES] : []
}
