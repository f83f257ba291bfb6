// The hook the wiki engine calls inside every write transaction (create, edit, restore, delete, undelete,
// purge, and note changes): one change-log row, committed or rolled back with the write itself.
import { searchChanges } from '../../database/schema/search'
import type { DbOrTx } from '../db'

/** Entity types in the change log; new searchable types add theirs (sale items: "item"). */
export type SearchEntityType = 'mark' | 'maker' | 'material' | 'category' | 'note'

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
