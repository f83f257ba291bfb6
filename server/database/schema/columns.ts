// Column helpers shared by every table. MariaDB rejects drizzle's serial(), so ids are explicit bigints.
import { bigint, datetime } from 'drizzle-orm/mysql-core'
import { sql } from 'drizzle-orm'

export const id = () => bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey()
export const ref = (name: string) => bigint(name, { mode: 'number', unsigned: true })
export const teamId = () => ref('team_id').notNull()

// All times are UTC: the pool sets time_zone '+00:00' on every connection.
export const utcDatetime = (name: string) => datetime(name, { mode: 'date', fsp: 3 })
export const createdAt = () => utcDatetime('created_at').notNull().default(sql`CURRENT_TIMESTAMP(3)`)
export const updatedAt = () => utcDatetime('updated_at').notNull().default(sql`CURRENT_TIMESTAMP(3)`).$onUpdate(() => new Date())
export const timestamps = () => ({ createdAt: createdAt(), updatedAt: updatedAt() })

/**
 * A per-team version counter row (wiki_versions, ledger_versions): moved on inside the transactions of the writes
 * it covers, so a cache can tell with one read that what it built is still current. changed_at is set on every
 * change too, so a database restored to an older counter never repeats a (version, time) pair.
 */
export const teamVersionColumns = () => ({
  teamId: teamId().primaryKey(),
  version: bigint('version', { mode: 'number', unsigned: true }).notNull().default(0),
  changedAt: datetime('changed_at', { mode: 'date', fsp: 6 }).notNull().default(sql`CURRENT_TIMESTAMP(6)`),
})
