// npm run bench:reports — seeds 200,000 items for one team (and two other teams' items beside them) into a
// throwaway MariaDB, then prints p50/p95 of every report query and of the buy check, over HTTP through the
// built app and with the same engine and SQL run directly on a connection pool (server/utils/reports/engine.ts),
// and their ratio. Targets: p95 ≤ 150 ms per report, ≤ 50 ms for the buy check, HTTP ≤ 1.3 × direct.
// The app reuses report figures while the team's ledger and wiki versions stand (server/utils/reports/cache.ts):
// "cold" moves the ledger version on before every request (untimed), as an item write does, so every figure is
// computed again; "warm" asks again with nothing changed. The targets are judged on the cold figures.
//
//   npm run bench:reports                        # needs a build: TALLYMARK_OUTPUT_DIR=.output-x, else .output
//   npm run bench:reports -- --items 50000 --runs 30 --sql-only   (--hold keeps the seeded database up)
// Every name below is invented.
import { mkdtempSync, rmSync } from 'node:fs'
import { cpus, loadavg, tmpdir } from 'node:os'
import { join } from 'node:path'
import mysql from 'mysql2/promise'
import { MySqlDialect } from 'drizzle-orm/mysql-core'
import type { SQL } from 'drizzle-orm'
import { startLocalServices } from '../lib/services'
import { applyMigrations } from '../lib/migrate'
import { startAppServer, type AppServer } from '../lib/app-server'
import { freePort } from '../lib/ports'
import { computeFees, type FeeProfile } from '../../shared/ledger/fees'
import { itemNetProfitCents, type ItemStatus } from '../../shared/ledger/item-rules'
import { buyCheckCompute, reportCompute, reportOutcomesCompute, reportSourcingCompute, type ReportExec } from '../../server/utils/reports/engine'
import { REPORT_DIMENSIONS } from '../../shared/schemas/reports'
import { drizzle } from 'drizzle-orm/mysql2'
import * as schema from '../../server/database/schema'
import { ledgerFiguresChanged } from '../../server/utils/ledger/versions'

const args = process.argv.slice(2)
const option = (name: string, fallback: number) => {
  const at = args.indexOf(`--${name}`)
  return at >= 0 ? Number(args[at + 1]) : fallback
}
const ITEMS = option('items', 200_000)
const OTHER_TEAM_ITEMS = option('other-items', 25_000)
const RUNS = option('runs', 40)
const WARMUP = 10
const SQL_ONLY = args.includes('--sql-only')
const BATCH = 2_000
const TODAY = new Date().toISOString().slice(0, 10)
const DAY_MS = 86_400_000
const YEARS = 4

// ---- A small seeded generator, so every run seeds the same ledger.
function generator(seed: number) {
  let a = seed >>> 0
  const next = () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
  return {
    next,
    int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1)),
    pick: <T>(list: readonly T[]): T => list[Math.floor(next() * list.length)]!,
    // Exponential with the given mean: days to sell.
    exp: (mean: number) => -Math.log(1 - next()) * mean,
  }
}

const dayIso = (days: number) => new Date(days * DAY_MS).toISOString().slice(0, 10)
const todayNumber = Math.floor(Date.parse(`${TODAY}T00:00:00Z`) / DAY_MS)

interface SeededTeam { id: number, slug: string, markIds: number[], makerIds: number[], categoryIds: number[], topCategoryIds: number[], storeIds: number[], memberIds: number[] }

