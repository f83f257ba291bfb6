import type { H3Event } from 'h3'
import { and, desc, eq, gt, isNull } from 'drizzle-orm'
import type { Role } from '../../shared/roles'
import { ROLE_LABELS } from '../../shared/roles'

const INVITATION_DAYS = 7

export async function listInvitations(teamId: number) {
  return await useDb().select({
    id: tables.invitations.id, email: tables.invitations.email, role: tables.invitations.role,
    createdAt: tables.invitations.createdAt, expiresAt: tables.invitations.expiresAt,
    acceptedAt: tables.invitations.acceptedAt, revokedAt: tables.invitations.revokedAt,
    invitedBy: tables.users.name,
  }).from(tables.invitations)
    .innerJoin(tables.users, eq(tables.users.id, tables.invitations.invitedBy))
    .where(eq(tables.invitations.teamId, teamId))
    .orderBy(desc(tables.invitations.createdAt))
    .limit(200)
}

export async function createInvitation(event: H3Event, access: TeamAccess, email: string, role: Role) {
  const rules: ThrottleRule[] = [
    // Per team and per inviting account (the account), and a looser cap per address, shared by everyone behind one NAT.
    { key: `invite:team:${access.team.id}`, limit: 100, windowSeconds: 60 * 60 },
    { key: `invite:user:${access.user.id}`, limit: 100, windowSeconds: 60 * 60 },
    { key: `invite:ip:${clientAddress(event)}`, limit: 1000, windowSeconds: 60 * 60 },
  ]
  assertNotThrottled(rules, 'Too many invitations sent in the last hour. Try again later.')
  const db = useDb()
  const existing = await findUserByEmail(email)
  if (existing && await findMembership(access.team.id, existing.id)) {
    throw httpError(409, `${email} is already a member of ${access.team.name}.`, { email: ['Already a member.'] })
  }
  countAttempt(rules)
  const { token, hash } = newSecretToken()
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000)
  const id = insertedId(await db.insert(tables.invitations).values({ teamId: access.team.id, email, role, tokenHash: hash, invitedBy: access.user.id, expiresAt }).$returningId())
  await recordAudit(event, 'invitation.created', { teamId: access.team.id, userId: access.user.id, targetType: 'invitation', targetId: id, detail: { email, role } })
  await sendMail(invitationMail({
    to: email, teamName: access.team.name, inviterName: access.user.name, role: ROLE_LABELS[role].toLowerCase(),
    url: `${useServerConfig().publicUrl}/invitations/${token}`, expiresDays: INVITATION_DAYS,
  }))
  return { id, email, role, expiresAt }
}

export async function revokeInvitation(event: H3Event, access: TeamAccess, id: number) {
  const [result] = await useDb().update(tables.invitations).set({ revokedAt: new Date() })
    .where(and(eq(tables.invitations.id, id), eq(tables.invitations.teamId, access.team.id), isNull(tables.invitations.acceptedAt), isNull(tables.invitations.revokedAt)))
  if (result.affectedRows !== 1) throw notFound('No open invitation with this id.')
  await recordAudit(event, 'invitation.revoked', { teamId: access.team.id, userId: access.user.id, targetType: 'invitation', targetId: id })
}

async function openInvitation(token: string, db: DbOrTx = useDb()) {
  const [row] = await db.select({
    id: tables.invitations.id, teamId: tables.invitations.teamId, email: tables.invitations.email, role: tables.invitations.role,
    teamName: tables.teams.name, teamSlug: tables.teams.slug, expiresAt: tables.invitations.expiresAt,
  }).from(tables.invitations)
    .innerJoin(tables.teams, eq(tables.teams.id, tables.invitations.teamId))
    .where(and(eq(tables.invitations.tokenHash, hashSecretToken(token)), isNull(tables.invitations.acceptedAt), isNull(tables.invitations.revokedAt), gt(tables.invitations.expiresAt, new Date())))
    .limit(1)
  return row
}

const GONE = 'This invitation is not valid any more: it was used, withdrawn or has expired. Ask the team for a new one.'

export async function describeInvitation(token: string) {
  const invitation = await openInvitation(token)
  if (!invitation) throw httpError(404, GONE)
  const account = await findUserByEmail(invitation.email)
  return { email: invitation.email, role: invitation.role, team: { name: invitation.teamName }, accountExists: Boolean(account), expiresAt: invitation.expiresAt }
}

export async function acceptInvitation(event: H3Event, token: string, input: { name?: string, password?: string }) {
  const invitation = await openInvitation(token)
  if (!invitation) throw httpError(404, GONE)
  const signedIn = event.context.currentUser
  const existing = await findUserByEmail(invitation.email)
  if (signedIn && signedIn.email !== invitation.email) {
    throw httpError(403, `This invitation is for ${invitation.email}. Sign out and open the link again, or sign in with that address.`)
  }
  if (existing && !signedIn) throw httpError(401, `An account for ${invitation.email} exists: sign in first, then accept.`)
  if (!existing) {
    const fieldErrors: FieldErrors = {}
    if (!input.name) fieldErrors.name = ['Enter your name.']
    if (!input.password) fieldErrors.password = ['Choose a password.']
    if (Object.keys(fieldErrors).length) throw httpError(400, 'Enter your name and choose a password to create your account.', fieldErrors)
    assertPasswordAcceptable(input.password!, 'password', { email: invitation.email })
  }
  const passwordHash = existing ? null : await hashPassword(input.password!)
  const user = await useDb().transaction(async (tx) => {
    const [claimed] = await tx.update(tables.invitations).set({ acceptedAt: new Date() })
      .where(and(eq(tables.invitations.id, invitation.id), isNull(tables.invitations.acceptedAt), isNull(tables.invitations.revokedAt)))
    if (claimed.affectedRows !== 1) throw httpError(404, GONE)
    const userId = existing?.id
      ?? insertedId(await tx.insert(tables.users).values({ email: invitation.email, name: input.name!, passwordHash: passwordHash! }).$returningId())
    if (!(await findMembership(invitation.teamId, userId, tx))) {
      await tx.insert(tables.memberships).values({ teamId: invitation.teamId, userId, role: invitation.role })
    }
    await tx.update(tables.invitations).set({ acceptedBy: userId }).where(eq(tables.invitations.id, invitation.id))
    await recordAudit(event, 'invitation.accepted', { teamId: invitation.teamId, userId, targetType: 'invitation', targetId: invitation.id }, tx)
    return { id: userId, sessionVersion: existing?.sessionVersion ?? 1 }
  }).catch((error: unknown) => {
    // Another invitation for the same new address was accepted at the same moment: that one made the account.
    if (isDuplicateKey(error, 'users_email_unique')) throw httpError(409, `An account for ${invitation.email} was just created. Sign in with it, then open the link again.`)
    throw error
  })
  if (!signedIn) await startSession(event, user)
  return { team: { slug: invitation.teamSlug, name: invitation.teamName }, role: invitation.role }
}
