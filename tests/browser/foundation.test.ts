// Register, sign out, sign in, invite a member and accept in a second browser context — on a phone and a desktop.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, newContext, shot, watchPage } from '../support/browser'
import { STRONG_PASSWORD, linkIn, uniqueEmail, waitForMail } from '../support/api'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe.each([['phone', PHONE], ['desktop', DESKTOP]] as const)('team foundation on a %s', (size, viewport) => {
  it('registers, signs out and in, invites a member who accepts in another browser', async () => {
    const ownerEmail = uniqueEmail(`owner-${size}`)
    const owner = await newContext(browser, viewport)
    const page = await owner.newPage()
    const problems = watchPage(page)

    await page.goto('/register')
    await hydrated(page)
    await page.getByLabel('Your name').fill('Wren Ashby')
    await page.getByLabel('E-mail').fill(ownerEmail)
    await page.getByLabel('Password').fill('password1')
    await page.getByLabel('Team name').fill(`Millpond Resale ${size}`)
    await page.getByRole('button', { name: 'Create account and team' }).click()
    // The server's field error shows next to the field.
    await expect.poll(() => page.locator('#password-error').textContent()).toContain('commonly used')
    await shot(page, `foundation-${size}-register-error`)
    await page.getByLabel('Password').fill(STRONG_PASSWORD)
    await page.getByRole('button', { name: 'Create account and team' }).click()
    await page.waitForURL(url => url.pathname.startsWith('/t/millpond-resale'))
    await expect.poll(() => page.locator('h1').textContent()).toContain(`Millpond Resale ${size}`)
    await shot(page, `foundation-${size}-team-home`)
    const teamPath = new URL(page.url()).pathname

    await page.goto('/account')
    await hydrated(page)
    await page.getByRole('button', { name: 'Sign out', exact: true }).click()
    await page.waitForURL(url => url.pathname === '/login')
    await page.goto(`${teamPath}/members`)
    await page.waitForURL(url => url.pathname === '/login' && url.searchParams.has('next'))

    await hydrated(page)
    await page.getByLabel('E-mail').fill(ownerEmail)
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect.poll(() => page.getByRole('alert').first().textContent()).toContain('do not match')
    await page.getByLabel('Password').fill(STRONG_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    // Back where the sign-in page was asked for.
    await page.waitForURL(url => url.pathname === `${teamPath}/members`)

    await hydrated(page)
    const inviteeEmail = uniqueEmail(`invitee-${size}`)
    await page.getByLabel('E-mail').fill(inviteeEmail)
    await page.getByLabel('Role', { exact: true }).selectOption('editor')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await expect.poll(() => page.getByRole('status').first().textContent()).toContain(`Invitation sent to ${inviteeEmail}`)
    await shot(page, `foundation-${size}-members`)

    const mail = await waitForMail(inviteeEmail)
    expect(mail.subject).toContain(`Millpond Resale ${size}`)
    const link = linkIn(mail, '/invitations/')

    const invitee = await newContext(browser, viewport)
    const second = await invitee.newPage()
    const secondProblems = watchPage(second)
    await second.goto(new URL(link).pathname)
    await hydrated(second)
    await expect.poll(() => second.locator('h1').textContent()).toContain(`Join Millpond Resale ${size}`)
    await second.getByLabel('Your name').fill('Jun Pardo')
    await second.getByLabel('Choose a password').fill(STRONG_PASSWORD)
    await shot(second, `foundation-${size}-accept`)
    await second.getByRole('button', { name: 'Create account and join' }).click()
    await second.waitForURL(url => url.pathname === teamPath)
    await expect.poll(() => second.getByText('Your role here').textContent()).toContain('Editor')

    await page.reload()
    await hydrated(page)
    await expect.poll(() => page.getByText('Jun Pardo').count()).toBeGreaterThan(0)
    await shot(page, `foundation-${size}-members-after`)

    // Keyboard: the sign-in form can be used without a pointer.
    const kb = await newContext(browser, viewport)
    const third = await kb.newPage()
    await third.goto('/login')
    await hydrated(third)
    await third.keyboard.press('Tab')
    await third.keyboard.press('Tab')
    await third.keyboard.type(inviteeEmail)
    await third.keyboard.press('Tab')
    await third.keyboard.type(STRONG_PASSWORD)
    await third.keyboard.press('Enter')
    await third.waitForURL(url => url.pathname === teamPath)

    // The handbook by client-side navigation: @nuxt/content queries it in the browser (WASM SQLite),
    // which must work under the Content-Security-Policy.
    await page.goto(teamPath)
    await hydrated(page)
    await page.getByRole('link', { name: 'Open the handbook' }).click()
    await page.waitForURL(url => url.pathname === '/handbook')
    await page.getByRole('link', { name: 'Safety' }).first().click()
    await page.waitForURL(url => url.pathname === '/handbook/safety')
    await expect.poll(() => page.locator('article h1').first().textContent()).toContain('Safety')
    await shot(page, `foundation-${size}-handbook`)

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow, 'no horizontal scrolling').toBeLessThanOrEqual(0)
    expect(problems.filter(p => !p.includes('401') && !p.includes('400'))).toEqual([])
    expect(secondProblems).toEqual([])
    await Promise.all([owner.close(), invitee.close(), kb.close()])
  })
})
