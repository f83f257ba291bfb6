// Dating clues where a mark is looked at: the suggestion on the mark page (one click to accept), the clues in
// the editor as the inscription is typed, and the compact clues of the quick add and the buy check. Ranges from
// SCAPIN-1535 / the Treaty of San Francisco (Occupied Japan 1947–1952), the Lanham Act (® from 1947) and the
// first countertop microwave oven (1967), as in shared/dating/rules.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, newContext, shot, watchPage } from '../support/browser'
import { newOwner } from '../support/api'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('dating clues on a phone', () => {
  it('suggests a range on an undated mark, accepts it in one click, and shows clues while typing', async () => {
    const { person, team } = await newOwner('Dating Browser Team')
    const created = await person.post(`/api/teams/${team.slug}/marks`, { inscriptions: ['MADE IN OCCUPIED JAPAN', 'Made in Occupied Japan'], markType: 'printed' })
    expect(created.status).toBe(201)
    const markId = created.body.id as number

    const context = await newContext(browser, PHONE)
    await context.addCookies(person.cookieHeader().split('; ').map((pair) => {
      const [name, ...rest] = pair.split('=')
      return { name: name!, value: rest.join('='), url: process.env.TALLYMARK_TEST_URL! }
    }))
    const page = await context.newPage()
    await page.goto(`/t/${team.slug}/marks/${markId}`)
    await hydrated(page)
    const panel = page.getByTestId('dating-clues')
    await expect.poll(() => panel.textContent()).toContain('1947–1952')
    await shot(page, 'dating-phone-suggestion')
    await panel.getByRole('button', { name: 'Use 1947–1952' }).click()
    await expect.poll(async () => (await person.get(`/api/teams/${team.slug}/marks/${markId}`)).body.yearFrom).toBe(1947)
    const saved = await person.get(`/api/teams/${team.slug}/marks/${markId}`)
    expect(saved.body).toMatchObject({ yearFrom: 1947, yearTo: 1952, revision: 2 })
    // Once dated, the clues stay as an explanation but no longer offer to overwrite the range.
    await expect.poll(() => panel.getByRole('button', { name: /^Use / }).count()).toBe(0)

    await page.goto(`/t/${team.slug}/marks/new`)
    await hydrated(page)
    await page.locator('input[id*="inscriptions"]').first().fill('Reg. U.S. Pat. & Tm. Off. Microwave safe')
    await expect.poll(() => page.getByTestId('dating-clues').textContent()).toContain('1975 or later')
    await shot(page, 'dating-phone-editor')
    await context.close()
  })
})

describe('dating clues in the quick add and the buy check', () => {
  it('reads the clues from what is typed off the base, then from the chosen mark, compact on a phone', async () => {
    const { person, team } = await newOwner('Dating Quick Add Team')
    const created = await person.post(`/api/teams/${team.slug}/marks`, { inscriptions: ['LARKSPUR CHINA', 'MADE IN OCCUPIED JAPAN'] })
    expect(created.status).toBe(201)
    const markId = created.body.id as number
    const context = await newContext(browser, PHONE)
    await context.addCookies(person.cookieHeader().split('; ').map((pair) => {
      const [name, ...rest] = pair.split('=')
      return { name: name!, value: rest.join('='), url: process.env.TALLYMARK_TEST_URL! }
    }))
    const page = await context.newPage()
    const problems = watchPage(page)
    await page.goto(`/t/${team.slug}/quick-add`)
    await hydrated(page)
    const markBox = page.getByRole('searchbox', { name: 'Mark (what the base reads)' })
    // No mark of the team reads like this, but the words on the base still date it (a microwave oven from 1967).
    await markBox.fill('Microwave safe')
    const panel = page.getByTestId('dating-clues')
    await expect.poll(() => panel.getByRole('heading').textContent().then(t => t?.trim())).toBe('Dating clues: 1967 or later')
    // Compact: one line until asked why; the reasons and sources are a tap away.
    expect((await panel.boundingBox())!.height).toBeLessThanOrEqual(64)
    expect(await panel.getByText(/Source:/).first().isVisible()).toBe(false)
    await panel.getByText('Why (1)').click()
    await expect.poll(() => panel.getByText(/Source: History of the home microwave oven/).isVisible()).toBe(true)
    await shot(page, 'dating-phone-quick-add-typed')

    // Picking the mark: the clues come from its own inscriptions (its second line), not from what was typed.
    await markBox.fill('larkspur')
    await page.getByRole('button', { name: /LARKSPUR CHINA/ }).click()
    await expect.poll(() => page.locator('[data-picker="mark"] [data-picked]').getAttribute('data-picked')).toBe(String(markId))
    await expect.poll(() => panel.getByRole('heading').textContent().then(t => t?.trim())).toBe('Dating clues: 1947–1952')
    expect((await panel.boundingBox())!.height).toBeLessThanOrEqual(64)
    const widths = await page.evaluate(() => ({ page: document.documentElement.scrollWidth, view: window.innerWidth }))
    expect(widths.page).toBeLessThanOrEqual(widths.view)
    await shot(page, 'dating-phone-quick-add-mark')
    // Changing the mark clears the clues with it.
    await page.getByRole('button', { name: 'Change the mark' }).click()
    await expect.poll(() => panel.count()).toBe(0)

    // The buy check for the same mark, linked with its id as a mark page does.
    await page.goto(`/t/${team.slug}/buy-check?markId=${markId}`)
    await hydrated(page)
    const check = page.getByTestId('dating-clues')
    await expect.poll(() => check.getByRole('heading').textContent().then(t => t?.trim())).toBe('Dating clues: 1947–1952')
    expect((await check.boundingBox())!.height).toBeLessThanOrEqual(64)
    await check.getByText('Why (1)').click()
    await expect.poll(() => check.getByText(/SCAPIN-1535/).isVisible()).toBe(true)
    await shot(page, 'dating-phone-buy-check')
    expect(problems).toEqual([])

    // On a desktop too; a maker picked instead of a mark has no inscription to read.
    await page.setViewportSize(DESKTOP)
    await page.reload()
    await hydrated(page)
    await expect.poll(() => page.getByTestId('dating-clues').getByRole('heading').textContent().then(t => t?.trim())).toBe('Dating clues: 1947–1952')
    await shot(page, 'dating-desktop-buy-check')
    const maker = await person.post(`/api/teams/${team.slug}/makers`, { name: 'Larkspur Works' })
    expect(maker.status).toBe(201)
    await page.goto(`/t/${team.slug}/buy-check?makerId=${maker.body.id}`)
    await hydrated(page)
    await expect.poll(() => page.getByTestId('buy-check-subject').textContent()).toMatch(/Larkspur Works/)
    expect(await page.getByTestId('dating-clues').count()).toBe(0)
    await context.close()
  })
})
