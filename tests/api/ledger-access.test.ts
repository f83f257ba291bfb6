// Roles and isolation for every ledger route: signed out → 401, another team's ids → 404 (a team's rows
// are invisible from another team), non-members → 404, viewers write nothing (403), and an item that links
// another team's reference entry, store, trip or fee profile is refused with a field error (400).
import { describe, expect, it } from 'vitest'
import { Person, expectError } from '../support/api'
import { createEntry } from '../support/wiki'
import { newFeeProfile, newItem, newLedgerTeam, newStore, newTrip, uploadCsv } from '../support/ledger'

describe('ledger roles and isolation', async () => {
  const a = await newLedgerTeam('Ledger A')
  const b = await newLedgerTeam('Ledger B')
  const store = await newStore(a.contributor, a)
  const trip = await newTrip(a.contributor, a, store.id)
  const profile = await newFeeProfile(a.editor, a)
  const item = await newItem(a.contributor, a, { storeId: store.id })
  const mark = await createEntry(a.editor, a, 'marks', { inscriptions: ['ONLY IN A'] })
  const category = await createEntry(a.editor, a, 'categories', { name: 'Only in A' })
  const maker = await createEntry(a.editor, a, 'makers', { name: 'Maker of A' })
  const material = await createEntry(a.editor, a, 'materials', { name: 'Material of A' })

  // Routes naming one of team A's rows, as [method, path under the team, body].
  const byId: [string, string, unknown][] = [
    ['GET', `/stores/${store.id}`, undefined], ['PATCH', `/stores/${store.id}`, { revision: 1, town: 'X' }], ['DELETE', `/stores/${store.id}`, undefined],
    ['GET', `/trips/${trip.id}`, undefined], ['PATCH', `/trips/${trip.id}`, { revision: 1, notes: 'X' }], ['DELETE', `/trips/${trip.id}`, undefined],
    ['GET', `/fee-profiles/${profile.id}`, undefined], ['PATCH', `/fee-profiles/${profile.id}`, { revision: 1, name: 'X' }], ['DELETE', `/fee-profiles/${profile.id}`, undefined],
    ['GET', `/items/${item.id}`, undefined], ['PATCH', `/items/${item.id}`, { revision: 1, title: 'X' }], ['DELETE', `/items/${item.id}`, undefined],
    ['GET', `/items/${item.id}/status`, undefined], ['POST', `/items/${item.id}/status`, { to: 'listed' }],
    ['POST', `/items/${item.id}/sale`, { salePriceCents: 100 }], ['GET', `/items/${item.id}/listing-draft`, undefined],
  ]
  const teamWide: [string, string, unknown][] = [
    ['GET', '/stores', undefined], ['POST', '/stores', { name: 'X' }], ['GET', '/trips', undefined], ['POST', '/trips', { storeId: 1, tripDate: '2026-01-01' }],
    ['GET', '/fee-profiles', undefined], ['POST', '/fee-profiles', { name: 'X' }], ['GET', '/items', undefined], ['POST', '/items', { title: 'X' }],
    ['POST', '/calculator', { expectedSaleCents: 100 }], ['GET', '/exports/items.csv', undefined], ['GET', '/imports/items/mappings', undefined],
    ['GET', '/ledger-settings', undefined], ['PATCH', '/ledger-settings', { mileageRateCents: 1 }],
  ]

  it('answers 404 to another team\'s ids on every route, and changes nothing', async () => {
    for (const [method, path, body] of byId) {
      for (const person of [b.owner, b.editor]) {
        const res = await person.request(method, b.api(path), body)
        expect(res.status, `${method} ${path}`).toBe(404)
      }
    }
    const still = await a.viewer.get(a.api(`/items/${item.id}`))
    expect(still.body).toMatchObject({ revision: 1, status: 'in_stock' })
    expect((await a.viewer.get(a.api(`/stores/${store.id}`))).status).toBe(200)
    expect((await a.viewer.get(a.api(`/fee-profiles/${profile.id}`))).status).toBe(200)
    expect((await b.owner.get(b.api('/items'))).body).toMatchObject({ total: 0, items: [] })
    expect((await b.owner.get(b.api('/stores'))).body.total).toBe(0)
  })

  it('answers 404 to non-members and 401 to the signed out on every route of the team', async () => {
    const stranger = new Person()
    for (const [method, path, body] of [...byId, ...teamWide]) {
      expect((await b.owner.request(method, a.api(path), body)).status, `${method} ${path}`).toBe(404)
      expect((await stranger.request(method, a.api(path), body)).status, `${method} ${path}`).toBe(401)
    }
    const form = await uploadCsv(b.owner, a, 'title\nX\n', '?dryRun=1')
    expect(form.status).toBe(404)
  })

  it('lets viewers read and nothing more', async () => {
    for (const [method, path, body] of [...byId, ...teamWide]) {
      const res = await a.viewer.request(method, a.api(path), body)
      if (method === 'GET' || path === '/calculator') expect(res.status, `${method} ${path}`).toBe(200)
      else expect(res.status, `${method} ${path}`).toBe(403)
    }
    expect((await uploadCsv(a.viewer, a, 'title,acquiredOn\nX,2026-01-01\n', '?dryRun=1')).status).toBe(403)
  })

  it('refuses to link another team\'s mark, category, maker, material, store, trip or fee profile (400 with field errors)', async () => {
    const links: [string, number][] = [
      ['markId', mark], ['categoryId', category], ['makerId', maker], ['materialId', material],
      ['storeId', store.id], ['tripId', trip.id], ['feeProfileId', profile.id],
    ]
    for (const [field, id] of links) {
      const res = await b.contributor.post(b.api('/items'), { title: 'Borrowed link', acquiredOn: '2026-03-01', [field]: id })
      expect(expectError(res, 400).fieldErrors?.[field], field).toBeDefined()
    }
    const own = await newItem(b.contributor, b)
    const patched = await b.contributor.patch(b.api(`/items/${own.id}`), { revision: 1, markId: mark })
    expect(expectError(patched, 400).fieldErrors?.markId).toBeDefined()
    // By name in an import, another team's entries are not found either.
    const imported = await uploadCsv(b.contributor, b, 'title,acquiredOn,category\nX,2026-01-01,Only in A\n', '?dryRun=1')
    expect(imported.body.errors).toMatchObject([{ row: 2, column: 'category' }])
    const byId = await uploadCsv(b.contributor, b, `title,acquiredOn,markId\nX,2026-01-01,${mark}\n`, '?dryRun=1')
    expect(byId.body.errors).toMatchObject([{ row: 2, column: 'markId' }])
  })
})
