// Sourcing trips: a store, a day, who went and what it cost beyond the items (bags, parking, fuel or miles at
// the team's rate). A trip's figures as its items sell come from SQL sums of its items, combined by
// tripFigures (shared/ledger/item-rules.ts).
import { and, count, eq, exists, gte, inArray, isNotNull, like, lte, sql, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import { tripFigures, tripMileageCents, type TripItemSums } from '../../../shared/ledger/item-rules'
import type { tripCreateSchema, tripListQuery, tripPatchSchema } from '../../../shared/schemas/ledger'
import type { LedgerTrip, LedgerTripTotals } from '../../../shared/types/ledger'
import { ledgerFiguresChanged } from './versions'

type TripRow = typeof tables.sourcingTrips.$inferSelect

const SOLD = sql.raw(`('sold','shipped')`)
const UNSOLD = sql.raw(`('in_stock','listed')`)

/** The SQL sums of items behind the trip figures, grouped by trip. */
function itemSumColumns() {
  const i = tables.items
  return {
    itemCount: sql<string>`count(*)`.as('item_count'),
    soldCount: sql<string>`sum(case when ${i.status} in ${SOLD} then 1 else 0 end)`.as('sold_count'),
    unsoldCount: sql<string>`sum(case when ${i.status} in ${UNSOLD} then 1 else 0 end)`.as('unsold_count'),
    costCents: sql<string>`sum(${i.costCents})`.as('cost_cents'),
    salePriceCents: sql<string>`sum(coalesce(${i.salePriceCents}, 0))`.as('sale_price_cents'),
    shippingChargedCents: sql<string>`sum(coalesce(${i.shippingChargedCents}, 0))`.as('shipping_charged_cents'),
    feesCents: sql<string>`sum(coalesce(${i.feesCents}, 0))`.as('fees_cents'),
    postageCents: sql<string>`sum(coalesce(${i.postageCents}, 0))`.as('postage_cents'),
    suppliesCents: sql<string>`sum(coalesce(${i.suppliesCents}, 0))`.as('supplies_cents'),
    refundCents: sql<string>`sum(coalesce(${i.refundCents}, 0))`.as('refund_cents'),
  }
}

type SumRow = Record<keyof TripItemSums, unknown>

function toSums(row: Partial<SumRow> | undefined): TripItemSums {
  return {
    itemCount: ledgerSqlNumber(row?.itemCount), soldCount: ledgerSqlNumber(row?.soldCount), unsoldCount: ledgerSqlNumber(row?.unsoldCount),
    costCents: ledgerSqlNumber(row?.costCents), salePriceCents: ledgerSqlNumber(row?.salePriceCents),
    shippingChargedCents: ledgerSqlNumber(row?.shippingChargedCents), feesCents: ledgerSqlNumber(row?.feesCents),
    postageCents: ledgerSqlNumber(row?.postageCents), suppliesCents: ledgerSqlNumber(row?.suppliesCents), refundCents: ledgerSqlNumber(row?.refundCents),
  }
}

async function sumsByTrip(db: DbOrTx, teamId: number, tripIds: number[]): Promise<Map<number, TripItemSums>> {
  const out = new Map<number, TripItemSums>()
  if (!tripIds.length) return out
  const i = tables.items
  const rows = await db.select({ tripId: i.tripId, ...itemSumColumns() }).from(i)
    .where(and(eq(i.teamId, teamId), inArray(i.tripId, tripIds))).groupBy(i.tripId)
  for (const row of rows) out.set(Number(row.tripId), toSums(row))
  return out
}

async function membersByTrip(db: DbOrTx, teamId: number, tripIds: number[]): Promise<Map<number, number[]>> {
  const out = new Map<number, number[]>(tripIds.map(id => [id, []]))
  if (!tripIds.length) return out
  const m = tables.tripMembers
  const rows = await db.select().from(m).where(and(eq(m.teamId, teamId), inArray(m.tripId, tripIds))).orderBy(m.tripId, m.userId)
  for (const row of rows) out.get(row.tripId)?.push(row.userId)
  return out
}

function present(row: TripRow, storeName: string, memberIds: number[], sums: TripItemSums | undefined): LedgerTrip {
  const figures = tripFigures(
    { bagsCents: row.bagsCents, parkingCents: row.parkingCents, fuelCents: row.fuelCents, mileageCents: row.mileageCents },
    sums ?? toSums(undefined),
  )
  return {
    id: row.id, revision: row.revision, storeId: row.storeId, storeName, tripDate: row.tripDate, memberIds,
    bagsCents: row.bagsCents, parkingCents: row.parkingCents, fuelCents: row.fuelCents,
    miles: row.milesTenths / 10, mileageRateCents: row.mileageRateCents, mileageCents: row.mileageCents,
    notes: row.notes, createdBy: row.createdBy, createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString(),
    ...figures,
  }
}

async function presentRows(db: DbOrTx, teamId: number, rows: { trip: TripRow, storeName: string | null }[]): Promise<LedgerTrip[]> {
  const ids = rows.map(r => r.trip.id)
  const [sums, members] = await Promise.all([sumsByTrip(db, teamId, ids), membersByTrip(db, teamId, ids)])
  return rows.map(r => present(r.trip, r.storeName ?? '', members.get(r.trip.id) ?? [], sums.get(r.trip.id)))
}

export async function tripFind(db: DbOrTx, teamId: number, id: number): Promise<TripRow | null> {
  const t = tables.sourcingTrips
  const [row] = await db.select().from(t).where(and(eq(t.id, id), eq(t.teamId, teamId))).limit(1)
  return row ?? null
}

export async function tripGet(access: TeamAccess, id: number): Promise<LedgerTrip> {
  const db = useDb()
  const t = tables.sourcingTrips
  const rows = await db.select({ trip: t, storeName: tables.stores.name }).from(t)
    .leftJoin(tables.stores, and(eq(tables.stores.id, t.storeId), eq(tables.stores.teamId, t.teamId)))
    .where(and(eq(t.id, id), eq(t.teamId, access.team.id))).limit(1)
  if (!rows.length) throw notFound('No such sourcing trip in this team.')
  return (await presentRows(db, access.team.id, rows))[0]!
}

function listConditions(teamId: number, query: z.infer<typeof tripListQuery>): SQL[] {
  const t = tables.sourcingTrips
  const where: SQL[] = [eq(t.teamId, teamId)]
  if (query.storeId) where.push(eq(t.storeId, query.storeId))
  if (query.from) where.push(gte(t.tripDate, query.from))
  if (query.to) where.push(lte(t.tripDate, query.to))
  if (query.q) where.push(like(t.notes, ledgerLikePattern(query.q)))
  if (query.memberId) {
    const m = tables.tripMembers
    where.push(exists(useDb().select({ one: sql`1` }).from(m).where(and(eq(m.teamId, teamId), eq(m.tripId, t.id), eq(m.userId, query.memberId)))))
  }
  return where
}

/** Totals over every trip the filters select: SQL sums of spend and of the trips' items, then tripFigures. */
async function tripTotals(db: DbOrTx, teamId: number, where: SQL[]): Promise<LedgerTripTotals> {
  const t = tables.sourcingTrips
  const i = tables.items
  const agg = db.select({ tripId: i.tripId, ...itemSumColumns() }).from(i)
    .where(and(eq(i.teamId, teamId), isNotNull(i.tripId))).groupBy(i.tripId).as('agg')
  const [row] = await db.select({
    trips: sql<string>`count(*)`,
    bagsCents: sql<string>`sum(${t.bagsCents})`,
    parkingCents: sql<string>`sum(${t.parkingCents})`,
    fuelCents: sql<string>`sum(${t.fuelCents})`,
    mileageCents: sql<string>`sum(${t.mileageCents})`,
    itemCount: sql<string>`sum(coalesce(${agg.itemCount}, 0))`,
    soldCount: sql<string>`sum(coalesce(${agg.soldCount}, 0))`,
    unsoldCount: sql<string>`sum(coalesce(${agg.unsoldCount}, 0))`,
    costCents: sql<string>`sum(coalesce(${agg.costCents}, 0))`,
    salePriceCents: sql<string>`sum(coalesce(${agg.salePriceCents}, 0))`,
    shippingChargedCents: sql<string>`sum(coalesce(${agg.shippingChargedCents}, 0))`,
    feesCents: sql<string>`sum(coalesce(${agg.feesCents}, 0))`,
    postageCents: sql<string>`sum(coalesce(${agg.postageCents}, 0))`,
    suppliesCents: sql<string>`sum(coalesce(${agg.suppliesCents}, 0))`,
    refundCents: sql<string>`sum(coalesce(${agg.refundCents}, 0))`,
  }).from(t).leftJoin(agg, eq(agg.tripId, t.id)).where(and(...where))
  const figures = tripFigures({
    bagsCents: ledgerSqlNumber(row?.bagsCents), parkingCents: ledgerSqlNumber(row?.parkingCents),
    fuelCents: ledgerSqlNumber(row?.fuelCents), mileageCents: ledgerSqlNumber(row?.mileageCents),
  }, toSums(row))
  return { trips: ledgerSqlNumber(row?.trips), totalSpentCents: figures.totalSpentCents, revenueCents: figures.revenueCents, netSoFarCents: figures.netSoFarCents }
}

export async function tripList(access: TeamAccess, query: z.infer<typeof tripListQuery>) {
  const db = useDb()
  const t = tables.sourcingTrips
  const where = listConditions(access.team.id, query)
  const [[total], rows, totals] = await Promise.all([
    db.select({ n: count() }).from(t).where(and(...where)),
    db.select({ trip: t, storeName: tables.stores.name }).from(t)
      .leftJoin(tables.stores, and(eq(tables.stores.id, t.storeId), eq(tables.stores.teamId, t.teamId)))
      .where(and(...where))
      .orderBy(...ledgerOrderBy(query.sort ?? '-tripDate', { tripDate: t.tripDate, createdAt: t.createdAt }, t.id))
      .limit(query.pageSize).offset((query.page - 1) * query.pageSize),
    tripTotals(db, access.team.id, where),
  ])
  return { items: await presentRows(db, access.team.id, rows), total: Number(total?.n ?? 0), page: query.page, pageSize: query.pageSize, totals }
}

async function checkTripRefs(db: DbOrTx, teamId: number, storeId: number | undefined, memberIds: number[] | undefined) {
  const errors: LedgerFieldErrors = {}
  await ledgerCheckRefs(db, teamId, [{ field: 'storeId', id: storeId, table: 'stores', label: 'store' }], errors)
  if (memberIds?.length) {
    const found = await ledgerMemberIds(db, teamId, memberIds)
    const missing = memberIds.filter(id => !found.has(id))
    if (missing.length) ledgerAddError(errors, 'memberIds', `Not members of this team: ${missing.join(', ')}.`)
  }
  ledgerThrowIfInvalid('trip', errors)
}

const toTenths = (miles: number) => Math.round(miles * 10)

export async function tripCreate(access: TeamAccess, input: z.infer<typeof tripCreateSchema>): Promise<LedgerTrip> {
  const teamId = access.team.id
  const id = await ledgerTransaction(async (tx) => {
    await checkTripRefs(tx, teamId, input.storeId, input.memberIds)
    const { mileageRateCents } = await ledgerSettingsOf(tx, teamId)
    const milesTenths = toTenths(input.miles ?? 0)
    const [{ id }] = await tx.insert(tables.sourcingTrips).values({
      teamId, storeId: input.storeId, tripDate: input.tripDate,
      bagsCents: input.bagsCents ?? 0, parkingCents: input.parkingCents ?? 0, fuelCents: input.fuelCents ?? 0,
      milesTenths, mileageRateCents, mileageCents: tripMileageCents(milesTenths, mileageRateCents),
      notes: input.notes ?? '', createdBy: access.user.id,
    }).$returningId() as [{ id: number }]
    // The member who records the trip went on it, unless the list says who did.
    const members = input.memberIds?.length ? input.memberIds : [access.user.id]
    await tx.insert(tables.tripMembers).values(members.map(userId => ({ teamId, tripId: id, userId })))
    return id
  })
  return await tripGet(access, id)
}

export async function tripUpdate(access: TeamAccess, id: number, patch: z.infer<typeof tripPatchSchema>): Promise<LedgerTrip> {
  const teamId = access.team.id
  const { revision, memberIds, miles, ...given } = patch
  try {
    await ledgerTransaction(async (tx) => {
      const current = await tripFind(tx, teamId, id)
      if (!current) throw notFound('No such sourcing trip in this team.')
      assertCanEditOwn(access, current.createdBy)
      await checkTripRefs(tx, teamId, given.storeId, memberIds)
      const set: Partial<typeof tables.sourcingTrips.$inferInsert> = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined))
      if (miles !== undefined) {
        // Costed at the rate the trip was recorded with.
        set.milesTenths = toTenths(miles)
        set.mileageCents = tripMileageCents(set.milesTenths, current.mileageRateCents)
      }
      const t = tables.sourcingTrips
      const [result] = await tx.update(t).set({ ...set, revision: revision + 1 }).where(and(eq(t.id, id), eq(t.teamId, teamId), eq(t.revision, revision)))
      if (result.affectedRows !== 1) throw new LedgerConflict()
      if (memberIds !== undefined) {
        const m = tables.tripMembers
        await tx.delete(m).where(and(eq(m.teamId, teamId), eq(m.tripId, id)))
        if (memberIds.length) await tx.insert(m).values(memberIds.map(userId => ({ teamId, tripId: id, userId })))
      }
      if (given.storeId !== undefined && given.storeId !== current.storeId) {
        // The trip's items came from the trip's store.
        await tx.update(tables.items).set({ storeId: given.storeId }).where(and(eq(tables.items.teamId, teamId), eq(tables.items.tripId, id)))
        await ledgerFiguresChanged(tx, teamId)
      }
    })
  }
  catch (error) {
    if (error instanceof LedgerConflict) throw ledgerConflictError('trip', await tripGet(access, id))
    throw error
  }
  return await tripGet(access, id)
}

export async function tripDelete(access: TeamAccess, id: number) {
  const teamId = access.team.id
  return await ledgerTransaction(async (tx) => {
    const current = await tripFind(tx, teamId, id)
    if (!current) throw notFound('No such sourcing trip in this team.')
    assertCanEditOwn(access, current.createdBy)
    const [used] = await tx.select({ n: count() }).from(tables.items).where(and(eq(tables.items.teamId, teamId), eq(tables.items.tripId, id)))
    if (Number(used?.n ?? 0) > 0) throw httpError(409, `${used!.n} items came from this trip: move or delete them first.`)
    await tx.delete(tables.tripMembers).where(and(eq(tables.tripMembers.teamId, teamId), eq(tables.tripMembers.tripId, id)))
    await tx.delete(tables.sourcingTrips).where(and(eq(tables.sourcingTrips.id, id), eq(tables.sourcingTrips.teamId, teamId)))
    return { id, deleted: true }
  })
}
