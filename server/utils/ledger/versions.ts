// The team's ledger version (ledger_versions): moved on inside every transaction that writes items — created,
// edited, sold, moved through a status, deleted, imported, or given a trip's store — so reports/cache.ts can tell,
// with one read, that figures it computed earlier still hold. Explicit imports only.
import { ledgerVersions } from '../../database/schema/ledger'
import type { DbOrTx } from '../db'
import { teamVersionMoveOn } from '../team-versions'

/** Call it last in the transaction: the version row stays locked until the commit, so writers queue there. */
export async function ledgerFiguresChanged(tx: DbOrTx, teamId: number): Promise<void> {
  await teamVersionMoveOn(tx, ledgerVersions, teamId)
}
