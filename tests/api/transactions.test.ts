// Every multi-row change is one transaction: the domain functions behind a sale with its note, the CSV item
// import, the team import and a wiki revision restore are called in this process with a database whose
// transactions fail after 0, 1, 2 ... statements. After each failure the whole database (row counts, checksums
// and the team's rows) must be as before; the last run, with room for every statement, must do the change.
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { itemSaleSchema } from '../../shared/schemas/ledger'
import { uniqueTeamName } from '../support/api'
import { closeTestDb, query, teamIdOf } from '../support/db'
import { failAtEveryStatement, failingDatabase, loadServerUtils, type FailingDatabase } from '../support/in-process'
import { created, newItem, newStore } from '../support/ledger'
import { jpegWithGps, photoForm, testStorageDir } from '../support/photos'
import { download } from '../support/transfer'
import { createEntry, newWikiTeam, type WikiTeam } from '../support/wiki'

let failing: FailingDatabase
let utils: Record<string, any>
let team: WikiTeam
let teamId: number
let owner: { id: number, email: string, name: string }
let marks: { first: number, second: number }
let category: number
const tmp = mkdtempSync(join(tmpdir(), 'tallymark-transactions-'))

const accessTo = async (slug: string) => ({
  team: { id: await teamIdOf(slug), slug, name: slug, timeZone: 'UTC' }, role: 'owner' as const, user: owner, ip: null,
})
const count = async (sql: string, params: unknown[]) => Number((await query<{ n: number }>(sql, params))[0]!.n)

beforeAll(async () => {
  failing = failingDatabase()
  utils = await loadServerUtils(failing.db)
  team = await newWikiTeam('Transactions Team')
  teamId = await teamIdOf(team.slug)
  const me = (await team.owner.get('/api/me')).body.user
  owner = { id: me.id, email: me.email, name: me.name }
  const maker = await createEntry(team.editor, team, 'makers', { name: 'Quillmere Pottery' })
  const material = await createEntry(team.editor, team, 'materials', { name: 'Stoneware' })
  category = await createEntry(team.editor, team, 'categories', { name: 'Jugs' })
  const second = await createEntry(team.editor, team, 'marks', { inscriptions: ['QUILLMERE HAND THROWN'], makerId: maker })
  const first = await createEntry(team.editor, team, 'marks', {
    inscriptions: ['QUILLMERE'], makerId: maker, materialIds: [material], lookalikes: [{ markId: second, howToTell: 'Thinner letters.' }],
  })
  marks = { first, second }
  // Revision 2 changes the inscriptions, the children and the links, so restoring revision 1 rewrites all of them.
  const edit = await team.editor.patch(team.api(`/marks/${first}`), {
    revision: 1, inscriptions: ['QUILLMERE', 'MADE IN HOLLOWBROOK'], materialIds: [], categoryIds: [category], lookalikes: [],
    notes: `See [the maker](/t/${team.slug}/makers/${maker}).`,
  })
  expect(edit.status, JSON.stringify(edit.body)).toBe(200)
  const upload = await team.editor.request('POST', team.api('/uploads'), photoForm(await jpegWithGps(400, 300), { fields: { entityType: 'mark', entityId: first } }))
  expect(upload.status, JSON.stringify(upload.body)).toBe(201)
}, 120_000)

afterAll(async () => {
  await failing?.close()
  await utils?.closeDb?.()
  await closeTestDb()
  rmSync(tmp, { recursive: true, force: true })
})

