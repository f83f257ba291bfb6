// The rules of a ledger item's life, as data: which status may follow which, who may move it, and which
// dates and figures each status needs. Pure (no Vue, no Nitro): the server, the seed and the pages share it.
import { roleAtLeast, type Role } from '../roles'
import { computeFees, type FeeProfile } from './fees'
import { roundHalfUp } from './money'
import { netProfit, daysToSell, roiPercent } from './profit'

export const ITEM_STATUSES = ['in_stock', 'listed', 'sold', 'shipped', 'returned', 'donated', 'written_off', 'kept'] as const
export type ItemStatus = typeof ITEM_STATUSES[number]

export const STORE_KINDS = ['thrift_store', 'estate_sale', 'auction', 'yard_sale', 'online', 'other'] as const
export type StoreKind = typeof STORE_KINDS[number]

export const DAMAGE_FLAGS = ['chip', 'crack', 'hairline', 'crazing', 'worn_gilding', 'worn_paint', 'repair', 'missing_part', 'stain', 'other'] as const
export type DamageFlag = typeof DAMAGE_FLAGS[number]

/** The condition scale a team starts with; a team may replace it (ledger settings). Best first. */
export const DEFAULT_CONDITION_SCALE = ['new', 'excellent', 'very_good', 'good', 'fair', 'poor'] as const

/** Statuses in which the item carries a sale: price and sale date are required. */
export const SALE_STATUSES: readonly ItemStatus[] = ['sold', 'shipped', 'returned']
/** Statuses in which the item is still for sale or waiting: it has no outcome yet. */
export const OPEN_STATUSES: readonly ItemStatus[] = ['in_stock', 'listed']

export interface StatusTransition {
  from: ItemStatus
  to: ItemStatus
  /** Lowest role that may make this move on an item the member added themselves. */
  ownRole: Role
  /** Lowest role that may make this move on anyone's item. */
  anyRole: Role
  /** What the move means, for the page and the error messages. */
  label: string
}

const t = (from: ItemStatus, to: ItemStatus, label: string, ownRole: Role = 'contributor', anyRole: Role = 'editor'): StatusTransition =>
  ({ from, to, label, ownRole, anyRole })

/**
 * Every allowed move. Anything not listed is refused. Moving to "sold" goes through the sale endpoint
 * (it needs the sale figures); undoing an end state (donated, written off, kept) is for editors only,
 * because it changes the books of a closed item.
 */
export const STATUS_TRANSITIONS: readonly StatusTransition[] = Object.freeze([
  t('in_stock', 'listed', 'list it'),
  t('in_stock', 'sold', 'sold without a listing'),
  t('in_stock', 'donated', 'donate it'),
  t('in_stock', 'written_off', 'write it off'),
  t('in_stock', 'kept', 'keep it'),
  t('listed', 'in_stock', 'take the listing down'),
  t('listed', 'sold', 'mark as sold'),
  t('listed', 'donated', 'donate it'),
  t('listed', 'written_off', 'write it off'),
  t('listed', 'kept', 'keep it'),
  t('sold', 'shipped', 'ship it'),
  t('sold', 'returned', 'the buyer returned it'),
  t('sold', 'listed', 'the sale fell through: list it again'),
  t('shipped', 'returned', 'the buyer returned it'),
  t('returned', 'donated', 'donate the returned piece'),
  t('returned', 'written_off', 'write off the returned piece'),
  t('returned', 'kept', 'keep the returned piece'),
  t('donated', 'in_stock', 'undo the donation', 'editor'),
  t('written_off', 'in_stock', 'undo the write-off', 'editor'),
  t('kept', 'in_stock', 'put it back in stock', 'editor'),
])

export function findTransition(from: ItemStatus, to: ItemStatus, table: readonly StatusTransition[] = STATUS_TRANSITIONS): StatusTransition | null {
  return table.find(row => row.from === from && row.to === to) ?? null
}

export type TransitionCheck = { ok: true, transition: StatusTransition } | { ok: false, reason: 'not_allowed' | 'role', message: string }

/** May a member with `role` (who added the item: `own`) move it from `from` to `to`? */
export function checkTransition(from: ItemStatus, to: ItemStatus, role: Role, own: boolean, table: readonly StatusTransition[] = STATUS_TRANSITIONS): TransitionCheck {
  const transition = findTransition(from, to, table)
  if (!transition) {
    const next = table.filter(row => row.from === from).map(row => row.to)
    return { ok: false, reason: 'not_allowed', message: `An item that is ${statusLabel(from)} cannot become ${statusLabel(to)}${next.length ? `; it can become: ${next.map(statusLabel).join(', ')}` : ''}.` }
  }
  const needed = own ? transition.ownRole : transition.anyRole
  if (!roleAtLeast(role, needed)) {
    return { ok: false, reason: 'role', message: `To ${transition.label} on ${own ? 'your own item' : 'someone else\'s item'} needs the ${needed} role or higher.` }
  }
  return { ok: true, transition }
}

