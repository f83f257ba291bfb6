// The team's wiki version (wiki_versions): moved on inside every transaction that changes what an entry page
// shows (entries, their child rows and links, and their photos), so page-cache.ts can tell, with one read,
// that a page it built earlier is still the page. The reports read it too (categories roll up, entries name
// the groups). Explicit imports only: photos.ts calls it too.
import { wikiVersions } from '../../database/schema/wiki'
import type { DbOrTx } from '../db'
import { teamVersionMoveOn } from '../team-versions'

/** Call it last in the transaction: the version row stays locked until the commit, so writers queue there. */
export async function wikiPageChanged(tx: DbOrTx, teamId: number): Promise<void> {
  await teamVersionMoveOn(tx, wikiVersions, teamId)
}
