// Status changes over HTTP: the transitions table and who may make each move, the events they record, and
// "mark as sold" writing the sale, its event and timeline notes in one transaction.
// Fee figures by hand computation from the invented profile below; net profit by trade-facts §4.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { closeTestDb, query } from '../support/db'
import { createEntry } from '../support/wiki'
import { newFeeProfile, newItem, newLedgerTeam } from '../support/ledger'

afterAll(closeTestDb)

describe('item status changes', async () => {
  const team = await newLedgerTeam('Status')
  // Invented: 10 % + 25 ¢ to the channel, 2.5 % + 30 ¢ for payment.
  const profile = await newFeeProfile(team.editor, team, { name: 'Tansy', percentBp: 1000, fixedCents: 25, paymentPercentBp: 250, paymentFixedCents: 30 })
  const status = (id: number) => team.api(`/items/${id}/status`)

  it('moves an item along the table and records every move', async () => {
    const item = await newItem(team.contributor, team, { title: 'Journey', acquiredOn: '2026-03-01' })
    const listed = await team.contributor.post(status(item.id), { to: 'listed', on: '2026-03-02', askingCents: 2500 })
    expect(listed.status, JSON.stringify(listed.body)).toBe(200)
    expect(listed.body).toMatchObject({ status: 'listed', listedOn: '2026-03-02', askingCents: 2500, revision: 2 })
    const sold = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-09', salePriceCents: 2000, shippingChargedCents: 500, postageCents: 450, suppliesCents: 50, feeProfileId: profile.id })
    expect(sold.status, JSON.stringify(sold.body)).toBe(200)
    // Fees: 10 % of 2,500 = 250 + 25 = 275; 2.5 % of 2,500 = 62.5 → 63 + 30 = 93; total 368.
    // Net: 2,000 + 500 − 300 − 368 − 450 − 50 = 1,332.
    expect(sold.body.item).toMatchObject({ status: 'sold', feesCents: 368, feesManual: false, netProfitCents: 1332, daysToSell: 8 })
    const shipped = await team.contributor.post(status(item.id), { to: 'shipped', on: '2026-03-10' })
    expect(shipped.body).toMatchObject({ status: 'shipped', shippedOn: '2026-03-10' })
    const returned = await team.contributor.post(status(item.id), { to: 'returned', on: '2026-03-20' })
    // A full refund of what the buyer paid unless another amount is given: 1,332 − 2,500 = −1,168.
    expect(returned.body).toMatchObject({ status: 'returned', refundCents: 2500, netProfitCents: -1168 })
    const history = await team.viewer.get(status(item.id))
    expect(history.body.items.map((e: any) => [e.from, e.to, e.happenedOn])).toEqual([
      [null, 'in_stock', '2026-03-01'], ['in_stock', 'listed', '2026-03-02'], ['listed', 'sold', '2026-03-09'],
      ['sold', 'shipped', '2026-03-10'], ['shipped', 'returned', '2026-03-20'],
    ])
    expect(history.body.items[1].changedBy.name).toBe('Contributor Person')
  })

  it('refuses moves that are not in the table, with 409, and "sold" without the sale figures', async () => {
    const item = await newItem(team.contributor, team, { title: 'Not like that' })
    expectError(await team.contributor.post(status(item.id), { to: 'shipped' }), 409, /cannot become shipped/)
    expectError(await team.contributor.post(status(item.id), { to: 'returned' }), 409)
    expect(expectError(await team.contributor.post(status(item.id), { to: 'sold' }), 400).fieldErrors?.to).toBeDefined()
    expectError(await team.contributor.post(status(item.id), { to: 'lost' }), 400)
    const [row] = await query<{ status: string, revision: number }>('select status, revision from items where id = ?', [item.id])
    expect(row).toMatchObject({ status: 'in_stock', revision: 1 })
  })

  it('lets contributors move their own items, editors everyone\'s, and viewers nothing', async () => {
    const editors = await newItem(team.editor, team, { title: 'Editor stock' })
    expectError(await team.contributor.post(status(editors.id), { to: 'listed' }), 403)
    expectError(await team.contributor.post(team.api(`/items/${editors.id}/sale`), { salePriceCents: 1000 }), 403)
    expectError(await team.viewer.post(status(editors.id), { to: 'listed' }), 403)
    const own = await newItem(team.contributor, team, { title: 'Own stock' })
    expect((await team.contributor.post(status(own.id), { to: 'listed' })).status).toBe(200)
    expect((await team.editor.post(status(editors.id), { to: 'listed' })).status).toBe(200)
    expect((await team.owner.post(status(own.id), { to: 'in_stock' })).status).toBe(200)
  })

  it('keeps undoing a write-off for editors, even on the contributor\'s own item (table data)', async () => {
    const item = await newItem(team.contributor, team, { title: 'Broken in the van' })
    expect((await team.contributor.post(status(item.id), { to: 'written_off' })).body).toMatchObject({ status: 'written_off', netProfitCents: -300 })
    expectError(await team.contributor.post(status(item.id), { to: 'in_stock' }), 403, /editor/)
    expect((await team.editor.post(status(item.id), { to: 'in_stock' })).body).toMatchObject({ status: 'in_stock', netProfitCents: null })
  })

  it('clears the sale when it falls through, and refuses a stale revision', async () => {
    const item = await newItem(team.contributor, team, { title: 'Buyer vanished' })
    await team.contributor.post(status(item.id), { to: 'listed', on: '2026-03-02' })
    await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-04', salePriceCents: 1200 })
    const relisted = await team.contributor.post(status(item.id), { to: 'listed', on: '2026-03-05' })
    expect(relisted.body).toMatchObject({ status: 'listed', soldOn: null, salePriceCents: null, feesCents: null, listedOn: '2026-03-05', netProfitCents: null })
    const stale = await team.contributor.post(status(item.id), { to: 'in_stock', revision: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body.current).toMatchObject({ id: item.id, status: 'listed' })
  })
})

describe('mark as sold with a timeline note, in one transaction', async () => {
  const team = await newLedgerTeam('Sale notes')
  await newFeeProfile(team.editor, team, { name: 'Lanternpost standard', channel: 'Lanternpost', percentBp: 1325, fixedCents: 30 })
  const category = await createEntry(team.editor, team, 'categories', { name: 'Planters' })
  const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['LARKHAVEN'] })

  async function notesOn(type: 'marks' | 'categories', id: number) {
    const res = await team.viewer.get(team.api(`/${type}/${id}/notes`))
    expect(res.status).toBe(200)
    return res.body.items as { body: string, happenedOn: string | null, author: { name: string } }[]
  }

  it('records the sale, its event and a prefilled note on the mark and the category', async () => {
    const item = await newItem(team.contributor, team, { title: 'Swan planter', markId: mark, categoryId: category, acquiredOn: '2026-03-01', costCents: 400 })
    const res = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-13', salePriceCents: 2800, shippingChargedCents: 0, postageCents: 700, note: {} })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    // Default profile: 13.25 % of 2,800 = 371 + 30 = 401 fees; net 2,800 − 400 − 401 − 700 = 1,299.
    expect(res.body.item).toMatchObject({ status: 'sold', feesCents: 401, netProfitCents: 1299, daysToSell: 12 })
    expect(res.body.notes.map((n: any) => n.entryType).sort()).toEqual(['category', 'mark'])
    const expected = 'Sold "Swan planter" for $28.00 on Lanternpost standard, 12 days after it was bought. Paid $4.00, net $12.99.'
    for (const [type, id] of [['marks', mark], ['categories', category]] as const) {
      const [note] = await notesOn(type, id)
      expect(note).toMatchObject({ body: expected, happenedOn: '2026-03-13', author: { name: 'Contributor Person' } })
    }
  })

  it('takes the member\'s own words for the note, and only where asked', async () => {
    const item = await newItem(team.contributor, team, { title: 'Duck planter', markId: mark, categoryId: category })
    const before = (await notesOn('categories', category)).length
    const res = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-02', salePriceCents: 1500, note: { body: 'Went to a collector at the Saturday table.', onCategory: false } })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect((await notesOn('marks', mark)).filter(n => n.body === 'Went to a collector at the Saturday table.')).toMatchObject([{ happenedOn: '2026-03-02' }])
    expect((await notesOn('categories', category)).length).toBe(before)
  })

  it('saves nothing when the note cannot be written: sale, event and notes roll back together', async () => {
    const doomedCategory = await createEntry(team.editor, team, 'categories', { name: 'Soon gone' })
    const item = await newItem(team.contributor, team, { title: 'Frog planter', markId: mark, categoryId: doomedCategory })
    await team.contributor.post(team.api(`/items/${item.id}/status`), { to: 'listed', on: '2026-03-02' })
    // The category goes to the deleted list after the item was linked to it.
    expect((await team.editor.delete(team.api(`/categories/${doomedCategory}`))).status).toBe(200)
    const markNotes = (await notesOn('marks', mark)).length
    const res = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-05', salePriceCents: 1900, note: {} })
    expectError(res, 409, /deleted list/)
    const [row] = await query<{ status: string, sale_price_cents: number | null, revision: number }>('select status, sale_price_cents, revision from items where id = ?', [item.id])
    expect(row).toMatchObject({ status: 'listed', sale_price_cents: null, revision: 2 })
    const [events] = await query<{ n: number }>('select count(*) n from item_status_events where item_id = ? and to_status = \'sold\'', [item.id])
    expect(Number(events!.n)).toBe(0)
    // The mark's note was written before the category's failed, inside the same transaction: it is gone too.
    expect((await notesOn('marks', mark)).length).toBe(markNotes)
    const [orphans] = await query<{ n: number }>('select count(*) n from entry_notes where entry_type = \'category\' and entry_id = ?', [doomedCategory])
    expect(Number(orphans!.n)).toBe(0)
    // Without the note the same sale goes through.
    const plain = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-05', salePriceCents: 1900 })
    expect(plain.status, JSON.stringify(plain.body)).toBe(200)
    expect(plain.body).toMatchObject({ item: { status: 'sold' }, notes: [] })
  })

  it('overrides computed fees with the ones entered, and refuses a sale before the purchase', async () => {
    const item = await newItem(team.contributor, team, { title: 'Hand fees', acquiredOn: '2026-03-01' })
    const res = await team.contributor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-03-03', salePriceCents: 1000, feesCents: 77 })
    expect(res.body.item).toMatchObject({ feesCents: 77, feesManual: true, netProfitCents: 1000 - 300 - 77 })
    const early = await newItem(team.contributor, team, { title: 'Time travel', acquiredOn: '2026-03-10' })
    expect(expectError(await team.contributor.post(team.api(`/items/${early.id}/sale`), { soldOn: '2026-03-01', salePriceCents: 1000 }), 400).fieldErrors?.soldOn).toBeDefined()
  })
})
