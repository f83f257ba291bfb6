// The members page with a locked account: everyone sees "locked" beside the member, only owners get the
// Unlock button, and pressing it clears the lock (the API's answer and the list agree). Phone and desktop.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, shot, signedInContext, watchPage } from '../support/browser'
import { newMember, newOwner, uniqueTeamName, type Person } from '../support/api'
import { closeTestDb, exec, query } from '../support/db'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

async function signedIn(person: Person, viewport: { width: number, height: number }): Promise<BrowserContext> {
  return await signedInContext(browser, person, viewport)
}

describe.each([['phone', PHONE], ['desktop', DESKTOP]] as const)('unlocking a member on a %s', (size, viewport) => {
  it('shows the lock to every member and lets the owner lift it', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName(`Latch Row ${size}`), 'Ines Marlow')
    const viewer = await newMember(owner, team.slug, 'viewer', 'Rafe Tolland')
    const locked = await newMember(owner, team.slug, 'contributor', 'Odile Brash')
    await exec('update users set locked_at = utc_timestamp(), failed_logins = 100 where id = ?', [locked.id])
    const row = (page: import('playwright-core').Page) => page.getByRole('listitem').filter({ hasText: 'Odile Brash' })

    const asViewer = await signedIn(viewer.person, viewport)
    const viewerPage = await asViewer.newPage()
    await viewerPage.goto(`/t/${team.slug}/members`)
    await hydrated(viewerPage)
    await expect.poll(() => row(viewerPage).innerText()).toContain('locked')
    expect(await row(viewerPage).getByRole('button', { name: /Unlock/ }).count()).toBe(0)
    await asViewer.close()

    const context = await signedIn(owner, viewport)
    const page = await context.newPage()
    const problems = watchPage(page)
    await page.goto(`/t/${team.slug}/members`)
    await hydrated(page)
    await expect.poll(() => row(page).innerText()).toContain('locked')
    // Only the locked member has the button.
    expect(await page.getByRole('button', { name: /^Unlock/ }).count()).toBe(1)
    await shot(page, `members-${size}-locked`)

    await row(page).getByRole('button', { name: 'Unlock Odile Brash' }).click()
    await expect.poll(() => row(page).getByRole('button', { name: /Unlock/ }).count()).toBe(0)
    expect(await row(page).innerText()).not.toContain('locked')
    const [user] = await query<{ locked_at: Date | null, failed_logins: number }>('select locked_at, failed_logins from users where id = ?', [locked.id])
    expect(user).toEqual({ locked_at: null, failed_logins: 0 })
    await shot(page, `members-${size}-unlocked`)
    expect(problems).toEqual([])
    await context.close()
  })
})