export function statusLabel(status: ItemStatus): string {
  return status.replace('_', ' ')
}

/** The stored figures of an item that the rules and the computed fields read. Money in cents, dates yyyy-mm-dd. */
export interface ItemFigures {
  status: ItemStatus
  quantity: number
  costCents: number
  acquiredOn: string | null
  listedOn: string | null
  soldOn: string | null
  shippedOn: string | null
  askingCents: number | null
  salePriceCents: number | null
  shippingChargedCents: number | null
  postageCents: number | null
  suppliesCents: number | null
  feesCents: number | null
  refundCents: number | null
}

export type ItemFieldErrors = Record<string, string[]>

const SALE_FIELDS = ['soldOn', 'salePriceCents', 'shippingChargedCents', 'postageCents', 'suppliesCents', 'feesCents', 'refundCents', 'shippedOn'] as const

/**
 * Cross-field checks for an item as stored (created directly in any status, as an import does, or after an
 * edit). Returns field errors keyed by field name; empty when consistent.
 */
export function checkItemConsistency(item: ItemFigures): ItemFieldErrors {
  const errors: ItemFieldErrors = {}
  const add = (field: string, message: string) => { (errors[field] ??= []).push(message) }
  if (!Number.isSafeInteger(item.quantity) || item.quantity < 1) add('quantity', 'A lot or set counts at least 1 piece.')
  if (!item.acquiredOn) add('acquiredOn', 'Enter the day the item was bought (or pick its sourcing trip).')
  const before = (a: string | null, b: string | null) => a !== null && b !== null && a > b
  if (before(item.acquiredOn, item.listedOn)) add('listedOn', `Listed on ${item.listedOn}, before it was bought on ${item.acquiredOn}.`)
  if (before(item.acquiredOn, item.soldOn)) add('soldOn', `Sold on ${item.soldOn}, before it was bought on ${item.acquiredOn}.`)
  if (before(item.listedOn, item.soldOn)) add('soldOn', `Sold on ${item.soldOn}, before it was listed on ${item.listedOn}.`)
  if (before(item.soldOn, item.shippedOn)) add('shippedOn', `Shipped on ${item.shippedOn}, before it was sold on ${item.soldOn}.`)

  const hasSale = SALE_STATUSES.includes(item.status)
  if (hasSale) {
    if (item.soldOn === null) add('soldOn', `An item that is ${statusLabel(item.status)} needs its sale date.`)
    if (item.salePriceCents === null) add('salePriceCents', `An item that is ${statusLabel(item.status)} needs its sale price.`)
  }
  else if (OPEN_STATUSES.includes(item.status)) {
    for (const field of SALE_FIELDS) {
      if (item[field] !== null) add(field, `An item that is ${statusLabel(item.status)} has no sale yet: leave ${field} empty.`)
    }
  }
  if (item.status === 'shipped' && item.shippedOn === null) add('shippedOn', 'A shipped item needs the day it was shipped.')
  if (item.status === 'listed' && item.listedOn === null) add('listedOn', 'A listed item needs the day it was listed.')
  if (item.refundCents !== null && item.refundCents > 0) {
    const paid = (item.salePriceCents ?? 0) + (item.shippingChargedCents ?? 0)
    if (item.refundCents > paid) add('refundCents', `The refund (${item.refundCents}¢) is more than the buyer paid (${paid}¢).`)
  }
  return errors
}

/** Fees of a sale: entered by hand when `manualFeesCents` is given, otherwise from the channel's fee profile. */
export function itemSaleFees(profile: FeeProfile, salePriceCents: number, shippingChargedCents: number, manualFeesCents?: number | null): { feesCents: number, feesManual: boolean } {
  if (manualFeesCents !== undefined && manualFeesCents !== null) return { feesCents: manualFeesCents, feesManual: true }
  return { feesCents: computeFees(profile, salePriceCents, shippingChargedCents).totalCents, feesManual: false }
}

/**
 * Net profit of an item once it has an outcome; null while it is in stock or listed. The fees are stored as
 * one total (marketplace + payment), so they enter netProfit as the marketplace part. An item given away or
 * kept without a sale has lost its cost.
 */
