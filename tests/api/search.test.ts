// The team search API: forgiving matching, filters, team isolation, incremental updates on every kind of
// write, the MariaDB fallback while an index builds, and two app instances sharing one database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startAppServer, type AppServer } from '../../scripts/lib/app-server'
import { freePort } from '../../scripts/lib/ports'
import { Person, expectError, newOwner } from '../support/api'
import { createEntry, newWikiTeam, type WikiTeam } from '../support/wiki'

interface Hit { type: string, id: number, title: string, subtitle: string, score: number, matched: Record<string, string[]>, snippet: { field: string, segments: { text: string, match: boolean }[] } | null, path: string }
interface Answer { hits: Hit[], total: number, tookMs: number, source: 'index' | 'database', mode: string }

const qs = (q: string, extra: Record<string, string | number> = {}) => new URLSearchParams({ q, ...Object.fromEntries(Object.entries(extra).map(([k, v]) => [k, String(v)])) }).toString()

async function search(person: Person, team: WikiTeam, q: string, extra: Record<string, string | number> = {}): Promise<Answer> {
  const res = await person.get<Answer>(team.api(`/search?${qs(q, extra)}`))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body
}

/** Retries `check` until it passes or `ms` ran out (index updates arrive through the change log). */
async function eventually<T>(check: () => Promise<T>, ms = 2000): Promise<{ value: T, elapsed: number }> {
  const started = Date.now()
  for (;;) {
    try {
      return { value: await check(), elapsed: Date.now() - started }
    }
    catch (error) {
      if (Date.now() - started > ms) throw error
      await new Promise(r => setTimeout(r, 50))
    }
  }
}

const ids = (answer: Answer, type = 'mark') => answer.hits.filter(h => h.type === type).map(h => h.id)

