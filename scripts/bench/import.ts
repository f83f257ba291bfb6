// npm run bench:import — imports a generated 100,000-row item CSV through the HTTP route of the built server
// (TALLYMARK_OUTPUT_DIR, default .output) into a throwaway MariaDB, and prints the time of the dry run, of
// the import and of a second import of the same file (which must add nothing), with the server's peak RSS
// (VmHWM) and the bench's own. Exits 1 when the import takes longer than the budget (60 s) or adds the
// wrong number of rows. BENCH_ROWS changes the size.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { cpus, loadavg, tmpdir } from 'node:os'
import { join } from 'node:path'
import Papa from 'papaparse'
import { startAppServer } from '../lib/app-server'
import { applyMigrations } from '../lib/migrate'
import { freePort } from '../lib/ports'
import { startLocalServices } from '../lib/services'
import { seededRandom } from '../lib/random'

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000)
const BUDGET_MS = 60_000

// A seeded generator, so every run imports the same file.
const { random, pick } = seededRandom(20260801)
const int = (lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1))
const LOOKS = ['Green matte', 'Blue drip', 'Floral', 'Gold-trimmed', 'Speckled', 'Pastel', 'Hobnail', 'Amber', 'Ribbed', 'Scalloped']
const NOUNS = ['vase', 'planter', 'mug', 'bowl', 'figurine', 'candy dish', 'platter', 'canister', 'candle holders', 'wall plaque']
const STORES = ['Second Chapter Thrift', 'Mill Street Mission Store', 'Orchard Lane Estate Sales', 'Tansy Hill Flea Market']
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']

/** The generated spreadsheet: several date and money forms, about 70 % sold, an external id on half the rows. */
function generateCsv(rows: number): string {
  const data: string[][] = []
  const day0 = Date.UTC(2023, 0, 1)
  for (let n = 0; n < rows; n++) {
    const bought = new Date(day0 + int(0, 900) * 86_400_000)
    const iso = bought.toISOString().slice(0, 10)
    const [y, m, d] = iso.split('-')
    const boughtText = n % 3 === 0 ? iso : n % 3 === 1 ? `${m}/${d}/${y}` : `${Number(d)} ${MONTHS[Number(m) - 1]} ${y}`
    const cost = int(50, 4000)
    const sold = random() < 0.7
    const soldOn = sold ? new Date(bought.getTime() + int(0, 120) * 86_400_000).toISOString().slice(0, 10) : ''
    const price = sold ? int(800, 12_000) : 0
    const status = sold ? 'sold' : random() < 0.5 ? 'listed' : 'in stock'
    data.push([
      n % 2 === 0 ? `BENCH-${n}` : '',
      `${pick(LOOKS)} ${pick(NOUNS)} no. ${n}`,
      boughtText,
      n % 4 === 0 ? `$${(cost / 100).toFixed(2)}` : (cost / 100).toFixed(2),
      pick(STORES),
      status,
      soldOn,
      status === 'in stock' ? '' : iso,
      sold ? (price / 100).toFixed(2) : '',
      sold ? (int(0, 1) ? '5.50' : '0') : '',
      sold ? (int(300, 900) / 100).toFixed(2) : '',
      pick(['very good', 'good', 'excellent', '']),
      random() < 0.2 ? 'chip;crazing' : '',
    ])
  }
  return Papa.unparse({ fields: ['Ref', 'Item', 'Bought', 'Paid', 'Store', 'Status', 'Sold on', 'Listed on', 'Sold for', 'Shipping', 'Postage', 'Condition', 'Damage'], data })
}

const MAPPING = {
  'Ref': 'externalId', 'Item': 'title', 'Bought': 'acquiredOn', 'Paid': 'cost', 'Store': 'store', 'Status': 'status', 'Sold on': 'soldOn',
  'Listed on': 'listedOn', 'Sold for': 'salePrice', 'Shipping': 'shippingCharged', 'Postage': 'postage', 'Condition': 'condition', 'Damage': 'damageFlags',
}

