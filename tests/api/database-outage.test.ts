// MariaDB stops and comes back while the app runs: requests get 503 with a clear message, the app recovers
// by itself without a restart, and no acknowledged write is lost.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { startPrivateMariaDb, type PrivateMariaDb } from '../../scripts/lib/mariadb'
import { applyMigrations } from '../../scripts/lib/migrate'
import { startAppServer, type AppServer } from '../../scripts/lib/app-server'
import { freePort } from '../../scripts/lib/ports'

const dir = mkdtempSync(join(tmpdir(), 'tallymark-outage-'))
const dbOptions = { dataDir: join(dir, 'db'), port: 0, database: 'tallymark', user: 'tallymark', password: 'outage-test-password', bufferPool: '64M', quiet: true }
let db: PrivateMariaDb | undefined
let app: AppServer | undefined

afterAll(async () => {
  await app?.stop()
  await db?.stop()
  rmSync(dir, { recursive: true, force: true })
})

async function post(path: string, body: unknown, cookie = '') {
  const res = await fetch(`${app!.url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify(body) })
  return { status: res.status, body: await res.json().catch(() => null), cookie: res.headers.getSetCookie().map(c => c.split(';')[0]).join('; '), retryAfter: res.headers.get('retry-after') }
}

describe('database outage', () => {
  it('answers 503 while MariaDB is down and recovers on its own when it is back', async () => {
    dbOptions.port = await freePort()
    db = await startPrivateMariaDb(dbOptions)
    await applyMigrations(db.url)
    app = await startAppServer({ port: await freePort(), env: { DATABASE_URL: db.url } })

    const account = { email: 'outage@example.test', password: 'kiln-crazing-teapot', name: 'Outage Tester', teamName: 'Outage Team' }
    const registered = await post('/api/auth/register', account)
    expect(registered.status).toBe(201)

    await db.stop()
    const me = await fetch(`${app.url}/api/me`, { headers: { cookie: registered.cookie } })
    expect(me.status).toBe(503)
    expect((await me.json()).message).toMatch(/database is not reachable/i)
    const writeWhileDown = await post('/api/auth/register', { ...account, email: 'second@example.test' })
    expect(writeWhileDown.status).toBe(503)
    expect(writeWhileDown.retryAfter).toBe('5')
    const health = await fetch(`${app.url}/api/health`)
    expect(health.status).toBe(503)

    db = await startPrivateMariaDb(dbOptions)
    let recovered = false
    for (let i = 0; i < 100 && !recovered; i++) {
      recovered = (await fetch(`${app.url}/api/health`)).status === 200
      if (!recovered) await new Promise(r => setTimeout(r, 150))
    }
    expect(recovered, 'the app answers again without a restart').toBe(true)

    // The write acknowledged before the outage is still there; the one refused during it was not half-made.
    const login = await post('/api/auth/login', { email: account.email, password: account.password })
    expect(login.status).toBe(200)
    const refused = await post('/api/auth/login', { email: 'second@example.test', password: account.password })
    expect(refused.status).toBe(401)
    const again = await post('/api/auth/register', { ...account, email: 'second@example.test' })
    expect(again.status).toBe(201)
  })
})
