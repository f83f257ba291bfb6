// The ledger pages in Chromium: quick add on a phone at the shelf (start a trip, add a piece with its tag
// price, mark and photo), mark as sold with the fees shown and the timeline note prefilled, the items table
// filtered and sorted through the URL with the server's totals, the CSV import with its dry run, the 409
// merge of the item form, and the stores and fee profile pages. Setup data goes in through the API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { join } from 'node:path'
import { ARTIFACTS, DESKTOP, PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { newOwner, uniqueTeamName, type Person } from '../support/api'
import { closeTestDb, query } from '../support/db'

let browser: Browser
let owner: Person
let slug: string
const ids: Record<string, number> = {}
const api = (path: string) => `/api/teams/${slug}${path}`

async function create(path: string, body: Record<string, unknown>): Promise<any> {
  const res = await owner.post(api(path), body)
  expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(201)
  return res.body
}
async function get(path: string): Promise<any> {
  const res = await owner.get(api(path))
  expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(200)
  return res.body
}

/** A browser context signed in as the owner (the API session's cookie, handed over). */
async function signedIn(viewport: { width: number, height: number }): Promise<BrowserContext> {
  return await signedInContext(browser, owner, viewport)
}

async function open(page: Page, path: string) {
  await page.goto(`/t/${slug}${path}`)
  await hydrated(page)
}

/** The titles in the desktop items table, top to bottom. */
async function tableTitles(page: Page): Promise<string[]> {
  return await page.getByTestId('items-table').locator('tbody tr td:first-child').allInnerTexts()
}

const fileOf = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') })

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Ledger Browser'), 'Marlow Pennick')
  owner = registered.person
  slug = registered.team.slug
  ids.ewers = (await create('/categories', { name: 'Ewers' })).id
  ids.bowls = (await create('/categories', { name: 'Serving bowls' })).id
  ids.mark = (await create('/marks', { inscriptions: ['QUILLMERE POTTERY', 'HAND THROWN'], country: 'England' })).id
  ids.otherMark = (await create('/marks', { inscriptions: ['BRACKENLOW WARE'] })).id
  ids.channel = (await create('/fee-profiles', { name: 'Lanternpost standard', channel: 'Lanternpost', percentBp: 1325, fixedCents: 30, isDefault: true })).id
  ids.cash = (await create('/fee-profiles', { name: 'Saturday table', channel: 'Market table', percentBp: 0, fixedCents: 0 })).id
  ids.store = (await create('/stores', { name: 'Second Chapter Thrift', kind: 'thrift_store', town: 'Hollowbrook' })).id
  ids.otherStore = (await create('/stores', { name: 'Orchard Lane Estate Sales', kind: 'estate_sale' })).id
  // An earlier trip there, so the phone offers "start a trip at Second Chapter Thrift today".
  ids.oldTrip = (await create('/trips', { storeId: ids.store, tripDate: '2026-01-10' })).id
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('ledger pages', () => {
  let itemId: number
  let tripId: number

  it('adds an item on a phone at the shelf: start a trip, tag price, mark, category, condition and photo', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, '')
    // The team home has a big Quick add button.
    await page.getByRole('link', { name: 'Quick add an item' }).click()
    await page.waitForURL(url => url.pathname === `/t/${slug}/quick-add`)
    await hydrated(page)

    await page.getByRole('button', { name: 'Start a trip at Second Chapter Thrift today' }).click()
    const tripCard = page.getByTestId('current-trip')
    await expect.poll(() => tripCard.textContent()).toContain('Second Chapter Thrift')

    const price = page.getByLabel('Price on the tag')
    expect(await price.getAttribute('inputmode'), 'the numeric keypad with a decimal point').toBe('decimal')
    await price.fill('4.50')
    await page.getByRole('button', { name: 'One piece more' }).click()
    await page.getByRole('button', { name: 'One piece fewer' }).click()
    await page.getByRole('button', { name: 'Ewers', exact: true }).click()
    await page.getByRole('searchbox', { name: 'Mark (what the base reads)' }).fill('quill')
    const hit = page.getByRole('button', { name: /QUILLMERE POTTERY/ })
    await hit.waitFor()
    const hitBox = await hit.boundingBox()
    expect(hitBox!.height, 'a thumb-sized target').toBeGreaterThanOrEqual(44)
    await hit.click()
    await page.locator('label', { hasText: /^\s*good\s*$/i }).click()
    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#8a5a3c' } }).jpeg().toBuffer()
    await page.locator('#qa-photo').setInputFiles({ name: 'shelf.jpg', mimeType: 'image/jpeg', buffer: jpeg })
    expect(await page.locator('#qa-photo').getAttribute('capture')).toBe('environment')
    await expect.poll(() => page.getByAltText('The photo to upload').count()).toBe(1)

    const add = page.getByRole('button', { name: 'Add item · $4.50' })
    const addBox = await add.boundingBox()
    expect(addBox!.y + addBox!.height, 'the add button sits at the bottom, in reach of the thumb').toBeGreaterThan(PHONE.height - 80)
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'ledger-phone-quick-add-filled')
    // What the phone shows without scrolling: the trip, the price, the category and the add button.
    await page.screenshot({ path: join(ARTIFACTS, 'ledger-phone-quick-add-screen.png') })
    await add.click()
    await expect.poll(() => page.getByTestId('quick-add-flash').textContent()).toContain('for $4.50')
    // Ready for the next piece: price cleared and focused, category and condition kept.
    await expect.poll(() => price.inputValue()).toBe('')
    await expect.poll(() => price.evaluate(el => el === document.activeElement)).toBe(true)
    expect(await page.locator('[data-picker="category"] [data-picked]').textContent()).toBe('Ewers')
    await expect.poll(() => page.getByTestId('qa-recent').textContent()).toContain('QUILLMERE POTTERY')
    expect(await page.getByText('its photo was not').count(), 'the photo was uploaded').toBe(0)
    await shot(page, 'ledger-phone-quick-add-done')

    const trips = await get('/trips?sort=-createdAt&pageSize=1')
    tripId = trips.items[0].id
    expect(trips.items[0].storeId).toBe(ids.store)
    const added = await get(`/items?tripId=${tripId}`)
    expect(added.total).toBe(1)
    const item = added.items[0]
    itemId = item.id
    expect(item).toMatchObject({ costCents: 450, quantity: 1, markId: ids.mark, categoryId: ids.ewers, condition: 'good', storeId: ids.store, status: 'in_stock' })
    expect(item.title).toBe('Ewers · QUILLMERE POTTERY')
    // The camera's photo went up after the item was created, attached to it.
    await expect.poll(async () => (await query('SELECT id FROM photos WHERE entity_type = ? AND entity_id = ?', ['item', itemId])).length).toBe(1)

    // It is in the items table (the phone's card layout).
    await open(page, '/items')
    const card = page.getByTestId('items-cards').locator(`[data-item-id="${itemId}"]`)
    await expect.poll(() => card.textContent()).toContain('Ewers · QUILLMERE POTTERY')
    expect(await card.textContent()).toContain('$4.50')
    await shot(page, 'ledger-phone-items')

    // The trip stays on this phone: a reload of quick add still shows it.
    await open(page, '/quick-add')
    await expect.poll(() => page.getByTestId('current-trip').textContent()).toContain('Second Chapter Thrift')
    expect(problems).toEqual([])
    await context.close()
  })

  it('marks the item as sold with the fees shown and editable, and the prefilled note lands on the mark\'s timeline', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, `/items/${itemId}`)
    await page.getByRole('button', { name: 'Mark as sold' }).click()
    await page.getByLabel('Sale price').fill('24.00')
    await page.getByLabel('Shipping charged to the buyer').fill('5.00')
    await page.getByLabel('Postage you paid').fill('4.10')
    // 13.25 % of $29.00 is $3.8425, rounded to $3.84, plus $0.30 per order.
    const fees = page.getByLabel('Fees', { exact: true })
    await expect.poll(() => fees.inputValue()).toBe('4.14')
    await expect.poll(() => page.getByTestId('net-preview').textContent()).toContain('$16.26')
    // Editable: typed fees replace the preview until the channel's figure is asked for again.
    await fees.fill('5.00')
    await expect.poll(() => page.getByTestId('net-preview').textContent()).toContain('$15.40')
    await page.getByRole('button', { name: 'Use the channel\'s' }).click()
    await expect.poll(() => fees.inputValue()).toBe('4.14')

    const note = page.getByLabel('Note', { exact: true })
    const prefilled = await note.inputValue()
    expect(prefilled).toContain('Sold "Ewers · QUILLMERE POTTERY" for $24.00 plus $5.00 shipping on Lanternpost')
    expect(prefilled).toContain('the day it was bought')
    expect(prefilled).toContain('net $16.26')
    await shot(page, 'ledger-desktop-sale-form')
    await page.getByRole('button', { name: 'Record the sale' }).click()
    await expect.poll(() => page.getByTestId('item-flash').textContent()).toContain('Sold for $24.00: net $16.26')
    expect(await page.getByTestId('item-flash').textContent()).toContain('the mark QUILLMERE POTTERY')
    await expect.poll(() => page.getByTestId('status-history').textContent()).toMatch(/Sold · /)
    await shot(page, 'ledger-desktop-item-sold')

    const item = await get(`/items/${itemId}`)
    expect(item).toMatchObject({ status: 'sold', salePriceCents: 2400, shippingChargedCents: 500, postageCents: 410, feesCents: 414, feesManual: false, netProfitCents: 1626, feeProfileId: ids.channel })
    const markNotes = await get(`/marks/${ids.mark}/notes`)
    expect(markNotes.items.map((n: any) => n.body)).toContain(prefilled)
    const categoryNotes = await get(`/categories/${ids.ewers}/notes`)
    expect(categoryNotes.items.map((n: any) => n.body)).toContain(prefilled)

    // The trip paid for itself: $29.00 in against $4.50 + $4.14 + $4.10 out.
    await open(page, `/trips/${tripId}`)
    await expect.poll(() => page.locator('[data-paid]').first().getAttribute('data-paid')).toBe('yes')
    expect(await page.getByTestId('ledger-totals').textContent()).toContain('$16.26')
    await shot(page, 'ledger-desktop-trip')

    // The listing draft is written by the server and copied with one button.
    await open(page, `/items/${itemId}`)
    await page.getByRole('button', { name: 'Write the listing draft' }).click()
    await expect.poll(() => page.locator('#draft-text').inputValue()).toContain('QUILLMERE POTTERY')
    expect(problems).toEqual([])
    await context.close()
  })

  it('filters and sorts the items table through the URL, with totals over every matching row', async () => {
    const made: Record<string, number> = {}
    for (const [title, cost] of [['Footed bowl', 700], ['Nesting bowl', 100], ['Lipped bowl', 300]] as const) {
      made[title] = (await create('/items', { title, categoryId: ids.bowls, costCents: cost, acquiredOn: '2026-02-01', storeId: ids.otherStore })).id
    }
    const listed = await owner.post(api(`/items/${made['Lipped bowl']}/status`), { to: 'listed', on: '2026-02-03', askingCents: 1800 })
    expect(listed.status, JSON.stringify(listed.body)).toBe(200)

    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, `/items?categoryId=${ids.bowls}&sort=costCents`)
    await expect.poll(() => tableTitles(page)).toEqual(['Nesting bowl', 'Lipped bowl', 'Footed bowl'])
    const totals = page.getByTestId('ledger-totals')
    const api3 = await get(`/items?categoryId=${ids.bowls}`)
    expect(api3.totals).toMatchObject({ items: 3, costCents: 1100 })
    expect(await totals.locator('[data-total="items"]').textContent()).toContain('3')
    expect(await totals.locator('[data-total="cost"]').textContent()).toContain('$11.00')

    // The column header sorts on the server: ascending becomes descending, in the URL.
    await page.locator('button[data-sort="costCents"]').click()
    await page.waitForURL(url => url.searchParams.get('sort') === '-costCents')
    await expect.poll(() => tableTitles(page)).toEqual(['Footed bowl', 'Lipped bowl', 'Nesting bowl'])
    expect(await page.locator('th[aria-sort="descending"]').textContent()).toContain('Cost')

    // A status filter from the page goes into the URL too; the totals follow the filter, not the page.
    await page.locator('label', { hasText: /^\s*listed\s*$/ }).click()
    await page.waitForURL(url => url.searchParams.get('status') === 'listed' && url.searchParams.get('categoryId') === String(ids.bowls))
    await expect.poll(() => tableTitles(page)).toEqual(['Lipped bowl'])
    await expect.poll(() => totals.locator('[data-total="cost"]').textContent()).toContain('$3.00')
    await shot(page, 'ledger-desktop-items-filtered')

    // The CSV link exports exactly the filtered view.
    const href = await page.getByTestId('items-export').getAttribute('href')
    expect(href).toContain(`categoryId=${ids.bowls}`)
    expect(href).toContain('status=listed')
    const csv = await owner.get(href!)
    expect(csv.status).toBe(200)
    expect(String(csv.body)).toContain('Lipped bowl')
    expect(String(csv.body)).not.toContain('Footed bowl')

    // A pasted link with a bad value drops that value instead of failing the page.
    await open(page, `/items?categoryId=${ids.bowls}&sort=sideways&pageSize=2`)
    await expect.poll(() => tableTitles(page)).toHaveLength(2)
    expect(await page.getByRole('navigation', { name: 'Pages' }).textContent()).toContain('Page 1 of 2')
    await page.getByRole('button', { name: 'Next' }).click()
    await page.waitForURL(url => url.searchParams.get('page') === '2')
    await expect.poll(() => tableTitles(page)).toHaveLength(1)

    // Phone: the same filters, as cards.
    await page.setViewportSize(PHONE)
    await open(page, `/items?categoryId=${ids.bowls}&sort=-costCents`)
    await expect.poll(() => page.getByTestId('items-cards').locator('li').count()).toBe(3)
    await shot(page, 'ledger-phone-items-filtered')
    expect(problems).toEqual([])
    await context.close()
  })

  it('imports a CSV: the dry run shows a row error by row and column, then a corrected file imports', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, '/import')
    const bad = 'Item name,Paid,Bought,Kind\nGilt rim saucer,2.50,2026-02-10,Serving bowls\nChipped jug,two dollars,2026-02-10,Ewers\nTall ewer,6,2026-02-11,Ewers\n'
    await page.locator('#import-file').setInputFiles(fileOf('finds.csv', bad))
    // "Item name" is not a field's name, so nothing is a title yet: the page says so and asks.
    await expect.poll(() => page.getByTestId('import-problem').textContent()).toContain('title')
    await page.getByLabel('Ledger field for the column Item name').selectOption('title')
    await page.getByLabel('Ledger field for the column Paid').selectOption('cost')
    await page.getByLabel('Ledger field for the column Bought').selectOption('acquiredOn')
    await page.getByLabel('Ledger field for the column Kind').selectOption('category')
    await page.getByRole('button', { name: 'Check the file' }).click()
    const errors = page.getByTestId('import-errors')
    await errors.waitFor()
    const row = errors.locator('tbody tr[data-row="3"]')
    expect(await row.locator('td').nth(1).textContent()).toContain('Paid')
    expect(await row.locator('td').nth(2).textContent()).toContain('two dollars')
    const report = page.getByTestId('import-report')
    expect(await report.textContent()).toContain('2 valid')
    expect(await report.locator('[data-total="cost"]').textContent()).toContain('$8.50')
    // With an error, the only import offered is the explicit "valid rows only".
    expect(await page.getByRole('button', { name: /^Import \d+ items?$/ }).count()).toBe(0)
    await expect.poll(() => page.getByRole('button', { name: 'Import only the 2 valid rows' }).count()).toBe(1)
    await shot(page, 'ledger-desktop-import-errors')

    const good = bad.replace('two dollars', '2.00')
    await page.locator('#import-file').setInputFiles(fileOf('finds-fixed.csv', good))
    await expect.poll(async () => (await report.textContent()) ?? '').toContain('3 valid')
    expect(await page.getByTestId('import-errors').count()).toBe(0)
    await page.getByRole('button', { name: 'Import 3 items' }).click()
    await expect.poll(() => page.getByTestId('import-done').textContent()).toContain('Imported 3 items')
    await shot(page, 'ledger-desktop-import-done')
    const imported = await get(`/items?q=${encodeURIComponent('Chipped jug')}`)
    expect(imported.items.map((i: any) => [i.title, i.costCents, i.categoryId])).toEqual([['Chipped jug', 200, ids.ewers]])

    // The matching is remembered for the team: the same columns next time come already matched.
    await open(page, '/import')
    await page.locator('#import-file').setInputFiles(fileOf('more.csv', 'Item name,Paid,Bought,Kind\nSmall ewer,1.25,2026-02-12,Ewers\n'))
    await expect.poll(() => page.getByTestId('import-mapping-source').textContent()).toContain('Remembered')
    expect(await page.getByLabel('Ledger field for the column Item name').inputValue()).toBe('title')
    await expect.poll(async () => (await report.textContent()) ?? '').toContain('1 valid')
    // The only failed request is the server's answer to the file without a title column.
    expect(problems).toEqual(['console: Failed to load resource: the server responded with a status of 400 (Bad Request)'])
    await context.close()
  })

  it('keeps typed text when someone saved the item meanwhile, and lets the person choose per field', async () => {
    const item = await create('/items', { title: 'Green jug', acquiredOn: '2026-02-05', costCents: 250 })
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, `/items/${item.id}`)
    await page.getByRole('button', { name: 'Edit' }).click()
    await page.getByLabel('Title').fill('Green jug, crackle glaze')
    // Meanwhile, on another phone, a teammate renames it and adds a note.
    const other = await owner.patch(api(`/items/${item.id}`), { revision: item.revision, title: 'Sage jug', notes: 'Base has a small firing flaw.' })
    expect(other.status, JSON.stringify(other.body)).toBe(200)
    await page.getByRole('button', { name: 'Save changes' }).click()
    const merge = page.getByTestId('ledger-merge')
    await merge.waitFor()
    const titleChoice = merge.locator('[data-field="title"]')
    expect(await titleChoice.textContent()).toContain('Green jug, crackle glaze')
    expect(await titleChoice.textContent()).toContain('Sage jug')
    expect(await merge.textContent()).toContain('Taken from the saved version (you had not changed them): Notes')
    await shot(page, 'ledger-phone-item-merge')
    await page.getByRole('button', { name: 'Save with these choices' }).click()
    await expect.poll(() => page.getByTestId('item-flash').textContent()).toContain('Changes saved')
    const saved = await get(`/items/${item.id}`)
    expect(saved).toMatchObject({ title: 'Green jug, crackle glaze', notes: 'Base has a small firing flaw.', revision: item.revision + 2 })
    expect(problems.filter(p => !p.includes('409'))).toEqual([])
    await context.close()
  })

  it('lists trips, and manages stores and fee profiles', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, '/trips')
    const row = page.getByTestId('trips-table').locator(`tr[data-trip-id="${tripId}"]`)
    expect(await row.textContent()).toContain('Second Chapter Thrift')
    expect(await row.textContent()).toContain('Paid for itself')
    const trips = await get('/trips')
    expect(await page.getByTestId('ledger-totals').locator('[data-total="trips"]').textContent()).toContain(String(trips.totals.trips))
    await shot(page, 'ledger-desktop-trips')

    await open(page, '/stores')
    await page.getByLabel('Name').first().fill('Tansy Hill Flea Market')
    await page.getByLabel('Kind').first().selectOption('other')
    await page.getByRole('button', { name: 'Add the store' }).click()
    await expect.poll(() => page.getByText('Tansy Hill Flea Market').count()).toBe(1)
    await shot(page, 'ledger-desktop-stores')

    await open(page, '/settings/fee-profiles')
    await page.locator('#fee-new-name').fill('Porchlight swap')
    await page.locator('#fee-new-percent').fill('10')
    await page.locator('#fee-new-fixed').fill('0.25')
    // $25.00 paid: 10 % is $2.50, plus $0.25.
    await expect.poll(() => page.getByTestId('fee-example').textContent()).toContain('$2.75')
    await page.getByRole('button', { name: 'Add the fee profile' }).click()
    const added = page.locator('li', { hasText: 'Porchlight swap' })
    await expect.poll(() => added.count()).toBe(1)
    await added.getByRole('button', { name: 'Make default' }).click()
    await expect.poll(() => added.textContent()).toContain('Default')
    const profiles = await get('/fee-profiles')
    expect(profiles.items.find((p: any) => p.isDefault)).toMatchObject({ name: 'Porchlight swap', percentBp: 1000, fixedCents: 25 })
    await shot(page, 'ledger-desktop-fee-profiles')

    await page.setViewportSize(PHONE)
    await open(page, '/trips')
    await shot(page, 'ledger-phone-trips')
    expect(problems).toEqual([])
    await context.close()
  })
  it('shows the item\'s photos, larger on a tap, and adds one to an existing item on a phone', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, `/items/${itemId}`)
    // The photo taken at quick add, as the item API sends it.
    const gallery = page.getByTestId('item-photos')
    await expect.poll(() => gallery.locator('img').count()).toBe(1)
    await expect.poll(() => gallery.locator('img').first().evaluate(img => (img as HTMLImageElement).naturalWidth)).toBe(320)
    // The names of its links come with the item.
    const details = page.locator('dl')
    expect(await details.textContent()).toContain('Ewers')
    expect(await details.textContent()).toContain('QUILLMERE POTTERY')
    expect(await details.textContent()).toContain('Marlow Pennick')

    const jpeg = await sharp({ create: { width: 900, height: 600, channels: 3, background: '#3c6a8a' } }).jpeg().toBuffer()
    await page.locator('#item-photo').setInputFiles({ name: 'base.jpg', mimeType: 'image/jpeg', buffer: jpeg })
    await page.getByRole('button', { name: 'Upload the photo' }).click()
    // Re-encoding on the server takes a moment on a busy machine.
    await expect.poll(() => gallery.locator('img').count(), { timeout: 15_000 }).toBe(2)
    await expect.poll(async () => (await query('SELECT id FROM photos WHERE entity_type = ? AND entity_id = ? ORDER BY position', ['item', itemId])).length).toBe(2)
    await page.getByRole('button', { name: 'Open photo 2 of 2' }).click()
    const large = page.getByTestId('item-photos-large')
    await expect.poll(() => large.evaluate(img => (img as HTMLImageElement).naturalWidth)).toBe(900)
    await shot(page, 'ledger-phone-item-photo-large')
    await page.getByRole('button', { name: 'Close' }).click()
    // After a reload the API lists both, in the order they were added.
    await open(page, `/items/${itemId}`)
    await expect.poll(() => gallery.locator('img').count()).toBe(2)
    await shot(page, 'ledger-phone-item-photos')
    expect(problems).toEqual([])
    await context.close()
  })

  it('shows every amount in the team\'s currency once an editor changes it', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await open(page, '/settings/fee-profiles')
    await page.getByLabel('Currency', { exact: true }).selectOption('EUR')
    await page.getByRole('button', { name: 'Save', exact: true }).click()
    await page.getByText('Saved: amounts are now shown in EUR.').waitFor()
    expect((await get('/ledger-settings')).currency).toBe('EUR')
    await open(page, `/items/${itemId}`)
    const figures = page.getByTestId('ledger-totals')
    await expect.poll(() => figures.textContent()).toContain('€24.00')
    expect(await figures.textContent()).not.toContain('$')
    await open(page, '/quick-add')
    await page.getByLabel('Price on the tag').fill('3')
    await page.getByRole('button', { name: 'Add item · €3.00' }).waitFor()
    await shot(page, 'ledger-phone-currency-eur')
    await open(page, '/reports')
    await expect.poll(() => page.locator('main').textContent()).toContain('€')
    expect(await page.locator('main').textContent()).not.toMatch(/\$\d/)
    // Back to dollars for the other tests of this team.
    expect((await owner.patch(api('/ledger-settings'), { currency: 'USD' })).status).toBe(200)
    expect(problems).toEqual([])
    await context.close()
  })
})
