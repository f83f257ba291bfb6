// Backup and restore of the app's database with Debian's mariadb-dump and mariadb client, connected the way
// the app is: DATABASE_URL when set, else the private MariaDB of npm start (127.0.0.1, port TALLYMARK_DB_PORT,
// user tallymark, password in <TALLYMARK_DATA_DIR>/db-password, see scripts/lib/services.ts). The password goes
// to the clients in an option file only readable by us, never on a command line other processes can see.
import { spawn, spawnSync } from 'node:child_process'
import { createReadStream, createWriteStream, existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { createGunzip, createGzip } from 'node:zlib'
import { startPrivateMariaDb, type PrivateMariaDb } from './mariadb'
import { localSecret } from './local-secrets'

export interface DbConnection { host: string, port: number, user: string, password: string, database: string }

export function dataDir(): string {
  return resolve(process.env.TALLYMARK_DATA_DIR || '.data')
}

export function backupDir(): string {
  return join(dataDir(), 'backups')
}

/** The database the app uses: DATABASE_URL, or the private one npm start runs (`create`: set it up if there is none yet). */
export function databaseConnection(create = false): DbConnection & { private: boolean } {
  const url = process.env.DATABASE_URL
  if (url) {
    const u = new URL(url)
    return {
      host: u.hostname, port: Number(u.port || 3306), user: decodeURIComponent(u.username), password: decodeURIComponent(u.password),
      database: decodeURIComponent(u.pathname.replace(/^\//, '')), private: false,
    }
  }
  const passwordFile = join(dataDir(), 'db-password')
  if (!create && !existsSync(passwordFile)) throw new Error(`There is no private database under ${dataDir()} yet (run npm start once), and DATABASE_URL is not set.`)
  return {
    host: '127.0.0.1', port: Number(process.env.TALLYMARK_DB_PORT ?? 3307), user: 'tallymark',
    password: localSecret(passwordFile), database: 'tallymark', private: true,
  }
}

const quote = (value: string) => `"${value.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`

/** Runs `work` with an option file for the clients ([client] host, port, user, password). */
export async function withOptionFile<T>(connection: DbConnection, work: (file: string) => Promise<T>): Promise<T> {
  const dir = mkdtempSync(join(tmpdir(), 'tallymark-db-'))
  const file = join(dir, 'client.cnf')
  writeFileSync(file, `[client]\nhost=${quote(connection.host)}\nport=${connection.port}\nuser=${quote(connection.user)}\npassword=${quote(connection.password)}\nprotocol=tcp\n`, { mode: 0o600 })
  try {
    return await work(file)
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

function answers(optionFile: string): boolean {
  // --defaults-file must come first, and reads only that file (Debian's /etc/mysql is ignored).
  return spawnSync('mariadb-admin', [`--defaults-file=${optionFile}`, '--connect-timeout=3', 'ping'], { stdio: 'ignore' }).status === 0
}

/**
 * Makes sure the database answers. The private MariaDB is started for the length of the work when npm start
 * is not running (and stopped again after); a database named by DATABASE_URL must already be up.
 */
export async function withDatabase<T>(work: (connection: DbConnection, optionFile: string) => Promise<T>, options: { create?: boolean } = {}): Promise<T> {
  const connection = databaseConnection(options.create)
  return await withOptionFile(connection, async (optionFile) => {
    let started: PrivateMariaDb | undefined
    if (!answers(optionFile)) {
      if (!connection.private) throw new Error(`The database at ${connection.host}:${connection.port} does not answer.`)
      const dir = join(dataDir(), 'mariadb')
      if (!options.create && !existsSync(join(dir, 'db', 'mysql'))) throw new Error(`There is no private database under ${dir} yet: nothing to back up.`)
      const pidFile = join(dir, 'mariadb.pid')
      if (existsSync(pidFile) && isAlive(Number(readFileSync(pidFile, 'utf8').trim()))) {
        throw new Error(`The private MariaDB (pid file ${pidFile}) is running but does not answer on port ${connection.port}: check TALLYMARK_DB_PORT.`)
      }
      started = await startPrivateMariaDb({ dataDir: dir, port: connection.port, database: connection.database, user: connection.user, password: connection.password, quiet: true })
    }
    try {
      return await work(connection, optionFile)
    }
    finally {
      await started?.stop()
    }
  })
}

function isAlive(pid: number): boolean {
  if (!pid) return false
  try {
    process.kill(pid, 0)
    return true
  }
  catch {
    return false
  }
}

/** 20260501T123000Z: the UTC time in ISO 8601's basic format (no colons, so it is a file name everywhere). */
export function backupStamp(date = new Date()): string {
  return date.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/[-:]/g, '')
}

function waitFor(child: ReturnType<typeof spawn>, what: string, stderr: () => string): Promise<void> {
  return new Promise((resolvePromise, reject) => {
    child.on('error', reject)
    child.on('close', code => code === 0 ? resolvePromise() : reject(new Error(`${what} exited with ${code}: ${stderr().trim()}`)))
  })
}

/** Writes a gzip'd mariadb-dump of the database into `file` (through a .part file, so a broken dump is never left as a backup). */
export async function dumpDatabase(connection: DbConnection, optionFile: string, file: string): Promise<void> {
  const part = `${file}.part`
  let stderr = ''
  const child = spawn('mariadb-dump', [
    `--defaults-file=${optionFile}`, '--single-transaction', '--routines', '--triggers', '--events', '--hex-blob', '--no-tablespaces',
    '--default-character-set=utf8mb4', connection.database,
  ], { stdio: ['ignore', 'pipe', 'pipe'] })
  child.stderr!.on('data', (d: Buffer) => { stderr += d.toString() })
  try {
    await Promise.all([pipeline(child.stdout!, createGzip(), createWriteStream(part, { mode: 0o600 })), waitFor(child, 'mariadb-dump', () => stderr)])
    renameSync(part, file)
  }
  catch (error) {
    rmSync(part, { force: true })
    throw error
  }
}

const HEADER = /^-- (MariaDB|MySQL) dump \d/m
const COMPLETED = /^-- Dump completed/m

/** Reads the whole file once: it must be gzip, start like a mariadb-dump and end with its "Dump completed" line. */
export async function checkDump(file: string): Promise<void> {
  if (!existsSync(file)) throw new Error(`No such file: ${file}`)
  let head = ''
  let tail = ''
  try {
    await pipeline(createReadStream(file), createGunzip(), async (source: AsyncIterable<Buffer>) => {
      for await (const chunk of source) {
        const text = chunk.toString('utf8')
        if (head.length < 4096) head += text.slice(0, 4096 - head.length)
        tail = (tail + text).slice(-4096)
      }
    })
  }
  catch (error) {
    throw new Error(`${file} is not a gzip file that can be read (${(error as Error).message}): it is not a backup made by npm run backup.`, { cause: error })
  }
  if (!HEADER.test(head)) throw new Error(`${file} does not start like a mariadb-dump: it is not a backup made by npm run backup.`)
  if (!COMPLETED.test(tail)) throw new Error(`${file} does not end with "-- Dump completed": the dump is incomplete, refusing to restore it.`)
}

/** Empties the database, then runs the dump into it, in one client session. */
export async function restoreDatabase(connection: DbConnection, optionFile: string, file: string): Promise<void> {
  const listed = spawnSync('mariadb', [`--defaults-file=${optionFile}`, '-N', '-B', '-e', 'select table_name from information_schema.tables where table_schema = database()', connection.database], { encoding: 'utf8' })
  if (listed.status !== 0) throw new Error(`Could not list the tables of ${connection.database}: ${listed.stderr.trim()}`)
  const tables = listed.stdout.split('\n').map(t => t.trim()).filter(Boolean)
  // Tables the dump does not have (made by a newer migration) must go too, or the next migrate would trip over them.
  const prelude = tables.length
    ? `SET FOREIGN_KEY_CHECKS=0;\nDROP TABLE IF EXISTS ${tables.map(t => `\`${t.replace(/`/g, '``')}\``).join(', ')};\nSET FOREIGN_KEY_CHECKS=1;\n`
    : ''
  let stderr = ''
  const child = spawn('mariadb', [`--defaults-file=${optionFile}`, '--default-character-set=utf8mb4', connection.database], { stdio: ['pipe', 'ignore', 'pipe'] })
  child.stderr!.on('data', (d: Buffer) => { stderr += d.toString() })
  const input = async function* () {
    yield Buffer.from(prelude)
    yield* createReadStream(file).pipe(createGunzip())
  }
  await Promise.all([pipeline(Readable.from(input()), child.stdin!), waitFor(child, 'mariadb', () => stderr)])
}

export function ensureBackupDir(): string {
  const dir = backupDir()
  mkdirSync(dir, { recursive: true, mode: 0o700 })
  return dir
}
