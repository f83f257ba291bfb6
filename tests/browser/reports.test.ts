// The reports page, the buy check and the sourcing sheet in Chromium at phone (360 px) and desktop (1280 px)
// widths: the report's choices live in the address bar, the table sorts, the chart has its table alternative,
// the buy check gives its verdict with count, spread, low-data warning and cautions. Screenshots in tests/artifacts/.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { newOwner, uniqueTeamName, type Person } from '../support/api'

const POLL = { timeout: 10_000 }
let browser: Browser
let owner: Person
let slug: string
const ids: Record<string, number> = {}

async function create(path: string, body: Record<string, unknown>) {
  const res = await owner.post(`/api/teams/${slug}/${path}`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

async function signedIn(viewport: { width: number, height: number }): Promise<BrowserContext> {
  return await signedInContext(browser, owner, viewport)
}

/** The page is no wider than the screen (tables scroll inside their own box). */
async function expectNoSideScroll(page: Page) {
  const widths = await page.evaluate(() => {
    // Elements that stick out on the right, to name in the failure.
    const wide = [...document.querySelectorAll('body *')].filter(el => el.getBoundingClientRect().right > window.innerWidth + 1)
    return { page: document.documentElement.scrollWidth, view: window.innerWidth, wide: wide.slice(0, 5).map(el => `${el.tagName}.${el.className}`) }
  })
  expect(widths.page, `page width; wider: ${widths.wide.join(' | ')}`).toBeLessThanOrEqual(widths.view)
}

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Reports Browser'))
  owner = registered.person
  slug = registered.team.slug
  await create('fee-profiles', { name: 'Porchlight', channel: 'Porchlight', percentBp: 1000, fixedCents: 0 })
  ids.store = await create('stores', { name: 'Second Chapter Thrift', kind: 'thrift_store', town: 'Hollowbrook' })
  ids.kitchen = await create('categories', { name: 'Kitchen' })
  ids.mugs = await create('categories', { name: 'Mugs', parentId: ids.kitchen })
  ids.stoneware = await create('materials', { name: 'Stoneware', cautions: 'Old glazes may leach lead: keep for decoration unless a laboratory test says otherwise.', damage: 'Crazing lets water into the body.' })
  ids.maker = await create('makers', { name: 'Fernwood Pottery' })
  ids.mark = await create('marks', { inscriptions: ['FERNWOOD OVEN PROOF'], makerId: ids.maker, materialIds: [ids.stoneware], categoryIds: [ids.mugs] })
  ids.rare = await create('marks', { inscriptions: ['TANSY STAMP'] })
  const sold = (n: number, price: number, extra: Record<string, unknown> = {}) => create('items', {
    title: `Mug ${n}`, status: 'sold', acquiredOn: `2026-0${1 + (n % 6)}-0${1 + (n % 5)}`, soldOn: `2026-0${1 + (n % 6)}-2${n % 8}`,
    salePriceCents: price, costCents: 300, markId: ids.mark, makerId: ids.maker, materialId: ids.stoneware, categoryId: ids.mugs,
    storeId: ids.store, condition: 'good', weightGrams: 450, ...extra,
  })
  for (const [n, price] of [1200, 1500, 1800, 2000, 2400, 2600, 900].entries()) await sold(n, price)
  await create('items', { title: 'Mug on the shelf', acquiredOn: '2026-05-01', costCents: 250, markId: ids.mark, categoryId: ids.mugs, storeId: ids.store })
  await create('items', { title: 'Stamped dish', status: 'sold', acquiredOn: '2026-03-01', soldOn: '2026-03-11', salePriceCents: 1600, costCents: 200, markId: ids.rare })
})
afterAll(async () => { await browser?.close() })

