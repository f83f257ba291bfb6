// Items over HTTP: creation in any status with consistency checks, computed figures, filters, paging,
// SQL totals checked against sums made here, optimistic concurrency, the listing draft and deletion.
// Arithmetic sources: trade-facts §4 (net profit, ROI, days to sell); fee figures by hand computation.
import sharp from 'sharp'
import { afterAll, describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { closeTestDb, query } from '../support/db'
import { fetchPhoto, photoForm } from '../support/photos'
import { createEntry } from '../support/wiki'
import { allItems, newFeeProfile, newItem, newLedgerTeam, newStore, newTrip } from '../support/ledger'

afterAll(closeTestDb)

describe('ledger items', async () => {
  const team = await newLedgerTeam('Items')
  // Invented profile: 12.9 % + 30 ¢, payment 3 % + 0 ¢ (hand computation below).
  const profile = await newFeeProfile(team.editor, team, { name: 'Porchlight', percentBp: 1290, fixedCents: 30, paymentPercentBp: 300, paymentFixedCents: 0 })
  const category = await createEntry(team.editor, team, 'categories', { name: 'Vases' })
  const maker = await createEntry(team.editor, team, 'makers', { name: 'Fernwood Pottery', country: 'USA', yearFrom: 1931, yearTo: 1979 })
  const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['FERNWOOD', 'MADE IN U.S.A.'], makerId: maker, yearFrom: 1952, yearTo: 1958, markType: 'impressed' })
  const material = await createEntry(team.editor, team, 'materials', { name: 'Stoneware' })
  const store = await newStore(team.contributor, team, { name: 'Second Chapter Thrift' })

  it('creates an item in stock with its computed fields empty', async () => {
    const item = await newItem(team.contributor, team, { title: 'Green vase', categoryId: category, markId: mark, makerId: maker, materialId: material, storeId: store.id, quantity: 1, condition: 'very_good', damage: { flags: ['chip'], notes: 'Flake on the foot' }, weightGrams: 450, box: { length: 5, width: 4, height: 8, unit: 'in' } })
    expect(item).toMatchObject({
      title: 'Green vase', status: 'in_stock', categoryId: category, markId: mark, makerId: maker, materialId: material, quantity: 1,
      costCents: 300, acquiredOn: '2026-03-01', storeId: store.id, condition: 'very_good', damage: { flags: ['chip'], notes: 'Flake on the foot' },
      // 5 in = 127 mm, 4 in = 101.6 → 102 mm, 8 in = 203.2 → 203 mm (25.4 mm to the inch).
      box: { lengthMm: 127, widthMm: 102, heightMm: 203 }, weightGrams: 450,
      netProfitCents: null, roi: null, daysToSell: null, revision: 1, salePriceCents: null,
    })
    const events = await team.viewer.get(team.api(`/items/${item.id}/status`))
    expect(events.body.items).toMatchObject([{ from: null, to: 'in_stock', happenedOn: '2026-03-01' }])
  })

  it('creates an item directly as sold, with fees from the fee profile and its figures computed', async () => {
    const item = await newItem(team.editor, team, {
      title: 'Sold mug', status: 'sold', costCents: 250, acquiredOn: '2026-03-01', listedOn: '2026-03-02', soldOn: '2026-03-15',
      salePriceCents: 2400, shippingChargedCents: 600, postageCents: 550, suppliesCents: 75, feeProfileId: profile.id,
    })
    // Fees by hand: 12.9 % of 3,000 = 387 + 30 = 417; 3 % of 3,000 = 90; total 507.
    // Net (trade-facts §4): 2,400 + 600 − 250 − 507 − 550 − 75 = 1,618; ROI 1,618 / 250 = 647.2 %; 14 days.
    expect(item).toMatchObject({ status: 'sold', feesCents: 507, feesManual: false, netProfitCents: 1618, daysToSell: 14, feeProfileId: profile.id })
    expect(item.roi).toBeCloseTo(647.2, 10)
  })

  it('keeps fees entered by hand, and hands them back to the profile on request', async () => {
    const item = await newItem(team.editor, team, { status: 'sold', soldOn: '2026-03-03', salePriceCents: 1000, feesCents: 111 })
    expect(item).toMatchObject({ feesCents: 111, feesManual: true, netProfitCents: 1000 - 300 - 111 })
    // The default profile (the first one made) computes: 12.9 % of 1,000 = 129 + 30 + 3 % = 30 → 189.
    const back = await team.editor.patch(team.api(`/items/${item.id}`), { revision: item.revision, feesManual: false })
    expect(back.status, JSON.stringify(back.body)).toBe(200)
    expect(back.body).toMatchObject({ feesCents: 189, feesManual: false, netProfitCents: 1000 - 300 - 189, revision: 2 })
  })

  it('checks an item created directly in a status for consistency, with field errors', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ status: 'sold', soldOn: '2026-02-01', salePriceCents: 900 }, 'soldOn'],
      [{ status: 'sold', soldOn: '2026-03-05' }, 'salePriceCents'],
      [{ status: 'shipped', soldOn: '2026-03-05', salePriceCents: 900 }, 'shippedOn'],
      [{ status: 'sold', listedOn: '2026-03-10', soldOn: '2026-03-05', salePriceCents: 900 }, 'soldOn'],
      [{ status: 'listed', soldOn: '2026-03-05', listedOn: '2026-03-02' }, 'soldOn'],
      [{ acquiredOn: null }, 'acquiredOn'],
      [{ condition: 'mint' }, 'condition'],
      [{ status: 'sold', soldOn: '2026-03-05', salePriceCents: 900, refundCents: 901 }, 'refundCents'],
    ]
    for (const [body, field] of cases) {
      const res = await team.editor.post(team.api('/items'), { title: 'Bad', acquiredOn: '2026-03-01', ...body })
      const error = expectError(res, 400)
      expect(error.fieldErrors?.[field], `${JSON.stringify(body)} → ${JSON.stringify(error.fieldErrors)}`).toBeDefined()
    }
    const [row] = await query<{ n: number }>('select count(*) n from items where title = ?', ['Bad'])
    expect(Number(row!.n)).toBe(0)
  })

  it('takes the store and purchase day from the sourcing trip', async () => {
    const trip = await newTrip(team.contributor, team, store.id, { tripDate: '2026-02-20' })
    const item = await newItem(team.contributor, team, { tripId: trip.id, acquiredOn: undefined, title: 'From the trip' })
    expect(item).toMatchObject({ tripId: trip.id, storeId: store.id, acquiredOn: '2026-02-20' })
    const other = await newStore(team.contributor, team)
    const refused = await team.contributor.post(team.api('/items'), { title: 'Mismatch', tripId: trip.id, storeId: other.id })
    expect(expectError(refused, 400).fieldErrors?.storeId).toBeDefined()
  })

  it('refuses a stale revision with 409 and the current item, in the UPDATE itself', async () => {
    const item = await newItem(team.contributor, team, { title: 'Two editors' })
    const first = await team.contributor.patch(team.api(`/items/${item.id}`), { revision: 1, title: 'First edit' })
    expect(first.status).toBe(200)
    expect(first.body.revision).toBe(2)
    const second = await team.editor.patch(team.api(`/items/${item.id}`), { revision: 1, title: 'Second edit' })
    expect(second.status).toBe(409)
    expect(second.body.current).toMatchObject({ id: item.id, revision: 2, title: 'First edit' })
    // Two saves on the same base at once: exactly one wins.
    const racers = await Promise.all(['A', 'B', 'C'].map(t => team.editor.patch(team.api(`/items/${item.id}`), { revision: 2, title: `Race ${t}` })))
    expect(racers.map(r => r.status).sort()).toEqual([200, 409, 409])
    const [row] = await query<{ revision: number }>('select revision from items where id = ?', [item.id])
    expect(Number(row!.revision)).toBe(3)
  })

  it('refuses a PATCH that would make the item inconsistent, and one without a revision', async () => {
    const item = await newItem(team.contributor, team, { title: 'Patch checks' })
    const bad = await team.contributor.patch(team.api(`/items/${item.id}`), { revision: 1, salePriceCents: 900 })
    expect(expectError(bad, 400).fieldErrors?.salePriceCents).toBeDefined()
    expect(expectError(await team.contributor.patch(team.api(`/items/${item.id}`), { title: 'No revision' }), 400).fieldErrors?.revision).toBeDefined()
  })

  it('filters, sorts and pages the list, with totals over every filtered row computed in SQL', async () => {
    const filterTeam = await newLedgerTeam('Item filters')
    const cat = await createEntry(filterTeam.editor, filterTeam, 'categories', { name: 'Mugs' })
    const p = await newFeeProfile(filterTeam.editor, filterTeam, { name: 'Flat', percentBp: 1000, fixedCents: 0 })
    const made: any[] = []
    for (let n = 0; n < 14; n++) {
      const soldItem = n % 2 === 0
      made.push(await newItem(filterTeam.editor, filterTeam, {
        title: `Mug ${n}`, costCents: 100 + n, categoryId: n < 10 ? cat : null, acquiredOn: `2026-01-${String(n + 1).padStart(2, '0')}`,
        ...(soldItem ? { status: 'sold', soldOn: `2026-02-${String(n + 1).padStart(2, '0')}`, salePriceCents: 1000 + n * 10, shippingChargedCents: 100, feeProfileId: p.id } : {}),
      }))
    }
    const list = await filterTeam.viewer.get(filterTeam.api(`/items?categoryId=${cat}&status=sold&pageSize=2&page=2&sort=-costCents`))
    expect(list.status, JSON.stringify(list.body)).toBe(200)
    const expected = made.filter((m, n) => n < 10 && m.status === 'sold')
    expect(list.body.total).toBe(expected.length)
    const byCost = [...expected].sort((a, b) => b.costCents - a.costCents)
    expect(list.body.items.map((i: any) => i.id)).toEqual(byCost.slice(2, 4).map(i => i.id))
    // Totals over all five filtered rows, not only this page; summed here from the items themselves.
    expect(list.body.totals).toEqual({
      items: expected.length,
      costCents: expected.reduce((s, i) => s + i.costCents, 0),
      revenueCents: expected.reduce((s, i) => s + i.salePriceCents + i.shippingChargedCents, 0),
      netProfitCents: expected.reduce((s, i) => s + i.netProfitCents, 0),
    })
    const inJanuary = await filterTeam.viewer.get(filterTeam.api('/items?acquiredFrom=2026-01-03&acquiredTo=2026-01-05'))
    expect(inJanuary.body.items.map((i: any) => i.title).sort()).toEqual(['Mug 2', 'Mug 3', 'Mug 4'])
    const soldRange = await filterTeam.viewer.get(filterTeam.api('/items?soldFrom=2026-02-05&soldTo=2026-02-09'))
    expect(soldRange.body.items.map((i: any) => i.title).sort()).toEqual(['Mug 4', 'Mug 6', 'Mug 8'])
    const search = await filterTeam.viewer.get(filterTeam.api('/items?q=Mug%201'))
    expect(search.body.items.map((i: any) => i.title).sort()).toEqual(['Mug 1', 'Mug 10', 'Mug 11', 'Mug 12', 'Mug 13'])
    expectError(await filterTeam.viewer.get(filterTeam.api('/items?pageSize=101')), 400)
    expectError(await filterTeam.viewer.get(filterTeam.api('/items?status=lost')), 400)
    expectError(await filterTeam.viewer.get(filterTeam.api('/items?sort=price')), 400)
    expect((await allItems(filterTeam.viewer, filterTeam)).length).toBe(14)
  })

  it('drafts a listing from the mark, maker, era, material, measurements and condition', async () => {
    const item = await newItem(team.contributor, team, { title: 'Vase', markId: mark, materialId: material, categoryId: category, condition: 'good', damage: { flags: ['crazing'], notes: '' }, weightGrams: 900, box: { length: 20, width: 15, height: 30, unit: 'cm' } })
    const res = await team.viewer.get(team.api(`/items/${item.id}/listing-draft`))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    // The maker comes through the mark; the era is the mark's years.
    expect(res.body.title).toBe('Fernwood Pottery Vase Stoneware 1950s')
    expect(res.body.description).toContain('Mark on the base: "FERNWOOD" / "MADE IN U.S.A." (impressed)')
    expect(res.body.description).toContain('Maker: Fernwood Pottery (USA, 1931–1979)')
    expect(res.body.description).toContain('Measurements: 20 × 15 × 30 cm (7.9 × 5.9 × 11.8 in)')
    expect(res.body.description).toContain('Condition: Good. Flaws: crazing to the glaze.')
  })

  it('lets contributors change and delete only their own items', async () => {
    const theirs = await newItem(team.editor, team, { title: 'Editor piece' })
    expect((await team.contributor.patch(team.api(`/items/${theirs.id}`), { revision: 1, title: 'Taken' })).status).toBe(403)
    expect((await team.contributor.delete(team.api(`/items/${theirs.id}`))).status).toBe(403)
    expect((await team.viewer.post(team.api('/items'), { title: 'Viewer', acquiredOn: '2026-03-01' })).status).toBe(403)
    const own = await newItem(team.contributor, team, { title: 'Mine' })
    expect((await team.contributor.delete(team.api(`/items/${own.id}`))).status).toBe(200)
    expect((await team.viewer.get(team.api(`/items/${own.id}`))).status).toBe(404)
    const [events] = await query<{ n: number }>('select count(*) n from item_status_events where item_id = ?', [own.id])
    expect(Number(events!.n)).toBe(0)
  })

  it('sends the names of its links and its photos in gallery order; the list sends the names its table shows', async () => {
    const top = await createEntry(team.editor, team, 'categories', { name: 'Tableware' })
    const boats = await createEntry(team.editor, team, 'categories', { name: 'Gravy boats', parentId: top })
    const gone = await createEntry(team.editor, team, 'marks', { inscriptions: ['ASHBY LANE WARE'], makerId: maker })
    const trip = await newTrip(team.contributor, team, store.id, { tripDate: '2026-03-04' })
    const editorId = (await team.editor.get('/api/me')).body.user.id as number
    const contributorId = (await team.contributor.get('/api/me')).body.user.id as number
    const item = await newItem(team.contributor, team, {
      title: 'Linked boat', categoryId: boats, markId: gone, materialId: material, tripId: trip.id, feeProfileId: profile.id,
      status: 'listed', listedOn: '2026-03-05', askingCents: 1800, listedBy: editorId,
    })
    // Two photos of different sizes, uploaded in this order: the gallery keeps it.
    const sizes: [number, number][] = [[800, 600], [300, 500]]
    const uploaded: number[] = []
    for (const [width, height] of sizes) {
      const jpeg = await sharp({ create: { width, height, channels: 3, background: '#5a7d4e' } }).jpeg().toBuffer()
      const res = await team.contributor.request('POST', team.api('/uploads'), photoForm(jpeg, { fields: { entityType: 'item', entityId: item.id } }))
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      uploaded.push(res.body.id)
    }
    // The mark goes to the deleted list: the item keeps its name, marked as deleted.
    expect((await team.editor.delete(team.api(`/marks/${gone}`))).status).toBe(200)

    const res = await team.viewer.get(team.api(`/items/${item.id}`))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.links).toEqual({
      category: { id: boats, name: 'Gravy boats', path: ['Tableware', 'Gravy boats'], deleted: false },
      mark: { id: gone, name: 'ASHBY LANE WARE', deleted: true },
      maker: { id: maker, name: 'Fernwood Pottery', deleted: false, fromMark: true },
      material: { id: material, name: 'Stoneware', deleted: false },
      store: { id: store.id, name: 'Second Chapter Thrift' },
      trip: { id: trip.id, tripDate: '2026-03-04', storeName: 'Second Chapter Thrift' },
      feeProfile: { id: profile.id, name: 'Porchlight' },
      sourcedBy: { id: contributorId, name: 'Contributor Person' },
      listedBy: { id: editorId, name: 'Editor Person' },
    })
    const base = team.api('/photos')
    expect(res.body.photos).toEqual([
      { id: uploaded[0], width: 800, height: 600, thumbUrl: `${base}/${uploaded[0]}/thumb`, displayUrl: `${base}/${uploaded[0]}/display` },
      { id: uploaded[1], width: 300, height: 500, thumbUrl: `${base}/${uploaded[1]}/thumb`, displayUrl: `${base}/${uploaded[1]}/display` },
    ])
    const thumb = await fetchPhoto(team.viewer, res.body.photos[1].thumbUrl)
    expect(thumb.status).toBe(200)
    expect(thumb.headers.get('content-type')).toBe('image/webp')
    expect(await sharp(thumb.bytes).metadata()).toMatchObject({ width: 192, height: 320 })

    // An item naming its own maker says so; one without links has none.
    const own = await newItem(team.contributor, team, { title: 'Own maker', markId: mark, makerId: maker })
    expect(own.links).toMatchObject({ maker: { id: maker, fromMark: false }, mark: { id: mark, name: 'FERNWOOD' }, category: null, trip: null, listedBy: null })
    expect(own.photos).toEqual([])

    // The list: the same names for every row, without photos.
    const list = await team.viewer.get(team.api('/items?q=Linked%20boat'))
    expect(list.status).toBe(200)
    expect(list.body.items).toHaveLength(1)
    expect(list.body.items[0].links).toEqual(res.body.links)
    expect(list.body.items[0].photos).toBeUndefined()
  })
})