describe('one transaction per multi-row change, proven by failing half-way', () => {
  it('a sale with its notes on the mark and the category', async () => {
    const store = await newStore(team.owner, team)
    const item = await newItem(team.owner, team, { markId: marks.first, categoryId: category, storeId: store.id })
    const input = itemSaleSchema.parse({ salePriceCents: 2600, shippingChargedCents: 450, postageCents: 400, soldOn: '2026-04-10', note: { onMark: true, onCategory: true } })
    const notesBefore = await count('select count(*) as n from entry_notes where team_id = ?', [teamId])
    const statements = await failAtEveryStatement(failing, teamId, async () => utils.itemRecordSale(await accessTo(team.slug), item.id, input))
    expect(statements).toBeGreaterThan(5)
    const [row] = await query<{ status: string, sale_price_cents: number }>('select status, sale_price_cents from items where id = ?', [item.id])
    expect(row).toMatchObject({ status: 'sold', sale_price_cents: 2600 })
    expect(await count('select count(*) as n from entry_notes where team_id = ?', [teamId])).toBe(notesBefore + 2)
    expect(await count('select count(*) as n from item_status_events where item_id = ?', [item.id])).toBe(2)
  })

  it('a CSV item import that adds a store', async () => {
    const csv = [
      'title,acquiredOn,cost,store,salePrice,soldOn',
      'Blue jug,2026-03-01,2.00,Fernhill Rummage,18.00,2026-03-20',
      'Green jug,2026-03-01,3.00,Fernhill Rummage,,',
      'Cream jug,2026-03-02,1.50,Fernhill Rummage,12.00,2026-03-25',
    ].join('\n')
    const options = { dryRun: false, onlyValid: false, dateOrder: 'mdy' as const }
    const itemsBefore = await count('select count(*) as n from items where team_id = ?', [teamId])
    const statements = await failAtEveryStatement(failing, teamId, async () => utils.ledgerImportItems(await accessTo(team.slug), csv, options))
    expect(statements).toBeGreaterThan(2)
    expect(await count('select count(*) as n from items where team_id = ?', [teamId])).toBe(itemsBefore + 3)
    expect(await count('select count(*) as n from stores where team_id = ? and name = \'Fernhill Rummage\'', [teamId])).toBe(1)
  })

  it('a wiki revision restore (entry row, inscriptions, materials, categories, lookalikes, links, revision)', async () => {
    const statements = await failAtEveryStatement(failing, teamId, async () => utils.wikiRestoreRevision(await accessTo(team.slug), 'mark', marks.first, 1, undefined))
    expect(statements).toBeGreaterThan(8)
    const [mark] = await query<{ revision: number }>('select revision from marks where id = ?', [marks.first])
    expect(mark!.revision).toBe(3)
    expect((await query<{ text: string }>('select text from mark_inscriptions where mark_id = ? order by position', [marks.first])).map(r => r.text)).toEqual(['QUILLMERE'])
    expect(await count('select count(*) as n from mark_lookalikes where team_id = ?', [teamId])).toBe(1)
    expect(await count('select count(*) as n from entry_links where team_id = ? and from_id = ?', [teamId, marks.first])).toBe(0)
  })

  it('a team import, photo files included', async () => {
    const zip = await download(team.owner, team.api('/exports/team.zip'))
    expect(zip.status).toBe(200)
    const path = join(tmp, 'team.zip')
    writeFileSync(path, zip.bytes)
    const target = await created(team.owner, '/api/teams', { name: uniqueTeamName('Transactions Target') })
    const targetId = await teamIdOf(target.team.slug)
    const filesOf = () => {
      const dir = join(testStorageDir(), 'teams', String(targetId))
      return existsSync(dir) ? readdirSync(dir, { recursive: true }).filter(f => String(f).endsWith('.webp')).length : 0
    }
    const statements = await failAtEveryStatement(failing, targetId, async () => utils.transferImportTeam(await accessTo(target.team.slug), path), async () => {
      // The photo files stored before the transaction are removed again when it fails.
      expect(filesOf()).toBe(0)
    })
    expect(statements).toBeGreaterThan(20)
    expect(await count('select count(*) as n from marks where team_id = ?', [targetId])).toBe(await count('select count(*) as n from marks where team_id = ?', [teamId]))
    expect(await count('select count(*) as n from items where team_id = ?', [targetId])).toBe(await count('select count(*) as n from items where team_id = ?', [teamId]))
    expect(filesOf()).toBe(2)
  })
})
