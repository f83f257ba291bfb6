// The hook the wiki engine calls inside every write transaction (create, edit, restore, delete, undelete,
// purge, and note changes): one change-log row, committed or rolled back with the write itself.
import { searchChanges } from '../../database/schema/search'
import type { DbOrTx } from '../db'

/**
 * Entity types in the change log; new searchable types add theirs. "item": a ledger item's sale or links
 * changed (the sales counts of server/utils/search/popularity.ts); item id 0 stands for all of a team's items.
 */
export type SearchEntityType = 'mark' | 'maker' | 'material' | 'category' | 'note' | 'item'

const listeners = new Set<() => void>()

/** Lets this instance's search service look at the log soon after its own writes (others poll). */
export function searchOnChange(listener: () => void): () => void {
  listeners.add(listener)
  return () => listeners.delete(listener)
}

export async function searchTrackChange(db: DbOrTx, teamId: number, entityType: SearchEntityType, entityId: number): Promise<void> {
  await db.insert(searchChanges).values({ teamId, entityType, entityId })
  for (const listener of listeners) listener()
}

/** Many change-log rows at once (a team import), a thousand per statement, in the caller's transaction. */
export async function searchTrackChanges(db: DbOrTx, teamId: number, changes: { entityType: SearchEntityType, entityId: number }[]): Promise<void> {
  for (let i = 0; i < changes.length; i += 1_000) {
    await db.insert(searchChanges).values(changes.slice(i, i + 1_000).map(c => ({ teamId, ...c })))
  }
  if (changes.length) for (const listener of listeners) listener()
}
