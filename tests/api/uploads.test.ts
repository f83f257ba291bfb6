// Photo uploads and serving: roles, team isolation, content checks, size limit, metadata stripping,
// attaching to entries and deleting.
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { baseUrl, expectError, newMember, newOwner, Person, uniqueTeamName } from '../support/api'
import { closeTestDb, query, teamIdOf } from '../support/db'
import {
  exifGpsTags, fetchPhoto, HTML_PAYLOAD, insertEntry, jpegWithGps, photoForm, SVG_PAYLOAD, testStorageDir,
} from '../support/photos'
import { PHOTO_MAX_BYTES, PHOTO_NOT_AN_IMAGE, PHOTO_TOO_LARGE } from '../../shared/photos'

type Member = { person: Person, id: number }
let owner: Awaited<ReturnType<typeof newOwner>>
let teamId: number
let editor: Member
let contributor: Member
let otherContributor: Member
let viewer: Member
let outsider: Awaited<ReturnType<typeof newOwner>>
let gpsJpeg: Buffer

const uploads = (slug: string) => `/api/teams/${slug}/uploads`
const photoPath = (slug: string, id: number) => `/api/teams/${slug}/photos/${id}`

async function upload(person: Person, bytes: Uint8Array, options: Parameters<typeof photoForm>[1] = {}, slug = owner.team.slug) {
  return await person.request('POST', uploads(slug), photoForm(bytes, options))
}

async function photoRow(id: number) {
  const [row] = await query<Record<string, any>>('select * from photos where id = ?', [id])
  return row
}

beforeAll(async () => {
  owner = await newOwner(uniqueTeamName('Photo Team'))
  teamId = await teamIdOf(owner.team.slug)
  editor = await newMember(owner.person, owner.team.slug, 'editor')
  contributor = await newMember(owner.person, owner.team.slug, 'contributor')
  otherContributor = await newMember(owner.person, owner.team.slug, 'contributor')
  viewer = await newMember(owner.person, owner.team.slug, 'viewer')
  outsider = await newOwner(uniqueTeamName('Other Photo Team'))
  gpsJpeg = await jpegWithGps(2400, 1800)
})
afterAll(closeTestDb)

