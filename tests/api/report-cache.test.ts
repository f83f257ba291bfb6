// Report figures are reused while the team's ledger and wiki versions stand (server/utils/reports/cache.ts), and
// every write that changes them moves a version on in its own transaction. First the reuse itself: a change made
// behind the app's back (straight into the database, no version moved) is not seen until the version moves.
// Then each kind of write through the API: the ledger version moves on once, and the next report shows it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeTestDb, exec, query, teamIdOf } from '../support/db'
import { newItem, newLedgerTeam, newStore, newTrip, uploadCsv, type LedgerTeam } from '../support/ledger'
import { createEntry } from '../support/wiki'

afterAll(closeTestDb)

let team: LedgerTeam
let teamId: number
let markId: number

async function report(path = '/reports/mark'): Promise<any> {
  const res = await team.owner.get(team.api(path))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body
}

async function ledgerVersion(): Promise<number> {
  const [row] = await query<{ version: number }>('select version from ledger_versions where team_id = ?', [teamId])
  return Number(row?.version ?? 0)
}

/** Runs a write and expects it to move the ledger version on by exactly one. */
async function movesLedgerOn(write: () => Promise<unknown>): Promise<void> {
  const before = await ledgerVersion()
  await write()
  expect(await ledgerVersion()).toBe(before + 1)
}

const ok = (res: { status: number, body: unknown }, status = 200) => expect(res.status, JSON.stringify(res.body)).toBe(status)

beforeAll(async () => {
  team = await newLedgerTeam('Report Cache Team')
  teamId = await teamIdOf(team.slug)
  markId = await createEntry(team.owner, team, 'marks', { title: 'Crowned Fern', inscriptions: ['CROWNED FERN'] })
})

describe('report cache', () => {
  it('answers again from what it computed until the ledger version moves on', async () => {
    const item = await newItem(team.owner, team, { markId, costCents: 400 })
    const first = await report()
    expect(first.totals.bought).toBe(1)

    // Behind the app's back: the figures stay as they were computed…
    await exec('update items set cost_cents = 900 where id = ?', [item.id])
    expect((await report()).totals.unsoldCostCents).toBe(first.totals.unsoldCostCents)
    // …until the version moves on, as every write of the app does in its transaction.
    await exec('update ledger_versions set version = version + 1 where team_id = ?', [teamId])
    expect((await report()).totals.unsoldCostCents).toBe(900)
  })

  it('sees every item write: create, edit, sale, status, delete, trip store, import', async () => {
    const start = await report()
    let item: any
    await movesLedgerOn(async () => { item = await newItem(team.contributor, team, { markId, costCents: 250 }) })
    expect((await report()).totals.bought).toBe(start.totals.bought + 1)

    await movesLedgerOn(async () => ok(await team.contributor.patch(team.api(`/items/${item.id}`), { revision: item.revision, costCents: 350 })))
    expect((await report()).totals.unsoldCostCents).toBe(start.totals.unsoldCostCents + 350)

    await movesLedgerOn(async () => ok(await team.contributor.post(team.api(`/items/${item.id}/sale`), { salePriceCents: 2000, soldOn: '2026-04-01' })))
    const sold = await report()
    expect(sold.totals.sold).toBe(start.totals.sold + 1)
    expect(sold.totals.revenueCents).toBe(start.totals.revenueCents + 2000)

    await movesLedgerOn(async () => ok(await team.contributor.post(team.api(`/items/${item.id}/status`), { to: 'returned', on: '2026-04-05' })))
    expect((await report()).totals.sold).toBe(start.totals.sold)

    const spare = await newItem(team.contributor, team, { costCents: 125 })
    const withSpare = await report()
    await movesLedgerOn(async () => ok(await team.contributor.delete(team.api(`/items/${spare.id}`))))
    expect((await report()).totals.bought).toBe(withSpare.totals.bought - 1)

    // A trip's new store is its items' store: the store report moves them.
    const [storeA, storeB] = [await newStore(team.owner, team), await newStore(team.owner, team)]
    const trip = await newTrip(team.owner, team, storeA.id)
    await newItem(team.contributor, team, { tripId: trip.id, storeId: storeA.id, costCents: 100 })
    const byStore = (body: any, id: number) => body.rows.find((r: any) => r.key === id)?.bought ?? 0
    expect(byStore(await report('/reports/store'), storeA.id)).toBe(1)
    await movesLedgerOn(async () => ok(await team.owner.patch(team.api(`/trips/${trip.id}`), { revision: trip.revision, storeId: storeB.id })))
    const moved = await report('/reports/store')
    expect([byStore(moved, storeA.id), byStore(moved, storeB.id)]).toEqual([0, 1])

    const beforeImport = await report()
    await movesLedgerOn(async () => ok(await uploadCsv(team.contributor, team, 'title,acquiredOn,cost\nFern cup,2026-03-01,2.50\nFern saucer,2026-03-02,1.00\n')))
    expect((await report()).totals.bought).toBe(beforeImport.totals.bought + 2)
    // A dry run writes nothing and moves nothing.
    const version = await ledgerVersion()
    ok(await uploadCsv(team.contributor, team, 'title,acquiredOn\nFern jug,2026-03-03\n', '?dryRun=1'))
    expect(await ledgerVersion()).toBe(version)
  })

  it('sees wiki writes: a category moved under another rolls up there at once, a mark renamed is named anew', async () => {
    const parent = await createEntry(team.owner, team, 'categories', { name: 'Fern Tableware' })
    const child = await createEntry(team.owner, team, 'categories', { name: 'Fern Cups' })
    await newItem(team.contributor, team, { categoryId: child, costCents: 200 })
    const keys = async () => (await report('/reports/category')).rows.map((r: any) => r.key)
    expect(await keys()).toContain(child)

    const version = await ledgerVersion()
    ok(await team.owner.patch(team.api(`/categories/${child}`), { revision: 1, parentId: parent }))
    // Not an item write: the wiki version covers it.
    expect(await ledgerVersion()).toBe(version)
    const after = await keys()
    expect(after).toContain(parent)
    expect(after).not.toContain(child)

    // A mark's new title is its row's label straight away.
    const label = async () => (await report()).rows.find((r: any) => r.key === markId)?.label
    expect(await label()).toBe('Crowned Fern')
    const [mark] = await query<{ revision: number }>('select revision from marks where id = ?', [markId])
    ok(await team.owner.patch(team.api(`/marks/${markId}`), { revision: mark!.revision, title: 'Crowned Fern, later' }))
    expect(await label()).toBe('Crowned Fern, later')
  })

  it('reads names fresh: a store renamed without any item write shows its new name', async () => {
    const store = await newStore(team.owner, team, { name: 'Fernside Thrift' })
    await newItem(team.contributor, team, { storeId: store.id })
    const label = async () => (await report('/reports/store')).rows.find((r: any) => r.key === store.id)?.label
    expect(await label()).toBe('Fernside Thrift')
    const version = await ledgerVersion()
    ok(await team.owner.patch(team.api(`/stores/${store.id}`), { revision: store.revision, name: 'Fernside Charity Shop' }))
    expect(await ledgerVersion()).toBe(version)
    expect(await label()).toBe('Fernside Charity Shop')
  })
})
