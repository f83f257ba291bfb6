// Another team's rows through one's own team: a full member (the owner) of team A names team B's rows in
// A's address. Every route of tests/support/route-rules.ts whose path names a row answers 404, with all of
// B's ids and with each id on its own; every filter naming B's rows answers as for an id that exists nowhere
// (or 404 where the id is looked up); and no answer of A ever carries B's word, which is in all of B's names.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, type ApiResponse } from '../support/api'
import { closeTestDb } from '../support/db'
import { photoForm } from '../support/photos'
import { buildTeamFixture, smallPng, type TeamFixture } from '../support/route-fixtures'
import { routeContext, ROUTE_RULES, type Builder, type QueryIdSet } from '../support/route-rules'

afterAll(closeTestDb)

const ID_PARAMS = /^:(id|noteId|rev|userId)$/
/** An id that no table reaches in a test run. */
const UNKNOWN_ID = 2_000_000_000

const teamRules = Object.entries(ROUTE_RULES).filter(([key]) => key.split(' ')[1]!.startsWith('/api/teams/:team'))
const idRules = teamRules.filter(([key]) => key.split(' ')[1]!.split('/').some(s => ID_PARAMS.test(s)))

/** The segments of a built path (query left off). */
const segments = (path: string) => path.split('?')[0]!.split('/')

/** The built path with the segment of `param` in the template replaced by `value`. */
function withSegment(path: string, template: string, param: string, value: string): string {
  const [pathname, query] = path.split('?')
  const parts = pathname!.split('/')
  parts[template.split('/').indexOf(param)] = value
  return parts.join('/') + (query === undefined ? '' : `?${query}`)
}

function withQuery(path: string, params: Record<string, string | number>): string {
  const url = new URL(path, 'http://x')
  for (const [name, value] of Object.entries(params)) url.searchParams.set(name, String(value))
  return url.pathname + url.search
}

/** The answer without what echoes the request or changes from call to call. */
function comparable(res: ApiResponse): unknown {
  if (!res.body || typeof res.body !== 'object') return res.body
  const { filters: _filters, tookMs: _tookMs, source: _source, ...rest } = res.body
  return rest
}

/** The answer as lower-case text (the team's word is in names as WORD, Word and word). */
const text = (res: ApiResponse) => (typeof res.body === 'string' ? res.body : JSON.stringify(res.body)).toLowerCase()