describe('reports page', () => {
  for (const [size, viewport] of [['desktop', DESKTOP], ['phone', PHONE]] as const) {
    it(`groups, filters and sorts with everything in the address bar (${size})`, async () => {
      const context = await signedIn(viewport)
      const page = await context.newPage()
      const problems = watchPage(page)
      // All time: the fixture's dates are fixed, the default period moves with the calendar.
      await page.goto(`/t/${slug}/reports?by=mark&period=all`)
      await hydrated(page)
      const table = page.getByRole('table', { name: /Report by mark/ })
      await expect.poll(() => table.getByRole('row', { name: /FERNWOOD OVEN PROOF/ }).count(), POLL).toBe(1)
      // The totals row: nine items bought, eight sold of them.
      await expect.poll(() => table.locator('tfoot').innerText(), POLL).toMatch(/All rows/)
      // The chart is drawn, with its values as a table beside it.
      await expect.poll(() => page.locator('canvas[role="img"]').count(), POLL).toBe(1)
      expect(await page.locator('canvas[role="img"]').getAttribute('aria-label')).toMatch(/Net profit.*FERNWOOD OVEN PROOF/)
      await page.getByText('The chart as a table').click()
      await expect.poll(() => page.locator('details table').first().innerText(), POLL).toMatch(/FERNWOOD OVEN PROOF/)
      // Sorting by a column writes the sort into the address bar.
      await table.getByRole('button', { name: 'Sold', exact: true }).click()
      await expect.poll(() => new URL(page.url()).searchParams.get('sort'), POLL).toBe('-sold')
      await expect.poll(() => table.locator('th[aria-sort="descending"]').innerText(), POLL).toMatch(/sold/i)
      await shot(page, `reports-${size}-mark`)
      // A filter is part of the address too, and survives a reload.
      await page.getByRole('combobox', { name: 'Store' }).selectOption(String(ids.store))
      await expect.poll(() => new URL(page.url()).searchParams.get('storeId'), POLL).toBe(String(ids.store))
      await expect.poll(() => table.getByRole('row', { name: /TANSY STAMP/ }).count(), POLL).toBe(0)
      await page.reload()
      await hydrated(page)
      expect(await page.getByRole('combobox', { name: 'Store' }).inputValue()).toBe(String(ids.store))
      expect(await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(`/api/teams/${slug}/reports/mark.csv?storeId=${ids.store}`)
      // By month: a line over the months.
      await page.getByText('Month', { exact: true }).click()
      await expect.poll(() => new URL(page.url()).searchParams.get('by'), POLL).toBe('month')
      await expect.poll(() => page.getByRole('heading', { name: 'Net profit by month' }).count(), POLL).toBe(1)
      await expect.poll(() => page.getByRole('table', { name: /Report by month/ }).getByRole('row', { name: /Jan 2026/ }).count(), POLL).toBe(1)
      await shot(page, `reports-${size}-month`)
      await expectNoSideScroll(page)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('shows the last 12 months unless the address names a period, with all time one click away', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/reports?by=mark`)
    await hydrated(page)
    // 365 UTC days up to today, worked out here on its own.
    const day = (back: number) => new Date(Date.now() - back * 86_400_000).toISOString().slice(0, 10)
    const period = page.getByRole('group', { name: 'Period', exact: true })
    expect(await period.getByRole('button', { name: 'Last 12 months', exact: true }).getAttribute('aria-pressed')).toBe('true')
    expect(await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(`/api/teams/${slug}/reports/mark.csv?from=${day(364)}&to=${day(0)}`)
    await expect.poll(() => page.getByText(new RegExp(`, ${day(364)} to ${day(0)}: sell-through`)).count(), POLL).toBe(1)
    await period.getByRole('button', { name: 'All time' }).click()
    await expect.poll(() => new URL(page.url()).searchParams.get('period'), POLL).toBe('all')
    await expect.poll(() => page.getByText(/, all time: sell-through/).count(), POLL).toBe(1)
    expect(await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(`/api/teams/${slug}/reports/mark.csv`)
    // Back to the default: the address carries no period again.
    await period.getByRole('button', { name: 'Last 12 months', exact: true }).click()
    await expect.poll(() => new URL(page.url()).search, POLL).toBe('?by=mark')
    await context.close()
  })

  it('opens a category\'s subcategories from its row', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/reports?period=all`)
    await hydrated(page)
    await page.getByRole('button', { name: 'Kitchen' }).click()
    await expect.poll(() => new URL(page.url()).searchParams.get('parentId'), POLL).toBe(String(ids.kitchen))
    await expect.poll(() => page.getByRole('table', { name: /Report by category/ }).getByRole('row', { name: /Mugs/ }).count(), POLL).toBe(1)
    await shot(page, 'reports-desktop-subcategories')
    await context.close()
  })
})

describe('buy check', () => {
  it('gives a verdict on a phone for a mark linked from elsewhere, with count, spread and cautions', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await page.goto(`/t/${slug}/buy-check?markId=${ids.mark}`)
    await hydrated(page)
    expect(await page.getByTestId('buy-check-subject').innerText()).toBe('FERNWOOD OVEN PROOF')
    // Without a price: the expected sale, and a prompt for the price.
    await expect.poll(() => page.getByText(/Enter the tag price for a verdict/).count(), POLL).toBe(1)
    const price = page.getByLabel('Tag price (one piece)')
    await price.fill('3.00')
    await expect.poll(() => new URL(page.url()).searchParams.get('priceCents'), POLL).toBe('300')
    await expect.poll(() => page.getByTestId('buy-verdict').innerText(), POLL).toMatch(/^(Buy|Maybe|Pass)$/)
    // Seven sales: 900 … 2,600, median 1,800 (type 7), from this mark.
    await expect.poll(() => page.getByText(/Expected sale \$18\.00: the median of 7 sales of this mark/).count(), POLL).toBe(1)
    expect(await page.getByRole('complementary', { name: 'Cautions', exact: true }).innerText()).toMatch(/Old glazes may leach lead/)
    expect(await page.getByRole('complementary', { name: 'Cautions', exact: true }).innerText()).toMatch(/Crazing lets water into the body/)
    // Large targets for a thumb.
    for (const name of ['One piece more', 'One piece fewer']) {
      const box = await page.getByRole('button', { name }).boundingBox()
      expect(box!.height, name).toBeGreaterThanOrEqual(44)
    }
    await page.getByRole('button', { name: 'One piece more' }).click()
    await expect.poll(() => new URL(page.url()).searchParams.get('quantity'), POLL).toBe('2')
    await page.getByLabel('Condition').selectOption('fair')
    await expect.poll(() => page.getByText(/No comparable sales in fair condition/).count(), POLL).toBe(1)
    await shot(page, 'buy-check-phone')
    await expectNoSideScroll(page)
    expect(problems).toEqual([])
    await context.close()
  })

  it('finds the entry through the lookup on a desktop and warns when the sales are few', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/buy-check`)
    await hydrated(page)
    const search = page.getByRole('combobox', { name: 'Mark, maker or category' })
    await search.fill('TANSY')
    await page.getByRole('button', { name: /TANSY STAMP/ }).click()
    await page.getByLabel('Tag price (one piece)').fill('2')
    await expect.poll(() => new URL(page.url()).searchParams.get('markId'), POLL).toBe(String(ids.rare))
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Few sales to go on' }).count(), POLL).toBe(1)
    await expect.poll(() => page.getByTestId('buy-verdict').innerText(), POLL).toBe('Maybe')
    await shot(page, 'buy-check-desktop-low-data')
    await context.close()
  })
})

describe('sourcing sheet', () => {
  it('reads on a phone and has a print button', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/sourcing-sheet?from=2026-01-01`)
    await hydrated(page)
    await expect.poll(() => page.getByRole('region', { name: 'Marks that earned the most' }).innerText(), POLL).toMatch(/FERNWOOD OVEN PROOF/)
    expect(await page.getByRole('button', { name: 'Print' }).count()).toBe(1)
    await shot(page, 'sourcing-sheet-phone')
    await expectNoSideScroll(page)
    await page.emulateMedia({ media: 'print' })
    expect(await page.locator('header.sticky').isVisible()).toBe(false)
    await page.setViewportSize(DESKTOP)
    await shot(page, 'sourcing-sheet-print')
    await context.close()
  })
})
