// Ledger items: one piece, or a lot or set counted by quantity, from the day it was bought to its outcome.
// Every write recomputes the stored net profit with shared/ledger, checks the item's dates and figures for
// consistency (item-rules.ts) and refuses a stale revision in the UPDATE itself. Status changes follow the
// transitions table and are recorded as events; a sale can also leave a note on the mark and category.
import { and, count, eq, gte, inArray, isNull, like, lte, or, sql, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import { formatCents } from '../../../shared/ledger/money'
import {
  checkItemConsistency, checkTransition, itemComputed, itemNetProfitCents, itemSaleFees, lengthToMm, SALE_STATUSES, statusLabel,
  OPEN_STATUSES, type ItemFigures, type ItemStatus,
} from '../../../shared/ledger/item-rules'
import { noteCreateSchema } from '../../../shared/schemas/wiki'
import { searchTrackChange } from '../search/changes'
import { searchTrackItemSale } from '../search/popularity'
import { ledgerFiguresChanged } from './versions'
import type { itemCreateSchema, itemFilterQuery, itemListQuery, itemPatchSchema, itemSaleSchema, itemStatusSchema } from '../../../shared/schemas/ledger'
import type { LedgerItem, LedgerItemDetail, LedgerItemFields, LedgerItemTotals, LedgerStatusEvent } from '../../../shared/types/ledger'
import { listEntryPhotos } from '../photos'
import { categorySubtreeCte } from './category-subtree'

type ItemRow = typeof tables.items.$inferSelect
type ItemInsert = typeof tables.items.$inferInsert

/** Every stored field an item's rules read or write (the row without its bookkeeping columns). */
export type LedgerItemDraft = Omit<ItemRow, 'id' | 'teamId' | 'revision' | 'importKey' | 'createdBy' | 'updatedBy' | 'createdAt' | 'updatedAt'>

export function itemFiguresOf(row: Omit<Pick<LedgerItemDraft, keyof ItemFigures>, 'acquiredOn'> & { acquiredOn: string | null }): ItemFigures {
  return {
    status: row.status, quantity: row.quantity, costCents: row.costCents, acquiredOn: row.acquiredOn, listedOn: row.listedOn,
    soldOn: row.soldOn, shippedOn: row.shippedOn, askingCents: row.askingCents, salePriceCents: row.salePriceCents,
    shippingChargedCents: row.shippingChargedCents, postageCents: row.postageCents, suppliesCents: row.suppliesCents,
    feesCents: row.feesCents, refundCents: row.refundCents,
  }
}

export function itemPresent(row: ItemRow): LedgerItemFields {
  const computed = itemComputed(itemFiguresOf(row))
  return {
    id: row.id, revision: row.revision, title: row.title, status: row.status,
    categoryId: row.categoryId, markId: row.markId, makerId: row.makerId, materialId: row.materialId,
    quantity: row.quantity, condition: row.condition, damage: { flags: row.damageFlags, notes: row.damageNotes },
    weightGrams: row.weightGrams,
    box: row.boxLengthMm !== null && row.boxWidthMm !== null && row.boxHeightMm !== null
      ? { lengthMm: row.boxLengthMm, widthMm: row.boxWidthMm, heightMm: row.boxHeightMm }
      : null,
    tripId: row.tripId, storeId: row.storeId, acquiredOn: row.acquiredOn, costCents: row.costCents,
    sourcedBy: row.sourcedBy, listedBy: row.listedBy, listedOn: row.listedOn, askingCents: row.askingCents,
    feeProfileId: row.feeProfileId, soldOn: row.soldOn, shippedOn: row.shippedOn, salePriceCents: row.salePriceCents,
    shippingChargedCents: row.shippingChargedCents, postageCents: row.postageCents, suppliesCents: row.suppliesCents,
    feesCents: row.feesCents, feesManual: row.feesManual, refundCents: row.refundCents,
    ...computed,
    externalId: row.externalId, notes: row.notes, createdBy: row.createdBy, updatedBy: row.updatedBy,
    createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString(),
  }
}

export async function itemFindRow(db: DbOrTx, teamId: number, id: number): Promise<ItemRow> {
  const i = tables.items
  const [row] = await db.select().from(i).where(and(eq(i.id, id), eq(i.teamId, teamId))).limit(1)
  if (!row) throw notFound('No such item in this team.')
  return row
}

/** Items with the names of what they link to (one query per kind of entry for the whole list). */
export async function itemWithLinks(db: DbOrTx, teamId: number, rows: ItemRow[]): Promise<LedgerItem[]> {
  const links = await itemLinksOf(db, teamId, rows)
  return rows.map(row => ({ ...itemPresent(row), links: links.get(row.id)! }))
}

/** One item: its fields, the names of its links and its photos in gallery order. */
export async function itemGet(access: TeamAccess, id: number): Promise<LedgerItemDetail> {
  const db = useDb()
  const row = await itemFindRow(db, access.team.id, id)
  const [[item], photos] = await Promise.all([itemWithLinks(db, access.team.id, [row]), listEntryPhotos(access.team, 'item', [id])])
  return { ...item!, photos: photos.get(id) ?? [] }
}

/** WHERE conditions of the item filters: shared by the list, its totals and the CSV export. */
export function itemFilterConditions(teamId: number, f: z.infer<typeof itemFilterQuery>): SQL[] {
  const i = tables.items
  const where: SQL[] = [eq(i.teamId, teamId)]
  if (f.status?.length) where.push(inArray(i.status, f.status))
  if (f.categoryId) {
    where.push(f.subcategories
      ? sql`${i.categoryId} IN (WITH RECURSIVE ${categorySubtreeCte(teamId, [f.categoryId])} SELECT id FROM cat_filter)`
      : eq(i.categoryId, f.categoryId))
  }
  if (f.markId) where.push(eq(i.markId, f.markId))
  if (f.makerId) where.push(eq(i.makerId, f.makerId))
  if (f.materialId) where.push(eq(i.materialId, f.materialId))
  if (f.storeId) where.push(eq(i.storeId, f.storeId))
  if (f.tripId) where.push(eq(i.tripId, f.tripId))
  if (f.sourcedBy) where.push(eq(i.sourcedBy, f.sourcedBy))
  if (f.acquiredFrom) where.push(gte(i.acquiredOn, f.acquiredFrom))
  if (f.acquiredTo) where.push(lte(i.acquiredOn, f.acquiredTo))
  if (f.soldFrom) where.push(gte(i.soldOn, f.soldFrom))
  if (f.soldTo) where.push(lte(i.soldOn, f.soldTo))
  if (f.q) {
    const pattern = ledgerLikePattern(f.q)
    where.push(or(like(i.title, pattern), like(i.notes, pattern), like(i.damageNotes, pattern), eq(i.externalId, f.q))!)
  }
  return where
}

/** Count and SQL sums (cost, revenue = sale price + shipping charged, net) of every row the filters select. */
export async function itemTotals(db: DbOrTx, where: SQL[]): Promise<LedgerItemTotals> {
  const i = tables.items
  const [row] = await db.select({
    items: count(),
    costCents: sql<string>`sum(${i.costCents})`,
    revenueCents: sql<string>`sum(coalesce(${i.salePriceCents}, 0) + coalesce(${i.shippingChargedCents}, 0))`,
    netProfitCents: sql<string>`sum(${i.netProfitCents})`,
  }).from(i).where(and(...where))
  return {
    items: ledgerSqlNumber(row?.items), costCents: ledgerSqlNumber(row?.costCents),
    revenueCents: ledgerSqlNumber(row?.revenueCents), netProfitCents: ledgerSqlNumber(row?.netProfitCents),
  }
}

export function itemSortColumns() {
  const i = tables.items
  return {
    acquiredOn: i.acquiredOn, soldOn: i.soldOn, listedOn: i.listedOn, title: i.title, costCents: i.costCents,
    salePriceCents: i.salePriceCents, netProfitCents: i.netProfitCents, createdAt: i.createdAt, id: i.id,
  }
}

export async function itemList(access: TeamAccess, query: z.infer<typeof itemListQuery>) {
  const db = useDb()
  const i = tables.items
  const where = itemFilterConditions(access.team.id, query)
  const [totals, rows] = await Promise.all([
    itemTotals(db, where),
    db.select().from(i).where(and(...where))
      .orderBy(...ledgerOrderBy(query.sort ?? '-acquiredOn', itemSortColumns(), i.id))
      .limit(query.pageSize).offset((query.page - 1) * query.pageSize),
  ])
  return { items: await itemWithLinks(db, access.team.id, rows), total: totals.items, page: query.page, pageSize: query.pageSize, totals }
}

/** The day an item entered a status, for the event recorded when it is created directly in that status. */
export function itemStatusDay(draft: Pick<LedgerItemDraft, 'status' | 'acquiredOn' | 'listedOn' | 'soldOn' | 'shippedOn'>): string {
  switch (draft.status) {
    case 'listed': return draft.listedOn ?? draft.acquiredOn
    case 'sold': case 'returned': return draft.soldOn ?? draft.acquiredOn
    case 'shipped': return draft.shippedOn ?? draft.soldOn ?? draft.acquiredOn
    default: return draft.acquiredOn
  }
}

type DraftInProgress = Omit<LedgerItemDraft, 'acquiredOn' | 'netProfitCents'> & { acquiredOn: string | null }

/**
 * Fills what the item takes from its trip and channel, checks every reference against the team (only the
 * ones that changed, so an item keeps a link to an entry deleted later), the condition scale, the fees and
 * the consistency rules; then computes the net. Throws a 400 with field errors.
 */
async function itemFinishDraft(db: DbOrTx, teamId: number, draft: DraftInProgress, current: ItemRow | null): Promise<LedgerItemDraft> {
  const errors: LedgerFieldErrors = {}
  const changed = <K extends keyof DraftInProgress>(key: K) => !current || current[key as keyof ItemRow] !== draft[key]
  if (draft.tripId !== null && changed('tripId')) {
    const trip = await tripFind(db, teamId, draft.tripId)
    if (!trip) ledgerAddError(errors, 'tripId', `No sourcing trip with id ${draft.tripId} in this team.`)
    else {
      if (draft.storeId === null) draft.storeId = trip.storeId
      else if (draft.storeId !== trip.storeId) ledgerAddError(errors, 'storeId', 'The item\'s store must be the store of its sourcing trip (leave storeId out to take it from the trip).')
      draft.acquiredOn ??= trip.tripDate
    }
  }
  const refs: LedgerRefCheck[] = []
  if (changed('categoryId')) refs.push({ field: 'categoryId', id: draft.categoryId, table: 'categories', label: 'category' })
  if (changed('markId')) refs.push({ field: 'markId', id: draft.markId, table: 'marks', label: 'mark' })
  if (changed('makerId')) refs.push({ field: 'makerId', id: draft.makerId, table: 'makers', label: 'maker' })
  if (changed('materialId')) refs.push({ field: 'materialId', id: draft.materialId, table: 'materials', label: 'material' })
  if (changed('storeId') && !(draft.tripId !== null && changed('tripId'))) refs.push({ field: 'storeId', id: draft.storeId, table: 'stores', label: 'store' })
  if (changed('feeProfileId')) refs.push({ field: 'feeProfileId', id: draft.feeProfileId, table: 'feeProfiles', label: 'fee profile' })
  if (changed('sourcedBy')) refs.push({ field: 'sourcedBy', id: draft.sourcedBy, table: 'members', label: 'member' })
  if (changed('listedBy')) refs.push({ field: 'listedBy', id: draft.listedBy, table: 'members', label: 'member' })
  await ledgerCheckRefs(db, teamId, refs, errors)
  if (draft.condition !== null && changed('condition')) {
    const { conditionScale } = await ledgerSettingsOf(db, teamId)
    if (!conditionScale.includes(draft.condition)) ledgerAddError(errors, 'condition', `The team's condition grades are: ${conditionScale.join(', ')}.`)
  }
  // Computed fees are recomputed only when what they depend on changed: a later change of the profile's
  // rates does not rewrite the fees of a past sale when its title is edited.
  const feeInputsChanged = changed('status') || changed('salePriceCents') || changed('shippingChargedCents') || changed('feeProfileId')
    || changed('feesManual') || draft.feesCents === null
  if (SALE_STATUSES.includes(draft.status) && draft.salePriceCents !== null && !draft.feesManual && feeInputsChanged && !errors.feeProfileId) {
    const profile = draft.feeProfileId !== null ? await ledgerFindFeeProfile(db, teamId, draft.feeProfileId) : await ledgerDefaultFeeProfile(db, teamId)
    draft.feeProfileId = profile?.id ?? null
    draft.feesCents = itemSaleFees(ledgerFeeTerms(profile), draft.salePriceCents, draft.shippingChargedCents ?? 0).feesCents
  }
  for (const [field, messages] of Object.entries(checkItemConsistency(itemFiguresOf({ ...draft, acquiredOn: draft.acquiredOn })))) {
    for (const message of messages) ledgerAddError(errors, field, message)
  }
  ledgerThrowIfInvalid('item', errors)
  const finished = { ...draft, acquiredOn: draft.acquiredOn! }
  return { ...finished, netProfitCents: itemNetProfitCents(itemFiguresOf(finished)) }
}

function boxColumns(box: z.infer<typeof itemCreateSchema>['box']): Pick<LedgerItemDraft, 'boxLengthMm' | 'boxWidthMm' | 'boxHeightMm'> {
  if (!box) return { boxLengthMm: null, boxWidthMm: null, boxHeightMm: null }
  return { boxLengthMm: lengthToMm(box.length, box.unit), boxWidthMm: lengthToMm(box.width, box.unit), boxHeightMm: lengthToMm(box.height, box.unit) }
}

async function recordEvent(db: DbOrTx, teamId: number, itemId: number, from: ItemStatus | null, to: ItemStatus, happenedOn: string, userId: number) {
  await db.insert(tables.itemStatusEvents).values({ teamId, itemId, fromStatus: from, toStatus: to, happenedOn, changedBy: userId })
}

export async function itemCreate(access: TeamAccess, input: z.infer<typeof itemCreateSchema>): Promise<LedgerItemDetail> {
  const teamId = access.team.id
  const id = await ledgerTransaction(async (tx) => {
    const draft = await itemFinishDraft(tx, teamId, {
      title: input.title, status: input.status ?? 'in_stock',
      categoryId: input.categoryId ?? null, markId: input.markId ?? null, makerId: input.makerId ?? null, materialId: input.materialId ?? null,
      quantity: input.quantity ?? 1, condition: input.condition ?? null,
      damageFlags: input.damage?.flags ?? [], damageNotes: input.damage?.notes ?? '',
      weightGrams: input.weightGrams ?? null, ...boxColumns(input.box),
      tripId: input.tripId ?? null, storeId: input.storeId ?? null, acquiredOn: input.acquiredOn ?? null, costCents: input.costCents ?? 0,
      sourcedBy: input.sourcedBy === undefined ? access.user.id : input.sourcedBy, listedBy: input.listedBy ?? null,
      listedOn: input.listedOn ?? null, askingCents: input.askingCents ?? null, feeProfileId: input.feeProfileId ?? null,
      soldOn: input.soldOn ?? null, shippedOn: input.shippedOn ?? null, salePriceCents: input.salePriceCents ?? null,
      shippingChargedCents: input.shippingChargedCents ?? null, postageCents: input.postageCents ?? null, suppliesCents: input.suppliesCents ?? null,
      feesCents: input.feesCents ?? null, feesManual: input.feesCents !== undefined && input.feesCents !== null,
      refundCents: input.refundCents ?? null, externalId: input.externalId ?? null, notes: input.notes ?? '',
    }, null)
    const [{ id }] = await tx.insert(tables.items).values({ ...draft, teamId, createdBy: access.user.id, updatedBy: access.user.id } satisfies ItemInsert).$returningId() as [{ id: number }]
    await recordEvent(tx, teamId, id, null, draft.status, itemStatusDay(draft), access.user.id)
    await searchTrackItemSale(tx, teamId, id, [draft.status])
    await ledgerFiguresChanged(tx, teamId)
    return id
  })
  return await itemGet(access, id)
}

/** The UPDATE behind every change: WHERE revision = the one the change is based on, else a conflict. */
async function writeItem(tx: Transaction, access: TeamAccess, id: number, base: number, draft: LedgerItemDraft) {
  const i = tables.items
  const [result] = await tx.update(i).set({ ...draft, revision: base + 1, updatedBy: access.user.id })
    .where(and(eq(i.id, id), eq(i.teamId, access.team.id), eq(i.revision, base)))
  if (result.affectedRows !== 1) throw new LedgerConflict()
}

async function withConflictAnswer<T>(access: TeamAccess, id: number, work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  }
  catch (error) {
    if (error instanceof LedgerConflict) throw ledgerConflictError('item', await itemGet(access, id))
    throw error
  }
}

