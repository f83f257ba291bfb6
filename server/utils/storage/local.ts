// Local disk storage under STORAGE_DIR (default .data/uploads). Writes go to a temp file and are renamed,
// so a reader never sees half a photo.
import { createReadStream } from 'node:fs'
import { mkdir, rename, rm, stat, writeFile } from 'node:fs/promises'
import { randomBytes } from 'node:crypto'
import { dirname, extname, isAbsolute, relative, resolve, sep } from 'node:path'
import { assertStorageKey } from './keys'
import type { StorageDriver } from './index'

const TYPES: Record<string, string> = { '.webp': 'image/webp', '.jpg': 'image/jpeg', '.jpeg': 'image/jpeg', '.png': 'image/png' }

export function createLocalStorageDriver(dir: string): StorageDriver {
  const root = resolve(dir)

  function pathOf(key: string): string {
    assertStorageKey(key)
    if (isAbsolute(key) || key.split('/').includes('..')) throw new Error('Refused storage key: absolute or climbing path.')
    const full = resolve(root, key)
    const rel = relative(root, full)
    if (!rel || rel.startsWith('..') || isAbsolute(rel) || rel.split(sep).includes('..')) throw new Error('Refused storage key: outside the storage folder.')
    return full
  }

  return {
    name: 'local',
    async put(key, bytes) {
      const full = pathOf(key)
      await mkdir(dirname(full), { recursive: true })
      const temp = `${full}.${randomBytes(6).toString('hex')}.part`
      try {
        await writeFile(temp, bytes, { mode: 0o640 })
        await rename(temp, full)
      }
      catch (error) {
        await rm(temp, { force: true })
        throw error
      }
    },
    async get(key) {
      const full = pathOf(key)
      let size: number
      try {
        const info = await stat(full)
        if (!info.isFile()) return null
        size = info.size
      }
      catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null
        throw error
      }
      return { body: createReadStream(full), contentType: TYPES[extname(full).toLowerCase()] ?? 'application/octet-stream', size }
    },
    async delete(key) {
      await rm(pathOf(key), { force: true })
    },
  }
}
