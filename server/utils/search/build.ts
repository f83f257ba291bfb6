// Reading a team's entries into a new index: one loop for the worker thread (build-worker.ts), which runs it
// flat out, and for the main thread where no worker can run (nuxt dev), which pauses between slices.
import type { DbOrTx } from '../db'
import { searchSources } from './documents'
import { SearchTeamIndex } from './team-index'

export interface SearchReadOptions {
  pageSize: number
  /** A promise when the loop should yield now (the main thread), else undefined. */
  pause?: () => Promise<void> | undefined
  /** True when the build is no longer wanted. */
  stopped?: () => boolean
}

/** Every live entry of the team in a new index; null when stopped on the way. */
export async function searchReadTeam(db: DbOrTx, teamId: number, options: SearchReadOptions): Promise<SearchTeamIndex | null> {
  const index = new SearchTeamIndex()
  for (const source of Object.values(searchSources)) {
    let next = source.page(db, teamId, 0, options.pageSize)
    for (;;) {
      const page = await next
      if (options.stopped?.()) return null
      const full = page.length === options.pageSize
      // The next page is read while this one is indexed.
      if (full) next = source.page(db, teamId, page[page.length - 1]!.id, options.pageSize)
      for (const record of page) {
        index.upsert(record)
        const pause = options.pause?.()
        if (pause) await pause
      }
      if (!full) break
      if (options.stopped?.()) {
        next.catch(() => {})
        return null
      }
    }
  }
  return index
}
