// Popularity in search (server/utils/search/popularity.ts): between equally relevant hits the mark or maker the
// team sold more often comes first, and an empty or one-letter query lists the most sold entries first. The
// counts follow sales, returns, deletions and a mark's maker through the search change log.
import { beforeAll, describe, expect, it } from 'vitest'
import type { Person } from '../support/api'
import { newItem, newLedgerTeam } from '../support/ledger'
import { createEntry, type WikiTeam } from '../support/wiki'

interface Hit { type: string, id: number, score: number }
interface Answer { hits: Hit[], source: string, mode: string }

async function search(person: Person, team: WikiTeam, q: string, types: string): Promise<Answer> {
  const res = await person.get<Answer>(team.api(`/search?${new URLSearchParams({ q, types })}`))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body
}

async function eventually(check: () => Promise<void>, ms = 3000) {
  const started = Date.now()
  for (;;) {
    try {
      return await check()
    }
    catch (error) {
      if (Date.now() - started > ms) throw error
      await new Promise(r => setTimeout(r, 50))
    }
  }
}

const SOLD = { status: 'sold', soldOn: '2026-04-02', salePriceCents: 2400 }

describe('popularity in search', async () => {
  const team = await newLedgerTeam('Popularity')
  const { editor, viewer } = team
  const makerA = await createEntry(editor, team, 'makers', { name: 'Ostlerby Kilns' })
  const makerB = await createEntry(editor, team, 'makers', { name: 'Ostlerby Kilns' })
  // Two marks with the very same words: any query on them finds them equally relevant.
  const first = await createEntry(editor, team, 'marks', { inscriptions: ['QUARRENDEN WARE'], makerId: makerA })
  const second = await createEntry(editor, team, 'marks', { inscriptions: ['QUARRENDEN WARE'], makerId: makerB })
  // Added last: the most recent entry, first in the empty query's list while nothing is sold.
  const latest = await createEntry(editor, team, 'marks', { inscriptions: ['ZELBURY WARE'] })
  const order = async (q: string, types = 'mark') => (await search(viewer, team, q, types)).hits.map(h => h.id)

  beforeAll(async () => {
    await eventually(async () => expect((await search(viewer, team, 'quarrenden', 'mark')).source).toBe('index'))
  })

  it('orders equally relevant marks by how often the team sold them, and follows sales, returns and deletions', async () => {
    const tie = await search(viewer, team, 'quarrenden', 'mark')
    expect(tie.hits.map(h => h.id).sort()).toEqual([first, second].sort())
    expect(tie.hits[0]!.score).toBe(tie.hits[1]!.score)
    const [top, below] = tie.hits.map(h => h.id) as [number, number]
    // One piece of the lower mark sold (created sold, as an import would): it moves up.
    const one = await newItem(editor, team, { title: 'Quarrenden jug', markId: below, ...SOLD })
    await eventually(async () => expect(await order('quarrenden')).toEqual([below, top]))
    // Two sales of the other mark through the sale route: it goes back in front.
    const sales: number[] = []
    for (const title of ['Quarrenden bowl', 'Quarrenden cup']) {
      const item = await newItem(editor, team, { title, markId: top, status: 'listed', listedOn: '2026-03-05' })
      const sold = await editor.post(team.api(`/items/${item.id}/sale`), { soldOn: '2026-04-01', salePriceCents: 1800 })
      expect(sold.status, JSON.stringify(sold.body)).toBe(200)
      sales.push(item.id)
    }
    await eventually(async () => expect(await order('quarrenden')).toEqual([top, below]))
    // Both come back: a returned sale does not count, so the lower mark's one sale wins again.
    for (const id of sales) expect((await editor.post(team.api(`/items/${id}/status`), { to: 'returned', on: '2026-04-10' })).status).toBe(200)
    await eventually(async () => expect(await order('quarrenden')).toEqual([below, top]))
    // Its sold item deleted: a tie again, in the index's own order.
    expect((await editor.delete(team.api(`/items/${one.id}`))).status).toBe(200)
    await eventually(async () => expect(await order('quarrenden')).toEqual([top, below]))
  })

  it('counts a sold item for its own maker, else for its mark\'s maker', async () => {
    const tie = await order('ostlerby', 'maker')
    expect(tie.sort()).toEqual([makerA, makerB].sort())
    // Through the mark: `first` is makerA's.
    await newItem(editor, team, { title: 'Quarrenden plate', markId: first, ...SOLD })
    await eventually(async () => expect(await order('ostlerby', 'maker')).toEqual([makerA, makerB]))
    // An item's own maker counts before its mark's: two for makerB.
    for (const title of ['Ostlerby crock', 'Ostlerby pitcher']) await newItem(editor, team, { title, makerId: makerB, markId: first, ...SOLD })
    await eventually(async () => expect(await order('ostlerby', 'maker')).toEqual([makerB, makerA]))
  })

  it('lists the most sold entries first for an empty or one-letter query, then the most recent', async () => {
    await newItem(editor, team, { title: 'Quarrenden tureen', markId: second, ...SOLD })
    await eventually(async () => {
      const answer = await search(viewer, team, '', 'mark')
      expect(answer.mode).toBe('recent')
      // `first` has three sales standing (the plate and the two Ostlerby pieces), `second` one, `latest` none.
      expect(answer.hits.map(h => h.id)).toEqual([first, second, latest])
    })
    // One letter: titles starting with it first (only `latest` starts with z), then by sales.
    expect(await order('z')).toEqual([latest, first, second])
    expect(await order('q')).toEqual([first, second, latest])
    // Enough sales of `second` and it leads the list.
    for (let n = 0; n < 3; n++) await newItem(editor, team, { title: `Quarrenden saucer ${n}`, markId: second, ...SOLD })
    await eventually(async () => expect(await order('')).toEqual([second, first, latest]))
  })
})