const BOOKKEEPING = new Set(['id', 'teamId', 'revision', 'importKey', 'createdBy', 'updatedBy', 'createdAt', 'updatedAt', 'netProfitCents'])

function draftOf(row: ItemRow): DraftInProgress {
  return Object.fromEntries(Object.entries(row).filter(([key]) => !BOOKKEEPING.has(key))) as DraftInProgress
}

export async function itemUpdate(access: TeamAccess, id: number, patch: z.infer<typeof itemPatchSchema>): Promise<LedgerItemDetail> {
  const teamId = access.team.id
  const { revision, box, damage, feesCents, feesManual, ...given } = patch
  return await withConflictAnswer(access, id, async () => {
    await ledgerTransaction(async (tx) => {
      const current = await itemFindRow(tx, teamId, id)
      assertCanEditOwn(access, current.createdBy)
      if (revision !== current.revision) throw new LedgerConflict()
      const draft: DraftInProgress = { ...draftOf(current), ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined)) }
      if (box !== undefined) Object.assign(draft, boxColumns(box))
      if (damage !== undefined) Object.assign(draft, { damageFlags: damage.flags, damageNotes: damage.notes })
      // Fees given by hand stay as given; null (or feesManual: false) hands them back to the fee profile.
      if (feesCents !== undefined) Object.assign(draft, { feesCents, feesManual: feesCents !== null })
      else if (feesManual !== undefined) draft.feesManual = feesManual
      if (given.tripId !== undefined && given.tripId !== current.tripId && given.storeId === undefined) draft.storeId = null
      await writeItem(tx, access, id, revision, await itemFinishDraft(tx, teamId, draft, current))
      // A sold item's mark or maker may have changed: the sales counts follow.
      await searchTrackItemSale(tx, teamId, id, [current.status])
      await ledgerFiguresChanged(tx, teamId)
    })
    return await itemGet(access, id)
  })
}

