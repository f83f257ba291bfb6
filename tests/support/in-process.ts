// Runs the server's domain functions inside the test process, as Nitro would run them: every export of
// server/utils becomes a global (Nitro's auto-imports), h3's helpers too, and useDb answers a database whose
// transactions can be told to fail after N statements. That failure exists only here, in the test process:
// nothing in the shipped server can switch it on.
import { readdirSync, statSync } from 'node:fs'
import { join, resolve } from 'node:path'
import * as h3 from 'h3'
import mysql from 'mysql2/promise'
import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2'
import { vi } from 'vitest'
import * as schema from '../../server/database/schema'
import { query } from './db'

export class InjectedFailure extends Error {
  constructor(readonly statement: number) {
    super(`Injected failure before statement ${statement} of the transaction (test only).`)
  }
}

/** True when the error, or one of its causes, is the injected failure. */
export function isInjected(error: unknown): boolean {
  for (let e = error as { cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (e instanceof InjectedFailure) return true
  }
  return false
}

// Transaction control is not counted: the rollback after the failure must still run.
const CONTROL = /^\s*(begin|commit|rollback|savepoint|release savepoint|set transaction|start transaction)\b/i

export interface FailingDatabase {
  db: MySql2Database<typeof schema>
  /** From now on, transactions fail before their (n+1)-th statement: n statements run, then the failure. */
  failAfter: (n: number) => void
  disarm: () => void
  /** Statements run inside transactions since the last failAfter. */
  readonly statements: number
  close: () => Promise<void>
}

export function failingDatabase(url = process.env.DATABASE_URL!): FailingDatabase {
  const pool = mysql.createPool({ uri: url, connectionLimit: 4, timezone: 'Z', supportBigNumbers: true, charset: 'utf8mb4_unicode_ci' })
  pool.on('connection', (conn) => {
    conn.query('SET time_zone = \'+00:00\'')
  })
  let limit: number | null = null
  let statements = 0
  const counted = new WeakSet<object>()
  // drizzle runs a transaction on a connection it takes with getConnection(); plain queries go through pool.query.
  const getConnection = pool.getConnection.bind(pool)
  pool.getConnection = (async () => {
    const conn = await getConnection()
    if (!counted.has(conn)) {
      counted.add(conn)
      const run = conn.query.bind(conn) as (...args: unknown[]) => Promise<unknown>
      conn.query = ((...args: unknown[]) => {
        const first = args[0] as string | { sql?: string }
        const text = typeof first === 'string' ? first : first?.sql ?? ''
        if (limit !== null && !CONTROL.test(text)) {
          statements++
          if (statements > limit) return Promise.reject(new InjectedFailure(statements))
        }
        return run(...args)
      }) as typeof conn.query
    }
    return conn
  }) as typeof pool.getConnection
  const db: MySql2Database<typeof schema> = drizzle(pool as never, { schema, mode: 'default' })
  return {
    db,
    failAfter(n) {
      limit = n
      statements = 0
    },
    disarm() {
      limit = null
    },
    get statements() {
      return statements
    },
    close: () => pool.end(),
  }
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? walk(full) : full.endsWith('.ts') ? [full] : []
  })
}

/**
 * Loads every module of server/utils and makes its exports globals, with useDb answering `db`. Returns the
 * exports by name. Modules that import useDb explicitly (photos, audit) keep the app's own pool.
 */
export async function loadServerUtils(db: FailingDatabase['db']): Promise<Record<string, any>> {
  for (const [name, value] of Object.entries(h3)) vi.stubGlobal(name, value)
  vi.stubGlobal('useRuntimeConfig', () => ({ session: { name: 'tallymark-session' } }))
  const all: Record<string, any> = {}
  for (const file of walk('server/utils').sort()) {
    let mod: Record<string, unknown>
    try {
      mod = await import(resolve(file)) as Record<string, unknown>
    }
    catch (error) {
      // A module that does not load (someone's work in progress) only matters if a tested function needs it:
      // then its name is missing, and that test fails saying so.
      console.warn(`[in-process] ${file} did not load: ${(error as Error).message}`)
      continue
    }
    for (const [name, value] of Object.entries(mod)) {
      all[name] = value
      vi.stubGlobal(name, value)
    }
  }
  vi.stubGlobal('useDb', () => db)
  return all
}

/** Every table's row count and checksum, and every row the team owns: what "the database is unchanged" means here. */
export async function databaseState(teamId: number): Promise<Record<string, unknown>> {
  const tables = (await query<{ name: string }>('select table_name as name from information_schema.tables where table_schema = database() order by table_name')).map(t => t.name)
  const teamTables = new Set((await query<{ name: string }>(
    'select table_name as name from information_schema.columns where table_schema = database() and column_name = \'team_id\'',
  )).map(t => t.name))
  const state: Record<string, unknown> = {}
  const sums = await query<{ Table: string, Checksum: number }>(`checksum table ${tables.map(t => `\`${t}\``).join(', ')}`)
  for (const table of tables) {
    const [row] = await query<{ n: number }>(`select count(*) as n from \`${table}\``)
    state[`${table} rows`] = Number(row!.n)
    state[`${table} checksum`] = sums.find(s => s.Table.endsWith(`.${table}`))?.Checksum
    if (teamTables.has(table)) state[`${table} of the team`] = await query(`select * from \`${table}\` where team_id = ? order by 1, 2, 3`, [teamId])
  }
  return state
}

/**
 * Runs `operation` with the failure injected after 0, 1, 2 ... statements until it succeeds; after every
 * injected failure the database must be as it was. Returns how many statements the whole operation took.
 */
export async function failAtEveryStatement(failing: FailingDatabase, teamId: number, operation: () => Promise<unknown>, check: (n: number) => Promise<void> = async () => {}): Promise<number> {
  const before = await databaseState(teamId)
  for (let n = 0; n < 5_000; n++) {
    failing.failAfter(n)
    let failed: unknown = null
    try {
      await operation()
    }
    catch (error) {
      failed = error
    }
    const used = failing.statements
    failing.disarm()
    if (failed === null) return used
    if (!isInjected(failed)) throw failed
    const after = await databaseState(teamId)
    if (JSON.stringify(after) !== JSON.stringify(before)) {
      const changed = Object.keys(before).filter(key => JSON.stringify(before[key]) !== JSON.stringify(after[key]))
      throw new Error(`After a failure before statement ${n + 1} the database changed: ${changed.join(', ')}`)
    }
    await check(n)
  }
  throw new Error('The operation never finished')
}
