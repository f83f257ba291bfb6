// Team export and import with the photos in an S3-compatible bucket: a second app instance with STORAGE_DRIVER=s3
// (the fake S3 npm test starts), sharing the test database. A team's round trip through it keeps every photo byte
// for byte; the export reads the rows in one short transaction, so a paused download holds no snapshot; a photo
// purged during the download is left out cleanly; a download closed half-way leaves no temporary file behind.
import { createHash, randomBytes } from 'node:crypto'
import { existsSync, mkdtempSync, readdirSync, readlinkSync, rmSync } from 'node:fs'
import { get as httpGet, type IncomingMessage } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import mysql from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startAppServer, type AppServer } from '../../scripts/lib/app-server'
import { freePort } from '../../scripts/lib/ports'
import { createStorageDriver } from '../../server/utils/storage'
import { newOwner, uniqueTeamName, type Person } from '../support/api'
import { closeTestDb, exec, query, teamIdOf } from '../support/db'
import { testStorageDir } from '../support/photos'
import { storedBytes, testS3AppEnv, testS3Config } from '../support/s3'
import { download, normaliseExport, seedFixtureTeam, unzip, zipForm, type FixtureTeam } from '../support/transfer'

const s3 = createStorageDriver({ storageDriver: 's3', storageDir: '/nonexistent', s3: testS3Config() })
// The S3 instance's temporary folder (TMPDIR), so the test sees exactly that instance's temporary files.
const tmp = mkdtempSync(join(tmpdir(), 'tallymark-transfer-s3-'))
let instance: AppServer
let source: FixtureTeam

const sha = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex')
const temporaryFiles = () => readdirSync(tmp).filter(name => /^tallymark-(export|import)-/.test(name))
/** Files under the temporary folder the S3 instance still holds open (a deleted file held open still takes disk space). */
const openTemporaryFiles = () => {
  const fds = `/proc/${instance.process.pid}/fd`
  return readdirSync(fds).flatMap((fd) => {
    try {
      return [readlinkSync(join(fds, fd))]
    }
    catch {
      return []
    }
  }).filter(target => target.startsWith(tmp))
}
const s3Bytes = async (key: string) => {
  const object = await s3.get(key)
  expect(object, key).not.toBeNull()
  return storedBytes(object!)
}
const photoRows = (teamId: number) => query<{ id: number, display_key: string, thumb_key: string, content_type: string }>(
  'select id, display_key, thumb_key, content_type from photos where team_id = ? order by id', [teamId])

