// Team export and import: a demo-like team goes out as a zip and into a new, empty team; the second team's
// export equals the first one's (ids and the team's address aside), photo bytes included; search finds the
// imported marks; full teams, broken files and the wrong people are refused, and a refused import writes nothing.
import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { expectError, newOwner, Person, uniqueTeamName } from '../support/api'
import { closeTestDb, exec, query, teamIdOf } from '../support/db'
import { testStorageDir } from '../support/photos'
import { download, normaliseExport, seedFixtureTeam, unzip, zipForm, zipOf, type FixtureTeam } from '../support/transfer'

let source: FixtureTeam
let zipBytes: Buffer
let files: Map<string, Buffer>
let doc: any

/** A new team of the source's owner, with the source's other members in the same roles (matched by e-mail). */
async function emptyTeamOfOwner(name: string, withMembers: boolean): Promise<{ slug: string, id: number }> {
  const res = await source.owner.post('/api/teams', { name: uniqueTeamName(name) })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const slug = res.body.team.slug as string
  const id = await teamIdOf(slug)
  if (withMembers) {
    for (const role of ['editor', 'contributor', 'viewer'] as const) {
      await exec('insert into memberships (team_id, user_id, role) values (?, ?, ?)', [id, source.userIds[role], role])
    }
  }
  return { slug, id }
}

const teamRows = async (teamId: number) => {
  const tables = ['marks', 'makers', 'materials', 'categories', 'items', 'stores', 'fee_profiles', 'sourcing_trips', 'entry_notes', 'entry_revisions', 'photos', 'search_changes', 'mark_inscriptions']
  const out: Record<string, number> = {}
  for (const table of tables) out[table] = Number((await query<{ n: number }>(`select count(*) as n from ${table} where team_id = ?`, [teamId]))[0]!.n)
  return out
}
const storedFiles = (teamId: number) => {
  const dir = join(testStorageDir(), 'teams', String(teamId))
  if (!existsSync(dir)) return 0
  return readdirSync(dir, { recursive: true }).filter(f => /\.(webp|jpg|png)$/.test(String(f))).length
}
const importInto = (person: Person, slug: string, bytes: Buffer) => person.request('POST', `/api/teams/${slug}/imports/team`, zipForm(bytes))

beforeAll(async () => {
  source = await seedFixtureTeam()
  const res = await download(source.owner, source.api('/exports/team.zip'))
  expect(res.status).toBe(200)
  expect(res.headers.get('content-type')).toBe('application/zip')
  expect(res.headers.get('content-disposition')).toMatch(new RegExp(`attachment; filename="${source.slug}-team-\\d{4}-\\d{2}-\\d{2}\\.zip"`))
  zipBytes = res.bytes
  files = await unzip(zipBytes)
  doc = JSON.parse(files.get('team.json')!.toString('utf8'))
}, 180_000)
afterAll(async () => {
  await closeTestDb()
})

