// The local disk storage driver: round trip, missing keys, and keys that try to leave the folder.
import { afterAll, describe, expect, it } from 'vitest'
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Readable } from 'node:stream'
import { createLocalStorageDriver } from '../../server/utils/storage/local'
import { assertStorageKey } from '../../server/utils/storage/keys'
import type { StoredObject } from '../../server/utils/storage'

const dir = mkdtempSync(join(tmpdir(), 'tallymark-storage-local-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

async function bytesOf(object: StoredObject): Promise<Buffer> {
  if (Buffer.isBuffer(object.body)) return object.body
  const chunks: Buffer[] = []
  for await (const chunk of object.body as Readable) chunks.push(chunk as Buffer)
  return Buffer.concat(chunks)
}

describe('local storage driver', () => {
  const storage = createLocalStorageDriver(join(dir, 'uploads'))

  it('puts, gets and deletes an object', async () => {
    const key = 'teams/7/photos/0123abcd/display.webp'
    const bytes = Buffer.from('not really a webp, but bytes are bytes')
    await storage.put(key, bytes, 'image/webp')
    expect(existsSync(join(dir, 'uploads', key))).toBe(true)
    // No temp file is left beside it.
    expect(readdirSync(join(dir, 'uploads', 'teams/7/photos/0123abcd'))).toEqual(['display.webp'])

    const got = await storage.get(key)
    expect(got).not.toBeNull()
    expect(got!.contentType).toBe('image/webp')
    expect(got!.size).toBe(bytes.length)
    expect((await bytesOf(got!)).equals(bytes)).toBe(true)

    await storage.delete(key)
    expect(await storage.get(key)).toBeNull()
    expect(existsSync(join(dir, 'uploads', key))).toBe(false)
  })

  it('overwrites an existing key', async () => {
    const key = 'teams/7/photos/overwrite/thumb.webp'
    await storage.put(key, Buffer.from('first'), 'image/webp')
    await storage.put(key, Buffer.from('second'), 'image/webp')
    expect((await bytesOf((await storage.get(key))!)).toString()).toBe('second')
  })

  it('answers null for a missing key and deletes a missing key quietly', async () => {
    expect(await storage.get('teams/7/photos/nothing/display.webp')).toBeNull()
    await expect(storage.delete('teams/7/photos/nothing/display.webp')).resolves.toBeUndefined()
  })

  it('refuses keys with "..", absolute paths, backslashes or empty segments', async () => {
    for (const key of ['../outside.webp', 'teams/../../etc/passwd', '/etc/passwd', 'teams/7/../x.webp', 'teams\\7\\x.webp', 'teams//x.webp', '', 'teams/./x.webp', 'C:/x.webp']) {
      expect(() => assertStorageKey(key), key).toThrow(/Refused storage key/)
      await expect(storage.put(key, Buffer.from('x'), 'image/webp'), key).rejects.toThrow(/Refused storage key/)
      await expect(storage.get(key), key).rejects.toThrow(/Refused storage key/)
      await expect(storage.delete(key), key).rejects.toThrow(/Refused storage key/)
    }
    expect(existsSync(join(dir, 'outside.webp'))).toBe(false)
  })
})
