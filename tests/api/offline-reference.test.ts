// GET /api/teams/<team>/offline/reference: the phone's copy of the reference. A full snapshot with the
// wiki's content (inscriptions, look-alikes from both sides, notes, thumbnails) and nothing of the ledger;
// then only changes since the cursor, deletions included; compressed when the client accepts it; members only.
import { request } from 'node:http'
import { gunzipSync, brotliDecompressSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { OfflineDeviceIndex } from '../../shared/offline/device-index'
import type { OfflineReferenceResponse } from '../../shared/offline/types'
import { baseUrl, expectError, newMember, newOwner, Person, uniqueTeamName } from '../support/api'
import { photoForm } from '../support/photos'

let owner: Person
let slug: string
const ids: Record<string, number> = {}

async function create(path: string, body: Record<string, unknown>) {
  const res = await owner.post(`/api/teams/${slug}/${path}`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

/** The raw response: status, headers and body bytes as sent. */
function raw(path: string, person: Person, encoding: string): Promise<{ status: number, headers: Record<string, string | string[] | undefined>, body: Buffer }> {
  return new Promise((resolve, reject) => {
    const req = request(baseUrl + path, { headers: { 'cookie': person.cookieHeader(), 'accept-encoding': encoding, 'accept': 'application/json' } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
    })
    req.on('error', reject)
    req.end()
  })
}

beforeAll(async () => {
  const registered = await newOwner(uniqueTeamName('Offline Reference'))
  owner = registered.person
  slug = registered.team.slug
  ids.maker = await create('makers', { name: 'Ostrand Works', otherNames: ['Ostrand & Co'], country: 'England' })
  ids.material = await create('materials', { name: 'Ironstone' })
  ids.category = await create('categories', { name: 'Jugs' })
  ids.a = await create('marks', { inscriptions: ['OSTRAND WARE', 'ENGLAND'], makerId: ids.maker, materialIds: [ids.material], categoryIds: [ids.category] })
  ids.b = await create('marks', { inscriptions: ['OSTRAND WARF'] })
  const patched = await owner.patch(`/api/teams/${slug}/marks/${ids.b}`, { revision: 1, lookalikes: [{ markId: ids.a, howToTell: 'F, not E.' }] })
  expect(patched.status).toBe(200)
  expect((await owner.post(`/api/teams/${slug}/marks/${ids.a}/notes`, { body: 'A pair seen at the fair.' })).status).toBe(201)
  const jpeg = await sharp({ create: { width: 200, height: 160, channels: 3, background: '#b4681c' } }).jpeg().toBuffer()
  const up = await owner.request('POST', `/api/teams/${slug}/uploads`, photoForm(jpeg, { fields: { entityType: 'mark', entityId: ids.a } }))
  expect(up.status, JSON.stringify(up.body)).toBe(201)
  ids.photo = up.body.id
  // A ledger item with a price: it must not travel with the reference.
  const item = await owner.post(`/api/teams/${slug}/items`, { title: 'Ostrand jug', markId: ids.a, costCents: 1234, acquiredOn: '2026-03-14' })
  expect(item.status, JSON.stringify(item.body)).toBe(201)
})

describe('offline reference', () => {
  it('sends the whole reference the first time, with look-alikes, notes and thumbnails, and no ledger figures', async () => {
    const res = await owner.get(`/api/teams/${slug}/offline/reference`)
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('private, no-store')
    const body = res.body
    expect(body.full).toBe(true)
    expect(body.format).toBe(1)
    expect(body.cursor).toMatch(/^v1\.\d+\.\d+$/)
    expect(body.marks.map((m: { id: number }) => m.id).sort()).toEqual([ids.a, ids.b].sort())
    const a = body.marks.find((m: { id: number }) => m.id === ids.a)
    expect(a).toMatchObject({ inscriptions: ['OSTRAND WARE', 'ENGLAND'], makerId: ids.maker, materialIds: [ids.material], categoryIds: [ids.category], lookalikes: [{ markId: ids.b, howToTell: 'F, not E.' }] })
    expect(body.makers).toEqual([expect.objectContaining({ id: ids.maker, name: 'Ostrand Works', otherNames: ['Ostrand & Co'] })])
    expect(body.materials).toHaveLength(1)
    expect(body.categories).toHaveLength(1)
    expect(body.notes).toEqual([expect.objectContaining({ entryType: 'mark', entryId: ids.a, body: 'A pair seen at the fair.', authorName: 'Owner Person' })])
    expect(body.thumbs.mark).toEqual([[ids.a, ids.photo]])
    expect(JSON.stringify(body)).not.toMatch(/costCents|salePrice|Ostrand jug/)
    // The phone that has the thumbnail list already is not sent it again.
    const again = await owner.get(`/api/teams/${slug}/offline/reference?thumbs=${body.thumbs.hash}`)
    expect(again.body.thumbs).toBeUndefined()
  })

  it('sends only the changes since the cursor, deletions included', async () => {
    const first = (await owner.get(`/api/teams/${slug}/offline/reference`)).body
    // Changes of the last 10 s are not behind the cursor yet, so what was written above comes again: harmless.
    const edited = await owner.patch(`/api/teams/${slug}/marks/${ids.a}`, { revision: 1, inscriptions: ['OSTRAND WARE', 'ENGLAND', 'IRONSTONE'] })
    expect(edited.status, JSON.stringify(edited.body)).toBe(200)
    expect((await owner.delete(`/api/teams/${slug}/categories/${ids.category}`)).status).toBe(200)
    const delta = (await owner.get(`/api/teams/${slug}/offline/reference?since=${encodeURIComponent(first.cursor)}&thumbs=${first.thumbs.hash}`)).body
    expect(delta.full).toBe(false)
    expect(delta.marks.find((m: { id: number }) => m.id === ids.a).inscriptions).toEqual(['OSTRAND WARE', 'ENGLAND', 'IRONSTONE'])
    expect(delta.categories).toEqual([])
    expect(delta.removed.category).toEqual([ids.category])
    expect(delta.thumbs).toBeUndefined()
    // A cursor that is not one of ours gets everything.
    expect((await owner.get(`/api/teams/${slug}/offline/reference?since=garbage`)).body.full).toBe(true)
    expect((await owner.get(`/api/teams/${slug}/offline/reference?since=v1.999999999.${Date.now()}`)).body.full).toBe(true)
    expect((await owner.get(`/api/teams/${slug}/offline/reference?since=v1.1.${Date.now() - 2 * 24 * 3600 * 1000}`)).body.full).toBe(true)
  })

  it('is compressed with brotli or gzip when the client accepts it', async () => {
    const br = await raw(`/api/teams/${slug}/offline/reference`, owner, 'gzip, deflate, br')
    expect(br.status).toBe(200)
    expect(br.headers['content-encoding']).toBe('br')
    expect(br.headers.vary).toMatch(/Accept-Encoding/i)
    const fromBr = JSON.parse(brotliDecompressSync(br.body).toString('utf8'))
    expect(fromBr.marks).toHaveLength(2)
    const gz = await raw(`/api/teams/${slug}/offline/reference`, owner, 'gzip')
    expect(gz.headers['content-encoding']).toBe('gzip')
    expect(JSON.parse(gunzipSync(gz.body).toString('utf8')).marks).toHaveLength(2)
    const plain = await raw(`/api/teams/${slug}/offline/reference`, owner, 'identity')
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(br.body.length).toBeLessThan(plain.body.length)
  })

  it('lets the phone find what the server finds, in the same order', async () => {
    for (const [name, country] of [['Ostrander Pottery', 'England'], ['Ostrava Glass', 'Czechia'], ['Westrand Ceramics', 'Germany']] as const) {
      const maker = await create('makers', { name, country })
      await create('marks', { inscriptions: [`${name.toUpperCase()} CO`, 'MADE IN ' + country.toUpperCase()], makerId: maker, country })
    }
    const snapshot = (await owner.get(`/api/teams/${slug}/offline/reference`)).body as OfflineReferenceResponse
    const phone = new OfflineDeviceIndex(slug)
    phone.put('maker', snapshot.makers)
    phone.put('material', snapshot.materials)
    phone.put('category', snapshot.categories)
    phone.put('mark', snapshot.marks)
    phone.put('note', snapshot.notes)
    for (let i = 0; (await owner.get(`/api/teams/${slug}/search?q=ostrand`)).body.source !== 'index'; i++) {
      if (i > 200) throw new Error('The search index was not ready within 20 s.')
      await new Promise(r => setTimeout(r, 100))
    }
    for (const q of ['ostrand', 'ostrnd ware', 'ostra', 'made in england', 'ironstone', 'pair fair', 'westrand ceramic', 'ware']) {
      const server = (await owner.get(`/api/teams/${slug}/search?q=${encodeURIComponent(q)}&limit=20`)).body as { hits: { type: string, id: number, title: string }[] }
      const device = phone.search(q, { limit: 20 })
      expect(device.source).toBe('device')
      expect(device.hits.map(h => `${h.type}:${h.id} ${h.title}`), q).toEqual(server.hits.map(h => `${h.type}:${h.id} ${h.title}`))
    }
  })

  it('is for members of the team only', async () => {
    expectError(await new Person().get(`/api/teams/${slug}/offline/reference`), 401)
    const stranger = await newOwner(uniqueTeamName('Stranger'))
    expectError(await stranger.person.get(`/api/teams/${slug}/offline/reference`), 404)
    const viewer = await newMember(owner, slug, 'viewer')
    expect((await viewer.person.get(`/api/teams/${slug}/offline/reference`)).status).toBe(200)
    expectError(await owner.get(`/api/teams/${slug}/offline/reference?since=${'x'.repeat(200)}`), 400)
  })
})
