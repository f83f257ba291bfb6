// The S3 storage driver against the fake S3 that npm test starts on loopback (scripts/lib/fake-s3.ts).
import { randomBytes } from 'node:crypto'
import sharp from 'sharp'
import { describe, expect, it } from 'vitest'
import { createStorageDriver } from '../../server/utils/storage'
import { processPhotoImage } from '../../server/utils/images'
import { jpegWithGps } from '../support/photos'
import { storedBytes, testS3Config } from '../support/s3'

describe('S3 storage driver', () => {
  const storage = createStorageDriver({ storageDriver: 's3', storageDir: '/nonexistent', s3: testS3Config() })
  const folder = `teams/1/photos/${randomBytes(16).toString('hex')}`

  it('is the S3 driver when STORAGE_DRIVER says s3', () => {
    expect(storage.name).toBe('s3')
  })

  it('puts, gets and deletes an object, keeping its content type', async () => {
    const key = `${folder}/thumb.webp`
    const bytes = randomBytes(50_000)
    await storage.put(key, bytes, 'image/webp')
    const got = await storage.get(key)
    expect(got).not.toBeNull()
    expect(got!.contentType).toBe('image/webp')
    expect(got!.size).toBe(bytes.length)
    expect((await storedBytes(got!)).equals(bytes)).toBe(true)
    await storage.delete(key)
    expect(await storage.get(key)).toBeNull()
  })

  it('round-trips a processed photo that still decodes', async () => {
    const { display } = await processPhotoImage(await jpegWithGps(800, 600))
    const key = `${folder}/display.webp`
    await storage.put(key, display.bytes, display.contentType)
    const back = await storedBytes((await storage.get(key))!)
    expect(back.equals(display.bytes)).toBe(true)
    expect(await sharp(back).metadata()).toMatchObject({ format: 'webp', width: 800, height: 600 })
    await storage.delete(key)
  })

  it('answers null for a missing key and deletes a missing key quietly', async () => {
    expect(await storage.get(`${folder}/never-written.webp`)).toBeNull()
    await expect(storage.delete(`${folder}/never-written.webp`)).resolves.toBeUndefined()
  })

  it('refuses keys with "..", absolute paths or odd characters before any request', async () => {
    for (const key of ['../x.webp', '/teams/1/x.webp', 'teams/1/../x.webp', 'teams/1/x y.webp', 'teams//x.webp']) {
      await expect(storage.put(key, Buffer.from('x'), 'image/webp'), key).rejects.toThrow(/Refused storage key/)
      await expect(storage.get(key), key).rejects.toThrow(/Refused storage key/)
    }
  })

  it('reports a missing bucket as an error, not as a missing object', async () => {
    const misconfigured = createStorageDriver({ storageDriver: 's3', storageDir: '/nonexistent', s3: { ...testS3Config(), bucket: 'no-such-bucket-here' } })
    await expect(misconfigured.get(`${folder}/thumb.webp`)).rejects.toThrow(/bucket/i)
    await expect(misconfigured.put(`${folder}/thumb.webp`, Buffer.from('x'), 'image/webp')).rejects.toThrow(/bucket/i)
  })
})
