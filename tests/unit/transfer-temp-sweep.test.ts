// The start-up sweep of old export and import folders: only those, only when older than the limit.
import { mkdir, mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterEach, describe, expect, it } from 'vitest'
import { sweepTransferTempDirs, TRANSFER_TEMP_MAX_AGE_MS } from '../../server/utils/transfer/temp-sweep'

let dir = ''
afterEach(async () => { if (dir) await rm(dir, { recursive: true, force: true }) })

async function folder(name: string, ageMs: number) {
  const path = join(dir, name)
  await mkdir(path)
  await writeFile(join(path, 'team.json'), '{}')
  const at = new Date(Date.now() - ageMs)
  await utimes(path, at, at)
}

describe('sweepTransferTempDirs', () => {
  it('removes export and import folders older than a day, and nothing else', async () => {
    dir = await mkdtemp(join(tmpdir(), 'sweep-test-'))
    const day = TRANSFER_TEMP_MAX_AGE_MS
    await folder('tallymark-export-old', day + 60_000)
    await folder('tallymark-import-old', 3 * day)
    await folder('tallymark-export-running', 60_000)
    await folder('someone-elses-folder', 5 * day)
    await writeFile(join(dir, 'tallymark-export-a-file'), 'not a folder')
    const removed = await sweepTransferTempDirs(dir)
    expect(removed).toEqual(['tallymark-export-old', 'tallymark-import-old'])
    expect((await readdir(dir)).sort()).toEqual(['someone-elses-folder', 'tallymark-export-a-file', 'tallymark-export-running'])
  })
})
