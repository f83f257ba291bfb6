// npm run backup and npm run restore against the test database: a dump, then rows added, deleted and changed,
// then the restore; every table's CHECKSUM TABLE must be what it was at the dump. Files that are not complete
// dumps, or no file at all, are refused before the database is touched.
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, exec, query } from '../support/db'

const dataDir = mkdtempSync(join(tmpdir(), 'tallymark-backup-'))
// The scripts find the database the way the app does (DATABASE_URL here); backups go under TALLYMARK_DATA_DIR.
const env = { ...process.env, TALLYMARK_DATA_DIR: dataDir }
const run = (script: string, args: string[] = []) => spawnSync('bash', [script, ...args], { env, encoding: 'utf8', timeout: 120_000 })

async function checksums(): Promise<Record<string, string>> {
  const tables = (await query<{ name: string }>('select table_name as name from information_schema.tables where table_schema = database() order by table_name')).map(t => t.name)
  const rows = await query<{ Table: string, Checksum: string | number }>(`checksum table ${tables.map(t => `\`${t}\``).join(', ')}`)
  return Object.fromEntries(rows.map(r => [r.Table.split('.').pop()!, String(r.Checksum)]))
}

afterAll(async () => {
  await closeTestDb()
  rmSync(dataDir, { recursive: true, force: true })
})

describe('backup and restore', () => {
  let backup = ''

  it('npm run backup writes a gzip\'d mariadb-dump named by the UTC time', () => {
    const res = run('scripts/backup.sh')
    expect(res.status, res.stderr + res.stdout).toBe(0)
    const files = readdirSync(join(dataDir, 'backups'))
    expect(files).toHaveLength(1)
    expect(files[0]).toMatch(/^\d{8}T\d{6}Z\.sql\.gz$/)
    backup = join(dataDir, 'backups', files[0]!)
    expect(res.stdout).toContain(backup)
  })

  it('restore brings every table back to the moment of the dump', async () => {
    // The backup above is replaced by one taken now, beside rows this test owns, so "before" is exactly the dump.
    const slug = `backup-${Date.now().toString(36)}`
    await exec('insert into teams (slug, name) values (?, ?)', [slug, 'Backup Kept Team'])
    await exec('insert into users (email, name, password_hash) values (?, ?, ?)', [`${slug}@example.test`, 'Backup Person', 'x'])
    rmSync(join(dataDir, 'backups'), { recursive: true, force: true })
    const dumped = run('scripts/backup.sh')
    expect(dumped.status, dumped.stderr).toBe(0)
    backup = join(dataDir, 'backups', readdirSync(join(dataDir, 'backups'))[0]!)
    const before = await checksums()

    // Changes after the dump: a row deleted, a row changed, rows added, a table added.
    expect(await exec('delete from teams where slug = ?', [slug])).toBe(1)
    expect(await exec('update users set name = ? where email = ?', ['Renamed Person', `${slug}@example.test`])).toBe(1)
    await exec('insert into teams (slug, name) values (?, ?)', [`${slug}-later`, 'Added After The Backup'])
    await exec('create table backup_scratch (id int primary key)')
    const changed = await checksums()
    expect(changed.teams).not.toBe(before.teams)
    expect(changed.users).not.toBe(before.users)

    const restored = run('scripts/restore.sh', [backup])
    expect(restored.status, restored.stderr + restored.stdout).toBe(0)
    expect(await checksums()).toEqual(before)
    expect(await query('select name from teams where slug = ?', [slug])).toEqual([{ name: 'Backup Kept Team' }])
    expect(await query('select id from teams where slug = ?', [`${slug}-later`])).toEqual([])
    expect((await query('select name from users where email = ?', [`${slug}@example.test`]))[0]).toEqual({ name: 'Backup Person' })
    // The app's own tables are all there, with their rows.
    expect(Number((await query<{ n: number }>('select count(*) as n from __drizzle_migrations'))[0]!.n)).toBeGreaterThan(0)
  })

  it('refuses to run without a file, and refuses files that are not complete dumps, changing nothing', async () => {
    const before = await checksums()
    const none = run('scripts/restore.sh')
    expect(none.status).not.toBe(0)
    expect(none.stderr).toMatch(/Usage: npm run restore -- <backup\.sql\.gz>/)
    const notGzip = join(dataDir, 'plain.sql.gz')
    writeFileSync(notGzip, 'DROP TABLE teams;')
    const notDump = join(dataDir, 'other.sql.gz')
    writeFileSync(notDump, gzipSync('DROP TABLE teams;\n-- Dump completed\n'))
    const cut = join(dataDir, 'cut.sql.gz')
    writeFileSync(cut, gzipSync('-- MariaDB dump 10.19  Distrib 10.11\nDROP TABLE IF EXISTS `teams`;\n'))
    for (const [file, message] of [[notGzip, /not a gzip file/], [notDump, /does not start like a mariadb-dump/], [cut, /incomplete/], [join(dataDir, 'missing.sql.gz'), /No such file/]] as const) {
      const res = run('scripts/restore.sh', [file])
      expect(res.status, file).not.toBe(0)
      expect(res.stderr, file).toMatch(message)
    }
    expect(await checksums()).toEqual(before)
  })
})
