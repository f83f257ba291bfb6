// Helpers for the team export and import tests: a demo-like fixture team, zips read and written in the test,
// and the normal form two exports are compared in (ids become their rank, the team's address a placeholder).
import { Readable } from 'node:stream'
import { drizzle } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import yauzl from 'yauzl'
import { ZipArchive } from 'archiver'
import { expect } from 'vitest'
import * as schema from '../../server/database/schema'
import { seedDemoReference } from '../../server/database/seed/reference'
import { seedDemoLedger } from '../../server/database/seed/demo-ledger'
import { seedDemoPhotos } from '../../server/database/seed/photos'
import { createLocalStorageDriver } from '../../server/utils/storage/local'
import type { StorageDriver } from '../../server/utils/storage'
import { baseUrl, type Person } from './api'
import { query, teamIdOf } from './db'
import { testStorageDir } from './photos'
import { newWikiTeam, type WikiTeam } from './wiki'

export interface FixtureTeam extends WikiTeam { id: number, userIds: Record<'owner' | 'editor' | 'contributor' | 'viewer', number> }

async function userIdOf(person: Person): Promise<number> {
  const me = await person.get('/api/me')
  return me.body.user.id as number
}

/**
 * A team like the demo team (its reference with revisions and notes, its ledger with trips and items, drawn
 * photos), seeded in-process by the demo seed's own functions, then given history over the API: an edit with
 * links between entries, a restore, a deleted entry, a lookalike pair, notes, a sale with its note, an item
 * photo, buy targets. The photo files go to `storage` (the local folder the test app uses, unless told otherwise).
 */
export async function seedFixtureTeam(name = 'Transfer Source', storage: StorageDriver = createLocalStorageDriver(testStorageDir())): Promise<FixtureTeam> {
  const team = await newWikiTeam(name)
  const id = await teamIdOf(team.slug)
  const userIds = {
    owner: await userIdOf(team.owner), editor: await userIdOf(team.editor), contributor: await userIdOf(team.contributor), viewer: await userIdOf(team.viewer),
  }
  const connection = await mysql.createConnection({ uri: process.env.DATABASE_URL!, timezone: 'Z' })
  try {
    await connection.query('SET time_zone = \'+00:00\'')
    const db = drizzle(connection, { schema, mode: 'default' })
    await db.transaction(async (tx) => {
      await seedDemoReference(tx, id, { editors: [userIds.owner, userIds.editor], noteAuthors: [userIds.contributor, userIds.editor, userIds.owner] })
      await seedDemoLedger(tx, id, { sourcers: [userIds.owner, userIds.editor, userIds.contributor], today: '2026-05-01' })
    })
    await seedDemoPhotos(db, id, userIds.owner, storage, 3)
  }
  finally {
    await connection.end()
  }
  const api = team.api
  const ok = (res: { status: number, body: unknown }, status = 200) => {
    expect(res.status, JSON.stringify(res.body)).toBe(status)
    return res.body as any
  }
  const marks = ok(await team.editor.get(api('/marks?pageSize=5&sort=createdAt'))).items
  const makers = ok(await team.editor.get(api('/makers?pageSize=2&sort=createdAt'))).items
  const categories = ok(await team.editor.get(api('/categories?pageSize=100&sort=createdAt'))).items
  const [first, second] = marks
  // Revision 2: notes that link a maker and another mark, and a lookalike; revision 3 restores revision 1.
  const notes = `Compare with [the other mark](/t/${team.slug}/marks/${second.id}) and [its maker](/t/${team.slug}/makers/${makers[0].id}).`
  const lookalikes = [...first.lookalikes.map((l: any) => ({ markId: l.markId, howToTell: l.howToTell })).filter((l: any) => l.markId !== second.id), { markId: second.id, howToTell: 'The foot ring is glazed on this one.' }]
  ok(await team.editor.patch(api(`/marks/${first.id}`), { revision: first.revision, notes, lookalikes }))
  ok(await team.editor.patch(api(`/marks/${second.id}`), { revision: second.revision, tags: [...second.tags, 'checked'] }))
  ok(await team.editor.post(api(`/marks/${second.id}/revisions/1/restore`), {}))
  ok(await team.contributor.post(api(`/makers/${makers[1].id}/notes`), { body: `Seen beside [this mark](/t/${team.slug}/marks/${first.id}).`, happenedOn: '2026-04-02' }), 201)
  const leaf = categories.find((c: any) => c.parentId !== null && !categories.some((d: any) => d.parentId === c.id))
  const spare = ok(await team.editor.post(api('/categories'), { name: 'Spare shelf', parentId: leaf?.parentId ?? null }), 201)
  ok(await team.editor.delete(api(`/categories/${spare.id}`)))
  // A sale with its note on the mark, and a photo on an item.
  const [open] = ok(await team.owner.get(api('/items?status=in_stock&pageSize=1&sort=id'))).items
  const item = open ?? ok(await team.owner.post(api('/items'), { title: 'Fixture piece', acquiredOn: '2026-03-01', costCents: 400 }), 201)
  const withMark = ok(await team.owner.patch(api(`/items/${item.id}`), { revision: item.revision, markId: first.id }))
  ok(await team.owner.post(api(`/items/${item.id}/sale`), { revision: withMark.revision, salePriceCents: 2400, shippingChargedCents: 500, postageCents: 450, suppliesCents: 50, soldOn: '2026-04-20', note: { onMark: true } }))
  const photos = await query<{ id: number }>('select id from photos where team_id = ? order by id limit 1', [id])
  ok(await team.owner.patch(api(`/photos/${photos[0]!.id}`), { entityType: 'item', entityId: item.id }))
  ok(await team.owner.patch(api('/buy-targets'), { revision: 0, minProfitCents: 800, minRoiPercent: 150, maxDaysToSell: 60 }))
  return { ...team, id, userIds }
}