describe('team export', () => {
  it('holds the whole team: settings, reference with history, ledger, people and photo files', () => {
    expect(doc).toMatchObject({ format: 'tallymark-team-export', version: 1, team: { slug: source.slug } })
    for (const name of ['makers', 'materials', 'categories', 'marks', 'lookalikes', 'links', 'revisions', 'notes', 'stores', 'feeProfiles', 'trips', 'items', 'photos']) {
      expect(doc[name].length, name).toBeGreaterThan(0)
    }
    expect(doc.ledgerSettings.conditionScale.length).toBeGreaterThan(1)
    expect(doc.buyTargets).toMatchObject({ minProfitCents: 800, minRoiBp: 15_000, maxDaysToSell: 60 })
    expect(doc.revisions.some((r: any) => r.action === 'restore')).toBe(true)
    expect(doc.categories.some((c: any) => c.deletedAt !== null)).toBe(true)
    expect(doc.items.some((i: any) => i.statusHistory.length > 1)).toBe(true)
    expect(doc.trips.some((t: any) => t.memberIds.length > 0)).toBe(true)
    expect(doc.people.map((p: any) => p.email).sort()).toEqual([source.owner.email, source.editor.email, source.contributor.email, source.viewer.email].sort())
    // Every photo's two copies are in the zip, byte for byte what storage holds.
    expect(doc.photos.some((p: any) => p.entityType === 'item')).toBe(true)
    for (const photo of doc.photos) {
      expect(files.get(photo.files.display)?.length, photo.files.display).toBeGreaterThan(0)
      expect(files.get(photo.files.thumb)?.length, photo.files.thumb).toBeGreaterThan(0)
    }
    expect([...files.keys()].sort()).toEqual(['team.json', ...doc.photos.flatMap((p: any) => [p.files.display, p.files.thumb])].sort())
  })

  it('is for owners only; other teams see no such team', async () => {
    expectError(await source.editor.get(source.api('/exports/team.zip')), 403)
    expectError(await source.viewer.get(source.api('/exports/team.zip')), 403)
    const outsider = await newOwner(uniqueTeamName('Outsider'))
    expectError(await outsider.person.get(source.api('/exports/team.zip')), 404)
    expectError(await importInto(outsider.person, source.slug, zipBytes), 404)
    expectError(await new Person().get(source.api('/exports/team.zip')), 401)
  })
})

