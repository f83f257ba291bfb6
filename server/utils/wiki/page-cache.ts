// Entry pages this instance built, answered again while nothing they show has changed. Right across instances:
// every answer from here first reads, in one statement, the team's wiki version (versions.ts: moved on inside
// the transaction of every write an entry page shows, whichever instance makes it) and the entry row's own
// version, and answers the page only when both read exactly as when it was built. People's names change
// without a wiki write (a member renames themselves): they are read fresh in that same statement.
import { getTableName, sql } from 'drizzle-orm'
import type { DbOrTx } from '../db'
import { wikiEntryVersionColumn, wikiPeopleColumn, wikiPeopleOf, wikiQuoted, wikiTeamVersionColumn, type WikiPageVersions } from './detail'
import type { WikiTypeConfig } from './types'

type People = [number | null, number | null, number | null]
interface CachedPage { versions: WikiPageVersions, page: Record<string, unknown>, people: People, size: number }

// Bounds memory whatever the traffic (sizes in characters of the page's JSON): the least recently used go first.
const MAX_PAGES = 20_000
const MAX_SIZE = 32 * 1024 * 1024
const pages = new Map<string, CachedPage>()
let size = 0

const slotOf = (config: WikiTypeConfig, teamId: number, id: number, includeDeleted: boolean) => `${teamId}:${config.type}:${id}:${includeDeleted ? 'all' : 'live'}`

function forget(slot: string) {
  const old = pages.get(slot)
  if (!old) return
  pages.delete(slot)
  size -= old.size
}

export interface WikiPageHit { page: Record<string, unknown>, people: People, names: Map<number, string> }

/** The page built earlier, if the database still reads the versions it was built at (one statement); else undefined. */
export async function wikiPageLookup(db: DbOrTx, config: WikiTypeConfig, team: { id: number }, id: number, includeDeleted: boolean): Promise<WikiPageHit | undefined> {
  const slot = slotOf(config, team.id, id, includeDeleted)
  const cached = pages.get(slot)
  if (!cached) return undefined
  const entry = wikiQuoted(getTableName(config.table))
  const [rows] = await db.execute(sql`select ${wikiTeamVersionColumn(team.id)} as team,
    (select ${wikiEntryVersionColumn(entry)} from ${entry} where ${entry}.team_id = ${team.id} and ${entry}.id = ${id}) as entry,
    ${wikiPeopleColumn(sql.join(cached.people.map(p => sql`${p}`), sql`, `))} as people`) as unknown as [Record<string, unknown>[]]
  const fresh = rows[0]!
  // Another request may have put a newer page in the slot meanwhile: that one is left alone.
  const current = pages.get(slot) === cached
  if (fresh.team !== cached.versions.team || fresh.entry !== cached.versions.entry) {
    if (current) forget(slot)
    return undefined
  }
  if (current) {
    // Most recently used last.
    pages.delete(slot)
    pages.set(slot, cached)
  }
  return { page: cached.page, people: cached.people, names: wikiPeopleOf(fresh.people) }
}

/** Keeps a page built from a statement that read these versions. */
export function wikiPageStore(config: WikiTypeConfig, teamId: number, id: number, includeDeleted: boolean, versions: WikiPageVersions, page: Record<string, unknown>, people: People) {
  if (versions.entry === null) return
  const slot = slotOf(config, teamId, id, includeDeleted)
  forget(slot)
  const entrySize = JSON.stringify(page).length
  if (entrySize > MAX_SIZE / 16) return
  pages.set(slot, { versions, page, people, size: entrySize })
  size += entrySize
  for (const [oldest] of pages) {
    if (pages.size <= MAX_PAGES && size <= MAX_SIZE) break
    forget(oldest)
  }
}