export function itemNetProfitCents(item: ItemFigures): number | null {
  if (OPEN_STATUSES.includes(item.status)) return null
  return netProfit({
    salePriceCents: item.salePriceCents ?? 0,
    shippingChargedCents: item.shippingChargedCents ?? 0,
    costCents: item.costCents,
    marketplaceFeeCents: item.feesCents ?? 0,
    paymentFeeCents: 0,
    postageCents: item.postageCents ?? 0,
    suppliesCents: item.suppliesCents ?? 0,
    refundsCents: item.refundCents ?? 0,
  })
}

/** The figures the server adds to an item's JSON: net, ROI (percent) and days to sell. */
export function itemComputed(item: ItemFigures): { netProfitCents: number | null, roi: number | null, daysToSell: number | null } {
  const netProfitCents = itemNetProfitCents(item)
  return {
    netProfitCents,
    roi: netProfitCents === null ? null : roiPercent(netProfitCents, item.costCents),
    daysToSell: item.acquiredOn && item.soldOn && item.acquiredOn <= item.soldOn ? daysToSell(item.acquiredOn, item.soldOn) : null,
  }
}

export type LengthInput = 'cm' | 'in' | 'mm'
const MM_PER: Record<LengthInput, number> = { mm: 1, cm: 10, in: 25.4 } // 25.4 mm to the inch, exact by definition

/** Box sides as whole millimetres (the stored unit), rounded to the nearest mm. */
export function lengthToMm(value: number, unit: LengthInput): number {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`a box side must be a positive length, got ${value}`)
  // 12 significant digits first, so 2.54 cm × 10 = 25.400000000000002 cannot round the wrong way.
  return Math.max(1, Math.round(Number((value * MM_PER[unit]).toPrecision(12))))
}

/** What a trip spent beyond its items: bags, parking, fuel and the miles driven at the team's rate. */
export interface TripSpend {
  bagsCents: number
  parkingCents: number
  fuelCents: number
  mileageCents: number
}

/** Sums of a trip's items, as read with SQL SUMs (null sums, from no rows, read as 0). */
export interface TripItemSums {
  itemCount: number
  soldCount: number
  unsoldCount: number
  costCents: number
  salePriceCents: number
  shippingChargedCents: number
  feesCents: number
  postageCents: number
  suppliesCents: number
  refundCents: number
}

export interface TripFigures {
  itemCount: number
  itemsSold: number
  itemsUnsold: number
  itemsCostCents: number
  extraSpendCents: number
  totalSpentCents: number
  revenueCents: number
  netSoFarCents: number
  roi: number | null
  paidForItself: boolean
}

/**
 * A trip's figures as its items sell. Total spent = the items' cost + the trip's extra spend; revenue = what
 * buyers paid (sale price + shipping charged); net so far = netProfit of the summed sales against everything
 * spent (netProfit is linear, so the sum of sales gives the same net as adding item by item).
 */
export function tripFigures(spend: TripSpend, sums: TripItemSums): TripFigures {
  const extraSpendCents = spend.bagsCents + spend.parkingCents + spend.fuelCents + spend.mileageCents
  const totalSpentCents = sums.costCents + extraSpendCents
  const netSoFarCents = netProfit({
    salePriceCents: sums.salePriceCents,
    shippingChargedCents: sums.shippingChargedCents,
    costCents: totalSpentCents,
    marketplaceFeeCents: sums.feesCents,
    paymentFeeCents: 0,
    postageCents: sums.postageCents,
    suppliesCents: sums.suppliesCents,
    refundsCents: sums.refundCents,
  })
  return {
    itemCount: sums.itemCount,
    itemsSold: sums.soldCount,
    itemsUnsold: sums.unsoldCount,
    itemsCostCents: sums.costCents,
    extraSpendCents,
    totalSpentCents,
    revenueCents: sums.salePriceCents + sums.shippingChargedCents,
    netSoFarCents,
    roi: roiPercent(netSoFarCents, totalSpentCents),
    paidForItself: netSoFarCents >= 0,
  }
}

/** Mileage spend of a trip: miles (in tenths, as stored) × the team's rate in cents per mile, rounded by the ledger rule. */
export function tripMileageCents(milesTenths: number, rateCentsPerMile: number): number {
  if (!Number.isSafeInteger(milesTenths) || milesTenths < 0) throw new RangeError(`miles must be a non-negative number of tenths, got ${milesTenths}`)
  if (!Number.isSafeInteger(rateCentsPerMile) || rateCentsPerMile < 0) throw new RangeError(`the mileage rate must be whole cents per mile, got ${rateCentsPerMile}`)
  return roundHalfUp(milesTenths * rateCentsPerMile, 10)
}
