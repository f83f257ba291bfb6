// The phone with no signal, in Chromium: the app installs (manifest, icons, service worker, no installability
// errors), keeps the team's reference, loads and searches with the network switched off, queues a note, an
// item and an inscription that survive a reload, sends them when the signal is back (checked through the
// API), shows the conflict when the same mark was edited on the server meanwhile, and reads a base from a
// generated photo with no signal and finds its mark. The sales ledger with no signal: a quick-add item with
// its photo (kept as a Blob), a sale and a note wait through a reload, and back online each reaches the
// database exactly once, even when the first answer is lost (the retry carries the same Idempotency-Key); a
// sale of an item someone edited meanwhile shows the choice.
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { baseUrl, newOwner, uniqueTeamName, type Person } from '../support/api'
import { closeTestDb, query } from '../support/db'
import { renderInscription } from '../support/ocr'

let browser: Browser
let owner: Person
let slug: string
const ids: Record<string, number> = {}

async function create(path: string, body: Record<string, unknown>) {
  const res = await owner.post(`/api/teams/${slug}/${path}`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

async function signedIn(viewport = PHONE): Promise<BrowserContext> {
  return await signedInContext(browser, owner, viewport)
}

/** Waits until the service worker is active and controls the page. */
async function controlled(page: Page) {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
  if (!await page.evaluate(() => Boolean(navigator.serviceWorker.controller))) {
    await page.reload()
    await hydrated(page)
  }
  expect(await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL)).toMatch(/\/sw\.js$/)
}

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Offline Browser'))
  owner = registered.person
  slug = registered.team.slug
  const maker = await create('makers', { name: 'Quellmoor Brothers', country: 'United States' })
  ids.quellmoor = await create('marks', { inscriptions: ['QUELLMOOR POTTERY CO', 'VARDENFIELD OHIO'], makerId: maker, country: 'United States', yearFrom: 1921, yearTo: 1948 })
  ids.brisk = await create('marks', { inscriptions: ['BRISKWATER GLASS WORKS'], country: 'England' })
  ids.tolland = await create('marks', { inscriptions: ['TOLLANDER WARE', 'MADE IN ENGLAND'], country: 'England' })
  ids.hemsley = await create('marks', { inscriptions: ['HEMSLEY & DRAKE'], country: 'England' })
  // A lookalike pair and a note, so the phone's copy carries them.
  const patched = await owner.patch(`/api/teams/${slug}/marks/${ids.tolland}`, { revision: 1, lookalikes: [{ markId: ids.hemsley, howToTell: 'The ware name is **arched** on the real one.' }] })
  expect(patched.status, JSON.stringify(patched.body)).toBe(200)
  expect((await owner.post(`/api/teams/${slug}/marks/${ids.quellmoor}/notes`, { body: 'Seen with a green underglaze stamp.' })).status).toBe(201)
  const jpeg = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#2f6a5e' } }).jpeg().toBuffer()
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(jpeg)], { type: 'image/jpeg' }), 'mark.jpg')
  form.append('entityType', 'mark')
  form.append('entityId', String(ids.quellmoor))
  expect((await owner.request('POST', `/api/teams/${slug}/uploads`, form)).status).toBe(201)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('installable app', () => {
  it('has a manifest with its own icons, an active service worker and no installability errors', async () => {
    // A normal (not incognito) profile: Chromium does not offer to install from an incognito window.
    const context = await chromium.launchPersistentContext(mkdtempSync(join(process.env.TALLYMARK_TEST_TMP || tmpdir(), 'tallymark-install-')), {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      baseURL: baseUrl, viewport: PHONE,
    })
    const page = context.pages()[0] ?? await context.newPage()
    await page.goto('/')
    await hydrated(page)
    const href = await page.locator('link[rel="manifest"]').getAttribute('href')
    expect(href).toBe('/manifest.webmanifest')
    const res = await fetch(`${baseUrl}${href}`)
    expect(res.status).toBe(200)
    const manifest = await res.json() as { name: string, short_name: string, display: string, start_url: string, theme_color: string, background_color: string, icons: { src: string, sizes: string, purpose: string }[] }
    expect(manifest).toMatchObject({ name: 'Tallymark', display: 'standalone', start_url: '/', theme_color: '#1f3b36', background_color: '#f6f1e7' })
    for (const want of ['192x192 any', '512x512 any', '192x192 maskable', '512x512 maskable']) {
      const [sizes, purpose] = want.split(' ')
      const icon = manifest.icons.find(i => i.sizes === sizes && i.purpose === purpose)
      expect(icon, want).toBeTruthy()
      const png = await fetch(`${baseUrl}${icon!.src}`)
      expect(png.headers.get('content-type')).toBe('image/png')
      const meta = await sharp(Buffer.from(await png.arrayBuffer())).metadata()
      expect(`${meta.width}x${meta.height}`).toBe(sizes)
    }
    await controlled(page)
    const cdp = await context.newCDPSession(page)
    const { installabilityErrors } = await cdp.send('Page.getInstallabilityErrors') as { installabilityErrors: { errorId: string }[] }
    expect(installabilityErrors.map(e => e.errorId)).toEqual([])
    // The app shell is precached; the service worker keeps no API answer.
    const cached = await page.evaluate(async () => {
      const names = await caches.keys()
      return (await Promise.all(names.map(async n => (await (await caches.open(n)).keys()).map(r => new URL(r.url).pathname)))).flat()
    })
    expect(cached.some(p => p.startsWith('/_nuxt/') && p.endsWith('.js'))).toBe(true)
    expect(cached.some(p => p.endsWith('.woff2'))).toBe(true)
    expect(cached.filter(p => p.startsWith('/api/'))).toEqual([])
    await context.close()
  })
})