describe('team import', () => {
  it('fills an empty team so that its export equals the source\'s, photos byte for byte, and search finds its marks', async () => {
    const target = await emptyTeamOfOwner('Transfer Target', true)
    // A report read while the team is empty is not answered again once the import has filled it.
    const emptyReport = await source.owner.get(`/api/teams/${target.slug}/reports/category`)
    expect(emptyReport.body.totals.bought).toBe(0)
    const res = await importInto(source.owner, target.slug, zipBytes)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const filledReport = await source.owner.get(`/api/teams/${target.slug}/reports/category`)
    expect(filledReport.body.totals.bought).toBe(doc.items.length)
    expect(res.body.imported).toMatchObject({ marks: doc.marks.length, items: doc.items.length, photos: doc.photos.length, revisions: doc.revisions.length })
    expect(res.body.people).toEqual({ matched: 4, toImporter: 0 })

    const again = await download(source.owner, `/api/teams/${target.slug}/exports/team.zip`)
    expect(again.status).toBe(200)
    const copyFiles = await unzip(again.bytes)
    const copy = JSON.parse(copyFiles.get('team.json')!.toString('utf8'))
    expect(copy.team.slug).toBe(target.slug)
    // New ids everywhere (the target's rows are its own), the same content in the same order.
    expect(copy.marks.map((m: any) => m.id)).not.toEqual(doc.marks.map((m: any) => m.id))
    expect(normaliseExport(copy)).toEqual(normaliseExport(doc))
    // Links in markdown now point into the new team.
    const linked = copy.marks.find((m: any) => m.notes.includes('[the other mark]'))
    expect(linked.notes).toContain(`/t/${target.slug}/marks/`)
    expect(linked.notes).not.toContain(source.slug)
    doc.photos.forEach((photo: any, i: number) => {
      const other = copy.photos[i]
      expect(copyFiles.get(other.files.display)!.equals(files.get(photo.files.display)!), photo.files.display).toBe(true)
      expect(copyFiles.get(other.files.thumb)!.equals(files.get(photo.files.thumb)!), photo.files.thumb).toBe(true)
    })
    const served = await download(source.owner, `/api/teams/${target.slug}/photos/${copy.photos[0].id}/display`)
    expect(served.bytes.equals(files.get(doc.photos[0].files.display)!)).toBe(true)

    const mark = copy.marks.find((m: any) => m.deletedAt === null)
    const found = await source.viewer.get(`/api/teams/${target.slug}/search?q=${encodeURIComponent(mark.inscriptions[0])}&types=mark`)
    expect(found.status, JSON.stringify(found.body)).toBe(200)
    expect(found.body.hits.map((h: any) => h.id)).toContain(mark.id)
    const changes = await query<{ n: number }>('select count(*) as n from search_changes where team_id = ? and entity_type = \'mark\'', [target.id])
    expect(Number(changes[0]!.n)).toBe(copy.marks.length)

    // The target is no longer empty: a second import is refused, and changes nothing.
    const before = await teamRows(target.id)
    const full = expectError(await importInto(source.owner, target.slug, zipBytes), 409)
    expect(full.message).toMatch(/already has .*marks.*empty team/)
    expect(await teamRows(target.id)).toEqual(before)
  })

  it('gives what people outside the team wrote to the importing owner', async () => {
    const target = await emptyTeamOfOwner('Transfer Alone', false)
    const res = await importInto(source.owner, target.slug, zipBytes)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.people).toEqual({ matched: 1, toImporter: 3 })
    const authors = await query<{ author_id: number }>('select distinct author_id from entry_notes where team_id = ?', [target.id])
    expect(authors.map(a => Number(a.author_id))).toEqual([source.userIds.owner])
    const sourceAuthors = await query<{ n: number }>('select count(distinct author_id) as n from entry_notes where team_id = ?', [source.id])
    expect(Number(sourceAuthors[0]!.n)).toBeGreaterThan(1)
  })

  it('refuses broken zips, bad JSON and broken references with a 400 that says what is wrong, writing nothing', async () => {
    const target = await emptyTeamOfOwner('Transfer Refused', true)
    const empty = await teamRows(target.id)
    const withJson = (json: string) => zipOf(new Map([['team.json', json]]))
    const broken = doc.items.findIndex((i: any) => i.markId === null)
    const badRef = structuredClone(doc)
    badRef.items[broken].markId = 987_654_321
    // The last photo's thumbnail is not an image: the photos before it were stored already, and must go again.
    const junkPhoto = new Map<string, Buffer | string>(files)
    junkPhoto.set(doc.photos.at(-1).files.thumb, Buffer.from('not an image at all'))
    const cases: [string, Buffer, RegExp, string?][] = [
      ['not a zip', Buffer.from('PK this is not a zip archive'), /not a zip archive/],
      ['no team.json', await zipOf(new Map([['notes.txt', 'hello']])), /no team\.json/],
      ['bad JSON', await withJson('{"format": "tallymark-team-export", '), /not valid JSON/],
      ['another format', await withJson(JSON.stringify({ ...doc, format: 'something-else' })), /not a Tallymark team export/, 'format'],
      ['a missing field', await withJson(JSON.stringify({ ...doc, items: undefined })), /items/, 'items'],
      ['a reference to nothing', await withJson(JSON.stringify(badRef)), /No mark with id 987654321 in the file/, `items.${broken}.markId`],
      ['a photo file missing', await zipOf(new Map([...files].filter(([name]) => name !== doc.photos[0].files.display))), /has no photos\//],
      ['a photo that is not an image', await zipOf(junkPhoto), /is not an image/],
    ]
    for (const [what, bytes, message, field] of cases) {
      const body = expectError(await importInto(source.owner, target.slug, bytes), 400, message)
      if (field) expect(Object.keys(body.fieldErrors ?? {}), what).toContain(field)
      expect(await teamRows(target.id), what).toEqual(empty)
      expect(storedFiles(target.id), what).toBe(0)
    }
    const noFile = new FormData()
    noFile.append('other', 'x')
    expectError(await source.owner.request('POST', `/api/teams/${target.slug}/imports/team`, noFile), 400, /Choose the team export/)
  })

  it('is for owners only, and only owners see it on the Members page', async () => {
    const target = await emptyTeamOfOwner('Transfer Roles', true)
    expectError(await importInto(source.editor, target.slug, zipBytes), 403)
    expect((await teamRows(target.id)).marks).toBe(0)
    const page = async (person: Person) => (await person.request('GET', `/t/${target.slug}/members`, undefined, { accept: 'text/html' })).body as string
    const ownerPage = await page(source.owner)
    expect(ownerPage).toContain('Download team export')
    expect(ownerPage).toContain(`href="/api/teams/${target.slug}/exports/team.zip"`)
    expect(ownerPage).toContain('Import into this empty team')
    expect(await page(source.editor)).not.toContain('Download team export')
  })
})
