// The names behind an item's ids (mark, maker, material, category with its path, store, trip, channel and
// the members who sourced and listed it), looked up for a whole page of items at once: one query per kind of
// entry, whatever the page size. An entry deleted later keeps its name and says so (`deleted`).
import { and, eq, inArray } from 'drizzle-orm'
import type { LedgerItemLinks, LedgerLinkedEntry } from '../../../shared/types/ledger'

type LinkSource = Pick<typeof tables.items.$inferSelect, 'id' | 'categoryId' | 'markId' | 'makerId' | 'materialId' | 'storeId' | 'tripId' | 'feeProfileId' | 'sourcedBy' | 'listedBy'>

const idsOf = (values: (number | null)[]) => [...new Set(values.filter((v): v is number => v !== null))]

type Named = { id: number, name: string, deletedAt?: Date | null }
const byId = <T extends { id: number }>(rows: T[]) => new Map(rows.map(r => [Number(r.id), r]))
const entry = (row: Named | undefined): LedgerLinkedEntry | null => row ? { id: Number(row.id), name: row.name, deleted: Boolean(row.deletedAt) } : null

/** Names from the top category down to `id`; a loop in old data stops the walk instead of hanging it. */
export function itemCategoryPath(parents: Map<number, { parentId: number | null, name: string }>, id: number): string[] {
  const path: string[] = []
  const seen = new Set<number>()
  for (let at: number | null = id; at !== null && !seen.has(at); at = parents.get(at)?.parentId ?? null) {
    seen.add(at)
    const row = parents.get(at)
    if (!row) break
    path.unshift(row.name)
  }
  return path
}

export async function itemLinksOf(db: DbOrTx, teamId: number, rows: LinkSource[]): Promise<Map<number, LedgerItemLinks>> {
  const result = new Map<number, LedgerItemLinks>()
  if (!rows.length) return result
  const t = tables
  const markIds = idsOf(rows.map(r => r.markId))
  const tripIds = idsOf(rows.map(r => r.tripId))
  const [marks, materials, categories, feeProfiles, trips, users] = await Promise.all([
    markIds.length
      ? db.select({ id: t.marks.id, name: t.marks.title, makerId: t.marks.makerId, deletedAt: t.marks.deletedAt }).from(t.marks).where(and(eq(t.marks.teamId, teamId), inArray(t.marks.id, markIds)))
      : [],
    pick(db, t.materials, teamId, idsOf(rows.map(r => r.materialId))),
    // The whole tree (a team has a few hundred categories at most): the paths need every ancestor.
    rows.some(r => r.categoryId !== null)
      ? db.select({ id: t.categories.id, name: t.categories.name, parentId: t.categories.parentId, deletedAt: t.categories.deletedAt }).from(t.categories).where(eq(t.categories.teamId, teamId))
      : [],
    idsOf(rows.map(r => r.feeProfileId)).length
      ? db.select({ id: t.feeProfiles.id, name: t.feeProfiles.name }).from(t.feeProfiles).where(and(eq(t.feeProfiles.teamId, teamId), inArray(t.feeProfiles.id, idsOf(rows.map(r => r.feeProfileId)))))
      : [],
    tripIds.length
      ? db.select({ id: t.sourcingTrips.id, tripDate: t.sourcingTrips.tripDate, storeId: t.sourcingTrips.storeId }).from(t.sourcingTrips).where(and(eq(t.sourcingTrips.teamId, teamId), inArray(t.sourcingTrips.id, tripIds)))
      : [],
    // Members by name; ids on the team's own items only, so no other person's name is reachable.
    idsOf(rows.flatMap(r => [r.sourcedBy, r.listedBy])).length
      ? db.select({ id: t.users.id, name: t.users.name }).from(t.users).where(inArray(t.users.id, idsOf(rows.flatMap(r => [r.sourcedBy, r.listedBy]))))
      : [],
  ])
  const markById = byId(marks)
  const storeIds = idsOf([...rows.map(r => r.storeId), ...trips.map(x => x.storeId)])
  const [makers, stores] = await Promise.all([
    pick(db, t.makers, teamId, idsOf([...rows.map(r => r.makerId), ...marks.map(m => m.makerId)])),
    storeIds.length
      ? db.select({ id: t.stores.id, name: t.stores.name }).from(t.stores).where(and(eq(t.stores.teamId, teamId), inArray(t.stores.id, storeIds)))
      : [],
  ])
  const makerById = byId(makers)
  const storeById = byId(stores)
  const materialById = byId(materials)
  const categoryById = byId(categories)
  const parents = new Map(categories.map(c => [Number(c.id), { parentId: c.parentId, name: c.name }]))
  const profileById = byId(feeProfiles)
  const tripById = byId(trips)
  const userById = byId(users)
  const person = (id: number | null) => {
    if (id === null) return null
    return { id, name: userById.get(id)?.name ?? '' }
  }
  for (const row of rows) {
    const mark = row.markId !== null ? markById.get(row.markId) : undefined
    const makerId = row.makerId ?? mark?.makerId ?? null
    const maker = entry(makerId !== null ? makerById.get(makerId) : undefined)
    const category = row.categoryId !== null ? categoryById.get(row.categoryId) : undefined
    const trip = row.tripId !== null ? tripById.get(row.tripId) : undefined
    const store = row.storeId !== null ? storeById.get(row.storeId) : undefined
    const profile = row.feeProfileId !== null ? profileById.get(row.feeProfileId) : undefined
    result.set(row.id, {
      category: category ? { ...entry(category)!, path: itemCategoryPath(parents, Number(category.id)) } : null,
      mark: entry(mark),
      maker: maker ? { ...maker, fromMark: row.makerId === null } : null,
      material: entry(row.materialId !== null ? materialById.get(row.materialId) : undefined),
      store: store ? { id: Number(store.id), name: store.name } : null,
      trip: trip ? { id: Number(trip.id), tripDate: trip.tripDate, storeName: storeById.get(trip.storeId)?.name ?? '' } : null,
      feeProfile: profile ? { id: Number(profile.id), name: profile.name } : null,
      sourcedBy: person(row.sourcedBy),
      listedBy: person(row.listedBy),
    })
  }
  return result
}

async function pick(db: DbOrTx, table: typeof tables.makers | typeof tables.materials, teamId: number, ids: number[]): Promise<Named[]> {
  if (!ids.length) return []
  return await db.select({ id: table.id, name: table.name, deletedAt: table.deletedAt }).from(table).where(and(eq(table.teamId, teamId), inArray(table.id, ids)))
}
