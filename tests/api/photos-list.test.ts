// listEntryPhotos, the function the wiki calls to show marks' and makers' photos: grouped per entry,
// in gallery order, inside one team; and storePhoto, which the demo seed calls. Photos are arranged over
// HTTP; the functions are called directly.
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { newMember, newOwner, uniqueTeamName } from '../support/api'
import { closeTestDb, query, teamIdOf } from '../support/db'
import { insertEntry, jpegWithGps, photoForm, testStorageDir } from '../support/photos'

// server/utils/db.ts reads its settings through Nitro's auto-imported useServerConfig.
vi.stubGlobal('useServerConfig', () => ({ databaseUrl: process.env.DATABASE_URL }))
const { deleteEntryPhotos, listEntryPhotos, storePhoto } = await import('../../server/utils/photos')
const { useDb } = await import('../../server/utils/db')
const { createLocalStorageDriver } = await import('../../server/utils/storage/local')
const { PhotoImageError } = await import('../../server/utils/images')
const { drawMarkPhoto } = await import('../../server/database/seed/demo-photos')
const { closeDb } = await import('../../server/utils/db')

let owner: Awaited<ReturnType<typeof newOwner>>
let team: { id: number, slug: string }
let jpeg: Buffer

async function uploadTo(person: Awaited<ReturnType<typeof newOwner>>['person'], slug: string, entityType: string, entityId: number): Promise<number> {
  const res = await person.request('POST', `/api/teams/${slug}/uploads`, photoForm(jpeg, { fields: { entityType, entityId } }))
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body.id
}

beforeAll(async () => {
  owner = await newOwner(uniqueTeamName('Listing Team'))
  team = { id: await teamIdOf(owner.team.slug), slug: owner.team.slug }
  jpeg = await jpegWithGps(900, 600)
})
afterAll(async () => {
  await closeDb()
  await closeTestDb()
})

