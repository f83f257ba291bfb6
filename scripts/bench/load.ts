// npm run bench:load — a throwaway MariaDB with the demo team (npm run db:seed's data, without photos), the
// built app (TALLYMARK_OUTPUT_DIR, default .output) and 50 more members of the team, each signed in. Then,
// at 50 connections (one member each), for --seconds (default 60) each:
//   1. a mix of searches, entry reads, mark edits (PATCH with the revision just read; a 409 is expected now
//      and then and the next round reads again) and sales (POST items/:id/sale, each on an item of its own);
//   2. authenticated entry reads alone (a mark's page: one statement, from the page cache while the team's wiki is unchanged);
//   3. authenticated team reads alone (GET /api/teams/:team: the session and membership checks, nothing else);
//   4. GET /api/health, the ceiling (no session, one trivial query).
// It prints p50/p95/p99 and req/s of each, per kind of request in the mix, the errors (any answer other than
// 2xx and the expected 409s), and checks that every acknowledged write is in the database afterwards. Exits 1
// on an error or a lost write. A script that prints figures, not a test.
//
//   TALLYMARK_OUTPUT_DIR=.output-x npm run bench:load -- --seconds 20
import { mkdtempSync, rmSync } from 'node:fs'
import { cpus, loadavg, tmpdir } from 'node:os'
import { join } from 'node:path'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import autocannon from 'autocannon'
import mysql from 'mysql2/promise'
import { seedDemoTeam } from '../../server/database/seed'
import { DEMO_TEAM } from '../../server/database/seed/demo-team'
import { startAppServer, type AppServer } from '../lib/app-server'
import { applyMigrations } from '../lib/migrate'
import { freePort } from '../lib/ports'
import { startLocalServices } from '../lib/services'
import { seededRandom } from '../lib/random'

const args = process.argv.slice(2)
const option = (name: string, fallback: number) => {
  const at = args.indexOf(`--${name}`)
  const value = at >= 0 ? Number(args[at + 1]) : Number.NaN
  return Number.isFinite(value) && value > 0 ? value : fallback
}
const SECONDS = option('seconds', 60)
const CONNECTIONS = option('connections', 50)
const MEMBERS = CONNECTIONS
const PASSWORD = 'kiln-shelf-and-saggar-2026'
// Edits go to a few marks only, so that members really do edit the same mark at the same moment.
const HOT_MARKS = 12

// A seeded generator, so every run asks the same things in the same order.
const { random, pick } = seededRandom(20260901)

type Kind = 'search' | 'read' | 'edit read' | 'edit' | 'sale'
interface Tally { ok: number, conflicts: number, errors: Map<number, number>, times: number[] }
const tallies = new Map<Kind, Tally>()
const tally = (kind: Kind) => tallies.get(kind) ?? tallies.set(kind, { ok: 0, conflicts: 0, errors: new Map(), times: [] }).get(kind)!

interface Context { user?: number, t0?: number, kind?: Kind, markId?: number, revision?: number, token?: string, itemId?: number, price?: number }

const percentile = (sorted: number[], p: number) => sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil(p / 100 * sorted.length) - 1)]! : Number.NaN
const fixed = (n: number, digits = 1) => Number.isFinite(n) ? n.toFixed(digits) : '—'
const load = () => `load average ${loadavg().map(n => n.toFixed(1)).join(' ')}`

/** One run's line: autocannon's request rate, and percentiles of the times this script measured (autocannon has no p95). */
function line(name: string, r: autocannon.Result, times: number[]) {
  const sorted = [...times].sort((a, b) => a - b)
  const p = (n: number) => fixed(percentile(sorted, n)).padStart(6)
  return `${name.padEnd(32)} ${fixed(r.requests.average, 0).padStart(6)} req/s   p50 ${p(50)}   p95 ${p(95)}   p99 ${p(99)} ms   non-2xx ${r.non2xx}   errors ${r.errors + r.timeouts}`
}

/**
 * Keeps a renewed session cookie, as a browser does: the app re-seals the cookie once a minute (the idle clock),
 * and a client that kept sending the old one would have it re-sealed on every request.
 */
function keepCookies(cookies: string[], context: Context, headers: Record<string, string | string[]>) {
  const key = Object.keys(headers).find(k => k.toLowerCase() === 'set-cookie')
  if (!key || context.user === undefined) return
  const jar = new Map(cookies[context.user]!.split('; ').map(pair => [pair.slice(0, pair.indexOf('=')), pair]))
  for (const line of ([] as string[]).concat(headers[key]!)) {
    const pair = line.split(';')[0]!
    jar.set(pair.slice(0, pair.indexOf('=')), pair)
  }
  cookies[context.user] = [...jar.values()].join('; ')
}

