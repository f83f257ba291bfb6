// Dating clues where a mark is looked at: the suggestion on the mark page (one click to accept) and the
// clues in the editor as the inscription is typed. Ranges from SCAPIN-1535 / the Treaty of San Francisco
// (Occupied Japan 1947–1952) and the Lanham Act (® from 1947), as in shared/dating/rules.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { PHONE, hydrated, launchBrowser, newContext, shot } from '../support/browser'
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