async function until(what: string, check: () => boolean | Promise<boolean>, timeoutMs = 10_000) {
  const start = Date.now()
  while (!(await check())) {
    if (Date.now() - start > timeoutMs) throw new Error(`${what}: not within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 50))
  }
}

/**
 * True when this connection gets `LOCK TABLES photos WRITE` within 2 s. A transaction that has read a table keeps
 * a shared metadata lock on it until it ends (plain consistent reads take no row locks, so a write would not wait),
 * and the write lock waits for every such lock: false means some transaction that read photos is still open.
 * The API test files run one at a time, and nothing else in the two idle instances reads photos meanwhile.
 */
async function photosFreeOfTransactions(): Promise<boolean> {
  const conn = await mysql.createConnection({ uri: process.env.DATABASE_URL! })
  try {
    await conn.query('SET SESSION lock_wait_timeout = 2')
    await conn.query('LOCK TABLES photos WRITE')
    await conn.query('UNLOCK TABLES')
    return true
  }
  catch (error) {
    if ((error as { errno?: number }).errno === 1205) return false
    throw error
  }
  finally {
    await conn.end()
  }
}

interface PausedDownload { status: number, first: Buffer, rest: () => Promise<Buffer>, close: () => void }

/** Starts a download from the S3 instance and stops reading after the first chunk, as a slow client would. */
function pausedDownload(person: Person, path: string): Promise<PausedDownload> {
  return new Promise((resolve, reject) => {
    const req = httpGet(instance.url + path, { headers: { cookie: person.cookieHeader() } }, (res: IncomingMessage) => {
      res.on('error', reject)
      res.once('data', (first: Buffer) => {
        res.pause()
        resolve({
          status: res.statusCode!,
          first,
          rest: () => new Promise((done, fail) => {
            const chunks = [first]
            res.on('data', (chunk: Buffer) => chunks.push(chunk))
            res.on('end', () => done(Buffer.concat(chunks)))
            res.on('error', fail)
            res.resume()
          }),
          close: () => req.destroy(),
        })
      })
    })
    req.on('error', reject)
  })
}

const viaS3 = async (person: Person, method: string, path: string, body?: FormData) => {
  const res = await fetch(instance.url + path, { method, body, headers: { cookie: person.cookieHeader(), accept: 'application/json' } })
  return { status: res.status, body: await res.json().catch(() => null) as any }
}

beforeAll(async () => {
  const port = await freePort()
  instance = await startAppServer({ port, env: { ...testS3AppEnv(), PUBLIC_URL: `http://127.0.0.1:${port}`, TMPDIR: tmp } })
  source = await seedFixtureTeam('S3 Transfer Source', s3)
}, 180_000)
afterAll(async () => {
  await instance?.stop()
  await closeTestDb()
  rmSync(tmp, { recursive: true, force: true })
})

describe('team export and import with photos in S3', () => {
  it('round-trips a team through the bucket: the copy exports equal, photos byte for byte', async () => {
    const first = await download(source.owner, source.api('/exports/team.zip'), instance.url)
    expect(first.status).toBe(200)
    const files = await unzip(first.bytes)
    const doc = JSON.parse(files.get('team.json')!.toString('utf8'))
    const rows = await photoRows(source.id)
    expect(rows.length).toBeGreaterThan(0)
    expect(doc.photos.map((p: any) => p.id)).toEqual(rows.map(r => r.id))
    for (const [i, row] of rows.entries()) {
      expect(files.get(doc.photos[i].files.display)!.equals(await s3Bytes(row.display_key)), row.display_key).toBe(true)
      expect(files.get(doc.photos[i].files.thumb)!.equals(await s3Bytes(row.thumb_key)), row.thumb_key).toBe(true)
    }

    const created = await source.owner.post('/api/teams', { name: uniqueTeamName('S3 Transfer Target') })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const target = { slug: created.body.team.slug as string, id: await teamIdOf(created.body.team.slug) }
    for (const role of ['editor', 'contributor', 'viewer'] as const) {
      await exec('insert into memberships (team_id, user_id, role) values (?, ?, ?)', [target.id, source.userIds[role], role])
    }
    const imported = await viaS3(source.owner, 'POST', `/api/teams/${target.slug}/imports/team`, zipForm(first.bytes))
    expect(imported.status, JSON.stringify(imported.body)).toBe(200)
    expect(imported.body.imported.photos).toBe(doc.photos.length)

    // The copies went into the bucket, with their content type; nothing into the local folder.
    const copies = await photoRows(target.id)
    expect(copies).toHaveLength(rows.length)
    for (const [i, copy] of copies.entries()) {
      const object = (await s3.get(copy.display_key))!
      expect(object.contentType).toBe(copy.content_type)
      expect((await storedBytes(object)).equals(files.get(doc.photos[i].files.display)!)).toBe(true)
      expect((await s3Bytes(copy.thumb_key)).equals(files.get(doc.photos[i].files.thumb)!)).toBe(true)
    }
    expect(existsSync(join(testStorageDir(), 'teams', String(target.id)))).toBe(false)

    const again = await download(source.owner, `/api/teams/${target.slug}/exports/team.zip`, instance.url)
    expect(again.status).toBe(200)
    const copyFiles = await unzip(again.bytes)
    const copy = JSON.parse(copyFiles.get('team.json')!.toString('utf8'))
    expect(normaliseExport(copy)).toEqual(normaliseExport(doc))
    doc.photos.forEach((photo: any, i: number) => {
      expect(copyFiles.get(copy.photos[i].files.display)!.equals(files.get(photo.files.display)!), photo.files.display).toBe(true)
      expect(copyFiles.get(copy.photos[i].files.thumb)!.equals(files.get(photo.files.thumb)!), photo.files.thumb).toBe(true)
    })
    const served = await download(source.owner, `/api/teams/${target.slug}/photos/${copy.photos[0].id}/display`, instance.url)
    expect(served.status).toBe(200)
    expect(served.headers.get('content-type')).toBe(copy.photos[0].contentType)
    expect(served.bytes.equals(files.get(doc.photos[0].files.display)!)).toBe(true)
    await until('temporary files removed', () => temporaryFiles().length === 0)
  })

  describe('a slow download', () => {
    const COUNT = 10
    let owner: Person
    let slug: string
    let teamId: number
    const hashes = new Map<number, { display: string, thumb: string }>()

    // Photos much larger than every buffer between the app and a client that stops reading (socket buffers of a
    // few MB, the zip writer's 1 MB), so the app is still copying photos while the download waits.
    beforeAll(async () => {
      const team = await newOwner(uniqueTeamName('S3 Large Photos'))
      owner = team.person
      slug = team.team.slug
      teamId = await teamIdOf(slug)
      const me = (await owner.get('/api/me')).body.user.id as number
      for (let i = 0; i < COUNT; i++) {
        const folder = `teams/${teamId}/photos/${randomBytes(16).toString('hex')}`
        const display = randomBytes(3_500_000)
        const thumb = randomBytes(500_000)
        await s3.put(`${folder}/display.webp`, display, 'image/webp')
        await s3.put(`${folder}/thumb.webp`, thumb, 'image/webp')
        const inserted = await exec(
          'insert into photos (team_id, display_key, thumb_key, content_type, width, height, thumb_width, thumb_height, bytes, original_bytes, uploaded_by) values (?, ?, ?, ?, 1600, 1200, 320, 240, ?, ?, ?)',
          [teamId, `${folder}/display.webp`, `${folder}/thumb.webp`, 'image/webp', display.length + thumb.length, display.length, me],
        )
        expect(inserted).toBe(1)
      }
      for (const row of await photoRows(teamId)) hashes.set(row.id, { display: sha(await s3Bytes(row.display_key)), thumb: sha(await s3Bytes(row.thumb_key)) })
    }, 120_000)

    it('holds no transaction while it waits, and leaves out a photo purged meanwhile', async () => {
      // The check sees a snapshot that is held ...
      const held = await mysql.createConnection({ uri: process.env.DATABASE_URL! })
      await held.query('START TRANSACTION WITH CONSISTENT SNAPSHOT')
      await held.query('SELECT count(*) FROM photos WHERE team_id = ?', [teamId])
      expect(await photosFreeOfTransactions()).toBe(false)
      await held.query('COMMIT')
      await held.end()
      // ... and the export's is over before the first byte, while the app still has photos to copy.
      const paused = await pausedDownload(owner, `/api/teams/${slug}/exports/team.zip`)
      expect(paused.status).toBe(200)
      expect(paused.first.subarray(0, 4).equals(Buffer.from([0x50, 0x4B, 0x03, 0x04]))).toBe(true)
      expect(await photosFreeOfTransactions()).toBe(true)
      expect(temporaryFiles()).toHaveLength(1)

      // The last photo is deleted for good while the download waits: the row first, then its files.
      const rows = await photoRows(teamId)
      const purged = rows.at(-1)!
      await exec('delete from photos where id = ?', [purged.id])
      await s3.delete(purged.display_key)
      await s3.delete(purged.thumb_key)

      const files = await unzip(await paused.rest())
      const doc = JSON.parse(files.get('team.json')!.toString('utf8'))
      // It was in the snapshot, but its files were gone when their turn came: out of the files and of team.json.
      expect(doc.photos.map((p: any) => p.id)).toEqual(rows.slice(0, -1).map(r => r.id))
      expect([...files.keys()].sort()).toEqual(['team.json', ...doc.photos.flatMap((p: any) => [p.files.display, p.files.thumb])].sort())
      for (const photo of doc.photos) {
        expect(sha(files.get(photo.files.display)!), photo.files.display).toBe(hashes.get(photo.id)!.display)
        expect(sha(files.get(photo.files.thumb)!), photo.files.thumb).toBe(hashes.get(photo.id)!.thumb)
      }
      await until('temporary files removed', () => temporaryFiles().length === 0)
    })

    it('closed half-way, leaves no temporary file behind, and the next download is whole', async () => {
      const paused = await pausedDownload(owner, `/api/teams/${slug}/exports/team.zip`)
      expect(paused.status).toBe(200)
      expect(temporaryFiles()).toHaveLength(1)
      paused.close()
      await until('temporary files removed after the download was closed', () => temporaryFiles().length === 0)
      await until('temporary files closed after the download was closed', () => openTemporaryFiles().length === 0)

      const whole = await download(owner, `/api/teams/${slug}/exports/team.zip`, instance.url)
      expect(whole.status).toBe(200)
      const files = await unzip(whole.bytes)
      const doc = JSON.parse(files.get('team.json')!.toString('utf8'))
      expect(doc.photos).toHaveLength(COUNT - 1)
      await until('temporary files removed', () => temporaryFiles().length === 0)
    })
  })
})