/** A GET with the person's cookies, the whole body as bytes; `base` is another app instance's address. */
export async function download(person: Person, path: string, base = baseUrl): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const res = await fetch(base + path, { headers: { cookie: person.cookieHeader() } })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

export async function unzip(bytes: Buffer): Promise<Map<string, Buffer>> {
  const zip = await yauzl.fromBufferPromise(bytes, { lazyEntries: true })
  const files = new Map<string, Buffer>()
  for await (const entry of zip.eachEntry()) {
    const chunks: Buffer[] = []
    for await (const chunk of await zip.openReadStreamPromise(entry)) chunks.push(chunk as Buffer)
    files.set(entry.fileName, Buffer.concat(chunks))
  }
  return files
}

export async function zipOf(files: Map<string, Buffer | string>): Promise<Buffer> {
  const zip = new ZipArchive({ zlib: { level: 1 } })
  const chunks: Buffer[] = []
  zip.on('data', (chunk: Buffer) => chunks.push(chunk))
  const ended = new Promise<void>((resolve, reject) => {
    zip.on('end', resolve)
    zip.on('error', reject)
  })
  for (const [name, body] of files) zip.append(Readable.from([Buffer.from(body)]), { name })
  await zip.finalize()
  await ended
  return Buffer.concat(chunks)
}

export function zipForm(bytes: Buffer, name = 'team.zip'): FormData {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'application/zip' }), name)
  return form
}

const COLLECTIONS = ['stores', 'feeProfiles', 'makers', 'materials', 'categories', 'marks', 'revisions', 'notes', 'trips', 'items', 'photos'] as const
const ENTRY_COLLECTION: Record<string, string> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories', item: 'items' }
const SEGMENT_COLLECTION: Record<string, string> = { marks: 'marks', makers: 'makers', materials: 'materials', categories: 'categories' }

/**
 * An export with every id replaced by its rank in its collection (the file lists each collection in id order,
 * and an import keeps that order), links in markdown with the team's address replaced, and the moment of the
 * export dropped. Two exports of the same team content are then equal, whatever ids the databases chose.
 */
