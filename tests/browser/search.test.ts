// The header search in Chromium: results as you type on a phone, thumbnails, keyboard navigation with the
// combobox pattern, "/" to focus, stale answers dropped, recent searches on the device, the no-match action
// and the full results page with filters.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { newOwner, uniqueTeamName, type Person } from '../support/api'
import { photoForm } from '../support/photos'

// Answers can take a while on a busy machine: wait up to 10 s for what a person would see.
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

/** A browser context signed in as the owner (the API test's session cookie, handed over). */
async function signedIn(viewport: { width: number, height: number }): Promise<BrowserContext> {
  return await signedInContext(browser, owner, viewport)
}

async function typeSlowly(page: Page, text: string) {
  // As a person types: one key at a time, faster than the debounce.
  await page.keyboard.type(text, { delay: 40 })
}

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Search Browser'))
  owner = registered.person
  slug = registered.team.slug
  const maker = await create('makers', { name: 'Hallowell Brothers', country: 'United States' })
  ids.hallowell = await create('marks', { inscriptions: ['HALLOWELL POTTERY CO', 'ZANESFORD OHIO'], makerId: maker, country: 'United States', yearFrom: 1920, yearTo: 1950 })
  ids.brantley = await create('marks', { inscriptions: ['BRANTLEY GLASS WORKS'], country: 'England' })
  ids.hallam = await create('marks', { inscriptions: ['HALLAM WARE'], country: 'England' })
  const jpeg = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#2f6a5e' } }).jpeg().toBuffer()
  const uploaded = await owner.request('POST', `/api/teams/${slug}/uploads`, photoForm(jpeg, { fields: { entityType: 'mark', entityId: ids.hallowell } }))
  expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201)
})
afterAll(async () => { await browser?.close() })