/** A request that only times itself (for the runs of one kind of request). */
function timed(times: number[], cookies: string[], build: (context: Context) => { path: string, user?: number }) {
  return {
    setupRequest: (r: autocannon.Request, c: Context) => {
      const { path, user } = build(c)
      c.user = user
      c.t0 = performance.now()
      return { ...r, method: 'GET', path, headers: { accept: 'application/json', ...(user === undefined ? {} : { cookie: cookies[user]! }) } }
    },
    onResponse: (_status: number, _body: string, c: Context, headers: Record<string, string | string[]>) => {
      times.push(performance.now() - c.t0!)
      keepCookies(cookies, c, headers)
    },
  }
}

async function main() {
  const loadStart = load()
  delete process.env.DATABASE_URL
  const tmp = mkdtempSync(join(tmpdir(), 'tallymark-bench-load-'))
  process.env.STORAGE_DIR = join(tmp, 'uploads')
  const services = await startLocalServices({ dataDir: tmp, dbPort: await freePort(), smtpPort: 0, withMail: false, bufferPool: '512M' })
  const pool = mysql.createPool({ uri: services.databaseUrl, connectionLimit: 4, timezone: 'Z' })
  let app: AppServer | undefined
  try {
    await applyMigrations(services.databaseUrl)
    await seedDemoTeam(services.databaseUrl, { photos: 0 })
    const [[team]] = await pool.query('select id from teams where slug = ?', [DEMO_TEAM.slug]) as unknown as [{ id: number }[]]
    const teamId = team!.id
    // The extra members, as editors (they edit marks and record sales); one scrypt hash for all of them.
    const hash = await new Hash(new Scrypt({})).make(PASSWORD)
    const emails = Array.from({ length: MEMBERS }, (_, n) => `load.member.${n + 1}@hollowbrook.example`)
    for (const email of emails) {
      const [res] = await pool.query('insert into users (email, name, password_hash) values (?, ?, ?)', [email, `Load Member ${email.split('.')[2]}`, hash]) as unknown as [{ insertId: number }]
      await pool.query('insert into memberships (team_id, user_id, role) values (?, ?, \'editor\')', [teamId, res.insertId])
    }
    const port = await freePort()
    app = await startAppServer({
      port,
      env: { DATABASE_URL: services.databaseUrl, PUBLIC_URL: `http://127.0.0.1:${port}`, NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-0123456789', SMTP_URL: 'smtp://127.0.0.1:9', STORAGE_DIR: join(tmp, 'uploads') },
    })
    const url = app.url
    const cookies: string[] = []
    for (const email of emails) {
      const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: PASSWORD }) })
      if (res.status !== 200) throw new Error(`sign-in of ${email}: ${res.status} ${await res.text()}`)
      cookies.push(res.headers.getSetCookie().map(c => c.split(';')[0]).join('; '))
    }
    const api = (path: string) => `/api/teams/${DEMO_TEAM.slug}${path}`

    // What to ask for: words off the demo marks (whole, three-letter starts, one letter wrong), marks, makers, items.
    const [inscriptions] = await pool.query('select text from mark_inscriptions where team_id = ?', [teamId]) as unknown as [{ text: string }[]]
    const words = [...new Set(inscriptions.flatMap(r => r.text.split(/[^\p{L}]+/u)).filter(w => w.length >= 5))]
    const queries = Array.from({ length: 400 }, () => {
      const w = pick(words)
      const kind = random()
      if (kind < 0.4) return w
      if (kind < 0.7) return w.slice(0, 3)
      const i = 1 + Math.floor(random() * (w.length - 2))
      return w.slice(0, i) + w.slice(i + 1)
    })
    const [markRows] = await pool.query('select id from marks where team_id = ? and deleted_at is null', [teamId]) as unknown as [{ id: number }[]]
    const [makerRows] = await pool.query('select id from makers where team_id = ? and deleted_at is null', [teamId]) as unknown as [{ id: number }[]]
    const [itemRows] = await pool.query('select id from items where team_id = ? and status in (\'in_stock\', \'listed\') order by id', [teamId]) as unknown as [{ id: number }[]]
    const marks = markRows.map(r => r.id)
    const makers = makerRows.map(r => r.id)
    const hot = marks.slice(0, HOT_MARKS)
    const forSale = itemRows.map(r => r.id)
    console.log(`Demo team: ${marks.length} marks, ${makers.length} makers, ${forSale.length} items for sale; ${MEMBERS} members signed in; ${words.length} words to search for.`)
    // The first search builds the team's index; the runs start once it answers.
    for (;;) {
      const res = await fetch(`${url}${api('/search?q=ware')}`, { headers: { cookie: cookies[0]! } })
      if ((await res.json() as { source: string }).source === 'index') break
      await new Promise(r => setTimeout(r, 200))
    }

    let nextUser = 0
    const acked: { edits: { markId: number, revision: number, token: string }[], sales: { itemId: number, price: number }[] } = { edits: [], sales: [] }
    let tokens = 0
    const start = (kind: Kind, request: autocannon.Request, context: Context, method: string, path: string, body?: unknown) => {
      context.user ??= nextUser++ % cookies.length
      context.kind = kind
      context.t0 = performance.now()
      return {
        ...request,
        method: method as autocannon.Request['method'],
        path,
        headers: { cookie: cookies[context.user]!, accept: 'application/json', ...(body ? { 'content-type': 'application/json' } : {}) },
        body: body ? JSON.stringify(body) : undefined,
      }
    }
    const finish = (status: number, body: string, context: Context, headers: Record<string, string | string[]>) => {
      keepCookies(cookies, context, headers)
      const t = tally(context.kind!)
      t.times.push(performance.now() - context.t0!)
      if (status >= 200 && status < 300) {
        t.ok++
        if (context.kind === 'edit read') context.revision = (JSON.parse(body) as { revision: number }).revision
        if (context.kind === 'edit') acked.edits.push({ markId: context.markId!, revision: (JSON.parse(body) as { revision: number }).revision, token: context.token! })
        if (context.kind === 'sale') acked.sales.push({ itemId: context.itemId!, price: context.price! })
      }
      else if (status === 409 && context.kind === 'edit') t.conflicts++
      else t.errors.set(status, (t.errors.get(status) ?? 0) + 1)
    }
    const search = { setupRequest: (r: autocannon.Request, c: Context) => start('search', r, c, 'GET', api(`/search?${new URLSearchParams({ q: pick(queries) })}`)), onResponse: finish }
    const read = {
      setupRequest: (r: autocannon.Request, c: Context) => random() < 0.7
        ? start('read', r, c, 'GET', api(`/marks/${pick(marks)}`))
        : start('read', r, c, 'GET', api(`/makers/${pick(makers)}`)),
      onResponse: finish,
    }
    const editRead = {
      setupRequest: (r: autocannon.Request, c: Context) => {
        c.markId = pick(hot)
        return start('edit read', r, c, 'GET', api(`/marks/${c.markId}`))
      },
      onResponse: finish,
    }
    const edit = {
      setupRequest: (r: autocannon.Request, c: Context) => {
        c.token = `load-${++tokens}`
        return start('edit', r, c, 'PATCH', api(`/marks/${c.markId}`), { revision: c.revision, notes: `Checked under load (${c.token}).` })
      },
      onResponse: finish,
    }
    const sale = {
      setupRequest: (r: autocannon.Request, c: Context) => {
        const itemId = forSale.shift()
        // Every item is sold once at most; when none are left, a read instead.
        if (itemId === undefined) return start('read', r, c, 'GET', api(`/marks/${pick(marks)}`))
        c.itemId = itemId
        c.price = 500 + Math.floor(random() * 5000)
        return start('sale', r, c, 'POST', api(`/items/${itemId}/sale`), { salePriceCents: c.price })
      },
      onResponse: finish,
    }

    console.log(`\nRunning ${SECONDS} s at ${CONNECTIONS} connections: the mix ... (${load()})`)
    const mix = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, requests: [search, read, editRead, edit, search, read, read, sale] as autocannon.Request[] })
    const loadMix = load()
    let readUser = 0
    const readTimes: number[] = []
    const healthTimes: number[] = []
    console.log(`Authenticated entry reads alone ... (${load()})`)
    const reads = await autocannon({
      url, connections: CONNECTIONS, duration: SECONDS,
      requests: [timed(readTimes, cookies, c => ({ path: api(`/marks/${pick(marks)}`), user: c.user ?? readUser++ % cookies.length }))] as autocannon.Request[],
    })
    const loadReads = load()
    let teamUser = 0
    const teamTimes: number[] = []
    console.log(`Authenticated team reads alone ... (${load()})`)
    const teamReads = await autocannon({
      url, connections: CONNECTIONS, duration: SECONDS,
      requests: [timed(teamTimes, cookies, c => ({ path: api(''), user: c.user ?? teamUser++ % cookies.length }))] as autocannon.Request[],
    })
    const loadTeam = load()
    console.log(`GET /api/health, the ceiling ... (${load()})`)
    const ceiling = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, requests: [timed(healthTimes, cookies, () => ({ path: '/api/health' }))] as autocannon.Request[] })
    const loadCeiling = load()
    const mixTimes = [...tallies.values()].flatMap(t => t.times)

    // ---- Every acknowledged write must be in the database.
    let lost = 0
    for (const e of acked.edits) {
      const [rows] = await pool.query('select snapshot from entry_revisions where team_id = ? and entry_type = \'mark\' and entry_id = ? and revision = ?', [teamId, e.markId, e.revision]) as unknown as [{ snapshot: unknown }[]]
      const snapshot = rows[0]?.snapshot
      if (!snapshot || !(typeof snapshot === 'string' ? snapshot : JSON.stringify(snapshot)).includes(e.token)) lost++
    }
    const latest = new Map<number, { revision: number, token: string }>()
    for (const e of acked.edits) if ((latest.get(e.markId)?.revision ?? 0) < e.revision) latest.set(e.markId, e)
    for (const [markId, e] of latest) {
      const [[row]] = await pool.query('select revision, notes from marks where id = ?', [markId]) as unknown as [{ revision: number, notes: string }[]]
      // A later edit may have been written while the run was being stopped, its answer never counted.
      if (!row || row.revision < e.revision || (row.revision === e.revision && !row.notes.includes(e.token))) lost++
    }
    for (const s of acked.sales) {
      const [[row]] = await pool.query('select i.status, i.sale_price_cents as price, (select count(*) from item_status_events e where e.team_id = i.team_id and e.item_id = i.id and e.to_status = \'sold\') as events from items i where i.team_id = ? and i.id = ?', [teamId, s.itemId]) as unknown as [{ status: string, price: number, events: number }[]]
      if (!row || row.status !== 'sold' || Number(row.price) !== s.price || Number(row.events) !== 1) lost++
    }

    console.log(`\n## Load (${CONNECTIONS} connections, ${SECONDS} s per run, ${cpus().length} cores shared with other work; ${loadStart} at start)`)
    console.log(`${line('mix (search, read, edit, sale)', mix, mixTimes)}   (${loadMix})`)
    console.log(`${line('authenticated entry reads', reads, readTimes)}   (${loadReads})`)
    console.log(`${line('authenticated team reads', teamReads, teamTimes)}   (${loadTeam})`)
    console.log(`${line('GET /api/health (ceiling)', ceiling, healthTimes)}   (${loadCeiling})`)
    console.log(`authenticated team reads / ceiling   ${fixed(100 * teamReads.requests.average / ceiling.requests.average)} % (aim ≥ 50 %: what signing in costs a request)`)
    console.log(`authenticated entry reads / ceiling  ${fixed(100 * reads.requests.average / ceiling.requests.average)} % (aim ≥ 50 %: a mark's page, one statement)`)
    console.log('\nkind         requests   p50 ms   p95 ms   p99 ms   ok      409s   errors')
    let errors = 0
    for (const [kind, t] of tallies) {
      const sorted = t.times.sort((a, b) => a - b)
      const errs = [...t.errors].map(([status, n]) => `${n}×${status}`).join(' ') || '0'
      errors += [...t.errors.values()].reduce((a, b) => a + b, 0)
      console.log(`${kind.padEnd(12)} ${String(sorted.length).padStart(8)} ${fixed(percentile(sorted, 50)).padStart(8)} ${fixed(percentile(sorted, 95)).padStart(8)} ${fixed(percentile(sorted, 99)).padStart(8)}   ${String(t.ok).padEnd(7)} ${String(t.conflicts).padEnd(6)} ${errs}`)
    }
    for (const r of [reads, teamReads, ceiling]) errors += r.errors + r.timeouts + r.non2xx
    errors += mix.errors + mix.timeouts
    console.log(`\nacknowledged writes: ${acked.edits.length} edits, ${acked.sales.length} sales; lost: ${lost}; errors: ${errors}`)
    process.exitCode = lost > 0 || errors > 0 ? 1 : 0
  }
  finally {
    await pool.end()
    await app?.stop()
    await services.stop()
    rmSync(tmp, { recursive: true, force: true })
  }
}

await main()
