// Debian's Chromium driven by playwright-core; screenshots land in tests/artifacts/ (git-ignored).
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { mkdirSync, mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { baseUrl } from './api'

export const PHONE = { width: 360, height: 780 }
export const DESKTOP = { width: 1280, height: 900 }
export const ARTIFACTS = join(process.cwd(), 'tests', 'artifacts')

export async function launchBrowser(): Promise<Browser> {
  mkdirSync(ARTIFACTS, { recursive: true })
  return await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync'],
    // playwright gives each browser a fresh profile in a temp dir of its own; HOME goes under the test run's temp
    // folder (npm test removes it at the end), so runs leave nothing behind in /tmp.
    env: { ...process.env, HOME: mkdtempSync(join(process.env.TALLYMARK_TEST_TMP || tmpdir(), 'tallymark-chromium-')) },
  })
}

export async function newContext(browser: Browser, viewport = DESKTOP): Promise<BrowserContext> {
  const context = await browser.newContext({ viewport, baseURL: process.env.TALLYMARK_TEST_URL, locale: 'en-US', timezoneId: 'America/Chicago' })
  context.setDefaultTimeout(15_000)
  return context
}

/** A context signed in as `person`: their session cookie from the API, for the app's address. */
export async function signedInContext(browser: Browser, person: { cookieHeader(): string }, viewport = DESKTOP): Promise<BrowserContext> {
  const context = await newContext(browser, viewport)
  await context.addCookies(person.cookieHeader().split('; ').filter(Boolean).map((pair) => {
    const eq = pair.indexOf('=')
    return { name: pair.slice(0, eq), value: pair.slice(eq + 1), url: baseUrl }
  }))
  return context
}

/** Collects console errors and failed requests, so a test can assert none happened. */
export function watchPage(page: Page) {
  const problems: string[] = []
  page.on('pageerror', e => problems.push(`pageerror: ${e.message}`))
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console: ${m.text()}`) })
  return problems
}

export async function shot(page: Page, name: string) {
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true })
}

/** Waits until Nuxt has hydrated and the current page has loaded its data, so clicks reach Vue handlers. */
export async function hydrated(page: Page) {
  try {
    await page.waitForFunction(() => document.documentElement.dataset.hydrated === 'true' && document.documentElement.dataset.ready === location.pathname)
  }
  catch (error) {
    await shot(page, `hydration-timeout-${Date.now()}`)
    throw new Error(`${page.url()} did not hydrate: ${(await page.locator('body').innerText()).slice(0, 300)}`, { cause: error })
  }
}
