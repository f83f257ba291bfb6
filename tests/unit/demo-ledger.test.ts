// The invented demo ledger (Hollowbrook Finds), planned without a database: size, determinism, links to the
// demo reference, realistic spreads, and items that follow the ledger's own rules. Spreads are the team's
// scenario, not published figures: thrift tags of a few dollars a piece (trade-facts §6, common practice,
// no published source); sale prices mostly $8–$120; days to sell skewed, with about a fifth unsold.
import { describe, expect, it } from 'vitest'
import { buildDemoReference } from '../../server/database/seed/demo-reference'
import { STARTER_MATERIALS } from '../../server/database/seed/materials'
import { DEMO_FEE_PROFILES, DEMO_MILEAGE_RATE_CENTS, DEMO_STORES, planDemoLedger, type DemoLedgerReference } from '../../server/database/seed/demo-ledger'
import { checkItemConsistency, findTransition, itemNetProfitCents, OPEN_STATUSES, tripMileageCents, type ItemFigures, type ItemStatus } from '#shared/ledger/item-rules'
import { computeFees } from '#shared/ledger/fees'
import { daysToSell } from '#shared/ledger/profit'

// Ids as the reference seed would hand them out: one list per table, in order.
function referenceWithIds(): DemoLedgerReference {
  const ref = buildDemoReference()
  const categoryId = new Map(ref.categories.map((c, i) => [c.key, 100 + i]))
  const makerId = new Map(ref.makers.map((m, i) => [m.key, 500 + i]))
  const materialId = new Map(STARTER_MATERIALS.map((m, i) => [m.key, 900 + i]))
  const parents = new Set(ref.categories.map(c => c.parentKey).filter(Boolean))
  return {
    categories: ref.categories.filter(c => !parents.has(c.key)).map(c => ({ id: categoryId.get(c.key)!, name: c.name })),
    marks: ref.marks.map((m, i) => ({
      id: 2000 + i,
      makerId: m.makerKey === null ? null : makerId.get(m.makerKey)!,
      categoryIds: m.categoryKeys.map(k => categoryId.get(k)!).filter(id => !parents.has(ref.categories[id - 100]!.key)),
      materialIds: m.materialKeys.map(k => materialId.get(k)!),
    })),
  }
}

const TODAY = '2026-06-01'
const SOURCERS = [11, 12, 13]
const reference = referenceWithIds()
const plan = planDemoLedger(reference, { sourcers: SOURCERS, today: TODAY })
const figuresOf = (item: typeof plan.items[number]): ItemFigures => ({
  status: item.status!, quantity: item.quantity!, costCents: item.costCents!, acquiredOn: item.acquiredOn, listedOn: item.listedOn ?? null,
  soldOn: item.soldOn ?? null, shippedOn: item.shippedOn ?? null, askingCents: item.askingCents ?? null, salePriceCents: item.salePriceCents ?? null,
  shippingChargedCents: item.shippingChargedCents ?? null, postageCents: item.postageCents ?? null, suppliesCents: item.suppliesCents ?? null,
  feesCents: item.feesCents ?? null, refundCents: item.refundCents ?? null,
})
const share = (n: number, of: number) => n / of

