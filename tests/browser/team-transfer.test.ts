// The owner's export and import section on the Members page, on a phone: a team export goes into an empty
// team from the page, and a second try into the now full team shows why it is refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { PHONE, hydrated, launchBrowser, newContext, shot, watchPage } from '../support/browser'
import { newOwner, uniqueTeamName } from '../support/api'
import { createEntry } from '../support/wiki'
import { download } from '../support/transfer'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('team export and import on the Members page', () => {
  it('imports a downloaded export into an empty team, then refuses the full team', async () => {
    const owner = await newOwner(uniqueTeamName('Pagefield Source'), 'Odile Pagefield')
    const api = (slug: string, path: string) => `/api/teams/${slug}${path}`
    const team = { api: (path: string) => api(owner.team.slug, path) }
    await createEntry(owner.person, team as never, 'makers', { name: 'Pagefield Kilnworks' })
    await createEntry(owner.person, team as never, 'marks', { inscriptions: ['PAGEFIELD KILNWORKS'] })
    const zip = await download(owner.person, team.api('/exports/team.zip'))
    expect(zip.status).toBe(200)
    const target = await owner.person.post('/api/teams', { name: uniqueTeamName('Pagefield Copy') })
    expect(target.status).toBe(201)
    const slug = target.body.team.slug as string

    const context = await newContext(browser, PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    await page.goto('/login')
    await hydrated(page)
    await page.getByLabel('E-mail').fill(owner.person.email)
    await page.getByLabel('Password').fill(owner.person.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(url => url.pathname.startsWith('/t/'))
    await page.goto(`/t/${slug}/members`)
    await hydrated(page)
    const section = page.locator('[data-test="team-transfer"]')
    await expect.poll(() => section.getByRole('link', { name: 'Download team export' }).getAttribute('href')).toBe(api(slug, '/exports/team.zip'))
    await section.scrollIntoViewIfNeeded()
    await shot(page, 'team-transfer-phone-members')

    await page.setInputFiles('#team-import-file', { name: 'pagefield.zip', mimeType: 'application/zip', buffer: zip.bytes })
    await section.getByRole('button', { name: 'Import into this empty team' }).click()
    await expect.poll(() => section.getByRole('status').textContent()).toMatch(/Imported 1 mark, 1 maker, 2 revisions\./)
    await shot(page, 'team-transfer-phone-imported')

    await section.getByRole('button', { name: 'Import into this empty team' }).click()
    await expect.poll(() => section.getByRole('alert').textContent()).toMatch(/already has 1 mark, 1 maker: .*empty team/)
    await shot(page, 'team-transfer-phone-refused')
    // The page is wide enough for its content on a phone: nothing sticks out sideways.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width)
    expect(problems.filter(p => !p.includes('409'))).toEqual([])
    await context.close()
  })
})
