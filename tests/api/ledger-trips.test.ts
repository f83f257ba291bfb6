// Stores and sourcing trips over HTTP: a trip's figures as its items sell, checked against a computation
// made here from the items' own figures (trade-facts §4: net = sale + shipping charged − cost − fees −
// postage − supplies; trade-facts §6: a trip has paid for itself when its net covers what it cost).
import { afterAll, describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { closeTestDb } from '../support/db'
import { newFeeProfile, newItem, newLedgerTeam, newStore, newTrip } from '../support/ledger'

afterAll(closeTestDb)

/** The trip's figures worked out independently from its items (not with shared/ledger). */
function expectedFigures(trip: { bagsCents: number, parkingCents: number, fuelCents: number, mileageCents: number }, items: any[]) {
  const extra = trip.bagsCents + trip.parkingCents + trip.fuelCents + trip.mileageCents
  let cost = 0
  let revenue = 0
  let proceeds = 0
  for (const i of items) {
    cost += i.costCents
    const paid = (i.salePriceCents ?? 0) + (i.shippingChargedCents ?? 0)
    revenue += paid
    proceeds += paid - (i.feesCents ?? 0) - (i.postageCents ?? 0) - (i.suppliesCents ?? 0) - (i.refundCents ?? 0)
  }
  const net = proceeds - cost - extra
  return {
    itemCount: items.length,
    itemsSold: items.filter(i => i.status === 'sold' || i.status === 'shipped').length,
    itemsUnsold: items.filter(i => i.status === 'in_stock' || i.status === 'listed').length,
    itemsCostCents: cost, extraSpendCents: extra, totalSpentCents: cost + extra, revenueCents: revenue, netSoFarCents: net, paidForItself: net >= 0,
  }
}

describe('sourcing trips', async () => {
  const team = await newLedgerTeam('Trips')
  const settings = await team.editor.patch(team.api('/ledger-settings'), { mileageRateCents: 62 })
  expect(settings.body).toMatchObject({ mileageRateCents: 62 })
  await newFeeProfile(team.editor, team, { name: 'Lanternpost standard', percentBp: 1325, fixedCents: 30, paymentPercentBp: 290, paymentFixedCents: 30 })
  const store = await newStore(team.contributor, team, { name: 'Mill Street Mission Store' })
  const contributorId = (await team.contributor.get('/api/me')).body.user.id as number
  const ownerId = (await team.owner.get('/api/me')).body.user.id as number

  it('records who went and costs the miles at the team\'s rate', async () => {
    const trip = await newTrip(team.contributor, team, store.id, { tripDate: '2026-02-07', bagsCents: 100, parkingCents: 300, miles: 12.5, memberIds: [ownerId, contributorId] })
    // 12.5 mi × 62 ¢ = 775 ¢ (hand computation).
    expect(trip).toMatchObject({ storeName: 'Mill Street Mission Store', miles: 12.5, mileageRateCents: 62, mileageCents: 775, memberIds: [ownerId, contributorId].sort((a, b) => a - b) })
    expect(trip).toMatchObject({ itemCount: 0, totalSpentCents: 1175, revenueCents: 0, netSoFarCents: -1175, paidForItself: false })
    // A later rate change does not rewrite the trip; new miles are costed at the trip's own rate.
    await team.editor.patch(team.api('/ledger-settings'), { mileageRateCents: 70 })
    const edited = await team.contributor.patch(team.api(`/trips/${trip.id}`), { revision: 1, miles: 10 })
    expect(edited.body).toMatchObject({ mileageRateCents: 62, mileageCents: 620, revision: 2 })
    await team.editor.patch(team.api('/ledger-settings'), { mileageRateCents: 62 })
  })

  it('adds up a trip as its items sell, matching an independent computation', async () => {
    const trip = await newTrip(team.contributor, team, store.id, { tripDate: '2026-02-14', bagsCents: 100, parkingCents: 0, fuelCents: 950 })
    const sale = (id: number, body: Record<string, unknown>) => team.contributor.post(team.api(`/items/${id}/sale`), body)
    const items = [
      await newItem(team.contributor, team, { title: 'Bowl', tripId: trip.id, acquiredOn: undefined, costCents: 399 }),
      await newItem(team.contributor, team, { title: 'Vase', tripId: trip.id, acquiredOn: undefined, costCents: 299 }),
      await newItem(team.contributor, team, { title: 'Mugs', tripId: trip.id, acquiredOn: undefined, costCents: 4 * 149, quantity: 4 }),
      await newItem(team.contributor, team, { title: 'Figurine', tripId: trip.id, acquiredOn: undefined, costCents: 199 }),
    ]
    let figures = (await team.viewer.get(team.api(`/trips/${trip.id}`))).body
    expect(figures).toMatchObject(expectedFigures(trip, items))
    expect(figures.paidForItself).toBe(false)

    await sale(items[0].id, { soldOn: '2026-02-20', salePriceCents: 2400, shippingChargedCents: 550, postageCents: 550, suppliesCents: 80 })
    await sale(items[1].id, { soldOn: '2026-03-01', salePriceCents: 2600, postageCents: 700 })
    await team.contributor.post(team.api(`/items/${items[2].id}/status`), { to: 'listed', on: '2026-02-16' })
    await team.contributor.post(team.api(`/items/${items[3].id}/status`), { to: 'donated', on: '2026-03-10' })
    const now = await Promise.all(items.map(async i => (await team.viewer.get(team.api(`/items/${i.id}`))).body))
    figures = (await team.viewer.get(team.api(`/trips/${trip.id}`))).body
    const expected = expectedFigures(trip, now)
    expect(figures).toMatchObject(expected)
    expect(figures).toMatchObject({ itemsSold: 2, itemsUnsold: 1, itemCount: 4 })
    expect(expected.paidForItself).toBe(true)

    // The list's totals over the filtered trips equal the sum of those trips.
    const list = await team.viewer.get(team.api(`/trips?storeId=${store.id}&pageSize=1`))
    expect(list.status, JSON.stringify(list.body)).toBe(200)
    const all = (await team.viewer.get(team.api(`/trips?storeId=${store.id}&pageSize=100`))).body.items as any[]
    expect(list.body.total).toBe(all.length)
    expect(list.body.totals).toEqual({
      trips: all.length,
      totalSpentCents: all.reduce((s, t) => s + t.totalSpentCents, 0),
      revenueCents: all.reduce((s, t) => s + t.revenueCents, 0),
      netSoFarCents: all.reduce((s, t) => s + t.netSoFarCents, 0),
    })
    const filtered = await team.viewer.get(team.api(`/trips?from=2026-02-10&to=2026-02-20&memberId=${contributorId}`))
    expect(filtered.body.items.map((t: any) => t.id)).toEqual([trip.id])
    expect(filtered.body.totals).toMatchObject({ trips: 1, totalSpentCents: expected.totalSpentCents, netSoFarCents: expected.netSoFarCents })
  })

  it('refuses members of other teams and stores of other teams', async () => {
    const other = await newLedgerTeam('Other trips')
    const outsider = (await other.owner.get('/api/me')).body.user.id as number
    const foreignStore = await newStore(other.contributor, other)
    expect(expectError(await team.contributor.post(team.api('/trips'), { storeId: store.id, tripDate: '2026-03-01', memberIds: [outsider] }), 400).fieldErrors?.memberIds).toBeDefined()
    expect(expectError(await team.contributor.post(team.api('/trips'), { storeId: foreignStore.id, tripDate: '2026-03-01' }), 400).fieldErrors?.storeId).toBeDefined()
  })

  it('keeps stores and trips that items still name, and store names unique', async () => {
    const busy = await newStore(team.contributor, team, { name: 'Orchard Lane Estate Sales', kind: 'estate_sale' })
    const trip = await newTrip(team.contributor, team, busy.id)
    await newItem(team.contributor, team, { tripId: trip.id })
    expectError(await team.contributor.delete(team.api(`/stores/${busy.id}`)), 409)
    expectError(await team.contributor.delete(team.api(`/trips/${trip.id}`)), 409)
    expect(expectError(await team.contributor.post(team.api('/stores'), { name: 'Orchard Lane Estate Sales' }), 400).fieldErrors?.name).toBeDefined()
    expect((await team.editor.patch(team.api(`/stores/${busy.id}`), { revision: 5, town: 'Elsewhere' })).status).toBe(409)
    const renamed = await team.editor.patch(team.api(`/stores/${busy.id}`), { revision: 1, town: 'Tansy Hill' })
    expect(renamed.body).toMatchObject({ town: 'Tansy Hill', revision: 2 })
    const empty = await newStore(team.contributor, team)
    expect((await team.contributor.delete(team.api(`/stores/${empty.id}`))).status).toBe(200)
    const kinds = await team.viewer.get(team.api('/stores?kind=estate_sale'))
    expect(kinds.body.items.map((s: any) => s.name)).toEqual(['Orchard Lane Estate Sales'])
  })
})
