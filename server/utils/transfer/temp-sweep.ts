// Old temporary folders of team exports and imports (server/plugins/temp-sweep.ts).
import { readdir, rm, stat } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export const TRANSFER_TEMP_PREFIXES = ['tallymark-export-', 'tallymark-import-'] as const
export const TRANSFER_TEMP_MAX_AGE_MS = 24 * 60 * 60 * 1000

/** Removes the transfer folders in `dir` last changed more than `maxAgeMs` ago; returns their names. */
export async function sweepTransferTempDirs(dir = tmpdir(), maxAgeMs = TRANSFER_TEMP_MAX_AGE_MS, now = Date.now()): Promise<string[]> {
  const removed: string[] = []
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    if (!entry.isDirectory() || !TRANSFER_TEMP_PREFIXES.some(p => entry.name.startsWith(p))) continue
    const path = join(dir, entry.name)
    const info = await stat(path).catch(() => null)
    if (!info || now - info.mtimeMs <= maxAgeMs) continue
    await rm(path, { recursive: true, force: true })
    removed.push(entry.name)
  }
  return removed.sort()
}