async function insertMany(pool: mysql.Pool, table: string, columns: string[], rows: unknown[][]): Promise<number[]> {
  const ids: number[] = []
  for (let at = 0; at < rows.length; at += BATCH) {
    const chunk = rows.slice(at, at + BATCH)
    const [result] = await pool.query<mysql.ResultSetHeader>(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ?`, [chunk])
    // One multi-row INSERT gets consecutive ids from the first one (innodb_autoinc_lock_mode keeps them together).
    for (let i = 0; i < chunk.length; i++) ids.push(result.insertId + i)
  }
  return ids
}

async function seedTeam(pool: mysql.Pool, team: { id: number, slug: string, ownerId: number }, items: number, seed: number): Promise<SeededTeam> {
  const rand = generator(seed)
  const t = team.id
  const entry = (extra: unknown[]) => [t, '[]', '', team.ownerId, team.ownerId, ...extra]
  const entryColumns = ['team_id', 'tags', 'notes', 'created_by', 'updated_by']

  // Members who source: the owner and five more.
  const memberRows = Array.from({ length: 5 }, (_, n) => [`bench.${t}.${n}.${seed}@example.test`, `Bench Member ${n + 1}`, 'x'])
  const userIds = await insertMany(pool, 'users', ['email', 'name', 'password_hash'], memberRows)
  await insertMany(pool, 'memberships', ['team_id', 'user_id', 'role'], userIds.map(u => [t, u, 'contributor']))
  const memberIds = [team.ownerId, ...userIds]

  const topCategoryIds = await insertMany(pool, 'categories', [...entryColumns, 'name', 'parent_id'],
    Array.from({ length: 12 }, (_, n) => entry([`Shelf ${n + 1}`, null])))
  const childIds = await insertMany(pool, 'categories', [...entryColumns, 'name', 'parent_id'],
    topCategoryIds.flatMap((parent, n) => Array.from({ length: 4 }, (_, c) => entry([`Shelf ${n + 1}.${c + 1}`, parent]))))
  const grandIds = await insertMany(pool, 'categories', [...entryColumns, 'name', 'parent_id'],
    childIds.slice(0, 12).map((parent, n) => entry([`Shelf corner ${n + 1}`, parent])))
  const categoryIds = [...topCategoryIds, ...childIds, ...grandIds]

  const makerIds = await insertMany(pool, 'makers', [...entryColumns, 'name', 'other_names'],
    Array.from({ length: 300 }, (_, n) => entry([`Bench Works ${n + 1}`, '[]'])))
  const materialIds = await insertMany(pool, 'materials', [...entryColumns, 'name', 'recognition', 'checks', 'damage', 'cautions', 'sources'],
    Array.from({ length: 25 }, (_, n) => entry([`Bench material ${n + 1}`, '', '{}', n % 3 === 0 ? 'Chips show white.' : '', n % 2 === 0 ? 'Decorative use only unless tested.' : '', '[]'])))
  const markIds = await insertMany(pool, 'marks', [...entryColumns, 'title', 'maker_id'],
    Array.from({ length: 3_000 }, (_, n) => entry([`BENCH MARK ${n + 1}`, makerIds[n % makerIds.length]])))
  await insertMany(pool, 'mark_materials', ['team_id', 'mark_id', 'material_id'], markIds.map((m, n) => [t, m, materialIds[n % materialIds.length]]))
  await insertMany(pool, 'mark_categories', ['team_id', 'mark_id', 'category_id'], markIds.map((m, n) => [t, m, categoryIds[n % categoryIds.length]]))
  const storeIds = await insertMany(pool, 'stores', ['team_id', 'name', 'kind', 'town', 'notes', 'created_by'],
    Array.from({ length: 40 }, (_, n) => [t, `Bench store ${n + 1}`, 'thrift_store', 'Hollowbrook', '', team.ownerId]))
  const profiles: (FeeProfile & { name: string })[] = [
    { name: 'Bench channel A', percentBp: 1325, fixedCents: 30, paymentPercentBp: 0, paymentFixedCents: 0 },
    { name: 'Bench channel B', percentBp: 1000, fixedCents: 0, paymentPercentBp: 290, paymentFixedCents: 30 },
    { name: 'Bench table', percentBp: 0, fixedCents: 0, paymentPercentBp: 0, paymentFixedCents: 0 },
  ]
  const profileIds = await insertMany(pool, 'fee_profiles', ['team_id', 'name', 'channel', 'percent_bp', 'fixed_cents', 'payment_percent_bp', 'payment_fixed_cents', 'default_flag'],
    profiles.map((p, n) => [t, p.name, p.name, p.percentBp, p.fixedCents, p.paymentPercentBp, p.paymentFixedCents, n === 0 ? 1 : null]))

  // Each mark has its own price level; popular marks are bought more often (the first ones).
  const markPrice = markIds.map(() => Math.round(600 * Math.exp(rand.next() * 2.5)))
  const conditions = ['new', 'excellent', 'very_good', 'good', 'fair', 'poor']
  const columns = ['team_id', 'title', 'status', 'category_id', 'mark_id', 'maker_id', 'material_id', 'quantity', 'condition_grade',
    'damage_flags', 'damage_notes', 'weight_grams', 'box_length_mm', 'box_width_mm', 'box_height_mm', 'store_id', 'acquired_on',
    'cost_cents', 'sourced_by', 'listed_by', 'listed_on', 'fee_profile_id', 'sold_on', 'shipped_on', 'sale_price_cents',
    'shipping_charged_cents', 'postage_cents', 'supplies_cents', 'fees_cents', 'refund_cents', 'net_profit_cents', 'notes', 'created_by', 'updated_by']
  const rows: unknown[][] = []
  const span = YEARS * 365
  for (let n = 0; n < items; n++) {
    const markAt = Math.min(markIds.length - 1, Math.floor(markIds.length * rand.next() ** 2))
    const acquired = todayNumber - rand.int(0, span)
    const quantity = rand.next() < 0.1 ? rand.int(2, 6) : 1
    const cost = rand.int(50, 1200) * quantity
    const roll = rand.next()
    const daysToSell = Math.round(rand.exp(40 + (markAt % 7) * 10))
    let status: ItemStatus = roll < 0.62 ? (rand.next() < 0.5 ? 'shipped' : 'sold') : roll < 0.66 ? 'returned' : roll < 0.74 ? rand.pick(['donated', 'written_off', 'kept'] as const) : rand.next() < 0.6 ? 'listed' : 'in_stock'
    if ((status === 'sold' || status === 'shipped' || status === 'returned') && acquired + daysToSell > todayNumber) status = 'listed'
    const sale = ['sold', 'shipped', 'returned'].includes(status)
    const listedOn = status === 'in_stock' || ((status === 'donated' || status === 'written_off' || status === 'kept') && rand.next() < 0.5) ? null : acquired + Math.min(rand.int(0, 7), sale ? daysToSell : 7)
    const soldOn = sale ? acquired + daysToSell : null
    const price = sale ? Math.max(100, Math.round(markPrice[markAt]! * quantity * (0.6 + rand.next() * 0.9))) : null
    const shipping = sale && rand.next() < 0.6 ? rand.int(4, 12) * 100 : 0
    const postage = sale ? rand.int(450, 1600) : null
    const supplies = sale ? rand.int(0, 150) : null
    const profileAt = rand.int(0, 2)
    const fees = sale ? computeFees(profiles[profileAt]!, price!, shipping).totalCents : null
    const refund = status === 'returned' ? price! + shipping : null
    const figures = {
      status, quantity, costCents: cost, acquiredOn: dayIso(acquired), listedOn: listedOn === null ? null : dayIso(listedOn),
      soldOn: soldOn === null ? null : dayIso(soldOn), shippedOn: status === 'shipped' ? dayIso(soldOn!) : null, askingCents: null,
      salePriceCents: price, shippingChargedCents: sale ? shipping : null, postageCents: postage, suppliesCents: supplies, feesCents: fees, refundCents: refund,
    }
    const weighed = rand.next() < 0.7
    rows.push([
      t, `Bench piece ${n + 1}`, status, rand.pick(categoryIds), markIds[markAt], makerIds[markAt % makerIds.length], materialIds[markAt % materialIds.length],
      quantity, rand.pick(conditions), '[]', '', weighed ? rand.int(100, 3000) : null,
      weighed ? rand.int(100, 400) : null, weighed ? rand.int(100, 300) : null, weighed ? rand.int(80, 300) : null,
      rand.pick(storeIds), figures.acquiredOn, cost, rand.pick(memberIds), listedOn === null ? null : rand.pick(memberIds), figures.listedOn,
      listedOn === null ? null : profileIds[profileAt], figures.soldOn, figures.shippedOn, price, figures.shippingChargedCents, postage, supplies, fees, refund,
      itemNetProfitCents(figures), '', team.ownerId, team.ownerId,
    ])
    if (rows.length === BATCH) await insertMany(pool, 'items', columns, rows.splice(0))
  }
  if (rows.length) await insertMany(pool, 'items', columns, rows.splice(0))
  return { id: t, slug: team.slug, markIds, makerIds, categoryIds, topCategoryIds, storeIds, memberIds }
}

async function directTeam(pool: mysql.Pool, name: string): Promise<{ id: number, slug: string, ownerId: number }> {
  const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-')
  const [owner] = await insertMany(pool, 'users', ['email', 'name', 'password_hash'], [[`${slug}@example.test`, `${name} owner`, 'x']])
  const [team] = await insertMany(pool, 'teams', ['slug', 'name'], [[slug, name]])
  await insertMany(pool, 'memberships', ['team_id', 'user_id', 'role'], [[team, owner, 'owner']])
  return { id: team!, slug, ownerId: owner! }
}

// ---- Timing

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!
}

/** `before` runs untimed ahead of every run (the cold runs move the ledger version on there). */
async function timed(run: () => Promise<unknown>, before?: () => Promise<unknown>): Promise<{ p50: number, p95: number }> {
  for (let i = 0; i < WARMUP; i++) {
    await before?.()
    await run()
  }
  const times: number[] = []
  for (let i = 0; i < RUNS; i++) {
    await before?.()
    const start = performance.now()
    await run()
    times.push(performance.now() - start)
  }
  times.sort((a, b) => a - b)
  return { p50: percentile(times, 50), p95: percentile(times, 95) }
}

async function register(url: string): Promise<{ cookie: string, slug: string, userId: number }> {
  const res = await fetch(`${url}/api/auth/register`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'accept': 'application/json' },
    body: JSON.stringify({ email: `bench.owner.${Date.now()}@example.test`, password: 'glazed-teapot-under-felt', name: 'Bench Owner', teamName: 'Bench Resale Team' }),
  })
  if (res.status !== 201) throw new Error(`register: ${res.status} ${await res.text()}`)
  const body = await res.json() as { team: { slug: string }, user: { id: number } }
  const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  return { cookie, slug: body.team.slug, userId: body.user.id }
}

const tmp = mkdtempSync(join(tmpdir(), 'tallymark-bench-'))
const services = await startLocalServices({ dataDir: tmp, dbPort: await freePort(), smtpPort: await freePort(), bufferPool: '512M' })
let app: AppServer | undefined
const pool = mysql.createPool({ uri: services.databaseUrl, connectionLimit: 20, timezone: 'Z', supportBigNumbers: true, charset: 'utf8mb4_unicode_ci' })
pool.on('connection', (conn) => { conn.query('SET time_zone = \'+00:00\'') })
try {
  await applyMigrations(services.databaseUrl)
  let main: { id: number, slug: string, ownerId: number }
  let cookie = ''
  if (SQL_ONLY) main = await directTeam(pool, 'Bench Resale Team')
  else {
    const port = await freePort()
    app = await startAppServer({
      port,
      env: {
        DATABASE_URL: services.databaseUrl, SMTP_URL: services.smtpUrl, PUBLIC_URL: `http://127.0.0.1:${port}`, NODE_ENV: 'production',
        NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-0123456789', STORAGE_DIR: join(tmp, 'uploads'),
      },
    })
    const owner = await register(app.url)
    cookie = owner.cookie
    const [row] = await pool.query<mysql.RowDataPacket[]>('SELECT id FROM teams WHERE slug = ?', [owner.slug])
    main = { id: Number(row![0]!.id), slug: owner.slug, ownerId: owner.userId }
  }
  let started = performance.now()
  const seeded = await seedTeam(pool, main, ITEMS, 1)
  for (const [n, name] of ['Bench Neighbour One', 'Bench Neighbour Two'].entries()) await seedTeam(pool, await directTeam(pool, name), OTHER_TEAM_ITEMS, n + 2)
  await pool.query('ANALYZE TABLE items, categories, marks, makers')
  console.log(`Seeded ${ITEMS.toLocaleString('en')} items for the team and ${(2 * OTHER_TEAM_ITEMS).toLocaleString('en')} for two others in ${((performance.now() - started) / 1000).toFixed(1)} s.`)

  if (args.includes('--hold')) {
    // For looking at plans by hand: keep the seeded database up until Ctrl-C.
    console.log(`Holding ${services.databaseUrl} (team ${main.id}); Ctrl-C ends.`)
    await new Promise(resolve => process.once('SIGINT', resolve))
  }

  // What every item write does in its transaction, so the app computes its figures again.
  const db = drizzle(pool, { schema, mode: 'default' })
  const ledgerWrite = (teamId: number) => ledgerFiguresChanged(db, teamId)
  const dialect = new MySqlDialect()
  const exec: ReportExec = async (statement: SQL) => {
    const query = dialect.sqlToQuery(statement)
    const [rows] = await pool.query(query.sql, query.params)
    return rows as Record<string, unknown>[]
  }
  const yearAgo = dayIso(todayNumber - 364)
  const popularMark = seeded.markIds[0]!
  const quietMark = seeded.markIds[seeded.markIds.length - 1]!
  interface Case { name: string, target: number, path: string, direct: () => Promise<unknown> }
  const cases: Case[] = []
  for (const dimension of REPORT_DIMENSIONS) {
    cases.push({ name: `report ${dimension}, all time`, target: 150, path: `/reports/${dimension}`, direct: () => reportCompute(exec, { teamId: main.id, dimension, filters: {}, today: TODAY }) })
    cases.push({ name: `report ${dimension}, last 12 months`, target: 150, path: `/reports/${dimension}?from=${yearAgo}&to=${TODAY}`, direct: () => reportCompute(exec, { teamId: main.id, dimension, filters: { from: yearAgo, to: TODAY }, today: TODAY }) })
  }
  const parent = seeded.topCategoryIds[0]!
  cases.push({ name: 'report category under a parent', target: 150, path: `/reports/category?parentId=${parent}`, direct: () => reportCompute(exec, { teamId: main.id, dimension: 'category', filters: { parentId: parent }, today: TODAY }) })
  cases.push({ name: 'report mark, one store, 12 months', target: 150, path: `/reports/mark?storeId=${seeded.storeIds[0]}&from=${yearAgo}`, direct: () => reportCompute(exec, { teamId: main.id, dimension: 'mark', filters: { storeId: seeded.storeIds[0], from: yearAgo }, today: TODAY }) })
  cases.push({ name: 'report CSV, mark', target: 150, path: `/reports/mark.csv`, direct: () => reportCompute(exec, { teamId: main.id, dimension: 'mark', filters: {}, today: TODAY }) })
  cases.push({ name: 'outcomes of a popular mark', target: 150, path: `/outcomes?type=mark&id=${popularMark}`, direct: () => reportOutcomesCompute(exec, { teamId: main.id, type: 'mark', id: popularMark, today: TODAY }) })
  cases.push({ name: 'outcomes of a top category', target: 150, path: `/outcomes?type=category&id=${parent}`, direct: () => reportOutcomesCompute(exec, { teamId: main.id, type: 'category', id: parent, today: TODAY }) })
  cases.push({ name: 'sourcing sheet', target: 150, path: '/sourcing-sheet', direct: () => reportSourcingCompute(exec, { teamId: main.id, filters: {}, today: TODAY }) })
  cases.push({ name: 'buy check, popular mark', target: 50, path: `/buy-check?markId=${popularMark}&priceCents=400&condition=good`, direct: () => buyCheckCompute(exec, { teamId: main.id, markId: popularMark, priceCents: 400, quantity: 1, condition: 'good' }) })
  cases.push({ name: 'buy check, quiet mark (falls back)', target: 50, path: `/buy-check?markId=${quietMark}&priceCents=400&quantity=2`, direct: () => buyCheckCompute(exec, { teamId: main.id, markId: quietMark, priceCents: 400, quantity: 2 }) })
  cases.push({ name: 'buy check, top category only', target: 50, path: `/buy-check?categoryId=${parent}&priceCents=400`, direct: () => buyCheckCompute(exec, { teamId: main.id, categoryId: parent, priceCents: 400, quantity: 1 }) })

  started = performance.now()
  const f = (ms: number) => ms.toFixed(1).padStart(7)
  console.log(`\n${RUNS} runs each after ${WARMUP} warm-up runs, one request at a time; times in ms (nearest-rank percentiles).`)
  console.log('http = cold requests (ledger version moved on before each); warm = the same request again, figures reused.')
  console.log('ratio = cold HTTP / the same engine and SQL on a pool of its own; extra = cold HTTP p50 − SQL p50 (session, membership, versions, JSON).')
  console.log(`${'query'.padEnd(40)}${'target'.padStart(7)}${'http p50'.padStart(10)}${'http p95'.padStart(10)}${'warm p50'.padStart(10)}${'warm p95'.padStart(10)}${'sql p50'.padStart(9)}${'sql p95'.padStart(9)}${'ratio p50'.padStart(11)}${'ratio p95'.padStart(11)}${'extra'.padStart(8)}  ok  load`)
  // Each row as soon as it is measured, so a long run that stops early still shows what it measured; load is the
  // one-minute load average after the row (the machine may be shared).
  for (const c of cases) {
    const direct = await timed(c.direct)
    let http: { p50: number, p95: number } | undefined
    let warm: { p50: number, p95: number } | undefined
    if (app) {
      const url = `${app.url}/api/teams/${main.slug}${c.path}`
      const ask = async () => {
        const res = await fetch(url, { headers: { cookie, accept: 'application/json' } })
        if (res.status !== 200) throw new Error(`${c.path}: ${res.status} ${await res.text()}`)
        await res.text()
      }
      http = await timed(ask, () => ledgerWrite(main.id))
      warm = await timed(ask)
    }
    const r = { name: c.name, target: c.target, http, direct }
    const limit = r.http ?? r.direct
    const ratio50 = r.http ? r.http.p50 / r.direct.p50 : null
    const ratio95 = r.http ? r.http.p95 / r.direct.p95 : null
    const ok = limit.p95 <= r.target && (ratio95 === null || ratio95 <= 1.3)
    console.log(`${r.name.padEnd(40)}${String(r.target).padStart(7)}${r.http ? `${f(r.http.p50)}   ${f(r.http.p95)}` : '       -         -'.padStart(20)}${warm ? `${f(warm.p50)}   ${f(warm.p95)}` : '       -         -'.padStart(20)}${f(r.direct.p50).padStart(9)}${f(r.direct.p95).padStart(9)}${ratio50 === null ? '-'.padStart(11) : `${ratio50.toFixed(2)}×`.padStart(11)}${ratio95 === null ? '-'.padStart(11) : `${ratio95.toFixed(2)}×`.padStart(11)}${r.http ? f(r.http.p50 - r.direct.p50).padStart(8) : '-'.padStart(8)}  ${(ok ? 'yes' : 'NO').padEnd(3)} ${loadavg()[0]!.toFixed(1).padStart(5)}`)
  }
  console.log(`\nMeasured in ${((performance.now() - started) / 1000).toFixed(1)} s on ${cpus().length} cores; load average at the end ${loadavg().map(l => l.toFixed(2)).join(', ')} (other work on the machine slows every figure).`)
}
finally {
  await pool.end()
  await app?.stop()
  await services.stop()
  if (!args.includes('--keep')) rmSync(tmp, { recursive: true, force: true })
  else console.log(`Kept ${tmp}`)
}
