// Users, teams, memberships, invitations, password-reset tokens and audit events.
import { int, json, mysqlEnum, mysqlTable, varchar, char, index, uniqueIndex, boolean } from 'drizzle-orm/mysql-core'
import { id, ref, teamId, timestamps, createdAt, utcDatetime } from './columns'
import { ROLES } from '../../../shared/roles'

export const users = mysqlTable('users', {
  id: id(),
  email: varchar('email', { length: 254 }).notNull(),
  name: varchar('name', { length: 120 }).notNull(),
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  // Bumped to revoke every sealed session of the user (password change, removal, role change, sign out everywhere).
  sessionVersion: int('session_version').notNull().default(1),
  failedLogins: int('failed_logins').notNull().default(0),
  lockedAt: utcDatetime('locked_at'),
  ...timestamps(),
}, t => [uniqueIndex('users_email_unique').on(t.email)])

export const teams = mysqlTable('teams', {
  id: id(),
  slug: varchar('slug', { length: 64 }).notNull(),
  name: varchar('name', { length: 120 }).notNull(),
  timeZone: varchar('time_zone', { length: 64 }).notNull().default('UTC'),
  isDemo: boolean('is_demo').notNull().default(false),
  ...timestamps(),
}, t => [uniqueIndex('teams_slug_unique').on(t.slug)])

export const memberships = mysqlTable('memberships', {
  id: id(),
  teamId: teamId(),
  userId: ref('user_id').notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  ...timestamps(),
}, t => [
  uniqueIndex('memberships_team_user_unique').on(t.teamId, t.userId),
  index('memberships_user_idx').on(t.userId),
])

export const invitations = mysqlTable('invitations', {
  id: id(),
  teamId: teamId(),
  email: varchar('email', { length: 254 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  // Only the SHA-256 of the token is stored: a database leak does not hand out invitations.
  tokenHash: char('token_hash', { length: 64 }).notNull(),
  invitedBy: ref('invited_by').notNull(),
  expiresAt: utcDatetime('expires_at').notNull(),
  acceptedAt: utcDatetime('accepted_at'),
  acceptedBy: ref('accepted_by'),
  revokedAt: utcDatetime('revoked_at'),
  createdAt: createdAt(),
}, t => [
  index('invitations_team_idx').on(t.teamId, t.createdAt),
  uniqueIndex('invitations_token_unique').on(t.tokenHash),
])

export const passwordResetTokens = mysqlTable('password_reset_tokens', {
  id: id(),
  userId: ref('user_id').notNull(),
  tokenHash: char('token_hash', { length: 64 }).notNull(),
  expiresAt: utcDatetime('expires_at').notNull(),
  usedAt: utcDatetime('used_at'),
  createdAt: createdAt(),
}, t => [
  index('password_reset_user_idx').on(t.userId),
  uniqueIndex('password_reset_token_unique').on(t.tokenHash),
])

export const auditEvents = mysqlTable('audit_events', {
  id: id(),
  teamId: ref('team_id'),
  userId: ref('user_id'),
  action: varchar('action', { length: 64 }).notNull(),
  targetType: varchar('target_type', { length: 32 }),
  targetId: varchar('target_id', { length: 64 }),
  ip: varchar('ip', { length: 45 }),
  detail: json('detail').$type<Record<string, unknown>>(),
  createdAt: createdAt(),
}, t => [
  index('audit_team_idx').on(t.teamId, t.createdAt),
  index('audit_user_idx').on(t.userId, t.createdAt),
])
