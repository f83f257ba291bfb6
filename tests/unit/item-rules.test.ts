// Item rules: the status transitions table, who may make each move, the consistency checks on an item's
// dates and figures, and the computed figures. Sources beside the checks: "trade-facts §4/§6" is
// the team's trade-facts notes (section 4); "hand computation" means the expected value was worked out by hand from the
// formula in the comment.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  checkItemConsistency, checkTransition, findTransition, ITEM_STATUSES, itemComputed, itemNetProfitCents, itemSaleFees,
  lengthToMm, OPEN_STATUSES, STATUS_TRANSITIONS, tripFigures, tripMileageCents, type ItemFigures, type ItemStatus,
} from '#shared/ledger/item-rules'
import { computeFees, type FeeProfile } from '#shared/ledger/fees'
import { ROLES } from '#shared/roles'

// Invented fee profile for examples; not any channel's real schedule.
const PROFILE: FeeProfile = { percentBp: 1325, fixedCents: 30, paymentPercentBp: 0, paymentFixedCents: 0 }

const base: ItemFigures = {
  status: 'in_stock', quantity: 1, costCents: 300, acquiredOn: '2024-03-05', listedOn: null, soldOn: null, shippedOn: null,
  askingCents: null, salePriceCents: null, shippingChargedCents: null, postageCents: null, suppliesCents: null, feesCents: null, refundCents: null,
}
const sold = (over: Partial<ItemFigures> = {}): ItemFigures => ({
  ...base, status: 'sold', listedOn: '2024-03-06', soldOn: '2024-03-19', salePriceCents: 2500, shippingChargedCents: 500,
  postageCents: 450, suppliesCents: 100, feesCents: 428, ...over,
})

describe('status transitions table', () => {
  it('names only real statuses, never a status to itself, and each pair once', () => {
    const pairs = new Set<string>()
    for (const row of STATUS_TRANSITIONS) {
      expect(ITEM_STATUSES).toContain(row.from)
      expect(ITEM_STATUSES).toContain(row.to)
      expect(row.from).not.toBe(row.to)
      expect(ROLES).toContain(row.ownRole)
      expect(ROLES).toContain(row.anyRole)
      expect(row.label.length).toBeGreaterThan(0)
      const key = `${row.from}>${row.to}`
      expect(pairs.has(key), key).toBe(false)
      pairs.add(key)
    }
  })

  it('reaches every status from in_stock', () => {
    const seen = new Set<ItemStatus>(['in_stock'])
    for (let grew = true; grew;) {
      grew = false
      for (const row of STATUS_TRANSITIONS) {
        if (seen.has(row.from) && !seen.has(row.to)) {
          seen.add(row.to)
          grew = true
        }
      }
    }
    expect([...seen].sort()).toEqual([...ITEM_STATUSES].sort())
  })

  it('follows the life of a sale: listed → sold → shipped → returned, and no way back to stock after a return', () => {
    expect(findTransition('in_stock', 'listed')).not.toBeNull()
    expect(findTransition('listed', 'sold')).not.toBeNull()
    expect(findTransition('sold', 'shipped')).not.toBeNull()
    expect(findTransition('shipped', 'returned')).not.toBeNull()
    expect(findTransition('shipped', 'listed')).toBeNull()
    expect(findTransition('returned', 'listed')).toBeNull()
    expect(findTransition('returned', 'in_stock')).toBeNull()
    expect(findTransition('in_stock', 'shipped')).toBeNull()
  })

  it('never lets a contributor do more with someone else\'s item than an editor, and never lets a viewer move anything', () => {
    for (const row of STATUS_TRANSITIONS) {
      expect(checkTransition(row.from, row.to, 'viewer', true).ok).toBe(false)
      expect(checkTransition(row.from, row.to, 'editor', false).ok).toBe(true)
      expect(checkTransition(row.from, row.to, 'owner', false).ok).toBe(true)
    }
  })

  it('lets contributors move their own items, not other people\'s', () => {
    expect(checkTransition('listed', 'sold', 'contributor', true)).toMatchObject({ ok: true })
    expect(checkTransition('listed', 'sold', 'contributor', false)).toMatchObject({ ok: false, reason: 'role' })
    expect(checkTransition('in_stock', 'listed', 'contributor', true)).toMatchObject({ ok: true })
  })

  it('keeps undoing an end state for editors, even on a contributor\'s own item', () => {
    for (const end of ['donated', 'written_off', 'kept'] as const) {
      expect(checkTransition(end, 'in_stock', 'contributor', true)).toMatchObject({ ok: false, reason: 'role' })
      expect(checkTransition(end, 'in_stock', 'editor', true)).toMatchObject({ ok: true })
    }
  })

  it('refuses a move not in the table and says which moves exist', () => {
    const result = checkTransition('shipped', 'in_stock', 'owner', true)
    expect(result.ok).toBe(false)
    if (!result.ok) {
      expect(result.reason).toBe('not_allowed')
      expect(result.message).toMatch(/returned/)
    }
  })
})