describe('object isolation between teams', async () => {
  const a: TeamFixture = await buildTeamFixture({ allRoles: false })
  const b: TeamFixture = await buildTeamFixture({ allRoles: false })

  it('finds the routes that name rows, photos, notes, revisions and members among them', () => {
    const templates = idRules.map(([key]) => key)
    for (const expected of [
      'GET /api/teams/:team/photos/:id/:size', 'PATCH /api/teams/:team/marks/:id/notes/:noteId', 'GET /api/teams/:team/makers/:id/revisions/:rev',
      'POST /api/teams/:team/categories/:id/restore', 'POST /api/teams/:team/items/:id/status', 'POST /api/teams/:team/items/:id/sale',
      'GET /api/teams/:team/items/:id/listing-draft', 'POST /api/teams/:team/members/:userId/unlock', 'DELETE /api/teams/:team/invitations/:id',
    ]) expect(templates).toContain(expected)
  })

  for (const [key, rule] of idRules) {
    it(`${key}: another team's ids are not found`, async () => {
      const [method, template] = key.split(' ') as [string, string]
      const forms: Builder[] = [rule.build, ...(rule.purge ? [rule.purge.build] : [])]
      for (const build of forms) {
        const inB = await build(routeContext(b, 'owner'))
        const inA = await build(routeContext(a, 'owner'))
        const through = inB.path.replace(`/api/teams/${b.slug}/`, `/api/teams/${a.slug}/`)
        expectError(await a.owner.request(method, through, inB.body), 404)
        for (const param of template.split('/').filter(s => ID_PARAMS.test(s))) {
          const at = template.split('/').indexOf(param)
          const theirs = segments(inB.path)[at]!
          // Revision numbers count within an entry: B's rev 1 is A's rev 1.
          if (theirs === segments(inA.path)[at]) continue
          const mixed = withSegment(inA.path, template, param, theirs)
          expectError(await a.owner.request(method, mixed, inA.body), 404)
        }
        // The same request with A's own ids succeeds: the 404s above are the ids', not the request's.
        const own = await a.owner.request(method, inA.path, inA.body)
        expect(own.status, `${key} with A's own ids: ${JSON.stringify(own.body)?.slice(0, 300)}`).toBe(inA.status)
      }
    })
  }

  for (const [key, rule] of teamRules.filter(([, r]) => r.queryIds)) {
    it(`${key}: filters naming another team's rows show nothing of it`, async () => {
      const base = (await rule.build(routeContext(a, 'owner'))).path
      const theirs = rule.queryIds!(b)
      const ours = rule.queryIds!(a)
      expect(theirs.length).toBeGreaterThan(0)
      for (const [i, set] of theirs.entries()) {
        const label = `${key} ${JSON.stringify(set.params)}`
        const res = await a.owner.get(withQuery(base, set.params))
        if (set.foreign === 404) {
          expectError(res, 404)
          expect((await a.owner.get(withQuery(base, ours[i]!.params))).status, `${label} with A's ids`).toBe(200)
          continue
        }
        const unknown = await a.owner.get(withQuery(base, unknownIds(set)))
        expect(res.status, label).toBe(unknown.status)
        expect(comparable(res), label).toEqual(comparable(unknown))
        expect(text(res), label).not.toContain(b.word)
        // A's own ids do find something: the filter is applied, so the equality above has teeth.
        const own = await a.owner.get(withQuery(base, ours[i]!.params))
        expect(comparable(own), `${label} with A's ids`).not.toEqual(comparable(unknown))
      }
    })
  }

  it('never shows B\'s word in any of A\'s answers, while B\'s own answers carry it', async () => {
    const carried: string[] = []
    for (const [key, rule] of teamRules) {
      if (!key.startsWith('GET ') || rule.fresh) continue
      const ours = await rule.build(routeContext(a, 'owner'))
      const res = await a.owner.get(ours.path)
      expect(res.status, key).toBe(ours.status)
      expect(text(res), key).not.toContain(b.word)
      const theirs = await rule.build(routeContext(b, 'owner'))
      if (text(await b.owner.get(theirs.path)).includes(b.word)) carried.push(key.split(' ')[1]!.replace('/api/teams/:team', ''))
    }
    // The word is there to be found: these answers of B show it, so its absence from A's answers means something.
    expect(carried).toEqual(expect.arrayContaining([
      '', '/members', '/marks', '/makers/:id', '/materials/:id/notes', '/categories/:id/revisions/:rev', '/entries/lookup', '/search',
      '/offline/reference', '/stores', '/trips/:id', '/fee-profiles', '/items', '/items/:id/listing-draft', '/exports/items.csv',
      '/reports/:dimension', '/sourcing-sheet', '/outcomes', '/buy-check',
    ]))
  })

  it('does not find B\'s words by text in A: search, the link picker, the items', async () => {
    for (const path of ['/search?q=', '/entries/lookup?q=', '/items?q=']) {
      const mine = await b.owner.get(b.api(`${path}${b.word}`))
      expect(text(mine), `${path} in B`).toContain(b.word)
      const res = await a.owner.get(a.api(`${path}${b.word}`))
      expect(res.status).toBe(200)
      expect(text(res), `${path} in A`).not.toContain(b.word)
    }
    const search = await a.owner.get(a.api(`/search?q=${b.word}`))
    expect(search.body.hits).toEqual([])
  })

  it('refuses B\'s rows named in bodies: photo attachments, sales, status changes, the calculator, entry links', async () => {
    expectError(await a.owner.request('POST', a.api('/uploads'), await uploadForm({ entityType: 'item', entityId: b.rows.item })), 404)
    for (const target of [{ entityType: 'item', entityId: b.rows.item }, { entityType: 'mark', entityId: b.rows.mark }, { entityType: 'maker', entityId: b.rows.maker }]) {
      expectError(await a.owner.patch(a.api(`/photos/${a.rows.photo}`), target), 404)
    }
    const item = (await a.owner.post(a.api('/items'), { title: 'Isolation piece', acquiredOn: '2026-03-01', costCents: 100 })).body.id
    expect(expectError(await a.owner.post(a.api(`/items/${item}/sale`), { salePriceCents: 900, feeProfileId: b.rows.feeProfile }), 400).fieldErrors).toHaveProperty('feeProfileId')
    expect(expectError(await a.owner.post(a.api(`/items/${item}/status`), { to: 'listed', on: '2026-03-02', feeProfileId: b.rows.feeProfile }), 400).fieldErrors).toHaveProperty('feeProfileId')
    expect(expectError(await a.owner.post(a.api('/calculator'), { expectedSaleCents: 900, feeProfileId: b.rows.feeProfile }), 400).fieldErrors).toHaveProperty('feeProfileId')
    const markPatches: Record<string, unknown>[] = [
      { makerId: b.rows.maker }, { materialIds: [b.rows.material] }, { categoryIds: [b.rows.category] }, { lookalikes: [{ markId: b.rows.mark, howToTell: 'x' }] },
    ]
    for (const patch of markPatches) {
      const res = await a.owner.patch(a.api(`/marks/${a.rows.mark}`), { revision: 1, ...patch })
      expect(Object.keys(expectError(res, 400).fieldErrors ?? {}), JSON.stringify(patch)).toHaveLength(1)
    }
    expect(expectError(await a.owner.post(a.api('/categories'), { name: 'Borrowed parent', parentId: b.rows.category }), 400).fieldErrors).toHaveProperty('parentId')
    expect(expectError(await a.owner.post(a.api('/trips'), { storeId: b.rows.store, tripDate: '2026-03-01' }), 400).fieldErrors).toHaveProperty('storeId')
    expect(expectError(await a.owner.post(a.api('/trips'), { storeId: a.rows.store, tripDate: '2026-03-01', memberIds: [b.userIds.owner] }), 400).fieldErrors).toHaveProperty('memberIds')
    for (const field of ['sourcedBy', 'listedBy']) {
      const res = await a.owner.post(a.api('/items'), { title: 'Borrowed person', acquiredOn: '2026-03-01', [field]: b.userIds.owner })
      expect(expectError(res, 400).fieldErrors, field).toHaveProperty(field)
    }
    // Nothing of B changed hands.
    expect((await b.owner.get(b.api(`/items/${b.rows.item}`))).body.photos ?? []).not.toContainEqual(expect.objectContaining({ id: a.rows.photo }))
    expect((await a.owner.get(a.api(`/marks/${a.rows.mark}`))).body.revision).toBe(1)
  })

  it('sends A\'s phone nothing of B for a download cursor that B\'s phone was given', async () => {
    const theirs = await b.owner.get(b.api('/offline/reference'))
    expect(text(theirs)).toContain(b.word)
    const res = await a.owner.get(a.api(`/offline/reference?since=${encodeURIComponent(theirs.body.cursor)}`))
    expect(res.status).toBe(200)
    expect(text(res)).not.toContain(b.word)
  })

  it('reads dating clues from the words alone: the same answer in every team', async () => {
    const words = encodeURIComponent('MADE IN ENGLAND DISHWASHER SAFE')
    const inA = await a.owner.get(a.api(`/dating?text=${words}`))
    const inB = await b.owner.get(b.api(`/dating?text=${words}`))
    expect(inA.status).toBe(200)
    expect(inA.body).toEqual(inB.body)
    expect(text(inA)).not.toContain(b.word)
  })
})

function unknownIds(set: QueryIdSet): Record<string, number> {
  return Object.fromEntries(Object.keys(set.params).map(name => [name, UNKNOWN_ID]))
}

async function uploadForm(fields: Record<string, string | number>): Promise<FormData> {
  return photoForm(await smallPng(), { name: 'base.png', type: 'image/png', fields })
}