export async function itemDelete(access: TeamAccess, id: number) {
  const teamId = access.team.id
  return await ledgerTransaction(async (tx) => {
    const current = await itemFindRow(tx, teamId, id)
    assertCanEditOwn(access, current.createdBy)
    await tx.delete(tables.itemStatusEvents).where(and(eq(tables.itemStatusEvents.teamId, teamId), eq(tables.itemStatusEvents.itemId, id)))
    await tx.delete(tables.items).where(and(eq(tables.items.id, id), eq(tables.items.teamId, teamId)))
    await searchTrackItemSale(tx, teamId, id, [current.status])
    await ledgerFiguresChanged(tx, teamId)
    return { id, deleted: true }
  })
}

function assertTransition(access: TeamAccess, row: ItemRow, to: ItemStatus) {
  const check = checkTransition(row.status, to, access.role, row.createdBy === access.user.id)
  if (!check.ok) throw check.reason === 'role' ? forbidden(check.message) : httpError(409, check.message)
}

const SALE_FIELDS_CLEARED = {
  soldOn: null, shippedOn: null, salePriceCents: null, shippingChargedCents: null, postageCents: null, suppliesCents: null,
  feesCents: null, feesManual: false, refundCents: null,
} as const

export async function itemChangeStatus(access: TeamAccess, id: number, input: z.infer<typeof itemStatusSchema>): Promise<LedgerItemDetail> {
  if (input.to === 'sold') {
    throw httpError(400, 'Please check the status: to: record a sale with POST …/items/[id]/sale, which takes the price and fees.', { to: ['Record a sale with the sale endpoint: it takes the price and fees.'] })
  }
  const teamId = access.team.id
  const on = input.on ?? ledgerToday()
  return await withConflictAnswer(access, id, async () => {
    await ledgerTransaction(async (tx) => {
      const current = await itemFindRow(tx, teamId, id)
      assertTransition(access, current, input.to)
      if (input.revision !== undefined && input.revision !== current.revision) throw new LedgerConflict()
      const draft = draftOf(current)
      draft.status = input.to
      if (input.to === 'listed') {
        if (current.status === 'sold') Object.assign(draft, SALE_FIELDS_CLEARED)
        draft.listedOn = current.status === 'in_stock' || current.status === 'sold' || !draft.listedOn ? on : draft.listedOn
        draft.listedBy ??= access.user.id
        if (input.askingCents !== undefined) draft.askingCents = input.askingCents
        if (input.feeProfileId !== undefined) draft.feeProfileId = input.feeProfileId
      }
      if (input.to === 'shipped') draft.shippedOn = on
      if (input.to === 'returned') draft.refundCents = input.refundCents ?? ((current.salePriceCents ?? 0) + (current.shippingChargedCents ?? 0))
      if (OPEN_STATUSES.includes(input.to) && current.salePriceCents !== null && current.status !== 'sold') {
        throw httpError(409, `This item went through a sale and a return: it cannot be ${statusLabel(input.to)} again. Add the piece as a new item to sell it again.`)
      }
      await writeItem(tx, access, id, current.revision, await itemFinishDraft(tx, teamId, draft, current))
      await recordEvent(tx, teamId, id, current.status, input.to, input.to === 'listed' ? draft.listedOn! : on, access.user.id)
      await searchTrackItemSale(tx, teamId, id, [current.status, input.to])
      await ledgerFiguresChanged(tx, teamId)
    })
    return await itemGet(access, id)
  })
}

