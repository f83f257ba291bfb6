// An entry's page, read in this test process as Nitro would run it (tests/support/in-process.ts) against a
// database that counts the statements sent: one statement a read, one again while the page is cached here;
// the same JSON as the list's loader and presenter build from many queries; and, with the app server as a
// second instance writing, never a page the other instance's write has changed.
import { drizzle } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { closeTestDb, query, teamIdOf } from '../support/db'
import { loadServerUtils } from '../support/in-process'
import { jpegWithGps, photoForm } from '../support/photos'
import { createEntry, getEntry, newWikiTeam, type WikiPath, type WikiTeam } from '../support/wiki'

type Type = 'mark' | 'maker' | 'material' | 'category'
const PATHS: Record<Type, WikiPath> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }

let pool: mysql.Pool
let db: ReturnType<typeof drizzle<typeof schema>>
const statements: string[] = []
let utils: Record<string, any>
let team: WikiTeam
let access: Record<string, unknown>
const ids = { maker: 0, material: 0, parent: 0, category: 0, other: 0, mark: 0, linking: 0, gone: 0, photo: 0 }

/** Statements sent while `work` runs, and what it returned. */
async function counted<T>(work: () => Promise<T>): Promise<{ result: T, statements: number }> {
  const before = statements.length
  const result = await work()
  return { result, statements: statements.length - before }
}

const page = (type: Type, id: number, includeDeleted = false): Promise<any> => utils.wikiGetEntry(access, type, id, includeDeleted)

/** The same entry through the list's path: wikiLoadEntries, then wikiPresent with its per-table queries. */
async function listPathPage(type: Type, id: number, includeDeleted = false) {
  const config = utils.wikiConfigs[type]
  const loaded = (await utils.wikiLoadEntries(db, config, (access.team as { id: number }).id, [id], includeDeleted)).get(id)
  return loaded ? (await utils.wikiPresent(access, config, [loaded], true))[0] : undefined
}

beforeAll(async () => {
  pool = mysql.createPool({ uri: process.env.DATABASE_URL!, connectionLimit: 4, timezone: 'Z', supportBigNumbers: true, charset: 'utf8mb4_unicode_ci' })
  pool.on('connection', conn => conn.query('SET time_zone = \'+00:00\''))
  // drizzle sends every statement outside a transaction through pool.query.
  const send = pool.query.bind(pool) as (...args: unknown[]) => Promise<unknown>
  pool.query = ((...args: unknown[]) => {
    const first = args[0] as string | { sql?: string }
    statements.push(typeof first === 'string' ? first : first.sql ?? '')
    return send(...args)
  }) as typeof pool.query
  db = drizzle(pool as never, { schema, mode: 'default' })
  utils = await loadServerUtils(db)
  team = await newWikiTeam('Page Reads Team')
  const me = (await team.owner.get('/api/me')).body.user
  access = { team: { id: await teamIdOf(team.slug), slug: team.slug, name: team.slug, timeZone: 'UTC' }, role: 'owner', user: me, ip: null }
  const link = (path: WikiPath, id: number) => `/t/${team.slug}/${path}/${id}`
  ids.maker = await createEntry(team.editor, team, 'makers', { name: 'Quillmere Pottery', otherNames: ['Quillmere'] })
  ids.material = await createEntry(team.editor, team, 'materials', { name: 'Stoneware' })
  ids.parent = await createEntry(team.editor, team, 'categories', { name: 'Kitchenware' })
  ids.category = await createEntry(team.editor, team, 'categories', { name: 'Jugs', parentId: ids.parent })
  ids.other = await createEntry(team.editor, team, 'marks', { inscriptions: ['QUILLMERE HAND THROWN'], makerId: ids.maker })
  ids.mark = await createEntry(team.editor, team, 'marks', {
    inscriptions: ['QUILLMERE', 'MADE IN "HOLLOWBROOK" \\ 1962'], makerId: ids.maker, materialIds: [ids.material], categoryIds: [ids.category],
    lookalikes: [{ markId: ids.other, howToTell: 'Thinner letters;\n**no** crown — “curly” quotes, a tab\there and 🏺.' }],
    notes: `Made by [the maker](${link('makers', ids.maker)}), compare [the other](${link('marks', ids.other)}).`,
  })
  // Entries linking to the mark: their titles are its backlinks (a deleted one's are not).
  ids.linking = await createEntry(team.editor, team, 'marks', { inscriptions: ['ZEPHYR WARE'], notes: `Not [this one](${link('marks', ids.mark)}).` })
  ids.gone = await createEntry(team.editor, team, 'marks', { inscriptions: ['ALDER WARE'], notes: `Nor [this](${link('marks', ids.mark)}).` })
  await createEntry(team.editor, team, 'materials', { name: 'Earthenware', notes: `Like [this mark](${link('marks', ids.mark)}).` })
  expect((await team.editor.delete(team.api(`/marks/${ids.gone}`))).status).toBe(200)
  const upload = await team.editor.request('POST', team.api('/uploads'), photoForm(await jpegWithGps(400, 300), { fields: { entityType: 'mark', entityId: ids.mark } }))
  expect(upload.status, JSON.stringify(upload.body)).toBe(201)
  ids.photo = upload.body.id
}, 120_000)

