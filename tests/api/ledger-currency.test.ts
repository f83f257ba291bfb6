// The team's currency: a ledger setting (ISO 4217 code, USD by default, one of the codes with cents), sent with
// the person's teams so every page formats with it, used in the sale's timeline note and named by the CSV export.
import Papa from 'papaparse'
import { afterAll, describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { closeTestDb } from '../support/db'
import { createEntry } from '../support/wiki'
import { newLedgerTeam, newItem, uploadCsv } from '../support/ledger'
import { LEDGER_CURRENCIES } from '../../shared/ledger/currencies'

afterAll(closeTestDb)

describe('team currency', async () => {
  const team = await newLedgerTeam('Currency')
  const other = await newLedgerTeam('Currency other')

  it('is USD until the team picks another, and is kept per team', async () => {
    const res = await team.viewer.get(team.api('/ledger-settings'))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ currency: 'USD', mileageRateCents: 0 })
    const changed = await team.editor.patch(team.api('/ledger-settings'), { currency: 'eur' })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    expect(changed.body.currency).toBe('EUR')
    expect((await team.viewer.get(team.api('/ledger-settings'))).body.currency).toBe('EUR')
    // Another setting changed later leaves the currency alone.
    expect((await team.editor.patch(team.api('/ledger-settings'), { mileageRateCents: 70 })).body).toMatchObject({ currency: 'EUR', mileageRateCents: 70 })
    expect((await other.viewer.get(other.api('/ledger-settings'))).body.currency).toBe('USD')
  })

  it('refuses codes outside the list (no cents, unknown, not a code) and viewers or contributors changing it', async () => {
    for (const bad of ['JPY', 'KWD', 'XYZ', 'dollars', '', 12]) {
      const res = await team.editor.patch(team.api('/ledger-settings'), { currency: bad })
      expect(expectError(res, 400).fieldErrors?.currency, String(bad)).toBeDefined()
    }
    expect(expectError(await team.editor.patch(team.api('/ledger-settings'), { currency: 'JPY' }), 400).message).toContain(LEDGER_CURRENCIES.join(', '))
    expect((await team.contributor.patch(team.api('/ledger-settings'), { currency: 'GBP' })).status).toBe(403)
    expect((await team.viewer.patch(team.api('/ledger-settings'), { currency: 'GBP' })).status).toBe(403)
    expect((await team.viewer.get(team.api('/ledger-settings'))).body.currency).toBe('EUR')
  })

  it('comes with the person\'s teams, so every page formats with it', async () => {
    const me = await team.viewer.get('/api/me')
    expect(me.body.teams.find((t: { slug: string }) => t.slug === team.slug)).toMatchObject({ currency: 'EUR' })
    const theirs = await other.viewer.get('/api/me')
    expect(theirs.body.teams.find((t: { slug: string }) => t.slug === other.slug)).toMatchObject({ currency: 'USD' })
  })

  it('words the sale\'s timeline note in the team\'s currency', async () => {
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['MERROW DALE'] })
    const item = await newItem(team.contributor, team, { title: 'Euro jug', markId: mark, costCents: 450 })
    const sale = await team.contributor.post(team.api(`/items/${item.id}/sale`), { salePriceCents: 2350, note: { onMark: true } })
    expect(sale.status, JSON.stringify(sale.body)).toBe(200)
    const notes = await team.viewer.get(team.api(`/marks/${mark}/notes`))
    const body = (notes.body.items as { body: string }[])[0]!.body
    expect(body).toContain('for €23.50')
    expect(body).toContain('Paid €4.50')
    expect(body).not.toContain('$')
  })

  it('names the currency in the CSV export, with the amounts as plain decimals', async () => {
    const res = await team.viewer.request('GET', team.api('/exports/items.csv?q=Euro%20jug'), undefined, { accept: 'text/csv' })
    expect(res.status).toBe(200)
    const csv = Papa.parse<Record<string, string>>(res.body as string, { header: true, skipEmptyLines: true })
    expect(csv.meta.fields).toContain('currency')
    expect(csv.data).toEqual([expect.objectContaining({ title: 'Euro jug', currency: 'EUR', cost: '4.50', salePrice: '23.50' })])
    expect(res.body as string).not.toContain('€')
  })

  it('imports rows in the team\'s currency and refuses, by row, amounts kept in another one', async () => {
    const csv = [
      'title,acquiredOn,currency,cost',
      'Euro cup,2024-04-02,EUR,3.00',
      'Euro saucer,2024-04-02,eur,1.50',
      'Dollar plate,2024-04-02,USD,2.00',
      'Unsaid bowl,2024-04-02,,2.25',
    ].join('\n')
    const res = await uploadCsv(team.contributor, team, csv, '?dryRun=1')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ rows: 4, validRows: 3, errorCount: 1 })
    expect(res.body.errors).toEqual([expect.objectContaining({ row: 4, column: 'currency', field: 'currency' })])
    expect(res.body.errors[0].message).toMatch(/in USD, but this team keeps its ledger in EUR/)
    // The other team keeps dollars: the same file's euro rows are the refused ones there.
    const there = await uploadCsv(other.contributor, other, csv, '?dryRun=1')
    expect(there.body.errors.map((e: { row: number }) => e.row)).toEqual([2, 3])
  })
})
