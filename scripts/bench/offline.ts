// npm run bench:offline — the phone's budgets, measured. Builds a team with 5,000 marks (2–4 inscriptions
// each, 600 makers, 30 materials, 40 categories, 5,000 notes, 1,000 look-alike pairs, made-up words) in a
// throwaway MariaDB, starts the built app (TALLYMARK_OUTPUT_DIR, default .output), and prints:
//   1. the bytes of GET /offline/reference as sent with Accept-Encoding br and gzip (and uncompressed), and of a
//      delta after ten edits — budget: the full snapshot ≤ 5 MB transferred;
//   2. in Chromium throttled to a mid-range phone (CDP Emulation.setCPUThrottlingRate 4×), the phone's own
//      index (shared/offline/device-index.ts, bundled as the app bundles it) built from that snapshot, and
//      the latency of 400 searches of four kinds, p50 / p95 / max, with recall@5 — budget: p95 ≤ 50 ms.
// A script that prints figures, not a test.
import { mkdtempSync, rmSync } from 'node:fs'
import { request } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import mysql from 'mysql2/promise'
import { build } from 'vite'
import { chromium } from 'playwright-core'
import { startAppServer } from '../lib/app-server'
import { applyMigrations } from '../lib/migrate'
import { freePort } from '../lib/ports'
import { startLocalServices } from '../lib/services'
import { seededRandom } from '../lib/random'

const MARKS = Number(process.env.BENCH_MARKS ?? 5000)
const MAKERS = 600
const QUERIES = Number(process.env.BENCH_QUERIES ?? 100)
const THROTTLE = Number(process.env.BENCH_CPU_THROTTLE ?? 4)
const BUDGET_BYTES = 5 * 1024 * 1024
const BUDGET_P95_MS = 50

const { random, pick } = seededRandom(20260815)
const SYLLABLES = ['var', 'hol', 'quen', 'del', 'bram', 'ston', 'fel', 'wick', 'mar', 'tor', 'lin', 'dra', 'cor', 'win', 'ash', 'by',
  'ford', 'ham', 'ley', 'ton', 'mere', 'wald', 'rid', 'gan', 'pel', 'tis', 'nor', 'vel', 'cot', 'brim', 'sel', 'kar', 'dun', 'mor']
const KINDS = ['POTTERY CO', 'GLASS WORKS', 'CHINA CO', 'PORCELAIN', 'WARE', 'CERAMICS', 'ART POTTERY', 'STONEWARE CO', '& SONS', 'BROS']
const NOTE_WORDS = 'found seen sold bought shelf base glaze crazing chip rim foot ring stamp mark faint worn blue green brown cream market fair lot box bowl jug vase plate cup lid handle crack repair good poor early late piece set pair small large heavy thin clear painted printed impressed label'.split(' ')
const word = (min: number, max: number) => Array.from({ length: min + Math.floor(random() * (max - min + 1)) }, () => pick(SYLLABLES)).join('')
function unique(count: number, make: () => string): string[] {
  const seen = new Set<string>()
  while (seen.size < count) seen.add(make())
  return [...seen]
}
const title = (s: string) => s.replace(/\b\p{L}+/gu, w => w[0]!.toUpperCase() + w.slice(1).toLowerCase())

function typo(w: string): string {
  const i = 1 + Math.floor(random() * (w.length - 2))
  const kind = random()
  if (kind < 0.33) return w.slice(0, i) + w.slice(i + 1)
  if (kind < 0.66) return w.slice(0, i) + pick([...'AEIOURSTN']) + w.slice(i)
  return w.slice(0, i) + pick([...'AEIOURSTNKLM'.replace(w[i]!, '')]) + w.slice(i + 1)
}

