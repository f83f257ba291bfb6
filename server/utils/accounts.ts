// Registration, sign-in, password change and reset.
import type { H3Event } from 'h3'
import { and, eq, gt, isNull, sql } from 'drizzle-orm'
import type { RegisterInput } from '../../shared/schemas/auth'

const MAX_CONSECUTIVE_FAILURES = 100
const RESET_TTL_MS = 60 * 60 * 1000
// A real scrypt hash of a random string: unknown e-mails cost the same time as wrong passwords.
let decoyHash: string | undefined

export function publicUser(user: { id: number, email: string, name: string }) {
  return { id: user.id, email: user.email, name: user.name }
}

export async function findUserByEmail(email: string, db: DbOrTx = useDb()) {
  const [user] = await db.select().from(tables.users).where(eq(tables.users.email, email)).limit(1)
  return user
}

export async function registerAccount(event: H3Event, input: RegisterInput) {
  assertPasswordAcceptable(input.password, 'password', { email: input.email })
  const db = useDb()
  if (await findUserByEmail(input.email)) {
    throw httpError(409, 'An account with this e-mail already exists. Sign in, or reset the password.', { email: ['An account with this e-mail already exists.'] })
  }
  const passwordHash = await hashPassword(input.password)
  return await db.transaction(async (tx) => {
    const id = insertedId(await tx.insert(tables.users).values({ email: input.email, name: input.name, passwordHash }).$returningId())
    const team = await createTeam(tx, { name: input.teamName, ownerId: id })
    await recordAudit(event, 'auth.register', { userId: id, teamId: team.id }, tx)
    return { user: { id, email: input.email, name: input.name, sessionVersion: 1 }, team }
  }).catch((error: unknown) => {
    if (isDuplicateKey(error, 'users_email_unique')) throw httpError(409, 'An account with this e-mail already exists.', { email: ['An account with this e-mail already exists.'] })
    throw error
  })
}

function loginRules(event: H3Event, email: string): ThrottleRule[] {
  return [
    { key: `login:acct:${email}`, limit: 10, windowSeconds: 15 * 60 },
    { key: `login:ip:${clientAddress(event)}`, limit: 100, windowSeconds: 15 * 60 },
  ]
}

const BAD_CREDENTIALS = 'That e-mail and password do not match an account.'

export async function signIn(event: H3Event, email: string, password: string) {
  const rules = loginRules(event, email)
  assertNotThrottled(rules, 'Too many failed sign-ins. Wait a few minutes and try again, or reset your password.')
  const user = await findUserByEmail(email)
  decoyHash ??= await hashPassword(crypto.randomUUID())
  const ok = await verifyPassword(user?.passwordHash ?? decoyHash, password)
  if (!user || !ok || user.lockedAt) {
    countAttempt(rules)
    if (user?.lockedAt && ok) {
      // The right password is not a failure: it leaves the count alone, and the person learns how to get back in.
      await recordAudit(event, 'auth.login_locked', { userId: user.id })
      throw httpError(423, 'This account is locked after too many failed sign-ins. Reset the password, or ask a team owner to unlock it.')
    }
    if (user) await noteFailedSignIn(event, user.id, user.failedLogins + 1)
    else await recordAudit(event, 'auth.login_failed', { detail: { reason: 'unknown-email' } })
    throw httpError(401, BAD_CREDENTIALS)
  }
  if (user.failedLogins) await useDb().update(tables.users).set({ failedLogins: 0 }).where(eq(tables.users.id, user.id))
  clearAttempts([rules[0]!.key])
  await startSession(event, user)
  await recordAudit(event, 'auth.login', { userId: user.id })
  return publicUser(user)
}

async function noteFailedSignIn(event: H3Event, userId: number, failures: number) {
  const lock = failures >= MAX_CONSECUTIVE_FAILURES
  await useDb().update(tables.users).set({
    failedLogins: sql`${tables.users.failedLogins} + 1`,
    ...(lock ? { lockedAt: new Date() } : {}),
  }).where(eq(tables.users.id, userId))
  await recordAudit(event, 'auth.login_failed', { userId, detail: { failures } })
  if (lock) await recordAudit(event, 'auth.locked', { userId, detail: { failures } })
}