describe('with no signal', () => {
  let context: BrowserContext
  let page: Page
  let problems: string[]
  beforeAll(async () => {
    context = await signedIn()
    page = await context.newPage()
    problems = watchPage(page)
  })
  afterAll(async () => { await context?.close() })
  afterEach(async ({ task }) => {
    if (task.result?.state === 'fail') await shot(page, `offline-failed-${task.name.slice(0, 20).replace(/\W+/g, '-')}`)
  })

  it('downloads the reference, then loads and searches from the phone with the network off', { timeout: 120_000 }, async () => {
    await page.goto(`/t/${slug}/offline`)
    await hydrated(page)
    await controlled(page)
    await page.getByRole('button', { name: 'Download for offline' }).click()
    const counts = page.getByTestId('offline-counts')
    await counts.waitFor()
    await expect.poll(() => counts.innerText()).toMatch(/Marks\s+4\b/)
    await expect.poll(() => counts.innerText()).toMatch(/Notes\s+1\b/)
    await expect.poll(() => counts.innerText()).toMatch(/Photos\s+1\b/)
    await expect.poll(() => page.getByTestId('offline-synced').innerText()).toMatch(/Last synced just now/)
    // The photo reader's files are fetched through the service worker as part of the download.
    await expect.poll(() => page.getByTestId('ocr-ready').innerText(), { timeout: 60_000 }).toMatch(/Ready/)

    await context.setOffline(true)
    await page.reload()
    await hydrated(page)
    const banner = page.getByTestId('offline-banner')
    await expect.poll(() => banner.innerText()).toMatch(/No signal\..*synced just now/s)
    await expect.poll(() => page.getByTestId('connection').innerText()).toBe('No signal')

    await page.getByRole('button', { name: 'Search', exact: true }).click()
    await page.keyboard.type('quellmor pot', { delay: 40 })
    const option = page.getByRole('option', { name: /QUELLMOOR POTTERY CO/ })
    await option.waitFor()
    await page.getByText('No signal: answered from this phone\'s copy').waitFor()
    await expect.poll(() => option.locator('mark').allTextContents()).toEqual(['QUELLMOOR', 'POTTERY'])
    // The thumbnail comes from the phone too.
    await expect.poll(() => option.locator('img').evaluate(img => (img as HTMLImageElement).naturalWidth)).toBeGreaterThan(0)
    await shot(page, 'offline-phone-search')
    await option.click()
    await page.waitForURL(url => url.pathname === `/t/${slug}/saved/mark/${ids.quellmoor}`)
    await hydrated(page)
    await page.getByRole('heading', { name: 'QUELLMOOR POTTERY CO', level: 1 }).waitFor()
    await page.locator('main').getByText('VARDENFIELD OHIO', { exact: true }).waitFor()
    await page.locator('main').getByText('Seen with a green underglaze stamp.').waitFor()
    await page.getByRole('link', { name: 'Quellmoor Brothers' }).waitFor()

    // A lookalike warning, read from the phone.
    await page.goto(`/t/${slug}/saved/mark/${ids.tolland}`)
    await hydrated(page)
    await page.getByRole('heading', { name: 'Easily confused with' }).waitFor()
    await page.getByRole('link', { name: 'HEMSLEY & DRAKE' }).waitFor()

    // The buy check for that mark: no figures without the server, but its dating clues, read from the
    // phone's copy of the mark (MADE IN ENGLAND: shared/dating/rules.ts), still show at the shelf.
    await page.goto(`/t/${slug}/buy-check?markId=${ids.tolland}`)
    await hydrated(page)
    const clues = page.getByTestId('dating-clues')
    await expect.poll(() => clues.getByRole('heading').textContent().then(t => t?.trim())).toBe('Dating clues: 1921 or later')
    await expect.poll(() => page.getByTestId('buy-check-subject').textContent()).toMatch(/TOLLANDER WARE/)
    await page.getByText('No signal: the check needs the team\'s sales from the server.', { exact: false }).waitFor()
    await shot(page, 'offline-phone-buy-check-dating')
  })

  it('queues a note, an item and an inscription that survive a reload, and sends them when the signal is back; a conflict shows both versions', { timeout: 120_000 }, async () => {
    await page.goto(`/t/${slug}/saved/mark/${ids.quellmoor}`)
    await hydrated(page)
    await page.getByLabel('Add a note').fill('Two on the top shelf, priced 3 each.')
    await page.getByRole('button', { name: 'Add note' }).click()
    await page.getByText(/No signal: “Note on QUELLMOOR POTTERY CO” is kept on this phone/).waitFor()
    await page.getByLabel('Item', { exact: true }).fill('Quellmoor jug, cream')
    // A mistyped amount is refused on the phone, with the reason, and nothing is queued for it.
    await page.getByLabel('Paid').fill('3.5.0')
    await page.getByRole('button', { name: 'Add to the items' }).click()
    await page.getByText(/Please check the amount: the digit groups in "3\.5\.0" are not in threes/).waitFor()
    await expect.poll(() => page.getByTestId('saved-queued').count()).toBe(1)
    await page.getByLabel('Paid').fill('3.50')
    await page.getByRole('button', { name: 'Add to the items' }).click()
    await page.getByText(/No signal: “Item “Quellmoor jug, cream”” is kept/).waitFor()
    await page.getByLabel('Another inscription seen on this mark').fill('QUELLMOOR USA')
    await page.getByRole('button', { name: 'Add inscription' }).click()
    await page.getByText(/No signal: “Inscription “QUELLMOOR USA”/).waitFor()
    await expect.poll(() => page.getByTestId('saved-queued').count()).toBe(3)
    await shot(page, 'offline-phone-saved-mark')

    // Closing and opening the app again with no signal: nothing is lost.
    await page.reload()
    await hydrated(page)
    await expect.poll(() => page.getByTestId('saved-queued').count()).toBe(3)
    await page.goto(`/t/${slug}/offline`)
    await hydrated(page)
    await expect.poll(() => page.locator('[data-testid="queued-change"][data-state="pending"]').count()).toBe(3)
    await expect.poll(() => page.getByTestId('offline-banner').innerText()).toMatch(/3 changes will be sent when the signal is back/)
    await shot(page, 'offline-phone-queue')

    // Meanwhile someone edits the same mark on the server.
    const current = await owner.get(`/api/teams/${slug}/marks/${ids.quellmoor}`)
    const edited = await owner.patch(`/api/teams/${slug}/marks/${ids.quellmoor}`, { revision: current.body.revision, inscriptions: ['QUELLMOOR POTTERY CO', 'VARDENFIELD O.'] })
    expect(edited.status, JSON.stringify(edited.body)).toBe(200)

    await context.setOffline(false)
    const notes = async () => ((await owner.get(`/api/teams/${slug}/marks/${ids.quellmoor}/notes`)).body.items as { body: string }[]).map(n => n.body)
    await expect.poll(notes, { timeout: 30_000 }).toContain('Two on the top shelf, priced 3 each.')
    const items = async () => ((await owner.get(`/api/teams/${slug}/items?q=${encodeURIComponent('Quellmoor jug')}`)).body.items as { title: string, markId: number, costCents: number }[])
    await expect.poll(items, { timeout: 30_000 }).toEqual([expect.objectContaining({ title: 'Quellmoor jug, cream', markId: ids.quellmoor, costCents: 350 })])
    // The inscription was based on the revision the phone had: refused, kept, both versions shown.
    const conflict = page.getByTestId('offline-conflict')
    await conflict.waitFor({ timeout: 30_000 })
    const row = conflict.locator('[data-field="inscriptions"]')
    await expect.poll(() => row.innerText()).toMatch(/Your version\s+QUELLMOOR POTTERY CO\s+VARDENFIELD OHIO\s+QUELLMOOR USA/)
    await expect.poll(() => row.innerText()).toMatch(/Saved meanwhile by Owner Person\s+QUELLMOOR POTTERY CO\s+VARDENFIELD O\./)
    await expect.poll(() => page.getByTestId('offline-banner').innerText()).toMatch(/1 change could not be saved/)
    expect(await page.locator('[data-testid="queued-change"]').count()).toBe(1)
    await shot(page, 'offline-phone-conflict')
    // The server still has the other person's version.
    expect((await owner.get(`/api/teams/${slug}/marks/${ids.quellmoor}`)).body.inscriptions).toEqual(['QUELLMOOR POTTERY CO', 'VARDENFIELD O.'])

    // Keeping mine sends it over the saved version, knowingly.
    await page.getByRole('button', { name: 'Save mine over it' }).click()
    await expect.poll(async () => (await owner.get(`/api/teams/${slug}/marks/${ids.quellmoor}`)).body.inscriptions, { timeout: 30_000 })
      .toEqual(['QUELLMOOR POTTERY CO', 'VARDENFIELD OHIO', 'QUELLMOOR USA'])
    await expect.poll(() => page.locator('[data-testid="queued-change"]').count()).toBe(0)
    expect(problems.filter(p => !/Failed to load resource|ERR_INTERNET_DISCONNECTED|net::/.test(p))).toEqual([])
  })

  it('reads a base from a photo with no signal and finds its mark', { timeout: 120_000 }, async () => {
    const dir = mkdtempSync(join(process.env.TALLYMARK_TEST_TMP || tmpdir(), 'tallymark-ocr-'))
    const file = join(dir, 'base.png')
    writeFileSync(file, await renderInscription({ lines: ['BRISKWATER', 'GLASS WORKS'], font: 'DejaVu Serif', size: 40, rotation: 90, noisy: false, seed: 7 }))
    await page.goto(`/t/${slug}/read-base`)
    await hydrated(page)
    await context.setOffline(true)
    await page.getByTestId('ocr-file').setInputFiles(file)
    await page.getByRole('button', { name: 'Read the text' }).click()
    const text = page.getByLabel('Text on the base')
    await expect.poll(() => text.inputValue(), { timeout: 60_000 }).toMatch(/BRISKWATER\s+GLASS WORKS/)
    await expect.poll(async () => Number((await page.getByTestId('ocr-confidence').innerText()).replace(/\D/g, ''))).toBeGreaterThan(60)
    await page.getByText('Read turned 270°.').waitFor()
    const results = page.getByRole('region', { name: '3. Marks that match' })
    await expect.poll(() => results.innerText(), { timeout: 15_000 }).toMatch(/answered from this phone's copy/)
    await results.getByRole('link', { name: /BRISKWATER GLASS WORKS/ }).first().waitFor()
    await shot(page, 'offline-phone-read-base')
    await context.setOffline(false)
  })
})

describe('the sales ledger with no signal', () => {
  let context: BrowserContext
  let page: Page
  let problems: string[]
  beforeAll(async () => {
    context = await signedIn()
    page = await context.newPage()
    problems = watchPage(page)
  })
  afterAll(async () => { await context?.close() })
  afterEach(async ({ task }) => {
    if (task.result?.state === 'fail') await shot(page, `offline-ledger-failed-${task.name.slice(0, 20).replace(/\W+/g, '-')}`)
  })

  it('queues an item with its photo, a sale and a note; they survive a reload; back online each is saved once, a lost answer included, and a conflict asks', { timeout: 180_000 }, async () => {
    const sellId = await create('items', { title: 'Celadon ewer', acquiredOn: '2026-03-01', costCents: 600 })
    const count = async (sql: string, params: unknown[]) => Number((await query<{ n: number }>(sql, params))[0]!.n)
    const open = async (path: string) => {
      await page.goto(`/t/${slug}${path}`)
      await hydrated(page)
    }
    // With a signal, the pages are opened once, so the phone keeps them.
    await open('/offline')
    await controlled(page)
    for (const path of [`/items/${sellId}`, '/quick-add', `/marks/${ids.hemsley}`]) await open(path)

    await context.setOffline(true)
    // A sale, on the item's page.
    await open(`/items/${sellId}`)
    await page.getByRole('button', { name: 'Mark as sold' }).click()
    await page.getByLabel('Sale price').fill('18.00')
    await page.getByRole('button', { name: 'Record the sale' }).click()
    await expect.poll(() => page.getByTestId('item-flash').innerText()).toMatch(/No signal: “Sale of “Celadon ewer”” is kept on this phone/)
    await expect.poll(() => page.getByTestId('item-pending').innerText()).toContain('Sale of “Celadon ewer”')
    await shot(page, 'offline-phone-sale-queued')

    // An item with its photo, at quick add.
    await open('/quick-add')
    await page.getByLabel('Price on the tag').fill('2.75')
    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#6b4f8a' } }).jpeg().toBuffer()
    await page.locator('#qa-photo').setInputFiles({ name: 'creamer.jpg', mimeType: 'image/jpeg', buffer: jpeg })
    await page.getByLabel('What is it?').fill('Speckled creamer')
    await page.getByRole('button', { name: 'Add item · $2.75' }).click()
    await expect.poll(() => page.getByTestId('quick-add-flash').innerText()).toMatch(/No signal: “Speckled creamer” for \$2\.75 with its photo is kept on this phone/)
    await shot(page, 'offline-phone-quick-add-queued')

    // A note, on a mark's page.
    await open(`/marks/${ids.hemsley}`)
    await page.getByLabel('Add a note').fill('A boxed pair at the church sale.')
    await page.getByRole('button', { name: 'Add note' }).click()
    await expect.poll(() => page.getByTestId('offline-banner').innerText()).toMatch(/4 changes will be sent when the signal is back/)

    // The photo waits in IndexedDB as a Blob, apart from the queue.
    const stored = await page.evaluate(() => new Promise<{ n: number, blobs: number, bytes: number }>((resolve, reject) => {
      const req = indexedDB.open('tallymark-offline')
      req.onerror = () => reject(req.error)
      req.onsuccess = () => {
        const all = req.result.transaction('queueFiles').objectStore('queueFiles').getAll()
        all.onsuccess = () => {
          const rows = all.result as { blob: unknown }[]
          resolve({ n: rows.length, blobs: rows.filter(r => r.blob instanceof Blob).length, bytes: rows.reduce((t, r) => t + (r.blob as Blob).size, 0) })
          req.result.close()
        }
      }
    }))
    expect(stored).toEqual({ n: 1, blobs: 1, bytes: jpeg.length })

    // Closing and opening the app with no signal: all four still wait.
    await open('/offline')
    await page.reload()
    await hydrated(page)
    const pending = page.locator('[data-testid="queued-change"][data-state="pending"]')
    await expect.poll(() => pending.count()).toBe(4)
    expect(await page.locator('[data-testid="queued-change"]').allInnerTexts()).toEqual([
      expect.stringContaining('Sale of “Celadon ewer”'), expect.stringContaining('Item “Speckled creamer”'),
      expect.stringContaining('Photo of “Speckled creamer”'), expect.stringContaining('Note on this mark'),
    ])
    await shot(page, 'offline-phone-ledger-queue')
    await open(`/items/${sellId}`)
    await expect.poll(() => page.getByTestId('item-pending').innerText()).toContain('Sale of “Celadon ewer”')
    await open('/offline')
    expect(await count('select count(*) n from items where title = ?', ['Speckled creamer'])).toBe(0)

    // Meanwhile someone edits the item that was sold on the phone.
    const current = await owner.get(`/api/teams/${slug}/items/${sellId}`)
    expect((await owner.patch(`/api/teams/${slug}/items/${sellId}`, { revision: current.body.revision, title: 'Celadon ewer, tall' })).status).toBe(200)

    // The first answer to the item is lost on the way back: the server saved it, the phone never hears.
    let lost = 0
    const keys: string[] = []
    await page.route(`**/api/teams/${slug}/items`, async (route) => {
      if (route.request().method() !== 'POST') return await route.continue()
      keys.push(route.request().headers()['idempotency-key'] ?? '')
      if (lost++ > 0) return await route.continue()
      await route.fetch()
      await route.abort('connectionreset')
    })
    await context.setOffline(false)
    await expect.poll(() => lost, { timeout: 30_000 }).toBe(1)
    await expect.poll(() => count('select count(*) n from items where title = ?', ['Speckled creamer']), { timeout: 30_000 }).toBe(1)
    // The phone still holds it as unsent; sending now retries with the same key.
    await expect.poll(() => page.locator('[data-testid="queued-change"]').filter({ hasText: 'Item “Speckled creamer”' }).getAttribute('data-state')).toBe('pending')
    await page.getByRole('button', { name: 'Send now' }).click()
    const sent = page.getByTestId('sent-change')
    await expect.poll(() => sent.count(), { timeout: 30_000 }).toBe(3)
    expect(keys).toHaveLength(2)
    expect(keys[0]).toMatch(/^[0-9a-f-]{36}$/)
    expect(keys[1]).toBe(keys[0])
    expect(await sent.allInnerTexts()).toEqual(expect.arrayContaining([
      expect.stringMatching(/Item “Speckled creamer”\s+Sent/), expect.stringMatching(/Photo of “Speckled creamer”\s+Sent/), expect.stringMatching(/Note on this mark\s+Sent/),
    ]))
    // Exactly once each in the database, the photo on the item the server made.
    const [creamer] = await query<{ id: number, cost_cents: number }>('select id, cost_cents from items where title = ?', ['Speckled creamer'])
    expect(Number(creamer!.cost_cents)).toBe(275)
    expect(await count('select count(*) n from items where title = ?', ['Speckled creamer'])).toBe(1)
    expect(await count('select count(*) n from photos where entity_type = ? and entity_id = ?', ['item', creamer!.id])).toBe(1)
    expect(await count('select count(*) n from entry_notes where entry_type = ? and entry_id = ? and body = ?', ['mark', ids.hemsley, 'A boxed pair at the church sale.'])).toBe(1)
    expect(await count('select count(*) n from item_status_events where item_id = ? and to_status = ?', [sellId, 'sold'])).toBe(0)

    // The sale met the other person's edit: both versions, and the choice.
    const conflict = page.getByTestId('offline-conflict')
    await conflict.waitFor({ timeout: 30_000 })
    await expect.poll(() => conflict.locator('[data-field="salePriceCents"]').innerText()).toMatch(/Sale price\s+Your version\s+\$18\.00\s+Saved meanwhile\s+\(empty\)/i)
    // What the other person changed shows too, though the sale did not send it: the title, and nothing else.
    await expect.poll(() => conflict.locator('[data-field="title"]').innerText())
      .toMatch(/Title \(changed meanwhile\)\s+When you made your change\s+Celadon ewer\s+Saved meanwhile(?: by [^\n]+)?\s+Celadon ewer, tall/i)
    expect(await conflict.locator('[data-field]').evaluateAll(rows => rows.map(r => r.getAttribute('data-field')).filter(f => !f!.endsWith('Cents') && f !== 'soldOn' && f !== 'feeProfileId' && f !== 'note'))).toEqual(['title'])
    await expect.poll(() => page.getByTestId('offline-banner').innerText()).toMatch(/1 change could not be saved/)
    await shot(page, 'offline-phone-ledger-conflict')
    await page.getByRole('button', { name: 'Save mine over it' }).click()
    await expect.poll(() => sent.count(), { timeout: 30_000 }).toBe(4)
    expect(await page.locator('[data-testid="queued-change"]').count()).toBe(0)
    const sold = (await owner.get(`/api/teams/${slug}/items/${sellId}`)).body
    expect(sold).toMatchObject({ status: 'sold', salePriceCents: 1800, title: 'Celadon ewer, tall' })
    expect(await count('select count(*) n from item_status_events where item_id = ? and to_status = ?', [sellId, 'sold'])).toBe(1)
    await shot(page, 'offline-phone-ledger-sent')
    await page.unroute(`**/api/teams/${slug}/items`)
    expect(problems.filter(p => !/Failed to load resource|ERR_INTERNET_DISCONNECTED|ERR_CONNECTION_RESET|net::/.test(p))).toEqual([])
  })
})
