// Report figures this instance computed, reused while nothing they rest on has changed. Right across instances:
// a request first reads, in one statement, the team's ledger version (moved on inside every transaction that
// writes items, ledger/versions.ts) and its wiki version (every entry write, wiki/versions.ts: categories roll
// up, entries file the items), and an answer is reused only under exactly those versions. The versions are read
// before any figure, so figures computed while a write commits are kept under the older versions and never
// served again once that write has moved them on.
import { LRUCache } from 'lru-cache'
import { sql, type SQL } from 'drizzle-orm'
import { MySqlDialect } from 'drizzle-orm/mysql-core'
import { ledgerVersions } from '../../database/schema/ledger'
import { wikiVersions } from '../../database/schema/wiki'
import { teamVersionColumn } from '../team-versions'
import type { ReportExec } from './engine'

type Rows = Record<string, unknown>[]
type Run = (statement: SQL) => Promise<Rows>

// Bounds memory whatever the traffic; sizes are estimates in bytes (a figure cell is a short string or number).
const figures = new LRUCache<string, Rows>({
  max: 5_000,
  maxSize: 64 * 1024 * 1024,
  sizeCalculation: rows => 64 + rows.length * (rows[0] ? Object.keys(rows[0]).length : 1) * 24,
})
const dialect = new MySqlDialect()

/** The statement behind the team's two versions, as one string ('-' for a team that never wrote). */
function reportVersionsSql(teamId: number): SQL {
  return sql`SELECT CONCAT_WS('|', COALESCE(${teamVersionColumn(ledgerVersions, teamId)}, '-'),
    COALESCE(${teamVersionColumn(wikiVersions, teamId)}, '-')) AS versions`
}

/**
 * An exec for one request of one team: statements marked 'figures' are answered from the cache when the team's
 * versions still read as when they were computed; everything else runs as given.
 */
export function reportCachingExec(teamId: number, run: Run): ReportExec {
  let versions: Promise<string> | undefined
  return async (statement, reads) => {
    if (reads !== 'figures') return await run(statement)
    versions ??= run(reportVersionsSql(teamId)).then(rows => String(rows[0]?.versions))
    const query = dialect.sqlToQuery(statement)
    const key = `${teamId}\n${await versions}\n${query.sql}\n${JSON.stringify(query.params)}`
    const hit = figures.get(key)
    if (hit) return hit
    const rows = await run(statement)
    figures.set(key, rows)
    return rows
  }
}