describe('team search', async () => {
  const team = await newWikiTeam('Search')
  const other = await newWikiTeam('Search Twin')
  const { editor, viewer, owner } = team
  const maker = await createEntry(editor, team, 'makers', { name: 'Hallowell Müller', otherNames: ['Hallowell & Company'], country: 'Germany' })
  const stoneware = await createEntry(editor, team, 'materials', { name: 'Stoneware' })
  const kitchen = await createEntry(editor, team, 'categories', { name: 'Kitchen' })
  const bowls = await createEntry(editor, team, 'categories', { name: 'Mixing bowls', parentId: kitchen })
  const hallowell = await createEntry(editor, team, 'marks', {
    inscriptions: ['HALLOWELL POTTERY CO', 'ZANESFORD OHIO'], makerId: maker, country: 'United States', yearFrom: 1920, yearTo: 1950,
    materialIds: [stoneware], categoryIds: [bowls], notes: 'Stamped **under** the foot ring.',
  })
  const brantley = await createEntry(editor, team, 'marks', { inscriptions: ['BRANTLEY GLASS WORKS'], country: 'England', yearFrom: 1960 })
  const kohler = await createEntry(editor, team, 'marks', { inscriptions: ['Gebrüder Köhler Steingut'], tags: ['stein'] })
  const note = (await team.contributor.post(team.api(`/marks/${brantley}/notes`), { body: 'Found a cobalt tumbler with the Quenby label.' })).body.id as number
  // The other team has an entry with the very same words.
  const twin = await createEntry(other.editor, other, 'marks', { inscriptions: ['HALLOWELL POTTERY CO', 'ZANESFORD OHIO'] })

  beforeAll(async () => {
    // The first search builds the team's index; a team this small is ready within the first request.
    await eventually(async () => expect((await search(viewer, team, 'hallowell')).source).toBe('index'))
  })

  it.each([
    ['exact words', 'hallowell pottery'],
    ['lower case and punctuation', 'hallowell, pottery co.'],
    ['one typo', 'halowell pottery'],
    ['two typos in a long word', 'hallowelll zanesfrod'],
    ['worn print: 0 for O and 1 for L', 'HA11OWELL P0TTERY'],
    ['a prefix while typing', 'hallowell pot'],
    ['a three-letter prefix', 'zan'],
    ['a partial inscription', '...ERY CO OHIO'],
    ['the end of a word', 'LOWELL POTTERY'],
    ['Company for Co.', 'hallowell pottery company'],
  ])('finds the mark by %s (%s)', async (_what, q) => {
    const answer = await search(viewer, team, q)
    expect(answer.source).toBe('index')
    expect(answer.hits[0], JSON.stringify(answer.hits.slice(0, 3))).toMatchObject({ type: 'mark', id: hallowell, path: `/t/${team.slug}/marks/${hallowell}` })
  })

  it('folds German spellings and diacritics both ways', async () => {
    for (const q of ['Kohler', 'Koehler', 'Köhler', 'gebruder', 'GEBRUEDER']) expect(ids(await search(viewer, team, q))[0], q).toBe(kohler)
    for (const q of ['Muller', 'Mueller', 'Müller']) {
      const answer = await search(viewer, team, q)
      expect(answer.hits[0], q).toMatchObject({ type: 'maker', id: maker })
    }
    // "&" and "and" are the same word.
    expect((await search(viewer, team, 'hallowell and company', { types: 'maker' })).hits[0]?.id).toBe(maker)
  })

  it('says which fields matched and highlights the words in a snippet', async () => {
    const answer = await search(viewer, team, 'halowell ohio')
    const hit = answer.hits.find(h => h.type === 'mark' && h.id === hallowell)!
    expect(hit.matched.inscriptions).toEqual(['HALLOWELL', 'OHIO'])
    expect(hit.snippet?.field).toBe('inscriptions')
    expect(hit.snippet?.segments.filter(s => s.match).map(s => s.text)).toEqual(['HALLOWELL', 'OHIO'])
    expect(hit.snippet?.segments.map(s => s.text).join('')).toBe('HALLOWELL POTTERY CO · ZANESFORD OHIO')
    expect(hit.subtitle).toBe('Hallowell Müller · 1920–1950 · United States')
    // A match in the notes is shown from the notes, as plain text.
    const inNotes = (await search(viewer, team, 'foot ring')).hits.find(h => h.id === hallowell)!
    expect(inNotes.matched.body).toEqual(['foot', 'ring'])
    expect(inNotes.snippet?.segments.map(s => s.text).join('')).toBe('Stamped under the foot ring.')
  })

  it('finds notes and links them to their entry', async () => {
    const answer = await search(viewer, team, 'quenby tumbler')
    expect(answer.hits[0]).toMatchObject({ type: 'note', id: note, title: 'Note on BRANTLEY GLASS WORKS', path: `/t/${team.slug}/marks/${brantley}#note-${note}` })
  })

  it('filters by type, country, maker, material, category (with subcategories) and year', async () => {
    const q = 'hallowell brantley kohler'
    expect(ids(await search(viewer, team, q))).toEqual(expect.arrayContaining([hallowell, brantley, kohler]))
    expect(ids(await search(viewer, team, q, { country: 'england' }))).toEqual([brantley])
    expect(ids(await search(viewer, team, q, { makerId: maker }))).toEqual([hallowell])
    expect(ids(await search(viewer, team, q, { materialId: stoneware }))).toEqual([hallowell])
    expect(ids(await search(viewer, team, q, { categoryId: kitchen }))).toEqual([hallowell])
    expect(ids(await search(viewer, team, q, { year: 1935 }))).toEqual([hallowell])
    // "From 1960" includes later years; undated marks never match a year.
    expect(ids(await search(viewer, team, q, { year: 1990 }))).toEqual([brantley])
    expect(ids(await search(viewer, team, q, { year: 1900 }))).toEqual([])
    const makersOnly = await search(viewer, team, 'hallowell', { types: 'maker' })
    expect(makersOnly.hits.map(h => h.type)).toEqual(['maker'])
    const limited = await search(viewer, team, q, { limit: 1 })
    expect(limited.hits.length).toBe(1)
    expect(limited.total).toBeGreaterThanOrEqual(3)
  })

  it('answers an empty or one-letter query with recent entries', async () => {
    for (const q of ['', 'h']) {
      const answer = await search(viewer, team, q)
      expect(answer.mode).toBe('recent')
      expect(answer.hits.length).toBeGreaterThanOrEqual(5)
    }
    // One letter: titles starting with it come first.
    expect((await search(viewer, team, 'b')).hits[0]?.title).toBe('BRANTLEY GLASS WORKS')
    expect(ids(await search(viewer, team, '', { types: 'mark', country: 'England' }))).toEqual([brantley])
  })

  it('refuses bad parameters with field errors', async () => {
    const bad: [string, string][] = [
      [`q=${'x'.repeat(201)}`, 'q'], ['limit=51', 'limit'], ['limit=0', 'limit'], ['types=mark,recipes', 'types'],
      ['year=old', 'year'], ['makerId=-3', 'makerId'], ['categoryId=abc', 'categoryId'],
    ]
    for (const [query, field] of bad) {
      const body = expectError(await viewer.get(team.api(`/search?${query}`)), 400)
      expect(Object.keys(body.fieldErrors ?? {}), query).toContain(field)
    }
    const ok = await viewer.get(team.api(`/search?q=${'x'.repeat(200)}&limit=50`))
    expect(ok.status).toBe(200)
  })

  it('keeps teams apart, even with identical words', async () => {
    const mine = await search(viewer, team, 'hallowell pottery zanesford ohio', { limit: 50 })
    expect(ids(mine)).toContain(hallowell)
    expect(ids(mine)).not.toContain(twin)
    const theirs = await search(other.viewer, other, 'hallowell pottery zanesford ohio', { limit: 50 })
    expect(ids(theirs)).toEqual([twin])
    expect(theirs.hits.every(h => h.path.startsWith(`/t/${other.slug}/`))).toBe(true)
    // Someone outside the team is told the team does not exist; signed out is 401.
    const outsider = (await newOwner('Outsider')).person
    expectError(await outsider.get(team.api('/search?q=hallowell')), 404)
    expectError(await new Person().get(team.api('/search?q=hallowell')), 401)
  })

  it('follows creates, edits, restores, deletes, undeletes and purges', async () => {
    const found = (q: string, id: number, yes = true) => eventually(async () => {
      expect(ids(await search(viewer, team, q)).includes(id), `${q} → ${id}`).toBe(yes)
    })
    const id = await createEntry(editor, team, 'marks', { inscriptions: ['QUILLERBY WARE'] })
    await found('quillerby', id)
    expect((await editor.patch(team.api(`/marks/${id}`), { revision: 1, inscriptions: ['PENTWORTH WARE'] })).status).toBe(200)
    await found('pentworth', id)
    await found('quillerby', id, false)
    const restored = await editor.post(team.api(`/marks/${id}/revisions/1/restore`), { revision: 2 })
    expect(restored.status, JSON.stringify(restored.body)).toBe(200)
    await found('quillerby', id)
    await found('pentworth', id, false)
    expect((await editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
    await found('quillerby', id, false)
    expect((await editor.post(team.api(`/marks/${id}/restore`))).status).toBe(200)
    await found('quillerby', id)
    // A maker's new name reaches its marks.
    const renamed = await editor.patch(team.api(`/makers/${maker}`), { revision: 1, name: 'Ormsby Hallowell' })
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200)
    await found('ormsby', hallowell)
    // Notes: added, edited, removed; a purged entry takes its notes with it.
    const noteId = (await team.contributor.post(team.api(`/marks/${id}/notes`), { body: 'Seen at the Tidewell fair' })).body.id as number
    await eventually(async () => expect(ids(await search(viewer, team, 'tidewell'), 'note')).toEqual([noteId]))
    expect((await team.contributor.patch(team.api(`/marks/${id}/notes/${noteId}`), { body: 'Seen at the Marrowby fair' })).status).toBe(200)
    await eventually(async () => expect(ids(await search(viewer, team, 'marrowby'), 'note')).toEqual([noteId]))
    expect(ids(await search(viewer, team, 'tidewell'), 'note')).toEqual([])
    expect((await editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
    // A deleted entry's notes are hidden with it.
    await eventually(async () => expect(ids(await search(viewer, team, 'marrowby'), 'note')).toEqual([]))
    expect((await owner.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(200)
    expect((await editor.post(team.api(`/marks/${id}/restore`))).status).toBe(404)
    await found('quillerby', id, false)
    const removable = (await team.contributor.post(team.api(`/marks/${brantley}/notes`), { body: 'Wexcombe auction' })).body.id as number
    await eventually(async () => expect(ids(await search(viewer, team, 'wexcombe'), 'note')).toEqual([removable]))
    expect((await team.contributor.delete(team.api(`/marks/${brantley}/notes/${removable}`))).status).toBe(200)
    await eventually(async () => expect(ids(await search(viewer, team, 'wexcombe'), 'note')).toEqual([]))
  })

  describe('a second app instance on the same database, whose builds are held back and which keeps one team in memory', () => {
    let second: AppServer
    const viaSecond = async (q: string, on: WikiTeam = team): Promise<Answer> => {
      const res = await fetch(`${second.url}${on.api(`/search?${qs(q)}`)}`, { headers: { cookie: on.viewer.cookieHeader(), accept: 'application/json' } })
      expect(res.status).toBe(200)
      return await res.json() as Answer
    }

    beforeAll(async () => {
      const port = await freePort()
      second = await startAppServer({ port, env: { PUBLIC_URL: `http://127.0.0.1:${port}`, SEARCH_BUILD_DELAY_MS: '1500', SEARCH_MAX_TEAMS: '1' } })
    })
    afterAll(async () => { await second?.stop() })

    it('answers from MariaDB while the index is being built, then from the index', async () => {
      const early = await viaSecond('hallowell pottery')
      expect(early.source).toBe('database')
      expect(early.hits[0]).toMatchObject({ type: 'mark', id: hallowell })
      expect(early.hits[0]!.matched.inscriptions).toEqual(['HALLOWELL', 'POTTERY'])
      expect(ids(await viaSecond('zanesf'))).toEqual([hallowell])
      // No fuzzy matching in the fallback; the index has it once built.
      expect(ids(await viaSecond('halowell zanesfrod'))).toEqual([])
      const { value } = await eventually(async () => {
        const answer = await viaSecond('halowell zanesfrod')
        expect(answer.source).toBe('index')
        return answer
      }, 5000)
      expect(ids(value)[0]).toBe(hallowell)
    })

    it('finds a write made through the first instance within 2 seconds', async () => {
      expect((await viaSecond('hallowell')).source).toBe('index')
      const id = await createEntry(editor, team, 'marks', { inscriptions: ['VELLACOTT & DAUGHTERS'] })
      const { elapsed } = await eventually(async () => expect(ids(await viaSecond('vellacott and daughters'))[0]).toBe(id), 2000)
      expect(elapsed).toBeLessThan(2000)
      // And a delete, the same way.
      expect((await editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
      await eventually(async () => expect(ids(await viaSecond('vellacott'))).toEqual([]), 2000)
    })

    it('drops the least recently used team index over SEARCH_MAX_TEAMS and rebuilds it on demand', async () => {
      expect((await viaSecond('hallowell')).source).toBe('index')
      // The other team's first search starts its build; once it is ready, this team's index is dropped.
      expect((await viaSecond('hallowell', other)).source).toBe('database')
      await eventually(async () => expect((await viaSecond('hallowell', other)).source).toBe('index'), 5000)
      const again = await viaSecond('hallowell pottery')
      expect(again.source).toBe('database')
      expect(ids(again)[0]).toBe(hallowell)
      await eventually(async () => expect((await viaSecond('hallowell')).source).toBe('index'), 5000)
      expect(ids(await viaSecond('hallowell', other))).toEqual([twin])
    })
  })
})