describe('demo ledger plan', () => {
  it('is the same plan every time for the same reference, members and day', () => {
    expect(planDemoLedger(referenceWithIds(), { sourcers: SOURCERS, today: TODAY })).toEqual(plan)
  })

  it('has 120 trips over the two years before the seed day, from all 8 stores, and at least 1,500 items', () => {
    expect(DEMO_STORES.length).toBe(8)
    expect(plan.trips.length).toBe(120)
    expect(new Set(plan.trips.map(t => t.storeIndex)).size).toBe(8)
    expect(plan.items.length).toBeGreaterThanOrEqual(1500)
    for (const trip of plan.trips) {
      const days = daysToSell(trip.row.tripDate as string, TODAY)
      expect(days).toBeGreaterThan(0)
      expect(days).toBeLessThanOrEqual(731)
      expect(trip.members.every(m => SOURCERS.includes(m))).toBe(true)
      expect(trip.row.mileageCents).toBe(tripMileageCents(trip.row.milesTenths ?? 0, DEMO_MILEAGE_RATE_CENTS))
    }
    for (const item of plan.items) expect(item.acquiredOn).toBe(plan.trips[item.tripIndex]!.row.tripDate)
  })

  it('links items to the demo reference: leaf categories, and marks with their maker and a material of theirs', () => {
    const categories = new Set(reference.categories.map(c => c.id))
    const marks = new Map(reference.marks.map(m => [m.id, m]))
    expect(new Set(plan.items.map(i => i.categoryId)).size).toBe(reference.categories.length)
    for (const item of plan.items) {
      expect(categories.has(item.categoryId!)).toBe(true)
      if (item.markId === null) continue
      const mark = marks.get(item.markId!)!
      expect(item.makerId).toBe(mark.makerId)
      if (item.materialId !== null) expect(mark.materialIds).toContain(item.materialId)
    }
    expect(share(plan.items.filter(i => i.markId !== null).length, plan.items.length)).toBeGreaterThan(0.5)
  })

  it('keeps every item consistent, with the net and fees the ledger computes', () => {
    for (const item of plan.items) {
      const figures = figuresOf(item)
      expect(checkItemConsistency(figures)).toEqual({})
      expect(item.netProfitCents).toBe(itemNetProfitCents(figures))
      if (item.salePriceCents !== null && item.salePriceCents !== undefined) {
        expect(item.profileIndex).not.toBeNull()
        expect(item.feesCents).toBe(computeFees(DEMO_FEE_PROFILES[item.profileIndex!]!, item.salePriceCents, item.shippingChargedCents ?? 0).totalCents)
      }
    }
    expect(DEMO_FEE_PROFILES.filter(p => p.isDefault).length).toBe(1)
  })

  it('records each item\'s history along the transitions table, ending at its status', () => {
    for (const item of plan.items) {
      expect(item.events[0]).toMatchObject({ from: null, to: 'in_stock', on: item.acquiredOn })
      for (let i = 1; i < item.events.length; i++) {
        const { from, to } = item.events[i]!
        expect(from).toBe(item.events[i - 1]!.to)
        expect(findTransition(from!, to), `${from} → ${to}`).not.toBeNull()
      }
      expect(item.events.at(-1)!.to).toBe(item.status)
    }
  })

  it('spreads prices like the team\'s shelves: thrift tags of a few dollars, sales mostly $8–$120, a few higher', () => {
    const thriftPieces = plan.items.filter(i => DEMO_STORES[i.storeIndex]!.kind === 'thrift_store').map(i => i.costCents! / i.quantity!).sort((a, b) => a - b)
    const median = thriftPieces[Math.floor(thriftPieces.length / 2)]!
    expect(median).toBeGreaterThanOrEqual(100)
    expect(median).toBeLessThanOrEqual(600)
    const sales = plan.items.map(i => i.salePriceCents).filter((c): c is number => typeof c === 'number')
    expect(share(sales.filter(c => c >= 800 && c <= 12_000).length, sales.length)).toBeGreaterThan(0.8)
    const high = sales.filter(c => c > 12_000).length
    expect(high).toBeGreaterThan(0)
    expect(share(high, sales.length)).toBeLessThan(0.08)
  })

  it('sells many within two weeks, has a long tail, leaves about a fifth unsold and has every other outcome', () => {
    const sold = plan.items.filter(i => i.soldOn)
    const days = sold.map(i => daysToSell(i.acquiredOn, i.soldOn!))
    expect(share(days.filter(d => d <= 14).length, days.length)).toBeGreaterThan(0.4)
    expect(days.filter(d => d > 90).length).toBeGreaterThan(50)
    const unsold = share(plan.items.filter(i => OPEN_STATUSES.includes(i.status!)).length, plan.items.length)
    expect(unsold).toBeGreaterThan(0.15)
    expect(unsold).toBeLessThan(0.25)
    const count = (s: ItemStatus) => plan.items.filter(i => i.status === s).length
    for (const s of ['returned', 'donated', 'written_off', 'kept', 'shipped', 'sold', 'listed', 'in_stock'] as const) expect(count(s), s).toBeGreaterThan(0)
  })
})
