// Answers kept for retried POSTs (server/utils/idempotency.ts): a phone that lost the answer to a change sends
// it again with the same Idempotency-Key and gets the stored answer instead of a second row. Kept 24 hours.
import { char, index, int, json, mysqlTable, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'
import { createdAt, id, ref, teamId, utcDatetime } from './columns'

export const idempotencyKeys = mysqlTable('idempotency_keys', {
  id: id(),
  teamId: teamId(),
  userId: ref('user_id').notNull(),
  // Chosen by the client (a UUID); scoped by team and person, so another person's key never collides.
  key: varchar('idem_key', { length: 100 }).notNull(),
  // "POST /api/teams/<slug>/items": a key reused on another route is refused like a changed body.
  route: varchar('route', { length: 255 }).notNull(),
  // SHA-256 hex of the request as the route read it (canonical JSON; an upload's file bytes and fields).
  requestHash: char('request_hash', { length: 64 }).notNull(),
  // Null while the first request is still being handled.
  statusCode: int('status_code'),
  response: json('response').$type<unknown>(),
  createdAt: createdAt(),
  expiresAt: utcDatetime('expires_at').notNull(),
}, t => [
  uniqueIndex('idempotency_keys_team_user_key_unique').on(t.teamId, t.userId, t.key),
  index('idempotency_keys_expires_idx').on(t.expiresAt),
])