describe('POST /api/teams/[team]/uploads', () => {
  it('takes a contributor\'s photo, answers 201 and serves both sizes as WebP with nosniff, inline and long private caching', async () => {
    const res = await upload(contributor.person, gpsJpeg, { name: 'bench.jpg' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toEqual({
      id: expect.any(Number),
      width: 1600,
      height: 1200,
      thumbUrl: `${photoPath(owner.team.slug, res.body.id)}/thumb`,
      displayUrl: `${photoPath(owner.team.slug, res.body.id)}/display`,
    })
    for (const [url, width, height] of [[res.body.thumbUrl, 320, 240], [res.body.displayUrl, 1600, 1200]] as const) {
      const got = await fetchPhoto(contributor.person, url)
      expect(got.status).toBe(200)
      expect(got.headers.get('content-type')).toBe('image/webp')
      expect(got.headers.get('x-content-type-options')).toBe('nosniff')
      expect(got.headers.get('content-disposition')).toBe('inline')
      expect(got.headers.get('cache-control')).toBe('private, max-age=31536000, immutable')
      expect(Number(got.headers.get('content-length'))).toBe(got.bytes.length)
      const meta = await sharp(got.bytes).metadata()
      expect([meta.format, meta.width, meta.height]).toEqual(['webp', width, height])
    }
  })

  it('stores no GPS: the uploaded file had it, the served copies have no EXIF at all', async () => {
    expect(exifGpsTags((await sharp(gpsJpeg).metadata()).exif)).toEqual(expect.arrayContaining([1, 2, 3, 4]))
    const res = await upload(contributor.person, gpsJpeg)
    expect(res.status).toBe(201)
    for (const url of [res.body.thumbUrl, res.body.displayUrl]) {
      const { bytes } = await fetchPhoto(contributor.person, url)
      const meta = await sharp(bytes).metadata()
      expect(meta.exif).toBeUndefined()
      expect(exifGpsTags(meta.exif)).toBeNull()
      expect(bytes.includes('Testcam')).toBe(false)
    }
    // And on disk: both stored objects are the re-encoded copies, never the original.
    const row = await photoRow(res.body.id)
    for (const key of [row!.display_key, row!.thumb_key]) {
      const stored = await sharp(join(testStorageDir(), key)).metadata()
      expect(stored.format).toBe('webp')
      expect(stored.exif).toBeUndefined()
    }
  })

  it('records the row in the team with server-made storage keys, whatever the file was called', async () => {
    const res = await upload(contributor.person, gpsJpeg, { name: '../../../etc/cron.d/evil.jpg', type: 'text/html' })
    expect(res.status).toBe(201)
    const row = await photoRow(res.body.id)
    expect(row).toMatchObject({ team_id: teamId, entity_type: null, entity_id: null, width: 1600, height: 1200, content_type: 'image/webp', uploaded_by: contributor.id })
    const folder = new RegExp(`^teams/${teamId}/photos/[0-9a-f]{32}/`)
    expect(row!.display_key).toMatch(new RegExp(`${folder.source}display\\.webp$`))
    expect(row!.thumb_key).toMatch(new RegExp(`${folder.source}thumb\\.webp$`))
    expect(Number(row!.original_bytes)).toBe(gpsJpeg.length)
    expect(existsSync(join(testStorageDir(), row!.display_key))).toBe(true)
  })

  it('refuses files that are not JPEG, PNG or WebP by content, whatever the name and declared type say', async () => {
    const cases: [string, Uint8Array, string, string][] = [
      ['text renamed .jpg', Buffer.from('Packing list: tissue, tape, two boxes.\n'), 'notes.jpg', 'image/jpeg'],
      ['SVG', Buffer.from(SVG_PAYLOAD), 'mark.png', 'image/png'],
      ['HTML', Buffer.from(HTML_PAYLOAD), 'mark.webp', 'image/webp'],
      ['polyglot', Buffer.concat([Buffer.from([0xFF, 0xD8, 0xFF, 0xE0]), Buffer.from(HTML_PAYLOAD)]), 'mark.jpg', 'image/jpeg'],
      ['GIF', await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } }).gif().toBuffer(), 'mark.jpg', 'image/jpeg'],
    ]
    const before = await query<{ n: number }>('select count(*) as n from photos where team_id = ?', [teamId])
    for (const [label, bytes, name, type] of cases) {
      const body = expectError(await upload(contributor.person, bytes, { name, type }), 415, PHOTO_NOT_AN_IMAGE)
      expect(body.fieldErrors, label).toEqual({ file: [PHOTO_NOT_AN_IMAGE] })
    }
    const after = await query<{ n: number }>('select count(*) as n from photos where team_id = ?', [teamId])
    expect(Number(after[0]!.n)).toBe(Number(before[0]!.n))
  })

  it('answers 413 with a clear message above 15 MB, and still takes a photo just under the limit', async () => {
    const tooBig = Buffer.alloc(PHOTO_MAX_BYTES + 1, 0x20)
    tooBig.set(gpsJpeg.subarray(0, 64), 0)
    expectError(await upload(contributor.person, tooBig), 413, PHOTO_TOO_LARGE)
    // A real JPEG padded after its end marker to exactly 15 MB is inside the limit.
    const padded = Buffer.concat([gpsJpeg, Buffer.alloc(PHOTO_MAX_BYTES - gpsJpeg.length)])
    expect(padded.length).toBe(PHOTO_MAX_BYTES)
    expect((await upload(contributor.person, padded)).status).toBe(201)
  })

  it('stops reading a streamed upload without Content-Length as soon as it passes the limit', async () => {
    const boundary = `tallymark${Date.now()}`
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`)
    const chunk = Buffer.alloc(1024 * 1024, 0x20)
    let sent = 0
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        // 40 MB if the server kept reading; it should answer after about 15 MB.
        if (sent === 0) controller.enqueue(head)
        if (sent >= 40) {
          controller.enqueue(Buffer.from(`\r\n--${boundary}--\r\n`))
          controller.close()
          return
        }
        sent++
        controller.enqueue(chunk)
      },
    })
    const res = await fetch(baseUrl + uploads(owner.team.slug), {
      method: 'POST',
      body,
      duplex: 'half',
      headers: { 'cookie': contributor.person.cookieHeader(), 'content-type': `multipart/form-data; boundary=${boundary}`, 'accept': 'application/json' },
    } as RequestInit)
    expect(res.status).toBe(413)
    expect(((await res.json()) as { message: string }).message).toBe(PHOTO_TOO_LARGE)
    expect(sent).toBeLessThan(40)
  })

  it('needs contributor or higher: viewers get 403, signed-out people 401, other teams 404', async () => {
    expectError(await upload(viewer.person, gpsJpeg), 403, /contributor role or higher; you are a viewer/)
    expectError(await upload(new Person(), gpsJpeg), 401)
    expectError(await upload(outsider.person, gpsJpeg), 404)
  })

  it('explains a missing file or a request that is not multipart', async () => {
    const form = new FormData()
    form.set('note', 'no file here')
    expect(expectError(await contributor.person.request('POST', uploads(owner.team.slug), form), 400).fieldErrors).toHaveProperty('file')
    expectError(await contributor.person.post(uploads(owner.team.slug), { file: 'data:image/png;base64,AAAA' }), 415, /multipart\/form-data/)
  })
})

describe('attaching on upload', () => {
  it('lets an editor attach to a mark or maker of the same team, in order', async () => {
    const markId = await insertEntry('mark', teamId, editor.id)
    const makerId = await insertEntry('maker', teamId, editor.id)
    const first = await upload(editor.person, gpsJpeg, { fields: { entityType: 'mark', entityId: markId } })
    const second = await upload(editor.person, gpsJpeg, { fields: { entityType: 'mark', entityId: markId } })
    const onMaker = await upload(editor.person, gpsJpeg, { fields: { entityType: 'maker', entityId: makerId } })
    for (const res of [first, second, onMaker]) expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(await photoRow(first.body.id)).toMatchObject({ entity_type: 'mark', entity_id: markId, position: 0 })
    expect(await photoRow(second.body.id)).toMatchObject({ entity_type: 'mark', entity_id: markId, position: 1 })
    expect(await photoRow(onMaker.body.id)).toMatchObject({ entity_type: 'maker', entity_id: makerId, position: 0 })
  })

  it('refuses contributors on marks and makers (403) and entries of other teams, deleted or missing ones (404)', async () => {
    const markId = await insertEntry('mark', teamId, editor.id)
    expectError(await upload(contributor.person, gpsJpeg, { fields: { entityType: 'mark', entityId: markId } }), 403, /editor role or higher/)
    const foreignMark = await insertEntry('mark', await teamIdOf(outsider.team.slug), outsider.user.id)
    expectError(await upload(editor.person, gpsJpeg, { fields: { entityType: 'mark', entityId: foreignMark } }), 404, /No such mark in this team/)
    const deletedMark = await insertEntry('mark', teamId, editor.id, { deleted: true })
    expectError(await upload(editor.person, gpsJpeg, { fields: { entityType: 'mark', entityId: deletedMark } }), 404)
    expectError(await upload(editor.person, gpsJpeg, { fields: { entityType: 'maker', entityId: 987654321 } }), 404, /No such maker/)
    expect(expectError(await upload(editor.person, gpsJpeg, { fields: { entityType: 'teapot', entityId: markId } }), 400).fieldErrors).toHaveProperty('entityType')
    expectError(await upload(editor.person, gpsJpeg, { fields: { entityType: 'mark' } }), 400, /together/)
  })
})

describe('GET /api/teams/[team]/photos/[id]/[size]', () => {
  it('serves members of the team only; another team\'s photo id is 404 under either slug', async () => {
    const mine = (await upload(contributor.person, gpsJpeg)).body
    expect((await fetchPhoto(viewer.person, mine.thumbUrl)).status).toBe(200)
    // The outsider is not a member of this team...
    expect((await fetchPhoto(outsider.person, mine.thumbUrl)).status).toBe(404)
    // ...and cannot reach it through their own team's address either.
    expect((await fetchPhoto(outsider.person, `${photoPath(outsider.team.slug, mine.id)}/display`)).status).toBe(404)
    expect((await fetchPhoto(new Person(), mine.thumbUrl)).status).toBe(401)
  })

  it('knows only the two sizes and numeric ids', async () => {
    const mine = (await upload(contributor.person, gpsJpeg)).body
    for (const path of [`${photoPath(owner.team.slug, mine.id)}/original`, `${photoPath(owner.team.slug, mine.id)}/..%2F..%2Fdisplay`, `/api/teams/${owner.team.slug}/photos/abc/thumb`]) {
      expect((await fetchPhoto(contributor.person, path)).status, path).toBe(404)
    }
  })
})

describe('PATCH /api/teams/[team]/photos/[id]', () => {
  it('lets an editor attach a contributor\'s photo to a mark and detach it; the uploader may not take it off the mark', async () => {
    const markId = await insertEntry('mark', teamId, editor.id)
    const photo = (await upload(contributor.person, gpsJpeg)).body
    expectError(await contributor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: 'mark', entityId: markId }), 403)
    const attached = await editor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: 'mark', entityId: markId })
    expect(attached.status, JSON.stringify(attached.body)).toBe(200)
    expect(attached.body).toMatchObject({ id: photo.id, entityType: 'mark', entityId: markId, thumbUrl: photo.thumbUrl })
    expect(await photoRow(photo.id)).toMatchObject({ entity_type: 'mark', entity_id: markId })
    expectError(await contributor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: null, entityId: null }), 403, /take a photo away/)
    expect((await editor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: null, entityId: null })).status).toBe(200)
    expect(await photoRow(photo.id)).toMatchObject({ entity_type: null, entity_id: null })
  })

  it('refuses other contributors\' photos, other teams, and bodies that are not an attachment', async () => {
    const photo = (await upload(contributor.person, gpsJpeg)).body
    expectError(await otherContributor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: null, entityId: null }), 403)
    expectError(await viewer.person.patch(photoPath(owner.team.slug, photo.id), { entityType: null, entityId: null }), 403)
    expectError(await outsider.person.patch(photoPath(outsider.team.slug, photo.id), { entityType: null, entityId: null }), 404)
    expectError(await editor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: 'mark' }), 400)
    // Sale items have no table yet: attaching to one is a clear 404, not a 500.
    expectError(await contributor.person.patch(photoPath(owner.team.slug, photo.id), { entityType: 'item', entityId: 1 }), 404, /No such sale item/)
  })
})

describe('DELETE /api/teams/[team]/photos/[id]', () => {
  it('lets the uploader delete their photo: the row and both stored files go, the URLs answer 404', async () => {
    const photo = (await upload(contributor.person, gpsJpeg)).body
    const row = await photoRow(photo.id)
    expectError(await otherContributor.person.delete(photoPath(owner.team.slug, photo.id)), 403)
    expectError(await viewer.person.delete(photoPath(owner.team.slug, photo.id)), 403)
    expectError(await outsider.person.delete(photoPath(outsider.team.slug, photo.id)), 404)
    expect(await photoRow(photo.id)).toBeDefined()

    const res = await contributor.person.delete(photoPath(owner.team.slug, photo.id))
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    expect(await photoRow(photo.id)).toBeUndefined()
    expect(existsSync(join(testStorageDir(), row!.display_key))).toBe(false)
    expect(existsSync(join(testStorageDir(), row!.thumb_key))).toBe(false)
    expect((await fetchPhoto(contributor.person, photo.thumbUrl)).status).toBe(404)
    expectError(await contributor.person.delete(photoPath(owner.team.slug, photo.id)), 404)
  })

  it('lets editors delete anyone\'s photo', async () => {
    const photo = (await upload(contributor.person, gpsJpeg)).body
    expect((await editor.person.delete(photoPath(owner.team.slug, photo.id))).status).toBe(200)
    expect(await photoRow(photo.id)).toBeUndefined()
  })
})
