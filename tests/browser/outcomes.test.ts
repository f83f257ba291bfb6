// Sales outcomes on the wiki entry pages, read by a viewer at phone (360 px) and desktop (1280 px) widths: each
// mark, maker, material and category page shows its own sold count, median sale and days to sell, net, ROI and
// sell-through with its recent items, and its link opens the items list filtered to it. The expected figures are
// worked out by hand below from the invented fixture (no fees: net = sale price − cost; ROI = net / cost × 100;
// sell-through = sold / available × 100, trade-facts §4; medians Hyndman & Fan type 7). Screenshots in tests/artifacts/.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { newMember, newOwner, uniqueTeamName, type Person } from '../support/api'

const POLL = { timeout: 10_000 }
let browser: Browser
let owner: Person
let viewer: Person
let slug: string
const ids: Record<string, number> = {}

async function create(path: string, body: Record<string, unknown>) {
  const res = await owner.post(`/api/teams/${slug}/${path}`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

async function signedIn(person: Person, viewport: { width: number, height: number }): Promise<BrowserContext> {
  return await signedInContext(browser, person, viewport)
}

async function expectNoSideScroll(page: Page) {
  const widths = await page.evaluate(() => ({ page: document.documentElement.scrollWidth, view: window.innerWidth }))
  expect(widths.page, 'page width').toBeLessThanOrEqual(widths.view)
}

/** The outcome figures as label → value (textContent: the labels are upper-cased by CSS only). */
async function figuresOf(region: Locator): Promise<Record<string, string>> {
  const pairs = await region.locator('dl > div').evaluateAll(divs => divs.map(d => [
    d.querySelector('dt')!.textContent!.trim(),
    [...d.querySelectorAll('dd')].map(dd => dd.textContent!.trim()).join(' | '),
  ]))
  return Object.fromEntries(pairs)
}

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Outcomes Browser'))
  owner = registered.person
  slug = registered.team.slug
  viewer = (await newMember(owner, slug, 'viewer')).person
  ids.jugs = await create('categories', { name: 'Jugs' })
  ids.cream = await create('categories', { name: 'Cream jugs', parentId: ids.jugs })
  ids.earthenware = await create('materials', { name: 'Earthenware' })
  ids.maker = await create('makers', { name: 'Thistlecombe Pottery' })
  ids.ware = await create('marks', { inscriptions: ['THISTLECOMBE WARE'], makerId: ids.maker, materialIds: [ids.earthenware], categoryIds: [ids.cream] })
  ids.studio = await create('marks', { inscriptions: ['THISTLECOMBE STUDIO'], makerId: ids.maker })
  ids.unsold = await create('marks', { inscriptions: ['PLOVER HALL'] })
  const ware = { markId: ids.ware, makerId: ids.maker, materialId: ids.earthenware, categoryId: ids.cream }
  // Three sales of the ware mark (10, 30 and 20 days), one piece still on the shelf.
  await create('items', { ...ware, title: 'Cream jug 1', status: 'sold', acquiredOn: '2026-01-05', soldOn: '2026-01-15', salePriceCents: 1000, costCents: 200 })
  await create('items', { ...ware, title: 'Cream jug 2', status: 'sold', acquiredOn: '2026-01-10', soldOn: '2026-02-09', salePriceCents: 1500, costCents: 300 })
  await create('items', { ...ware, title: 'Cream jug 3', status: 'sold', acquiredOn: '2026-02-01', soldOn: '2026-02-21', salePriceCents: 2000, costCents: 400 })
  await create('items', { ...ware, title: 'Cream jug 4', acquiredOn: '2026-03-01', costCents: 250 })
  // The studio mark, filed directly under Jugs: one sale (30 days), one listed.
  const studio = { markId: ids.studio, makerId: ids.maker, categoryId: ids.jugs }
  await create('items', { ...studio, title: 'Studio jug 1', status: 'sold', acquiredOn: '2026-02-10', soldOn: '2026-03-12', salePriceCents: 3000, costCents: 500 })
  await create('items', { ...studio, title: 'Studio jug 2', status: 'listed', acquiredOn: '2026-03-05', listedOn: '2026-03-06', costCents: 300 })
})
afterAll(async () => { await browser?.close() })

/** Opens an entry page, checks its outcomes, follows the ledger link and checks the filtered list. */
async function checkEntry(page: Page, entry: {
  path: string
  figures: Record<string, RegExp>
  recent?: string[]
  ledgerParam: string
  listed: number
  chip?: RegExp
}, shotName?: string) {
  await page.goto(`/t/${slug}${entry.path}`)
  await hydrated(page)
  const region = page.getByRole('region', { name: 'Sales outcomes' })
  await expect.poll(() => region.locator('dl > div').count(), POLL).toBe(6)
  const figures = await figuresOf(region)
  for (const [label, value] of Object.entries(entry.figures)) expect(figures[label], `${entry.path} ${label}`).toMatch(value)
  if (entry.recent) {
    expect(await region.getByRole('listitem').locator('a').allTextContents()).toEqual(entry.recent)
  }
  await expectNoSideScroll(page)
  if (shotName) await shot(page, shotName)
  await region.getByRole('link', { name: 'All its items in the ledger' }).click()
  await page.waitForURL(url => url.pathname === `/t/${slug}/items`)
  await hydrated(page)
  const id = entry.path.split('/')[2]!
  expect(new URL(page.url()).searchParams.get(entry.ledgerParam)).toBe(id)
  await expect.poll(() => page.locator('[data-total="items"]').textContent(), POLL).toMatch(new RegExp(`Items\\s*${entry.listed}\\b`))
  if (entry.chip) await expect.poll(() => page.getByTestId(`items-filter-${entry.ledgerParam}`).textContent(), POLL).toMatch(entry.chip)
  if (shotName) await shot(page, `${shotName}-ledger`)
}