afterAll(async () => {
  await pool?.end()
  await utils?.closeDb?.()
  await closeTestDb()
})

describe('an entry page read', () => {
  it('is one statement, and one again while this instance has the page', async () => {
    const first = await counted(() => page('mark', ids.mark))
    expect(first.statements).toBe(1)
    const again = await counted(() => page('mark', ids.mark))
    expect(again.statements).toBe(1)
    expect(JSON.stringify(again.result)).toBe(JSON.stringify(first.result))
    expect(first.result.backlinks).toHaveLength(2)
    expect(first.result.photos).toHaveLength(1)
    // A 404 is one statement too.
    const missing = await counted(() => page('mark', 99_999_999).catch((error: { statusCode?: number }) => error.statusCode))
    expect(missing).toEqual({ result: 404, statements: 1 })
  })

  it('answers what the list\'s loader and presenter build, for every entry of every type, live or deleted', async () => {
    const teamId = (access.team as { id: number }).id
    let compared = 0
    for (const type of Object.keys(PATHS) as Type[]) {
      const table = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }[type]
      for (const { id } of await query<{ id: number }>(`select id from ${table} where team_id = ? order by id`, [teamId])) {
        for (const includeDeleted of [false, true]) {
          const expected = await listPathPage(type, Number(id), includeDeleted)
          const got = await page(type, Number(id), includeDeleted).catch((error: { statusCode?: number }) => ({ statusCode: error.statusCode }))
          expect(JSON.stringify(got), `${type} ${id} includeDeleted ${includeDeleted}`).toBe(JSON.stringify(expected ?? { statusCode: 404 }))
          compared++
        }
      }
    }
    // Four marks, a maker, two materials, two categories; each read live and with the deleted.
    expect(compared).toBe(2 * 9)
  })

  it('never answers a page that a write through the other instance (the app server) has changed', async () => {
    // Names are read fresh with every answer: a rename finds the cached page still good (one statement).
    const fresh = new Set(['the editor renames themselves'])
    const steps: [string, () => Promise<{ status: number }>][] = [
      ['the mark is edited', async () => team.editor.patch(team.api(`/marks/${ids.mark}`), { revision: (await getEntry(team.editor, team, 'marks', ids.mark)).revision, colour: 'blue' })],
      ['its maker is renamed', async () => team.editor.patch(team.api(`/makers/${ids.maker}`), { revision: (await getEntry(team.editor, team, 'makers', ids.maker)).revision, name: 'Quillmere & Daughters' })],
      ['its material is renamed', async () => team.editor.patch(team.api(`/materials/${ids.material}`), { revision: (await getEntry(team.editor, team, 'materials', ids.material)).revision, name: 'Fine stoneware' })],
      ['its category is renamed', async () => team.editor.patch(team.api(`/categories/${ids.category}`), { revision: (await getEntry(team.editor, team, 'categories', ids.category)).revision, name: 'Milk jugs' })],
      ['the lookalike pair is edited from the other mark', async () => {
        const other = await getEntry(team.editor, team, 'marks', ids.other)
        return team.editor.patch(team.api(`/marks/${ids.other}`), { revision: other.revision, title: 'Quillmere hand thrown', lookalikes: [{ markId: ids.mark, howToTell: 'Seen from the other side.' }] })
      }],
      ['a linking entry is deleted', async () => team.editor.delete(team.api(`/marks/${ids.linking}`))],
      ['a deleted linking entry comes back', async () => team.editor.post(team.api(`/marks/${ids.gone}/restore`))],
      ['the photo is taken off', async () => team.editor.patch(team.api(`/photos/${ids.photo}`), { entityType: null, entityId: null })],
      ['the photo is put back', async () => team.editor.patch(team.api(`/photos/${ids.photo}`), { entityType: 'mark', entityId: ids.mark })],
      ['the editor renames themselves', async () => team.editor.patch('/api/me', { name: 'Renamed Editor' })],
      ['the mark is deleted', async () => team.editor.delete(team.api(`/marks/${ids.mark}`))],
    ]
    for (const [what, write] of steps) {
      // Cached here before the write...
      await page('mark', ids.mark, true)
      expect((await counted(() => page('mark', ids.mark, true))).statements, `before: ${what}`).toBe(1)
      const res = await write()
      expect(res.status, `${what}: ${JSON.stringify(res)}`).toBe(200)
      // ... and read again after it: the cached page found out of date, then built again (or, for a name, still good);
      // the same page as the list's path and the app server build now.
      const { result: after, statements: used } = await counted(() => page('mark', ids.mark, true))
      expect(used, what).toBe(fresh.has(what) ? 1 : 2)
      const http = await team.editor.get(team.api(`/marks/${ids.mark}?includeDeleted=true`))
      expect(JSON.stringify(after), what).toBe(JSON.stringify(await listPathPage('mark', ids.mark, true)))
      expect(JSON.stringify(after), what).toBe(JSON.stringify(http.body))
    }
    const end = await page('mark', ids.mark, true)
    expect(end.deletedAt).not.toBeNull()
    expect(end.updatedBy.name).toBe('Renamed Editor')
    expect(end.photos).toHaveLength(1)
    await expect(page('mark', ids.mark)).rejects.toMatchObject({ statusCode: 404 })
  })
})
