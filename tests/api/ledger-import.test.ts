// CSV import and export of items over HTTP: dry-run previews with their totals, row-level errors with row
// and column, all-or-nothing writes, idempotency (the same file twice adds nothing twice), remembered
// mappings, streaming export in pages, and export → import into an empty team giving the same totals.
// Expected totals are summed here from the rows the test wrote; fee figures by hand computation.
import Papa from 'papaparse'
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, query, teamIdOf } from '../support/db'
import { createEntry } from '../support/wiki'
import { allItems, newFeeProfile, newItem, newLedgerTeam, uploadCsv } from '../support/ledger'

afterAll(closeTestDb)

async function itemCount(slug: string): Promise<number> {
  const [row] = await query<{ n: number }>('select count(*) n from items where team_id = ?', [await teamIdOf(slug)])
  return Number(row!.n)
}

const MAPPING = {
  'Item': 'title', 'Bought': 'acquiredOn', 'Paid': 'cost', 'Sold on': 'soldOn', 'Sold for': 'salePrice',
  'Postage': 'postage', 'Status': 'status', 'Category': 'category', 'Notes': '',
}

describe('item import', async () => {
  const team = await newLedgerTeam('Import')
  // Invented default profile: 10 % + 0 ¢, no payment fee, so fees are easy to check by hand.
  await newFeeProfile(team.editor, team, { name: 'Flat ten', percentBp: 1000, fixedCents: 0 })
  await createEntry(team.editor, team, 'categories', { name: 'Mugs' })

  const good = [
    'Item,Bought,Paid,Sold on,Sold for,Postage,Status,Category,Notes',
    'Blue mug,2024-03-05,$2.50,2024-03-12,$18.00,5.50,sold,Mugs,first',
    'Green mug,03/06/2024,3,,,,in stock,mugs,',
    'Red jug,5 Mar 2024,"1,234.56",9 Mar 2024,"1,500.00",0,Sold,,big one',
    'Teapot,"Mar 7, 2024",4.00,,,,,,',
  ].join('\n')

  it('previews a file without writing, with the totals it would add', async () => {
    const res = await uploadCsv(team.contributor, team, good, '?dryRun=1', MAPPING)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    // Costs: 250 + 300 + 123,456 + 400; revenue: 1,800 + 150,000; fees 10 %: 180 and 15,000.
    // Net: (1,800 − 250 − 180 − 550) + (150,000 − 123,456 − 15,000 − 0) = 820 + 11,544 = 12,364.
    expect(res.body).toMatchObject({
      dryRun: true, rows: 4, validRows: 4, added: 4, alreadyImported: 0, errors: [], errorCount: 0,
      totals: { costCents: 124_406, revenueCents: 151_800, netProfitCents: 12_364 },
    })
    expect(await itemCount(team.slug)).toBe(0)
  })

  it('takes a file above the general 16 MB upload limit, up to its own 64 MiB, and refuses a larger one with 413', async () => {
    // One row whose ignored Notes column carries 20 MB: past the app-wide upload limit, within the import's own.
    const big = `${good.split('\n')[0]}\nBig lot,2024-03-05,1,,,,,,${'x'.repeat(20_000_000)}`
    const res = await uploadCsv(team.contributor, team, big, '?dryRun=1', MAPPING)
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200)
    expect(res.body).toMatchObject({ dryRun: true, rows: 1, validRows: 1 })
    const tooBig = await uploadCsv(team.contributor, team, `${big}${'x'.repeat(48_000_000)}`, '?dryRun=1', MAPPING)
    expect(tooBig.status).toBe(413)
    expect(await itemCount(team.slug)).toBe(0)
  })

  it('writes nothing when one row is bad, and reports each bad cell by row and column', async () => {
    const bad = [
      good,
      'Cracked bowl,2024-03-08,-1.00,,,,,,',
      'Odd one,2024-02-30,2,,,,lost,Plates,',
      'Early sale,2024-03-10,2,2024-03-01,9.00,,sold,,',
      ',2024-03-10,2,,,,,,',
    ].join('\n')
    const res = await uploadCsv(team.contributor, team, bad, '', MAPPING)
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toMatch(/nothing was imported/)
    const errors = res.body.report.errors as { row: number, column: string | null, field: string | null, message: string }[]
    const at = (row: number, column: string) => errors.find(e => e.row === row && e.column === column)
    // The header is row 1: the good rows are 2–5, the bad ones 6–9.
    expect(at(6, 'Paid')?.message).toMatch(/negative/)
    expect(at(7, 'Bought')?.message).toMatch(/not a real date/)
    expect(at(7, 'Status')?.message).toMatch(/not a status/)
    expect(at(7, 'Category')?.message).toMatch(/No category called "Plates"/)
    expect(at(8, 'Sold on')?.message).toMatch(/before it was bought/)
    expect(at(9, 'Item')?.message).toMatch(/title/)
    expect(errors.every(e => e.row >= 6)).toBe(true)
    expect(res.body.report).toMatchObject({ rows: 8, validRows: 4, added: 0, errorCount: errors.length })
    expect(await itemCount(team.slug)).toBe(0)

    // Asked explicitly, the valid rows go in and the bad ones are left out.
    const partial = await uploadCsv(team.contributor, team, bad, '?onlyValid=1', MAPPING)
    expect(partial.status, JSON.stringify(partial.body)).toBe(200)
    expect(partial.body).toMatchObject({ added: 4, validRows: 4 })
    expect(await itemCount(team.slug)).toBe(4)
  })

  it('adds nothing twice when the same file comes again', async () => {
    const again = await uploadCsv(team.contributor, team, good, '', MAPPING)
    expect(again.status, JSON.stringify(again.body)).toBe(200)
    expect(again.body).toMatchObject({ added: 0, alreadyImported: 4, totals: { costCents: 0, revenueCents: 0, netProfitCents: 0 } })
    expect(await itemCount(team.slug)).toBe(4)
    // Two identical rows are two pieces; importing that file again still adds nothing.
    const twins = 'Item,Bought,Paid\nSmall jar,2024-04-01,1.00\nSmall jar,2024-04-01,1.00\n'
    expect((await uploadCsv(team.contributor, team, twins, '', { Item: 'title', Bought: 'acquiredOn', Paid: 'cost' })).body.added).toBe(2)
    expect((await uploadCsv(team.contributor, team, twins, '', { Item: 'title', Bought: 'acquiredOn', Paid: 'cost' })).body).toMatchObject({ added: 0, alreadyImported: 2 })
    expect(await itemCount(team.slug)).toBe(6)
    // With an external id column, the id is the key: a corrected price does not make a second item.
    const withIds = 'Ref,Item,Bought,Paid\nHB-1,Lamp,2024-04-02,5.00\n'
    expect((await uploadCsv(team.contributor, team, withIds, '', { Ref: 'externalId', Item: 'title', Bought: 'acquiredOn', Paid: 'cost' })).body.added).toBe(1)
    expect((await uploadCsv(team.contributor, team, withIds.replace('5.00', '6.00'), '', { Ref: 'externalId', Item: 'title', Bought: 'acquiredOn', Paid: 'cost' })).body).toMatchObject({ added: 0, alreadyImported: 1 })
    const dup = await uploadCsv(team.contributor, team, 'Ref,Item,Bought\nHB-9,A,2024-04-02\nHB-9,B,2024-04-02\n', '?dryRun=1', { Ref: 'externalId', Item: 'title', Bought: 'acquiredOn' })
    expect(dup.body.errors).toMatchObject([{ row: 3, column: 'Ref', field: 'externalId' }])
  })

  it('adds the rows once when the same file is sent twice at the same moment', async () => {
    const racing = await newLedgerTeam('Import race')
    const csv = ['title,acquiredOn,cost', ...Array.from({ length: 300 }, (_, n) => `Racer ${n},2025-02-01,1.00`)].join('\n')
    const results = await Promise.all([uploadCsv(racing.contributor, racing, csv), uploadCsv(racing.contributor, racing, csv)])
    for (const res of results) expect([200, 409], JSON.stringify(res.body).slice(0, 300)).toContain(res.status)
    expect(results.reduce((sum, res) => sum + (res.status === 200 ? res.body.added : 0), 0)).toBe(300)
    expect(await itemCount(racing.slug)).toBe(300)
  })

  it('remembers the column mapping for a file with the same header row', async () => {
    const header = 'Item,Bought,Paid,Sold on,Sold for,Postage,Status,Category,Notes'
    const res = await uploadCsv(team.contributor, team, `${header}\nNew mug,2024-05-01,1.00,,,,,,\n`, '?dryRun=1')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.mapping).toEqual(Object.fromEntries(Object.entries(MAPPING).filter(([, f]) => f)))
    const mappings = await team.viewer.get(team.api('/imports/items/mappings'))
    expect(mappings.body.items.some((m: any) => m.headers.join(',') === header)).toBe(true)
  })

  it('reads day-first dates when told, and maps headers named like fields by themselves', async () => {
    const csv = 'title,acquiredOn,cost,soldOn,salePrice\nPlate,05/03/2024,1.50,10/03/2024,12.00\n'
    const res = await uploadCsv(team.contributor, team, csv, '?dryRun=1&dateOrder=dmy')
    expect(res.body).toMatchObject({ errors: [], added: 1, mapping: { title: 'title', acquiredOn: 'acquiredOn', cost: 'cost', soldOn: 'soldOn', salePrice: 'salePrice' } })
    // Day first: bought 5 March, sold 10 March; fees 10 % of 1,200 = 120.
    expect(res.body.totals).toEqual({ costCents: 150, revenueCents: 1200, netProfitCents: 1200 - 150 - 120 })
  })

  it('refuses a file without a title column or with an unknown mapped column', async () => {
    expect((await uploadCsv(team.contributor, team, 'Name,Paid\nX,1\n', '?dryRun=1', { Paid: 'cost' })).status).toBe(400)
    expect((await uploadCsv(team.contributor, team, 'Name,Paid\nX,1\n', '?dryRun=1', { Missing: 'title' })).status).toBe(400)
    expect((await uploadCsv(team.viewer, team, good, '?dryRun=1', MAPPING)).status).toBe(403)
  })
})