async function liveEntry(db: DbOrTx, teamId: number, type: 'mark' | 'category', id: number): Promise<boolean> {
  const t = type === 'mark' ? tables.marks : tables.categories
  const rows = await db.select({ id: t.id }).from(t).where(and(eq(t.id, id), eq(t.teamId, teamId), isNull(t.deletedAt))).limit(1)
  return rows.length > 0
}

/** The outcome in the team's words, for the timeline of the mark and category: price, days to sell, channel. */
export function itemSaleNoteText(item: LedgerItemFields, channelName: string | null, currency = 'USD'): string {
  const money = (cents: number) => formatCents(cents, currency)
  const parts = [`Sold "${item.title}"${item.quantity > 1 ? ` (${item.quantity} pieces)` : ''} for ${money(item.salePriceCents ?? 0)}`]
  if (item.shippingChargedCents) parts.push(` plus ${money(item.shippingChargedCents)} shipping`)
  if (channelName) parts.push(` on ${channelName}`)
  if (item.daysToSell !== null) parts.push(`, ${item.daysToSell === 0 ? 'the day it was bought' : `${item.daysToSell} day${item.daysToSell === 1 ? '' : 's'} after it was bought`}`)
  parts.push(`. Paid ${money(item.costCents)}`)
  if (item.netProfitCents !== null) parts.push(`, net ${money(item.netProfitCents)}`)
  parts.push('.')
  return parts.join('')
}

