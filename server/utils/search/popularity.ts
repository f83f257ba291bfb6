// How often the team sold an entry: breaks ties between equally relevant hits and orders the entries shown
// for an empty query. Counted from the ledger: items whose sale stands (sold or shipped; a returned item's
// sale was given back, as in the reports), per mark and per maker (the item's own maker, else its mark's, as
// the item pages show it). Loaded with the team's index and kept current through the search change log:
// item writes log "item" rows (entity id 0: count the whole team again, after an import).
import { and, eq, inArray, type SQL } from 'drizzle-orm'
import { items, marks } from '../../database/schema'
import type { ItemStatus } from '../../../shared/ledger/item-rules'
import type { SearchType } from '../../../shared/search/types'
import type { DbOrTx } from '../db'
import { searchTrackChange } from './changes'

export type SearchPopularity = (type: SearchType, id: number) => number

/** Statuses that carry a sale still standing (server/utils/reports/sql.ts counts the same ones). */
const STANDING_SALE: ItemStatus[] = ['sold', 'shipped']

/**
 * The ledger's hook, in an item write's transaction: when the item was sold before or after the write (any
 * of `statuses`), the sales counts must look at it again. Item id 0: all of the team's items (an import).
 */
export async function searchTrackItemSale(db: DbOrTx, teamId: number, itemId: number, statuses: (ItemStatus | null | undefined)[]): Promise<void> {
  if (statuses.some(s => s && STANDING_SALE.includes(s))) await searchTrackChange(db, teamId, 'item', itemId)
}

interface SoldLink { markId: number | null, makerId: number | null }

export class SearchPopularityCounts {
  private readonly sold = new Map<number, SoldLink>()
  private readonly marks = new Map<number, number>()
  private readonly makers = new Map<number, number>()

  /** Sold items of this team counted here. */
  get size(): number {
    return this.sold.size
  }

  readonly of: SearchPopularity = (type, id) => type === 'mark' ? this.marks.get(id) ?? 0 : type === 'maker' ? this.makers.get(id) ?? 0 : 0

  /** The item as it is now: sold with these links, or (null) not sold, deleted or not in this team. */
  set(itemId: number, link: SoldLink | null): void {
    const before = this.sold.get(itemId)
    if (before) this.count(before, -1)
    if (link) {
      this.sold.set(itemId, link)
      this.count(link, 1)
    }
    else this.sold.delete(itemId)
  }

  /** Sold items linked to these marks (their maker may come from the mark). */
  itemsOn(markIds: Set<number>): number[] {
    const out: number[] = []
    for (const [itemId, link] of this.sold) if (link.markId !== null && markIds.has(link.markId)) out.push(itemId)
    return out
  }

  private count(link: SoldLink, by: number) {
    const bump = (map: Map<number, number>, id: number | null) => {
      if (id === null) return
      const n = (map.get(id) ?? 0) + by
      if (n > 0) map.set(id, n)
      else map.delete(id)
    }
    bump(this.marks, link.markId)
    bump(this.makers, link.makerId)
  }
}

async function read(db: DbOrTx, teamId: number, where: SQL | undefined) {
  return await db.select({ id: items.id, status: items.status, markId: items.markId, ownMaker: items.makerId, markMaker: marks.makerId })
    .from(items)
    .leftJoin(marks, and(eq(marks.teamId, items.teamId), eq(marks.id, items.markId)))
    .where(and(eq(items.teamId, teamId), where))
}

const linkOf = (r: Awaited<ReturnType<typeof read>>[number]): SoldLink | null =>
  STANDING_SALE.includes(r.status) ? { markId: r.markId, makerId: r.ownMaker ?? r.markMaker } : null

/** The team's counts, read in one query (items_team_status_idx). */
export async function searchLoadPopularity(db: DbOrTx, teamId: number): Promise<SearchPopularityCounts> {
  const counts = new SearchPopularityCounts()
  for (const r of await read(db, teamId, inArray(items.status, STANDING_SALE))) counts.set(r.id, linkOf(r))
  return counts
}

/** Reads these items again and updates the counts; an id not found was deleted. */
export async function searchRefreshPopularity(db: DbOrTx, teamId: number, counts: SearchPopularityCounts, itemIds: number[]): Promise<void> {
  if (!itemIds.length) return
  const rows = await read(db, teamId, inArray(items.id, itemIds))
  const found = new Set<number>()
  for (const r of rows) {
    found.add(r.id)
    counts.set(r.id, linkOf(r))
  }
  for (const id of itemIds) if (!found.has(id)) counts.set(id, null)
}