describe('item export', async () => {
  const team = await newLedgerTeam('Export')
  await newFeeProfile(team.editor, team, { name: 'Lanternpost standard', percentBp: 1325, fixedCents: 30 })
  const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['WRENFIELD'] })
  const store = (await team.contributor.post(team.api('/stores'), { name: 'Second Chapter Thrift' })).body
  const other = (await team.contributor.post(team.api('/stores'), { name: 'Tansy Hill Flea Market', kind: 'other' })).body

  // A mix: in stock, listed, sold (computed and hand-entered fees), shipped, returned, donated.
  await newItem(team.contributor, team, { title: 'Plain bowl', storeId: store.id, costCents: 199 })
  await newItem(team.contributor, team, { title: 'Listed jug, "big"', storeId: store.id, status: 'listed', listedOn: '2026-03-02', askingCents: 2400, markId: mark })
  await newItem(team.contributor, team, { title: 'Sold vase', storeId: other.id, status: 'sold', soldOn: '2026-03-09', salePriceCents: 3200, shippingChargedCents: 500, postageCents: 480, suppliesCents: 60, damage: { flags: ['chip', 'crazing'], notes: 'Rim flake' } })
  await newItem(team.contributor, team, { title: 'Hand fees', status: 'sold', soldOn: '2026-03-04', salePriceCents: 1500, feesCents: 222 })
  await newItem(team.contributor, team, { title: 'Shipped set', quantity: 4, costCents: 800, status: 'shipped', soldOn: '2026-03-05', shippedOn: '2026-03-06', salePriceCents: 6400, shippingChargedCents: 900, postageCents: 900 })
  await newItem(team.contributor, team, { title: 'Returned lamp', status: 'returned', soldOn: '2026-03-05', shippedOn: '2026-03-06', salePriceCents: 4500, postageCents: 700, refundCents: 4500 })
  await newItem(team.contributor, team, { title: 'Donated frame', status: 'donated', costCents: 150, notes: 'Line one\nline two' })

  async function exportCsv(t: typeof team, queryText = '') {
    const res = await t.viewer.request('GET', t.api(`/exports/items.csv${queryText}`), undefined, { accept: 'text/csv' })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    return res.body as string
  }

  it('exports any filtered view', async () => {
    const sold = Papa.parse<Record<string, string>>(await exportCsv(team, '?status=sold,shipped'), { header: true, skipEmptyLines: true })
    expect(sold.data.map(r => r.title).sort()).toEqual(['Hand fees', 'Shipped set', 'Sold vase'])
    const vase = sold.data.find(r => r.title === 'Sold vase')!
    // Fees: 13.25 % of 3,700 = 490.25 → 490 + 30 = 520; net 3,200 + 500 − 300 − 520 − 480 − 60 = 2,340.
    expect(vase).toMatchObject({ salePrice: '32.00', shippingCharged: '5.00', fees: '5.20', netProfit: '23.40', store: 'Tansy Hill Flea Market', damageFlags: 'chip;crazing' })
    const empty = Papa.parse<Record<string, string>>(await exportCsv(team, '?q=nothing-like-this'), { header: true, skipEmptyLines: true })
    expect(empty.data).toEqual([])
    expect(empty.meta.fields).toContain('title')
  })

  it('imports its own export into an empty team with the same totals', async () => {
    const csv = await exportCsv(team)
    const empty = await newLedgerTeam('Export target')
    // The other team's ids and reference names mean nothing here: those columns are left unmapped.
    const mapping: Record<string, string> = {}
    for (const column of ['externalId', 'title', 'status', 'quantity', 'condition', 'damageFlags', 'damageNotes', 'weightGrams', 'boxLengthMm', 'boxWidthMm',
      'boxHeightMm', 'store', 'acquiredOn', 'cost', 'listedOn', 'asking', 'soldOn', 'shippedOn', 'salePrice', 'shippingCharged', 'postage', 'supplies', 'fees', 'refund', 'notes']) {
      mapping[column] = column
    }
    const res = await uploadCsv(empty.contributor, empty, csv, '', mapping)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ added: 7, errors: [], storesCreated: ['Second Chapter Thrift', 'Tansy Hill Flea Market'] })
    const totals = async (t: typeof team) => (await t.viewer.get(t.api('/items?pageSize=1'))).body.totals
    const source = await totals(team)
    expect(await totals(empty)).toEqual(source)
    // And the figures the source items carry, summed here, are those totals.
    const items = await allItems(team.viewer, team)
    expect(source).toEqual({
      items: 7,
      costCents: items.reduce((s, i) => s + i.costCents, 0),
      revenueCents: items.reduce((s, i) => s + (i.salePriceCents ?? 0) + (i.shippingChargedCents ?? 0), 0),
      netProfitCents: items.reduce((s, i) => s + (i.netProfitCents ?? 0), 0),
    })
    const copied = await allItems(empty.viewer, empty)
    expect(copied.map(i => [i.title, i.status, i.notes]).sort()).toEqual(items.map(i => [i.title, i.status, i.notes]).sort())
  })

  it('streams large views in pages without repeating or skipping a row', async () => {
    const big = await newLedgerTeam('Export pages')
    const rows = ['title,acquiredOn,cost', ...Array.from({ length: 2_150 }, (_, n) => `Piece ${n},2025-01-01,${(n % 50) + 1}.00`)]
    const imported = await uploadCsv(big.contributor, big, rows.join('\n'))
    expect(imported.body.added, JSON.stringify(imported.body).slice(0, 500)).toBe(2_150)
    const parsed = Papa.parse<Record<string, string>>(await exportCsv(big), { header: true, skipEmptyLines: true })
    expect(parsed.data.length).toBe(2_150)
    expect(new Set(parsed.data.map(r => r.id)).size).toBe(2_150)
    expect(new Set(parsed.data.map(r => r.title)).size).toBe(2_150)
  })
})
