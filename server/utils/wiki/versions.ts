// The team's wiki version (wiki_versions): moved on inside every transaction that changes what an entry page
// shows (entries, their child rows and links, and their photos), so page-cache.ts can tell, with one read,
// that a page it built earlier is still the page. Explicit imports only: photos.ts and the seed call it too.
import { eq, sql } from 'drizzle-orm'
import { wikiVersions } from '../../database/schema/wiki'
import type { DbOrTx } from '../db'

/** Call it last in the transaction: the version row stays locked until the commit, so writers queue there. */
export async function wikiPageChanged(tx: DbOrTx, teamId: number): Promise<void> {
  const v = wikiVersions
  const next = { version: sql`${v.version} + 1`, changedAt: sql`current_timestamp(6)` }
  // A plain UPDATE takes the row's exclusive lock at once. INSERT … ON DUPLICATE KEY UPDATE on a row that exists
  // takes a shared lock first and then upgrades it, and two writers of one team doing that deadlock each other.
  const [updated] = await tx.update(v).set(next).where(eq(v.teamId, teamId))
  if (updated.affectedRows === 0) await tx.insert(v).values({ teamId, version: 1 }).onDuplicateKeyUpdate({ set: next })
}