export async function changePassword(event: H3Event, userId: number, currentPassword: string, newPassword: string) {
  const [user] = await useDb().select().from(tables.users).where(eq(tables.users.id, userId)).limit(1)
  if (!user) throw unauthorized()
  if (!(await verifyPassword(user.passwordHash, currentPassword))) {
    throw httpError(400, 'Your current password is not right.', { currentPassword: ['This is not your current password.'] })
  }
  assertPasswordAcceptable(newPassword, 'newPassword', { email: user.email })
  const passwordHash = await hashPassword(newPassword)
  authCacheForgetUser(userId)
  await useDb().update(tables.users).set({ passwordHash, sessionVersion: user.sessionVersion + 1 }).where(eq(tables.users.id, userId))
  authCacheForgetUser(userId)
  await recordAudit(event, 'auth.password_changed', { userId })
  // Every other session is now revoked; this one continues with the new version.
  await startSession(event, { id: userId, sessionVersion: user.sessionVersion + 1 })
}

export async function requestPasswordReset(event: H3Event, email: string) {
  const rules: ThrottleRule[] = [
    { key: `reset:acct:${email}`, limit: 5, windowSeconds: 60 * 60 },
    { key: `reset:ip:${clientAddress(event)}`, limit: 30, windowSeconds: 60 * 60 },
  ]
  assertNotThrottled(rules, 'Too many reset requests. Wait a while before asking again.')
  countAttempt(rules)
  const user = await findUserByEmail(email)
  // The answer is the same whether or not the account exists.
  if (!user) return
  const { token, hash } = newSecretToken()
  await useDb().insert(tables.passwordResetTokens).values({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_TTL_MS) })
  const teams = await listUserTeams(user.id)
  await sendMail(passwordResetMail({ to: user.email, name: user.name, teamNames: teams.map(t => t.name), url: `${useServerConfig().publicUrl}/reset/${token}` }))
  await recordAudit(event, 'auth.password_reset_requested', { userId: user.id })
}

export async function confirmPasswordReset(event: H3Event, token: string, password: string) {
  const db = useDb()
  const [row] = await db.select({ id: tables.passwordResetTokens.id, userId: tables.passwordResetTokens.userId, email: tables.users.email })
    .from(tables.passwordResetTokens)
    .innerJoin(tables.users, eq(tables.users.id, tables.passwordResetTokens.userId))
    .where(and(eq(tables.passwordResetTokens.tokenHash, hashSecretToken(token)), isNull(tables.passwordResetTokens.usedAt), gt(tables.passwordResetTokens.expiresAt, new Date())))
    .limit(1)
  if (!row) throw httpError(400, 'This reset link is not valid any more: it was used already or is older than 1 hour. Ask for a new one.', { token: ['Invalid or expired link.'] })
  assertPasswordAcceptable(password, 'password', { email: row.email })
  const passwordHash = await hashPassword(password)
  authCacheForgetUser(row.userId)
  await db.transaction(async (tx) => {
    // Single use even under a double click: only the request that flips used_at goes on.
    const [claimed] = await tx.update(tables.passwordResetTokens).set({ usedAt: new Date() })
      .where(and(eq(tables.passwordResetTokens.id, row.id), isNull(tables.passwordResetTokens.usedAt)))
    if (claimed.affectedRows !== 1) throw httpError(400, 'This reset link was used already. Ask for a new one.', { token: ['Used already.'] })
    await tx.update(tables.users).set({ passwordHash, failedLogins: 0, lockedAt: null, sessionVersion: sql`${tables.users.sessionVersion} + 1` })
      .where(eq(tables.users.id, row.userId))
    await recordAudit(event, 'auth.password_reset', { userId: row.userId }, tx)
  })
  authCacheForgetUser(row.userId)
}

export async function signOutEverywhere(event: H3Event, userId: number) {
  await revokeSessions(userId)
  await recordAudit(event, 'auth.logout_everywhere', { userId })
}