describe('header search', () => {
  it('shows results as you type on a phone, with thumbnails and large targets', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await page.goto(`/t/${slug}`)
    await hydrated(page)
    await page.getByRole('button', { name: 'Search' }).click()
    const box = page.getByRole('combobox', { name: 'Search marks, makers and notes' })
    await expect.poll(() => box.evaluate(el => el === document.activeElement), POLL).toBe(true)
    await typeSlowly(page, 'halowell pot')
    const option = page.getByRole('option', { name: /HALLOWELL POTTERY CO/ })
    await option.waitFor()
    await expect.poll(() => box.getAttribute('aria-expanded'), POLL).toBe('true')
    // Grouped by type, the matched words highlighted, the mark's photo beside it.
    await expect.poll(() => page.getByRole('group', { name: 'Marks' }).count(), POLL).toBe(1)
    await expect.poll(() => option.locator('mark').allTextContents(), POLL).toEqual(['HALLOWELL', 'POTTERY'])
    const thumb = option.locator('img')
    await expect.poll(() => thumb.evaluate(img => (img as HTMLImageElement).naturalWidth), POLL).toBeGreaterThan(0)
    const size = await option.boundingBox()
    expect(size!.height, 'a thumb-sized target').toBeGreaterThanOrEqual(56)
    // The box sits at the bottom of the sheet, in reach of the thumb.
    const boxAt = await box.boundingBox()
    expect(boxAt!.y + boxAt!.height).toBeGreaterThan(PHONE.height - 90)
    await shot(page, 'search-phone-results')
    await option.click()
    await page.waitForURL(url => url.pathname === `/t/${slug}/marks/${ids.hallowell}`)
    expect(problems.filter(p => !p.includes('404'))).toEqual([])
    await context.close()
  })

  it('is driven by the keyboard: "/" focuses, arrows move, Enter opens, Escape closes', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/members`)
    await hydrated(page)
    await page.keyboard.press('/')
    const box = page.getByRole('combobox', { name: 'Search marks, makers and notes' })
    await expect.poll(() => box.evaluate(el => el === document.activeElement), POLL).toBe(true)
    expect(await box.inputValue(), '"/" is not typed into the box').toBe('')
    await typeSlowly(page, 'hall')
    await page.getByRole('option', { name: /HALLAM WARE/ }).waitFor()
    await page.getByRole('option', { name: /HALLOWELL POTTERY CO/ }).waitFor()
    await page.keyboard.press('ArrowDown')
    const first = await box.getAttribute('aria-activedescendant')
    expect(first).toBeTruthy()
    expect(await page.locator(`#${first}`).getAttribute('aria-selected')).toBe('true')
    await page.keyboard.press('ArrowDown')
    const second = await box.getAttribute('aria-activedescendant')
    expect(second).not.toBe(first)
    await page.keyboard.press('ArrowUp')
    expect(await box.getAttribute('aria-activedescendant')).toBe(first)
    // Escape closes the list, a second Escape clears the box.
    await page.keyboard.press('Escape')
    await expect.poll(() => box.getAttribute('aria-expanded'), POLL).toBe('false')
    await page.keyboard.press('Escape')
    await expect.poll(() => box.inputValue(), POLL).toBe('')
    await typeSlowly(page, 'brantly')
    await page.getByRole('option', { name: /BRANTLEY GLASS WORKS/ }).waitFor()
    await page.keyboard.press('ArrowDown')
    expect(await box.getAttribute('aria-activedescendant')).toBe(`tm-search-list-mark-${ids.brantley}`)
    await shot(page, 'search-desktop-keyboard')
    await page.keyboard.press('Enter')
    await page.waitForURL(url => url.pathname === `/t/${slug}/marks/${ids.brantley}`)

    // The search is remembered on this device and offered in an empty box.
    await page.goto(`/t/${slug}`)
    await hydrated(page)
    await page.keyboard.press('/')
    const recent = page.getByRole('group', { name: 'Your recent searches' })
    await recent.getByRole('option', { name: 'brantly' }).waitFor()
    expect(await page.evaluate(() => localStorage.getItem('tm-recent-searches'))).toContain('brantly')
    await context.close()
  })

  it('drops an answer that arrives after a newer one', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    // Answers for "brantley" are held back, so they arrive after the answer for what was typed next.
    await page.route('**/api/teams/*/search?*', async (route) => {
      const q = new URL(route.request().url()).searchParams.get('q')
      if (q === 'brantley') await new Promise(r => setTimeout(r, 1200))
      await route.continue().catch(() => undefined)
    })
    await page.goto(`/t/${slug}`)
    await hydrated(page)
    await page.keyboard.press('/')
    await page.keyboard.type('brantley')
    await page.waitForTimeout(300)
    await page.getByRole('combobox', { name: 'Search marks, makers and notes' }).fill('hallam')
    await page.getByRole('option', { name: /HALLAM WARE/ }).waitFor()
    await page.waitForTimeout(1500)
    expect(await page.getByRole('option', { name: /BRANTLEY/ }).count()).toBe(0)
    expect(await page.getByRole('option', { name: /HALLAM WARE/ }).count()).toBe(1)
    await context.close()
  })

  it('offers to add the mark when nothing matches', async () => {
    const context = await signedIn(PHONE)
    const page = await context.newPage()
    await page.goto(`/t/${slug}`)
    await hydrated(page)
    await page.getByRole('button', { name: 'Search' }).click()
    await typeSlowly(page, 'QXZ VORPAL')
    const add = page.getByRole('option', { name: 'Add this mark' })
    await add.waitFor()
    await expect.poll(() => page.getByText('No match for “QXZ VORPAL”.').count(), POLL).toBe(1)
    await shot(page, 'search-phone-no-match')
    await add.click()
    await page.waitForURL(url => url.pathname === `/t/${slug}/marks/new` && url.searchParams.get('inscription') === 'QXZ VORPAL')
    await context.close()
  })
})

describe('results page', () => {
  it('searches with filters kept in the address bar', async () => {
    const context = await signedIn(DESKTOP)
    const page = await context.newPage()
    await page.goto(`/t/${slug}/search?q=ware%20works%20pottery`)
    await hydrated(page)
    const results = page.getByRole('region', { name: 'Results' })
    await results.getByRole('link', { name: /HALLOWELL POTTERY CO/ }).waitFor()
    await results.getByRole('link', { name: /BRANTLEY GLASS WORKS/ }).waitFor()
    await page.getByLabel('Country').fill('England')
    await page.waitForURL(url => url.searchParams.get('country') === 'England')
    await expect.poll(() => results.getByRole('link', { name: /HALLOWELL/ }).count(), POLL).toBe(0)
    await results.getByRole('link', { name: /BRANTLEY GLASS WORKS/ }).waitFor()
    await page.getByLabel('Year').fill('12345')
    await expect.poll(() => page.getByText('year must be from 1 to 2100.').count(), POLL).toBe(1)
    await shot(page, 'search-desktop-page')
    await context.close()
  })
})
