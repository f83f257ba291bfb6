import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import * as schema from '../database/schema'

export type Database = MySql2Database<typeof schema>
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0]
export type DbOrTx = Database | Transaction

let pool: mysql.Pool | undefined
let database: Database | undefined

export function useDb(): Database {
  if (database) return database
  pool = mysql.createPool({
    uri: useServerConfig().databaseUrl,
    connectionLimit: 20,
    timezone: 'Z',
    dateStrings: false,
    supportBigNumbers: true,
    charset: 'utf8mb4_unicode_ci',
    connectTimeout: 5_000,
  })
  // CURRENT_TIMESTAMP and NOW() must be UTC whatever the server's own zone is. JSON_ARRAYAGG (an entry page's
  // lists, wiki/detail.ts) stops at group_concat_max_len (1 MiB by default): as much as a packet may carry instead.
  pool.on('connection', (conn) => {
    conn.query('SET time_zone = \'+00:00\', group_concat_max_len = 16777216')
  })
  database = drizzle(pool, { schema, mode: 'default' })
  return database
}

export async function closeDb() {
  await pool?.end()
  pool = undefined
  database = undefined
}

/**
 * True for a unique-key violation (of the index named `key`, when given). drizzle wraps driver errors in
 * DrizzleQueryError, so the MariaDB code and message are on the cause.
 */
export function isDuplicateKey(error: unknown, key?: string): boolean {
  type DriverError = { code?: string, sqlMessage?: string }
  const e = error as (DriverError & { cause?: DriverError }) | null | undefined
  const driver = e?.code ? e : e?.cause
  return driver?.code === 'ER_DUP_ENTRY' && (!key || Boolean(driver.sqlMessage?.includes(`'${key}'`)))
}

export { schema as tables }

/** The id of the one row an insert created ($returningId gives an array). */
export function insertedId(rows: { id: number }[]): number {
  const id = rows[0]?.id
  if (!id) throw new Error('The insert returned no id.')
  return id
}
