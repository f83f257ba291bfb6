// A per-team version counter (wiki_versions, ledger_versions; schema/columns.ts teamVersionColumns): moving it on,
// and reading it as one string for a cache key. Explicit imports only (no Nitro auto-imports), so the reports
// benchmark can call it as well.
import { eq, sql, type SQL } from 'drizzle-orm'
import type { ledgerVersions } from '../database/schema/ledger'
import type { wikiVersions } from '../database/schema/wiki'
import type { DbOrTx } from './db'

type TeamVersionTable = typeof wikiVersions | typeof ledgerVersions

/** The team's version as one string (NULL before the team's first write), as a column of a larger statement. */
export function teamVersionColumn(table: TeamVersionTable, teamId: number): SQL<string | null> {
  return sql<string | null>`(select concat(v.version, ' ', v.changed_at) from ${table} v where v.team_id = ${teamId})`
}

/** Call it last in the transaction: the version row stays locked until the commit, so writers queue there. */
export async function teamVersionMoveOn(tx: DbOrTx, table: TeamVersionTable, teamId: number): Promise<void> {
  const next = { version: sql`${table.version} + 1`, changedAt: sql`current_timestamp(6)` }
  // A plain UPDATE takes the row's exclusive lock at once. INSERT … ON DUPLICATE KEY UPDATE on a row that exists
  // takes a shared lock first and then upgrades it, and two writers of one team doing that deadlock each other.
  const [updated] = await tx.update(table).set(next).where(eq(table.teamId, teamId))
  if (updated.affectedRows === 0) await tx.insert(table).values({ teamId, version: 1 }).onDuplicateKeyUpdate({ set: next })
}