export function normaliseExport(doc: any): any {
  const ranks: Record<string, Map<number, number>> = {}
  for (const name of COLLECTIONS) ranks[name] = new Map((doc[name] as { id: number }[]).map((row, i) => [row.id, i + 1]))
  const rank = (collection: string, id: number | null) => {
    if (id === null || id === undefined) return id
    const r = ranks[collection]!.get(id)
    if (r === undefined) throw new Error(`${collection} ${id} is not in the export`)
    return `#${r}`
  }
  const linkPattern = new RegExp(`/t/${doc.team.slug}/(marks|makers|materials|categories)/(\\d+)`, 'g')
  const text = (value: string) => value.replace(linkPattern, (_, segment: string, id: string) => `/t/TEAM/${segment}/${rank(SEGMENT_COLLECTION[segment]!, Number(id))}`)
  const entryContent = (type: string, row: any) => {
    const out = { ...row }
    for (const key of ['notes', 'recognition', 'damage', 'cautions']) if (typeof out[key] === 'string') out[key] = text(out[key])
    if (type === 'mark') {
      if ('makerId' in out) out.makerId = rank('makers', out.makerId)
      if (out.materialIds) out.materialIds = out.materialIds.map((id: number) => rank('materials', id))
      if (out.categoryIds) out.categoryIds = out.categoryIds.map((id: number) => rank('categories', id))
      if (out.lookalikes) out.lookalikes = out.lookalikes.map((l: any) => ({ ...l, markId: rank('marks', l.markId), howToTell: text(l.howToTell) }))
    }
    if (type === 'category' && 'parentId' in out) out.parentId = rank('categories', out.parentId)
    return out
  }
  const withId = (collection: string, row: any) => ({ ...row, id: rank(collection, row.id) })
  return {
    ...doc,
    exportedAt: undefined,
    team: { ...doc.team, name: undefined, slug: undefined },
    stores: doc.stores.map((r: any) => withId('stores', r)),
    feeProfiles: doc.feeProfiles.map((r: any) => withId('feeProfiles', r)),
    makers: doc.makers.map((r: any) => withId('makers', entryContent('maker', r))),
    materials: doc.materials.map((r: any) => withId('materials', entryContent('material', r))),
    categories: doc.categories.map((r: any) => withId('categories', entryContent('category', r))),
    marks: doc.marks.map((r: any) => withId('marks', entryContent('mark', r))),
    lookalikes: doc.lookalikes.map((l: any) => ({ markLowId: rank('marks', l.markLowId), markHighId: rank('marks', l.markHighId), howToTell: text(l.howToTell) })),
    links: doc.links.map((l: any) => ({ ...l, fromId: rank(ENTRY_COLLECTION[l.fromType]!, l.fromId), toId: rank(ENTRY_COLLECTION[l.toType]!, l.toId) })),
    revisions: doc.revisions.map((r: any) => ({ ...withId('revisions', r), entryId: rank(ENTRY_COLLECTION[r.entryType]!, r.entryId), snapshot: entryContent(r.entryType, r.snapshot) })),
    notes: doc.notes.map((n: any) => ({ ...withId('notes', n), entryId: rank(ENTRY_COLLECTION[n.entryType]!, n.entryId), body: text(n.body) })),
    trips: doc.trips.map((t: any) => ({ ...withId('trips', t), storeId: rank('stores', t.storeId) })),
    items: doc.items.map((it: any) => ({
      ...withId('items', it),
      categoryId: rank('categories', it.categoryId), markId: rank('marks', it.markId), makerId: rank('makers', it.makerId), materialId: rank('materials', it.materialId),
      tripId: rank('trips', it.tripId), storeId: rank('stores', it.storeId), feeProfileId: rank('feeProfiles', it.feeProfileId),
    })),
    photos: doc.photos.map((p: any) => ({
      ...withId('photos', p),
      entityId: p.entityType ? rank(ENTRY_COLLECTION[p.entityType]!, p.entityId) : null,
      files: { display: p.files.display.replace(/^photos\/\d+\//, `photos/${rank('photos', p.id)}/`), thumb: p.files.thumb.replace(/^photos\/\d+\//, `photos/${rank('photos', p.id)}/`) },
    })),
  }
}