describe('item consistency checks', () => {
  it('accepts a consistent item in each status', () => {
    expect(checkItemConsistency(base)).toEqual({})
    expect(checkItemConsistency({ ...base, status: 'listed', listedOn: '2024-03-06' })).toEqual({})
    expect(checkItemConsistency(sold())).toEqual({})
    expect(checkItemConsistency(sold({ status: 'shipped', shippedOn: '2024-03-20' }))).toEqual({})
    expect(checkItemConsistency(sold({ status: 'returned', shippedOn: '2024-03-20', refundCents: 3000 }))).toEqual({})
    expect(checkItemConsistency({ ...base, status: 'donated' })).toEqual({})
  })

  it('refuses a sale before the purchase, and a sale before the listing', () => {
    expect(checkItemConsistency(sold({ soldOn: '2024-03-04', listedOn: null })).soldOn?.[0]).toMatch(/before it was bought/)
    expect(checkItemConsistency(sold({ listedOn: '2024-03-20' })).soldOn?.[0]).toMatch(/before it was listed/)
    expect(checkItemConsistency({ ...base, status: 'listed', listedOn: '2024-03-01' }).listedOn?.[0]).toMatch(/before it was bought/)
    expect(checkItemConsistency(sold({ status: 'shipped', shippedOn: '2024-03-18' })).shippedOn?.[0]).toMatch(/before it was sold/)
  })

  it('needs the sale fields when sold, shipped or returned', () => {
    for (const status of ['sold', 'shipped', 'returned'] as const) {
      const errors = checkItemConsistency({ ...base, status, shippedOn: status === 'sold' ? null : '2024-03-20' })
      expect(errors.soldOn, status).toBeDefined()
      expect(errors.salePriceCents, status).toBeDefined()
    }
    expect(checkItemConsistency(sold({ status: 'shipped' })).shippedOn).toBeDefined()
  })

  it('refuses sale fields on an item that is still in stock or listed', () => {
    for (const status of OPEN_STATUSES) {
      const errors = checkItemConsistency({ ...sold(), status, listedOn: '2024-03-06' })
      expect(errors.soldOn, status).toBeDefined()
      expect(errors.salePriceCents, status).toBeDefined()
      expect(errors.feesCents, status).toBeDefined()
    }
  })

  it('needs a listing date on a listed item, a purchase date always, and at least one piece', () => {
    expect(checkItemConsistency({ ...base, status: 'listed' }).listedOn).toBeDefined()
    expect(checkItemConsistency({ ...base, acquiredOn: null }).acquiredOn).toBeDefined()
    expect(checkItemConsistency({ ...base, quantity: 0 }).quantity).toBeDefined()
  })

  it('refuses a refund larger than what the buyer paid (hand computation: 2,500 + 500 = 3,000)', () => {
    expect(checkItemConsistency(sold({ refundCents: 3000 })).refundCents).toBeUndefined()
    expect(checkItemConsistency(sold({ refundCents: 3001 })).refundCents?.[0]).toMatch(/3000/)
  })

  it('holds for any order of dates: a sale date before the purchase date is always an error', () => {
    const day = fc.integer({ min: 0, max: 3000 }).map(n => new Date(Date.UTC(2020, 0, 1) + n * 86_400_000).toISOString().slice(0, 10))
    fc.assert(fc.property(day, day, (acquiredOn, soldOn) => {
      const errors = checkItemConsistency(sold({ acquiredOn, soldOn, listedOn: null }))
      expect(Boolean(errors.soldOn)).toBe(soldOn < acquiredOn)
    }))
  })
})