/**
 * Mark as sold, in ONE transaction: the sale figures (fees from the channel's profile unless entered), the
 * status event and, when asked, a timeline note on the item's mark and category. A note that cannot be
 * written (the mark was deleted meanwhile) rolls the whole sale back.
 */
export async function itemRecordSale(access: TeamAccess, id: number, input: z.infer<typeof itemSaleSchema>) {
  const teamId = access.team.id
  const soldOn = input.soldOn ?? ledgerToday()
  return await withConflictAnswer(access, id, async () => {
    const notes = await ledgerTransaction(async (tx) => {
      const current = await itemFindRow(tx, teamId, id)
      assertTransition(access, current, 'sold')
      if (input.revision !== undefined && input.revision !== current.revision) throw new LedgerConflict()
      const errors: LedgerFieldErrors = {}
      const profileId = input.feeProfileId ?? current.feeProfileId
      const profile = profileId ? await ledgerFindFeeProfile(tx, teamId, profileId) : await ledgerDefaultFeeProfile(tx, teamId)
      if (profileId && !profile) ledgerAddError(errors, 'feeProfileId', `No fee profile with id ${profileId} in this team.`)
      ledgerThrowIfInvalid('sale', errors)
      const fees = itemSaleFees(ledgerFeeTerms(profile), input.salePriceCents, input.shippingChargedCents, input.feesCents)
      const draft: DraftInProgress = {
        ...draftOf(current), status: 'sold', soldOn, shippedOn: null, refundCents: null,
        salePriceCents: input.salePriceCents, shippingChargedCents: input.shippingChargedCents,
        postageCents: input.postageCents, suppliesCents: input.suppliesCents,
        feeProfileId: profile?.id ?? null, feesCents: fees.feesCents, feesManual: fees.feesManual,
      }
      await writeItem(tx, access, id, current.revision, await itemFinishDraft(tx, teamId, draft, current))
      await recordEvent(tx, teamId, id, current.status, 'sold', soldOn, access.user.id)
      await searchTrackItemSale(tx, teamId, id, ['sold'])
      await ledgerFiguresChanged(tx, teamId)
      if (!input.note) return []
      const sold = itemPresent(await itemFindRow(tx, teamId, id))
      const { currency } = await ledgerSettingsOf(tx, teamId)
      const body = noteCreateSchema.parse({ body: input.note.body ?? itemSaleNoteText(sold, profile?.name ?? null, currency), happenedOn: soldOn })
      const targets: { entryType: 'mark' | 'category', entryId: number }[] = []
      if (input.note.onMark && current.markId !== null) targets.push({ entryType: 'mark', entryId: current.markId })
      if (input.note.onCategory && current.categoryId !== null) targets.push({ entryType: 'category', entryId: current.categoryId })
      const written: { entryType: 'mark' | 'category', entryId: number, noteId: number }[] = []
      for (const target of targets) {
        if (!await liveEntry(tx, teamId, target.entryType, target.entryId)) {
          throw httpError(409, `The item's ${target.entryType} (id ${target.entryId}) is in the deleted list, so the sale note cannot go on its timeline. Nothing was saved: record the sale without that note, or restore the ${target.entryType}.`)
        }
        // The same rows the wiki's note route writes (server/utils/wiki/notes.ts wikiAddNote: the note and its
        // search change-log row), written here on the sale's transaction so the sale and its notes are saved
        // together or not at all; wikiAddNote opens a transaction of its own and cannot join this one.
        const [{ id: noteId }] = await tx.insert(tables.entryNotes).values({
          teamId, entryType: target.entryType, entryId: target.entryId, authorId: access.user.id, body: body.body, happenedOn: body.happenedOn ?? null,
        }).$returningId() as [{ id: number }]
        await searchTrackChange(tx, teamId, 'note', noteId)
        written.push({ ...target, noteId })
      }
      return written
    })
    return { item: await itemGet(access, id), notes }
  })
}

export async function itemStatusHistory(access: TeamAccess, id: number): Promise<{ items: LedgerStatusEvent[] }> {
  await itemFindRow(useDb(), access.team.id, id)
  const e = tables.itemStatusEvents
  const rows = await useDb().select({ event: e, name: tables.users.name }).from(e)
    .leftJoin(tables.users, eq(tables.users.id, e.changedBy))
    .where(and(eq(e.teamId, access.team.id), eq(e.itemId, id))).orderBy(e.id)
  return {
    items: rows.map(({ event, name }) => ({
      id: event.id, from: event.fromStatus, to: event.toStatus, happenedOn: event.happenedOn,
      changedBy: { id: event.changedBy, name: name ?? '' }, changedAt: event.changedAt.toISOString(),
    })),
  }
}
