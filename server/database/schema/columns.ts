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