function peakRssMb(pid: number | undefined): number {
  if (!pid) return Number.NaN
  const match = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  return match ? Number(match[1]) / 1024 : Number.NaN
}

const tmp = mkdtempSync(join(tmpdir(), 'tallymark-bench-import-'))
const services = await startLocalServices({ dataDir: tmp, dbPort: await freePort(), smtpPort: 0, withMail: false, bufferPool: '512M' })
let app: Awaited<ReturnType<typeof startAppServer>> | undefined
let code = 1
try {
  await applyMigrations(services.databaseUrl)
  const port = await freePort()
  app = await startAppServer({
    port,
    env: {
      DATABASE_URL: services.databaseUrl, SMTP_URL: 'smtp://127.0.0.1:9', PUBLIC_URL: `http://127.0.0.1:${port}`,
      NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-0123456789', STORAGE_DIR: join(tmp, 'uploads'),
    },
  })
  const register = await fetch(`${app.url}/api/auth/register`, {
    method: 'POST', headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'bench@example.test', password: 'glazed-teapot-under-felt', name: 'Bench Person', teamName: 'Bench Finds' }),
  })
  if (register.status !== 201) throw new Error(`register failed: ${register.status} ${await register.text()}`)
  const cookie = register.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const slug = ((await register.json()) as { team: { slug: string } }).team.slug
  const api = (path: string) => `${app!.url}/api/teams/${slug}${path}`
  await fetch(api('/fee-profiles'), { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify({ name: 'Bench profile', percentBp: 1325, fixedCents: 30 }) })

  let started = performance.now()
  const csv = generateCsv(ROWS)
  console.log(`generated ${ROWS.toLocaleString('en')} rows, ${(csv.length / 1_048_576).toFixed(1)} MB, in ${((performance.now() - started) / 1000).toFixed(1)} s`)

  const upload = async (query: string) => {
    const form = new FormData()
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'bench.csv')
    form.append('mapping', JSON.stringify(MAPPING))
    const t0 = performance.now()
    const res = await fetch(api(`/imports/items${query}`), { method: 'POST', headers: { cookie }, body: form })
    const body = await res.json() as Record<string, any>
    return { ms: performance.now() - t0, status: res.status, body }
  }
  const line = (label: string, r: { ms: number, status: number, body: Record<string, any> }) =>
    console.log(`${label.padEnd(16)} ${(r.ms / 1000).toFixed(1).padStart(6)} s  HTTP ${r.status}  added ${r.body.added ?? '-'}  already ${r.body.alreadyImported ?? '-'}  errors ${r.body.errorCount ?? r.body.report?.errorCount ?? '-'}  server peak RSS ${peakRssMb(app!.process.pid).toFixed(0)} MB  ${JSON.stringify(r.body.timings ?? {})}`)

  const dry = await upload('?dryRun=1')
  line('dry run', dry)
  started = performance.now()
  const real = await upload('')
  line('import', real)
  const again = await upload('')
  line('same file again', again)
  const totals = await (await fetch(api('/items?pageSize=1'), { headers: { cookie } })).json() as { totals: Record<string, number> }
  console.log('totals after import', JSON.stringify(totals.totals), '| dry-run preview', JSON.stringify(dry.body.totals))
  console.log(`bench process peak RSS ${peakRssMb(process.pid).toFixed(0)} MB; load average ${loadavg().map(l => l.toFixed(1)).join(' ')} on ${cpus().length} cores`)

  const ok = real.status === 200 && real.body.added === ROWS && again.body.added === 0 && again.body.alreadyImported === ROWS
    && totals.totals.items === ROWS && real.ms <= BUDGET_MS
  console.log(ok ? `OK: ${ROWS.toLocaleString('en')} rows imported in ${(real.ms / 1000).toFixed(1)} s (budget ${BUDGET_MS / 1000} s)` : 'FAILED: see the figures above')
  code = ok ? 0 : 1
}
catch (error) {
  console.error(error)
}
finally {
  await app?.stop()
  await services.stop()
  rmSync(tmp, { recursive: true, force: true })
}
process.exit(code)