describe('sales outcomes on the wiki entry pages', () => {
  for (const [size, viewport] of [['phone', PHONE], ['desktop', DESKTOP]] as const) {
    it(`shows a viewer each entry's own figures with links into the filtered ledger (${size})`, async () => {
      const context = await signedIn(viewer, viewport)
      const page = await context.newPage()
      const problems = watchPage(page)
      // The ware mark: prices 1,000, 1,500, 2,000 → median $15.00, middle half $12.50–$17.50; days 10, 30, 20 → 20;
      // net 800 + 1,200 + 1,600 = $36.00 on a cost of 900 → ROI 400 %; sell-through 3 of 4 = 75 %.
      await checkEntry(page, {
        path: `/marks/${ids.ware}`,
        figures: {
          'Sold': /^3 \| 1 still on hand$/, 'Median sale': /^\$15\.00 \| middle half \$12\.50–\$17\.50$/, 'Days to sell': /^20 d/,
          'Net profit': /^\$36\.00$/, 'ROI': /^400 %$/, 'Sell-through': /^75 % \| 3 of 4$/,
        },
        // Newest first: bought 1 March, then sold 21 February, 9 February, 15 January.
        recent: ['Cream jug 4', 'Cream jug 3', 'Cream jug 2', 'Cream jug 1'],
        ledgerParam: 'markId',
        listed: 4,
      }, `outcomes-${size}-mark`)
      // The items list shows the mark in its filter.
      if (size === 'desktop') await expect.poll(() => page.locator('[data-picker="mark"] [data-picked]').textContent(), POLL).toBe('THISTLECOMBE WARE')
      // The maker: both marks. Prices 1,000 … 3,000 → median (1,500 + 2,000) / 2 = $17.50; days 10, 20, 30, 30 → 25;
      // net 3,600 + 2,500 = $61.00 on a cost of 1,400 → ROI 435.7 %; sell-through 4 of 6.
      await checkEntry(page, {
        path: `/makers/${ids.maker}`,
        figures: { 'Sold': /^4 \| 2 still on hand$/, 'Median sale': /^\$17\.50/, 'Days to sell': /^25 d/, 'Net profit': /^\$61\.00$/, 'ROI': /^435\.7 %$/, 'Sell-through': /^66\.7 % \| 4 of 6$/ },
        ledgerParam: 'makerId',
        listed: 6,
        chip: /Maker: Thistlecombe Pottery/,
      }, `outcomes-${size}-maker`)
      // The material: the ware mark's pieces.
      await checkEntry(page, {
        path: `/materials/${ids.earthenware}`,
        figures: { 'Sold': /^3 /, 'Net profit': /^\$36\.00$/, 'Sell-through': /^75 %/ },
        ledgerParam: 'materialId',
        listed: 4,
        chip: /Material: Earthenware/,
      })
      // The category counts its subcategory, and so does the list its ledger link opens: all six pieces.
      await checkEntry(page, {
        path: `/categories/${ids.jugs}`,
        figures: { 'Sold': /^4 /, 'Net profit': /^\$61\.00$/ },
        ledgerParam: 'categoryId',
        listed: 6,
      }, `outcomes-${size}-category`)
      expect(await page.locator('#f-category').inputValue()).toBe(String(ids.jugs))
      // Unticking the subcategories leaves the two pieces filed directly under Jugs.
      if (!await page.locator('#f-subcategories').isVisible()) await page.locator('summary').filter({ hasText: /Filters/ }).click()
      expect(await page.locator('#f-subcategories').isChecked()).toBe(true)
      await page.locator('#f-subcategories').uncheck()
      await expect.poll(() => page.locator('[data-total="items"]').textContent(), POLL).toMatch(/Items\s*2\b/)
      expect(new URL(page.url()).searchParams.get('subcategories')).toBeNull()
      await page.goto(`/t/${slug}/categories/${ids.jugs}`)
      await hydrated(page)
      await expect.poll(() => page.getByRole('region', { name: 'Sales outcomes' }).textContent(), POLL).toMatch(/Includes the items of its subcategories/)
      // An entry without items says so instead of a row of dashes.
      await page.goto(`/t/${slug}/marks/${ids.unsold}`)
      await hydrated(page)
      await expect.poll(() => page.getByRole('region', { name: 'Sales outcomes' }).textContent(), POLL).toMatch(/No items of this mark in the ledger yet/)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('links a mark\'s outcomes to the buy check for that mark', async () => {
    const context = await signedIn(owner, DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/marks/${ids.ware}`)
    await hydrated(page)
    await page.getByRole('region', { name: 'Sales outcomes' }).getByRole('link', { name: 'Buy check' }).click()
    await page.waitForURL(url => url.pathname === `/t/${slug}/buy-check`)
    expect(new URL(page.url()).searchParams.get('markId')).toBe(String(ids.ware))
    await context.close()
  })
})
