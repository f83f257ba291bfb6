// The search change log: one row per write to a searchable entry, in the write's own transaction. Every app
// instance polls it to update the team indexes it holds in memory, so a write through one instance is
// found through all of them. Rows older than a day are pruned by the instances (server/utils/search).
import { sql } from 'drizzle-orm'
import { index, mysqlTable, varchar } from 'drizzle-orm/mysql-core'
import { id, ref, teamId, utcDatetime } from './columns'

export const searchChanges = mysqlTable('search_changes', {
  id: id(),
  teamId: teamId(),
  // A string, not an enum: a new searchable type (sale items) needs no migration.
  entityType: varchar('entity_type', { length: 32 }).notNull(),
  entityId: ref('entity_id').notNull(),
  changedAt: utcDatetime('changed_at').notNull().default(sql`CURRENT_TIMESTAMP(3)`),
}, t => [
  index('search_changes_team_id_idx').on(t.teamId, t.id),
  index('search_changes_changed_idx').on(t.changedAt),
])
