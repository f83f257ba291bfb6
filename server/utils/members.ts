import type { H3Event } from 'h3'
import { and, asc, eq, sql } from 'drizzle-orm'
import type { Role } from '../../shared/roles'

export async function listMembers(teamId: number) {
  const rows = await useDb().select({
    userId: tables.users.id, name: tables.users.name, email: tables.users.email, role: tables.memberships.role,
    joinedAt: tables.memberships.createdAt, locked: sql<number>`${tables.users.lockedAt} is not null`,
  }).from(tables.memberships)
    .innerJoin(tables.users, eq(tables.users.id, tables.memberships.userId))
    .where(eq(tables.memberships.teamId, teamId))
    .orderBy(asc(tables.users.name))
  return rows.map(r => ({ ...r, locked: Boolean(Number(r.locked)) }))
}

async function ownerCount(tx: DbOrTx, teamId: number): Promise<number> {
  // FOR UPDATE serialises concurrent demotions, so two owners cannot demote each other at once.
  const rows = await tx.execute(sql`select count(*) as n from memberships where team_id = ${teamId} and role = 'owner' for update`)
  return Number((rows[0] as unknown as { n: number }[])[0]?.n ?? 0)
}

export async function changeMemberRole(event: H3Event, access: TeamAccess, userId: number, role: Role) {
  await useDb().transaction(async (tx) => {
    const member = await findMembership(access.team.id, userId, tx)
    if (!member) throw notFound('No such member in this team.')
    if (member.role === role) return
    if (member.role === 'owner' && (await ownerCount(tx, access.team.id)) <= 1) {
      throw httpError(409, 'A team always keeps at least one owner. Make someone else owner first.')
    }
    await tx.update(tables.memberships).set({ role }).where(eq(tables.memberships.id, member.id))
    await revokeSessions(userId, tx)
    await recordAudit(event, 'member.role_changed', { teamId: access.team.id, userId: access.user.id, targetType: 'user', targetId: userId, detail: { from: member.role, to: role } }, tx)
  })
  // Again now that it is committed (revokeSessions forgot the user inside the transaction already).
  authCacheForgetUser(userId)
}

/** Removes a member (owners), or lets a member leave (userId is the caller). */
export async function removeMember(event: H3Event, access: TeamAccess, userId: number) {
  const leaving = userId === access.user.id
  if (!leaving && access.role !== 'owner') throw forbidden('Only owners can remove members.')
  await useDb().transaction(async (tx) => {
    const member = await findMembership(access.team.id, userId, tx)
    if (!member) throw notFound('No such member in this team.')
    if (member.role === 'owner' && (await ownerCount(tx, access.team.id)) <= 1) {
      throw httpError(409, leaving
        ? 'You are the last owner: make someone else owner before you leave.'
        : 'A team always keeps at least one owner.')
    }
    await tx.delete(tables.memberships).where(and(eq(tables.memberships.id, member.id)))
    if (!leaving) await revokeSessions(userId, tx)
    await recordAudit(event, leaving ? 'member.left' : 'member.removed', { teamId: access.team.id, userId: access.user.id, targetType: 'user', targetId: userId }, tx)
  })
  // Someone who leaves keeps their sessions: only their remembered membership has to go.
  authCacheForgetUser(userId)
}

export async function endMemberSessions(event: H3Event, access: TeamAccess, userId: number) {
  if (!(await findMembership(access.team.id, userId))) throw notFound('No such member in this team.')
  await revokeSessions(userId)
  await recordAudit(event, 'member.sessions_ended', { teamId: access.team.id, userId: access.user.id, targetType: 'user', targetId: userId })
}

/**
 * An owner lifts the lock that consecutive failed sign-ins put on a member's account (accounts.ts), so the
 * member signs in again with their own password. Only members of the owner's team; nothing else changes.
 */
export async function unlockMember(event: H3Event, access: TeamAccess, userId: number) {
  if (!(await findMembership(access.team.id, userId))) throw notFound('No such member in this team.')
  const u = tables.users
  const [user] = await useDb().select({ email: u.email, lockedAt: u.lockedAt, failedLogins: u.failedLogins }).from(u).where(eq(u.id, userId)).limit(1)
  if (!user) throw notFound('No such member in this team.')
  if (user.lockedAt || user.failedLogins) {
    await useDb().transaction(async (tx) => {
      await tx.update(u).set({ lockedAt: null, failedLogins: 0 }).where(eq(u.id, userId))
      await recordAudit(event, 'member.unlocked', {
        teamId: access.team.id, userId: access.user.id, targetType: 'user', targetId: userId,
        detail: { wasLocked: Boolean(user.lockedAt), failedLogins: user.failedLogins },
      }, tx)
    })
  }
  // The short sign-in throttle of the account starts afresh too, so the member can sign in at once.
  clearAttempts([`login:acct:${user.email}`])
  return { userId, locked: false }
}