/** The response body's size as sent (before the client decompresses it), for one Accept-Encoding. */
function transferred(url: string, cookie: string, encoding: string): Promise<{ bytes: number, encoding: string, ms: number, body: Buffer }> {
  return new Promise((resolve, reject) => {
    const started = performance.now()
    const req = request(url, { headers: { cookie, 'accept-encoding': encoding, 'accept': 'application/json' } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        if (res.statusCode !== 200) return reject(new Error(`${url}: ${res.statusCode} ${Buffer.concat(chunks).toString().slice(0, 300)}`))
        const body = Buffer.concat(chunks)
        resolve({ bytes: body.length, encoding: String(res.headers['content-encoding'] ?? 'identity'), ms: performance.now() - started, body })
      })
    })
    req.on('error', reject)
    req.end()
  })
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} kB`
const mbText = (n: number) => `${(n / 1024 / 1024).toFixed(2)} MB`
function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil(p / 100 * sorted.length) - 1)]!
}

async function main() {
  const tmp = mkdtempSync(join(tmpdir(), 'tallymark-bench-offline-'))
  delete process.env.DATABASE_URL
  const services = await startLocalServices({ dataDir: tmp, dbPort: await freePort(), smtpPort: await freePort(), bufferPool: '256M', withMail: false })
  const pool = mysql.createPool({ uri: services.databaseUrl, connectionLimit: 4, timezone: 'Z', charset: 'utf8mb4_unicode_ci' })
  let server: Awaited<ReturnType<typeof startAppServer>> | undefined
  try {
    await applyMigrations(services.databaseUrl)
    const port = await freePort()
    server = await startAppServer({
      port,
      env: { DATABASE_URL: services.databaseUrl, PUBLIC_URL: `http://127.0.0.1:${port}`, NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-0123456789', SMTP_URL: 'smtp://127.0.0.1:9' },
    })
    const email = `bench.offline.${Date.now()}@example.test`
    const reg = await fetch(`${server.url}/api/auth/register`, {
      method: 'POST', headers: { 'content-type': 'application/json', 'origin': server.url },
      body: JSON.stringify({ email, password: 'glazed-teapot-under-felt', name: 'Bench Person', teamName: 'Offline Bench Team' }),
    })
    if (reg.status !== 201) throw new Error(`register: ${reg.status} ${await reg.text()}`)
    const cookie = reg.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const { team } = await reg.json() as { team: { slug: string } }
    const [[teamRow]] = await pool.query('select id from teams where slug = ?', [team.slug]) as unknown as [{ id: number }[]]
    const [[userRow]] = await pool.query('select id from users where email = ?', [email]) as unknown as [{ id: number }[]]
    const teamId = teamRow!.id
    const userId = userRow!.id

    // ---- The corpus, straight into MariaDB.
    const insert = async (table: string, columns: string[], rows: unknown[][]) => {
      for (let i = 0; i < rows.length; i += 2000) await pool.query(`insert into ${table} (${columns.join(', ')}) values ?`, [rows.slice(i, i + 2000)])
    }
    const makerNames = unique(MAKERS, () => word(2, 3).toUpperCase())
    await insert('makers', ['id', 'team_id', 'tags', 'notes', 'created_by', 'updated_by', 'name', 'other_names', 'country', 'year_from', 'year_to'],
      makerNames.map((name, i) => [i + 1, teamId, '["pottery"]', `${title(name)} worked from a small yard; marks changed twice.`, userId, userId, title(name), JSON.stringify([title(name).slice(0, 6)]), pick(['United States', 'England', 'Germany', 'Japan']), 1850 + i % 100, 1900 + i % 90]))
    const materialIds = Array.from({ length: 30 }, (_, i) => i + 1)
    await insert('materials', ['id', 'team_id', 'tags', 'notes', 'created_by', 'updated_by', 'name', 'recognition', 'checks', 'damage', 'cautions', 'sources'],
      materialIds.map(i => [i, teamId, '[]', '', userId, userId, `Material ${title(word(2, 2))}`, 'Heavy, cold to the touch, rings when tapped.', JSON.stringify({ weight: 'heavy', sound: 'rings', touch: 'cold', seams: '', uvGlow: '', translucency: '' }), 'Chips at the rim.', '', '[]']))
    await insert('categories', ['id', 'team_id', 'tags', 'notes', 'created_by', 'updated_by', 'parent_id', 'name'],
      Array.from({ length: 40 }, (_, i) => [i + 1, teamId, '[]', '', userId, userId, i < 8 ? null : 1 + (i % 8), `Category ${title(word(2, 2))}`]))
    const lines = unique(MARKS, () => word(3, 4).toUpperCase())
    const towns = unique(300, () => word(2, 2).toUpperCase() + pick(['TON', 'FORD', 'VILLE', 'FIELD']))
    const targets: { id: number, maker: string, line: string, town: string }[] = []
    const markRows: unknown[][] = []
    const inscriptionRows: unknown[][] = []
    const linkRows: unknown[][] = []
    const noteRows: unknown[][] = []
    for (let m = 1; m <= MARKS; m++) {
      const makerIndex = Math.floor(random() * MAKERS)
      const t = { id: m, maker: makerNames[makerIndex]!, line: lines[m - 1]!, town: pick(towns) }
      const inscriptions = [`${t.maker} ${pick(KINDS)}`, `${t.line} ${t.town}`]
      if (random() < 0.5) inscriptions.push(`${t.maker} ${t.line} ${100 + Math.floor(random() * 900)}`)
      if (random() < 0.3) inscriptions.push(pick(['MADE IN', 'HAND PAINTED', 'WARRANTED', 'OVEN PROOF']))
      const from = 1850 + Math.floor(random() * 130)
      markRows.push([m, teamId, '["backstamp"]', random() < 0.3 ? `Printed in ${pick(['green', 'blue', 'black'])} under the glaze.` : '', userId, userId, title(`${t.maker} ${t.line}`), makerIndex + 1, pick(['United States', 'England', 'Germany']), from, from + Math.floor(random() * 40)])
      inscriptions.forEach((text, position) => inscriptionRows.push([teamId, m, position, text]))
      linkRows.push([teamId, m, pick(materialIds)])
      const words = Array.from({ length: 8 + Math.floor(random() * 16) }, () => pick(NOTE_WORDS))
      noteRows.push([teamId, 'mark', m, userId, `${words.join(' ')}.`])
      targets.push(t)
    }
    await insert('marks', ['id', 'team_id', 'tags', 'notes', 'created_by', 'updated_by', 'title', 'maker_id', 'country', 'year_from', 'year_to'], markRows)
    await insert('mark_inscriptions', ['team_id', 'mark_id', 'position', 'text'], inscriptionRows)
    await insert('mark_materials', ['team_id', 'mark_id', 'material_id'], linkRows)
    await insert('entry_notes', ['team_id', 'entry_type', 'entry_id', 'author_id', 'body'], noteRows)
    const pairs = new Set<string>()
    while (pairs.size < 1000) {
      const a = 1 + Math.floor(random() * MARKS)
      const b = 1 + Math.floor(random() * MARKS)
      if (a !== b) pairs.add(`${Math.min(a, b)}:${Math.max(a, b)}`)
    }
    await insert('mark_lookalikes', ['team_id', 'mark_low_id', 'mark_high_id', 'how_to_tell'], [...pairs].map(p => [teamId, ...p.split(':').map(Number), 'The real one has a **serif** N.']))
    console.log(`Team: ${MARKS} marks (${inscriptionRows.length} inscriptions), ${MAKERS} makers, 30 materials, 40 categories, ${noteRows.length} notes, ${pairs.size} look-alike pairs.`)

    // ---- 1. What the phone downloads.
    const url = `${server.url}/api/teams/${team.slug}/offline/reference`
    const br = await transferred(url, cookie, 'br')
    const gz = await transferred(url, cookie, 'gzip')
    const plain = await transferred(url, cookie, 'identity')
    const snapshot = JSON.parse(plain.body.toString('utf8')) as { cursor: string, marks: unknown[], notes: unknown[] }
    console.log('\nReference download (full snapshot):')
    console.log(`  uncompressed ${mbText(plain.bytes)} · gzip ${mbText(gz.bytes)} (${gz.encoding}, ${gz.ms.toFixed(0)} ms) · br ${mbText(br.bytes)} (${br.encoding}, ${br.ms.toFixed(0)} ms)`)
    console.log(`  ${snapshot.marks.length} marks, ${snapshot.notes.length} notes; budget ≤ ${mbText(BUDGET_BYTES)}: ${Math.max(br.bytes, gz.bytes) <= BUDGET_BYTES ? 'met' : 'MISSED'}`)
    // Ten edits through the API, then only the changes. The cursor leaves out changes of the last 10 s (not
    // yet settled), so edits made before the snapshot are re-sent; these are made after it.
    for (let m = 1; m <= 10; m++) {
      const current = await (await fetch(`${server.url}/api/teams/${team.slug}/marks/${m}`, { headers: { cookie } })).json() as { revision: number, inscriptions: string[] }
      const res = await fetch(`${server.url}/api/teams/${team.slug}/marks/${m}`, {
        method: 'PATCH', headers: { cookie, 'content-type': 'application/json', 'origin': server.url },
        body: JSON.stringify({ revision: current.revision, inscriptions: [...current.inscriptions, 'SECOND STAMP'] }),
      })
      if (res.status !== 200) throw new Error(`edit: ${res.status} ${await res.text()}`)
    }
    const delta = await transferred(`${url}?since=${encodeURIComponent(snapshot.cursor)}`, cookie, 'br')
    const deltaPlain = await transferred(`${url}?since=${encodeURIComponent(snapshot.cursor)}`, cookie, 'identity')
    const deltaBody = JSON.parse(deltaPlain.body.toString('utf8')) as { full: boolean, marks: unknown[], notes: unknown[], thumbs?: unknown }
    console.log(`  changes after 10 edits: br ${kb(delta.bytes)} (${deltaBody.full ? 'full' : 'delta'}: ${deltaBody.marks.length} marks, ${deltaBody.notes.length} notes, thumbnails list ${deltaBody.thumbs ? 'sent' : 'not sent'} — ?thumbs= was not given)`)

    // ---- 2. Search on a throttled phone.
    const bundled = await build({
      configFile: false, logLevel: 'silent',
      build: {
        write: false, minify: true, target: 'es2022',
        lib: { entry: fileURLToPath(new URL('../../shared/offline/device-index.ts', import.meta.url)), formats: ['iife'], name: 'TallymarkDevice', fileName: 'device' },
      },
    })
    const output = (Array.isArray(bundled) ? bundled[0]! : bundled) as { output: { code?: string }[] }
    const code = output.output[0]!.code!
    console.log(`\nPhone search (shared/offline/device-index.ts, ${kb(code.length)} bundled) in Chromium, CPU throttled ${THROTTLE}×:`)
    const queries: Record<string, { q: string, target: number }[]> = {
      'exact words': [], '3-letter prefix': [], 'typo (1 edit)': [], 'partial inscription': [],
    }
    for (let i = 0; i < QUERIES; i++) {
      const t = pick(targets)
      queries['exact words']!.push({ q: `${t.line} ${t.town}`, target: t.id })
      const u = pick(targets)
      queries['3-letter prefix']!.push({ q: `${u.maker} ${u.line.slice(0, 3)}`, target: u.id })
      const v = pick(targets)
      queries['typo (1 edit)']!.push({ q: `${typo(v.line)} ${v.town}`, target: v.id })
      const w = pick(targets)
      queries['partial inscription']!.push({ q: `${w.line.slice(2)} ${w.town.slice(0, -2)}`, target: w.id })
    }
    const browser = await chromium.launch({
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      env: { ...process.env, HOME: mkdtempSync(join(tmpdir(), 'tallymark-bench-chromium-')) },
    })
    try {
      const page = await browser.newPage()
      await page.setContent('<!doctype html><title>bench</title>')
      await page.addScriptTag({ content: code })
      const cdp = await page.context().newCDPSession(page)
      await cdp.send('Emulation.setCPUThrottlingRate', { rate: THROTTLE })
      const buildMs = await page.evaluate((json) => {
        const data = JSON.parse(json)
        const t0 = performance.now()
        const { OfflineDeviceIndex } = (globalThis as unknown as { TallymarkDevice: { OfflineDeviceIndex: new (slug: string) => { put: (type: string, list: unknown[]) => void } } }).TallymarkDevice
        const index = new OfflineDeviceIndex('bench')
        for (const [type, key] of [['maker', 'makers'], ['material', 'materials'], ['category', 'categories'], ['mark', 'marks'], ['note', 'notes']] as const) index.put(type, data[key])
        ;(globalThis as unknown as { benchIndex: unknown }).benchIndex = index
        return performance.now() - t0
      }, plain.body.toString('utf8'))
      console.log(`  index built from the snapshot in ${buildMs.toFixed(0)} ms (once per app start, off the search path)`)
      let all: number[] = []
      for (const [name, list] of Object.entries(queries)) {
        const result = await page.evaluate((items) => {
          const index = (globalThis as unknown as { benchIndex: { search: (q: string, o: object) => { hits: { id: number, type: string }[] } } }).benchIndex
          for (const { q } of items.slice(0, 10)) index.search(q, { limit: 20 })
          const times: number[] = []
          let found = 0
          for (const { q, target } of items) {
            const t0 = performance.now()
            const answer = index.search(q, { limit: 20 })
            times.push(performance.now() - t0)
            if (answer.hits.filter(h => h.type === 'mark').slice(0, 5).some(h => h.id === target)) found++
          }
          return { times, found }
        }, list)
        const sorted = [...result.times].sort((a, b) => a - b)
        all = all.concat(result.times)
        console.log(`  ${name.padEnd(20)} p50 ${percentile(sorted, 50).toFixed(1)} ms · p95 ${percentile(sorted, 95).toFixed(1)} ms · max ${sorted[sorted.length - 1]!.toFixed(1)} ms · recall@5 ${(result.found / list.length).toFixed(2)}`)
      }
      all.sort((a, b) => a - b)
      const p95 = percentile(all, 95)
      console.log(`  all ${all.length} searches: p50 ${percentile(all, 50).toFixed(1)} ms · p95 ${p95.toFixed(1)} ms · max ${all[all.length - 1]!.toFixed(1)} ms; budget p95 ≤ ${BUDGET_P95_MS} ms: ${p95 <= BUDGET_P95_MS ? 'met' : 'MISSED'}`)
    }
    finally {
      await browser.close()
    }
  }
  finally {
    await pool.end()
    await server?.stop()
    await services.stop()
    rmSync(tmp, { recursive: true, force: true })
  }
}

await main()