describe('computed item figures', () => {
  it('computes net profit by the reseller formula (trade-facts §4: sale + shipping charged − cost − fees − postage − supplies)', () => {
    // Fees by hand: 13.25 % of (2,500 + 500) = 397.5 → 398, + 30 fixed = 428.
    expect(computeFees(PROFILE, 2500, 500).totalCents).toBe(428)
    // 2,500 + 500 − 300 − 428 − 450 − 100 = 1,722.
    expect(itemNetProfitCents(sold())).toBe(1722)
    const computed = itemComputed(sold())
    // ROI = net / cost × 100 (trade-facts §4): 1,722 / 300 × 100 = 574 %.
    expect(computed.roi).toBeCloseTo(574, 10)
    // Days to sell = sale date − acquisition date (trade-facts §4): 5 Mar → 19 Mar 2024 = 14 days.
    expect(computed.daysToSell).toBe(14)
  })

  it('subtracts refunds, and gives no net while the item is still open', () => {
    // A full refund of 3,000 leaves 1,722 − 3,000 = −1,278 (hand computation).
    expect(itemNetProfitCents(sold({ status: 'returned', shippedOn: '2024-03-20', refundCents: 3000 }))).toBe(-1278)
    expect(itemComputed(base)).toEqual({ netProfitCents: null, roi: null, daysToSell: null })
    expect(itemComputed({ ...base, status: 'listed', listedOn: '2024-03-06' }).netProfitCents).toBeNull()
  })

  it('books the whole cost as lost when an unsold item is donated, written off or kept', () => {
    for (const status of ['donated', 'written_off', 'kept'] as const) expect(itemNetProfitCents({ ...base, status })).toBe(-300)
  })

  it('has no ROI for an item that cost nothing (trade-facts §4: ROI divides by the cost)', () => {
    expect(itemComputed(sold({ costCents: 0 })).roi).toBeNull()
    expect(itemComputed(sold({ costCents: 0 })).netProfitCents).toBe(2022)
  })

  it('uses fees entered by hand as given, and otherwise the fee profile', () => {
    expect(itemSaleFees(PROFILE, 2500, 500, 999)).toEqual({ feesCents: 999, feesManual: true })
    expect(itemSaleFees(PROFILE, 2500, 500)).toEqual({ feesCents: 428, feesManual: false })
    expect(itemSaleFees(PROFILE, 2500, 500, null)).toEqual({ feesCents: 428, feesManual: false })
  })
})

describe('measures and trip figures', () => {
  it('stores box sides in whole millimetres (25.4 mm to the inch, exact by definition)', () => {
    expect(lengthToMm(12, 'in')).toBe(305) // 304.8 → 305
    expect(lengthToMm(2.54, 'cm')).toBe(25) // 25.4 → 25, not thrown off by 25.400000000000002
    expect(lengthToMm(10, 'cm')).toBe(100)
    expect(lengthToMm(0.1, 'mm')).toBe(1)
    expect(() => lengthToMm(0, 'cm')).toThrow(RangeError)
  })

  it('costs miles at the team rate, rounded half-up to the cent (hand computation)', () => {
    expect(tripMileageCents(125, 62)).toBe(775) // 12.5 mi × 62 ¢ = 775 ¢
    expect(tripMileageCents(33, 67)).toBe(221) // 3.3 × 67 = 221.1
    expect(tripMileageCents(5, 5)).toBe(3) // 0.5 × 5 = 2.5 → 3
    expect(() => tripMileageCents(-1, 62)).toThrow(RangeError)
  })

  it('adds up a trip: spent = items + extra spend, net so far against everything spent (trade-facts §6: it paid for itself when the net covers the spend)', () => {
    const spend = { bagsCents: 100, parkingCents: 200, fuelCents: 0, mileageCents: 775 }
    const sums = {
      itemCount: 3, soldCount: 2, unsoldCount: 1, costCents: 1200, salePriceCents: 5000, shippingChargedCents: 600,
      feesCents: 800, postageCents: 900, suppliesCents: 150, refundCents: 0,
    }
    const figures = tripFigures(spend, sums)
    // By hand: spent = 1,200 + 100 + 200 + 775 = 2,275; revenue = 5,600; net = 5,600 − 2,275 − 800 − 900 − 150 = 1,475.
    expect(figures).toMatchObject({ totalSpentCents: 2275, extraSpendCents: 1075, revenueCents: 5600, netSoFarCents: 1475, paidForItself: true, itemsSold: 2, itemsUnsold: 1 })
    expect(figures.roi).toBeCloseTo((1475 / 2275) * 100, 10)
    // Nothing sold yet: the trip is down by everything spent.
    const fresh = tripFigures(spend, { ...sums, soldCount: 0, unsoldCount: 3, salePriceCents: 0, shippingChargedCents: 0, feesCents: 0, postageCents: 0, suppliesCents: 0 })
    expect(fresh).toMatchObject({ netSoFarCents: -2275, paidForItself: false })
  })
})