describe('listEntryPhotos', () => {
  it('groups photos per entry in upload order, with an empty list for entries without photos', async () => {
    const [markA, markB, markC] = [await insertEntry('mark', team.id, owner.user.id), await insertEntry('mark', team.id, owner.user.id), await insertEntry('mark', team.id, owner.user.id)]
    const a1 = await uploadTo(owner.person, team.slug, 'mark', markA)
    const b1 = await uploadTo(owner.person, team.slug, 'mark', markB)
    const a2 = await uploadTo(owner.person, team.slug, 'mark', markA)

    const photos = await listEntryPhotos(team, 'mark', [markA, markB, markC])
    expect([...photos.keys()]).toEqual([markA, markB, markC])
    expect(photos.get(markA)!.map(p => p.id)).toEqual([a1, a2])
    expect(photos.get(markB)).toEqual([{
      id: b1, width: 900, height: 600,
      thumbUrl: `/api/teams/${team.slug}/photos/${b1}/thumb`,
      displayUrl: `/api/teams/${team.slug}/photos/${b1}/display`,
    }])
    expect(photos.get(markC)).toEqual([])
  })

  it('keeps types and teams apart, and accepts a bare team id', async () => {
    const mark = await insertEntry('mark', team.id, owner.user.id)
    const maker = await insertEntry('maker', team.id, owner.user.id)
    const onMark = await uploadTo(owner.person, team.slug, 'mark', mark)
    const onMaker = await uploadTo(owner.person, team.slug, 'maker', maker)

    // The same numeric id asked for as the other type finds nothing.
    expect((await listEntryPhotos(team, 'maker', [mark])).get(mark)).toEqual([])
    expect((await listEntryPhotos(team.id, 'maker', [maker])).get(maker)!.map(p => p.id)).toEqual([onMaker])

    // Another team asking for this team's entry ids sees none of its photos.
    const other = await newOwner(uniqueTeamName('Other Listing Team'))
    const otherId = await teamIdOf(other.team.slug)
    expect((await listEntryPhotos({ id: otherId, slug: other.team.slug }, 'mark', [mark])).get(mark)).toEqual([])
    expect((await listEntryPhotos(team, 'mark', [mark])).get(mark)!.map(p => p.id)).toEqual([onMark])
  })

  it('answers an empty map for no ids', async () => {
    expect((await listEntryPhotos(team, 'mark', [])).size).toBe(0)
  })

  it('follows a photo moved by an editor from one mark to another', async () => {
    const editor = await newMember(owner.person, team.slug, 'editor')
    const from = await insertEntry('mark', team.id, owner.user.id)
    const to = await insertEntry('mark', team.id, owner.user.id)
    const photo = await uploadTo(owner.person, team.slug, 'mark', from)
    const moved = await editor.person.patch(`/api/teams/${team.slug}/photos/${photo}`, { entityType: 'mark', entityId: to })
    expect(moved.status).toBe(200)
    const photos = await listEntryPhotos(team, 'mark', [from, to])
    expect(photos.get(from)).toEqual([])
    expect(photos.get(to)!.map(p => p.id)).toEqual([photo])
  })

  it('deleteEntryPhotos removes the photos of an entry and their files, and nothing else', async () => {
    const doomed = await insertEntry('mark', team.id, owner.user.id)
    const kept = await insertEntry('mark', team.id, owner.user.id)
    const ids = [await uploadTo(owner.person, team.slug, 'mark', doomed), await uploadTo(owner.person, team.slug, 'mark', doomed)]
    const keptPhoto = await uploadTo(owner.person, team.slug, 'mark', kept)
    const rows = await query<{ display_key: string, thumb_key: string }>('select display_key, thumb_key from photos where id in (?)', [ids])
    const files = rows.flatMap(r => [r.display_key, r.thumb_key]).map(key => join(testStorageDir(), key))
    expect(files.every(existsSync)).toBe(true)

    // Another team cannot delete them by naming the ids.
    const other = await newOwner(uniqueTeamName('Other Deleting Team'))
    expect(await deleteEntryPhotos(await teamIdOf(other.team.slug), 'mark', [doomed])).toBe(0)

    expect(await deleteEntryPhotos(team.id, 'mark', [doomed])).toBe(2)
    expect(files.some(existsSync)).toBe(false)
    const after = await listEntryPhotos(team, 'mark', [doomed, kept])
    expect(after.get(doomed)).toEqual([])
    expect(after.get(kept)!.map(p => p.id)).toEqual([keptPhoto])
  })
})

describe('storePhoto, the way in for the seed', () => {
  it('stores a drawn demo photo through the given driver and attaches it, with no session or role involved', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tallymark-store-photo-'))
    try {
      const storage = createLocalStorageDriver(dir)
      const mark = await insertEntry('mark', team.id, owner.user.id)
      const bytes = await drawMarkPhoto(['FENWICK', 'EST. 1901'], { shape: 'round', colour: '#1d3f8a', seed: 4 })
      const stored = await storePhoto({ teamId: team.id, uploadedBy: owner.user.id, bytes, entityType: 'mark', entityId: mark }, useDb(), storage)
      expect(stored).toEqual({ id: expect.any(Number), width: 600, height: 600 })
      const [row] = await query<{ display_key: string, thumb_key: string }>('select display_key, thumb_key from photos where id = ?', [stored.id])
      expect(existsSync(join(dir, row!.display_key))).toBe(true)
      expect(existsSync(join(dir, row!.thumb_key))).toBe(true)
      expect((await listEntryPhotos(team, 'mark', [mark])).get(mark)!.map(p => p.id)).toEqual([stored.id])
      await expect(storePhoto({ teamId: team.id, uploadedBy: owner.user.id, bytes: Buffer.from('<svg/>') }, useDb(), storage)).rejects.toBeInstanceOf(PhotoImageError)
    }
    finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
