// The reference wiki pages in Chromium: the editor on a phone (inscriptions, look-alikes, links, live
// preview, server field errors), look-alike warnings on both marks, notes, two editors saving the same
// revision (merge screen), history with a diff and a restore, soft delete and restore, lists by URL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, newContext, shot, watchPage } from '../support/browser'
import sharp from 'sharp'
import { type Person, newMember, newOwner, uniqueTeamName } from '../support/api'

/** expect.poll with room for a round trip to the server (vitest's default is one second). */
const poll = <T>(read: () => T | Promise<T>) => expect.poll(read, { timeout: 10_000 })

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

/** A browser context signed in as `person` (the API client's session cookie, copied over). */
async function signedIn(person: Person, viewport: typeof PHONE | typeof DESKTOP): Promise<BrowserContext> {
  const context = await newContext(browser, viewport)
  const url = process.env.TALLYMARK_TEST_URL!
  const cookies = person.cookieHeader().split('; ').filter(Boolean).map((pair) => {
    const eq = pair.indexOf('=')
    return { name: pair.slice(0, eq), value: pair.slice(eq + 1), url }
  })
  expect(cookies.length, 'the API client has a session cookie').toBeGreaterThan(0)
  await context.addCookies(cookies)
  return context
}

async function open(page: Page, path: string) {
  await page.goto(path)
  await hydrated(page)
}

/** After a client-side navigation: the new path, hydrated and loaded; on failure a screenshot and what the page shows. */
async function arrived(page: Page, path: string | RegExp) {
  const pathname = () => page.evaluate(() => location.pathname)
  try {
    if (typeof path === 'string') await poll(pathname).toBe(path)
    else await poll(pathname).toMatch(path)
  }
  catch (error) {
    await shot(page, `wiki-not-arrived-${Date.now()}`)
    throw new Error(`still on ${await pathname()}: ${(await page.locator('main').innerText()).slice(0, 600)}`, { cause: error })
  }
  await hydrated(page)
}

/** Accepts every confirm() and records its text. */
function acceptDialogs(page: Page) {
  const seen: string[] = []
  page.on('dialog', (d) => {
    seen.push(d.message())
    void d.accept()
  })
  return seen
}

/**
 * Nothing on the page itself reaches past the right edge. (The shared header is checked by the foundation
 * test; its right-hand cluster belongs to other work.)
 */
async function noHorizontalScroll(page: Page) {
  const wide = await page.evaluate(() => {
    const width = document.documentElement.clientWidth
    const main = document.getElementById('main')!
    const out = main.scrollWidth > main.clientWidth ? [`main is ${main.scrollWidth - main.clientWidth}px too wide`] : []
    for (const el of main.querySelectorAll('*')) {
      const box = el.getBoundingClientRect()
      if (box.width && box.right > width + 1 && !el.closest('.overflow-x-auto')) out.push(`${el.tagName.toLowerCase()}.${[...el.classList].slice(0, 4).join('.')}`)
    }
    return out.slice(0, 5)
  })
  expect(wide, `no horizontal scrolling on ${page.url()}`).toEqual([])
}

/** Console errors other than the failed requests a test provokes on purpose (field errors, conflicts, a non-image upload). */
const unexpected = (problems: string[]) => problems.filter(p => !/status of (400|409|415)/.test(p))

async function create(person: Person, slug: string, path: string, body: Record<string, unknown>): Promise<number> {
  const res = await person.post(`/api/teams/${slug}/${path}`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

describe('the reference wiki pages', () => {
  it('creates a mark with two inscriptions, a look-alike and a linked note on a phone; both marks warn; a note is added', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Wiki Phone'))
    const slug = team.slug
    const otherId = await create(owner, slug, 'marks', { inscriptions: ['BRAMBLE & CO', 'MADE IN ERLAND'], country: 'Erland', markType: 'printed' })
    await create(owner, slug, 'materials', {
      name: 'Lead-glazed earthenware',
      cautions: 'Older glazes of this kind may contain **lead**. Do not use for food.',
    })

    const context = await signedIn(owner, PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    acceptDialogs(page)

    // The shared header links to the wiki lists.
    await open(page, `/t/${slug}`)
    const phoneNav = page.getByRole('navigation', { name: 'Team (phone)' })
    for (const label of ['Home', 'Marks', 'Makers', 'Materials', 'Categories', 'Members']) {
      await poll(() => phoneNav.getByRole('link', { name: label, exact: true }).count()).toBe(1)
    }
    await page.getByRole('link', { name: 'Add a mark' }).first().click()
    await arrived(page, `/t/${slug}/marks/new`)

    // An empty form is stopped in the browser with the schema's own words.
    await page.getByRole('button', { name: 'Create mark' }).click()
    await poll(() => page.getByRole('alert').first().textContent()).toContain('Enter at least one inscription')

    // The search box's "no match — add this mark" link pre-fills the first inscription.
    await open(page, `/t/${slug}/marks/new?inscription=${encodeURIComponent('HOLLOWAY WARE')}`)
    await poll(() => page.getByLabel('Inscription 1', { exact: true }).inputValue()).toBe('HOLLOWAY WARE')
    await page.getByRole('button', { name: 'Add another inscription' }).click()
    await poll(() => page.evaluate(() => document.activeElement?.id)).toBe('wiki-inscriptions-1')
    await page.getByLabel('Inscription 2', { exact: true }).fill('HAND PAINTED · 1952')

    // A look-alike picked by its inscription, with how to tell them apart (live preview of the markdown).
    await page.getByRole('combobox', { name: 'Find a look-alike mark' }).fill('BRAMBLE')
    await page.getByRole('list', { name: 'Find a look-alike mark: results' }).getByRole('button', { name: /BRAMBLE & CO/ }).click()
    const howToTell = page.getByLabel('How to tell it apart from BRAMBLE & CO')
    await howToTell.fill('The look-alike has **two** lines; ours is hand painted.')
    await poll(() => page.getByTestId('wiki-lookalikes-0-howToTell-preview').locator('strong').textContent()).toBe('two')

    // The pickers work from the keyboard: arrow down into the results, Enter to choose.
    await page.getByRole('combobox', { name: 'Add a material' }).fill('Lead')
    await poll(() => page.getByRole('list', { name: 'Add a material: results' }).getByRole('button').count()).toBe(1)
    await page.getByRole('combobox', { name: 'Add a material' }).press('ArrowDown')
    await page.keyboard.press('Enter')
    await poll(() => page.getByRole('list', { name: 'Chosen: materials' }).textContent()).toContain('Lead-glazed earthenware')

    // The link picker inserts a markdown link at the cursor.
    const notes = page.getByLabel('What we know', { exact: false }).first()
    await notes.fill('Often confused with ')
    await page.getByRole('button', { name: 'Link to an entry in What we know' }).click()
    await page.getByRole('combobox', { name: 'Find the entry to link' }).fill('BRAMBLE')
    await page.getByRole('list', { name: 'Find the entry to link: results' }).getByRole('button', { name: /BRAMBLE & CO/ }).click()
    await poll(() => notes.inputValue()).toBe(`Often confused with [BRAMBLE & CO](/t/${slug}/marks/${otherId})`)
    await poll(() => page.getByTestId('wiki-notes-preview').locator(`a[href="/t/${slug}/marks/${otherId}"]`).textContent()).toBe('BRAMBLE & CO')

    // A rule only the server checks comes back as an error next to its field.
    await page.getByLabel('In use from').fill('1950')
    await page.getByLabel('In use until').fill('1900')
    await page.getByRole('button', { name: 'Create mark' }).click()
    await poll(() => page.locator('#wiki-yearTo-error').textContent()).toContain('The end year (1900) is before the start year (1950).')
    await shot(page, 'wiki-phone-editor-error')
    await page.getByLabel('In use until').fill('1965')
    await page.getByLabel('How sure').selectOption('medium')
    await noHorizontalScroll(page)
    await shot(page, 'wiki-phone-editor')
    await page.getByRole('button', { name: 'Create mark' }).click()

    await arrived(page, /^\/t\/[^/]+\/marks\/\d+$/)
    const newId = Number(new URL(page.url()).pathname.split('/').pop())
    expect(newId).not.toBe(otherId)
    await poll(() => page.getByRole('status').first().textContent()).toContain('The mark was added.')
    const base = page.getByRole('region', { name: 'As read on the base' })
    await poll(() => base.getByRole('listitem').allInnerTexts()).toEqual(['HOLLOWAY WARE', 'HAND PAINTED · 1952'])
    const warning = page.getByRole('complementary', { name: /Look-alike: BRAMBLE & CO/ })
    await poll(() => warning.textContent()).toContain('hand painted')
    await poll(() => page.getByText('1950–1965').count()).toBe(1)
    await poll(() => page.getByText('· medium confidence').count()).toBe(1)
    // The material's caution shows on the mark, deferring to local rules and laboratory testing.
    const caution = page.getByRole('complementary', { name: 'Caution for Lead-glazed earthenware:' })
    await poll(() => caution.textContent()).toContain('lead')
    await poll(() => caution.textContent()).toContain('laboratory')
    await noHorizontalScroll(page)
    await shot(page, 'wiki-phone-mark')

    // The warning links both ways: the other mark warns about this one, and lists it as linking there.
    await warning.getByRole('link', { name: 'Open the look-alike' }).click()
    await arrived(page, `/t/${slug}/marks/${otherId}`)
    const back = page.getByRole('complementary', { name: /Look-alike: HOLLOWAY WARE/ })
    await poll(() => back.textContent()).toContain('two lines')
    await poll(() => page.getByRole('region', { name: 'Linked from' }).textContent()).toContain('HOLLOWAY WARE')

    // A note after a sale, newest first in the timeline.
    await page.getByLabel('Add a note').fill('Sold one at the spring fair; buyers ask for the **hand painted** ones.')
    await page.getByLabel('When it happened').fill('2026-04-12')
    await page.getByRole('button', { name: 'Add note' }).click()
    const timeline = page.getByRole('region', { name: 'Notes from the team' })
    await poll(() => timeline.locator('ol > li').first().textContent()).toContain('spring fair')
    await poll(() => timeline.locator('ol > li strong').first().textContent()).toBe('12 Apr 2026')
    // Authors edit their own notes.
    await timeline.getByRole('button', { name: 'Edit note from Owner Person' }).click()
    await timeline.getByLabel('Edit your note').fill('Sold two at the spring fair.')
    await timeline.getByRole('button', { name: 'Save note' }).click()
    await poll(() => timeline.locator('ol > li').first().textContent()).toContain('Sold two at the spring fair.')
    await noHorizontalScroll(page)
    await shot(page, 'wiki-phone-lookalike-and-note')

    const stored = (await owner.get(`/api/teams/${slug}/marks/${newId}`)).body
    expect(stored).toMatchObject({ inscriptions: ['HOLLOWAY WARE', 'HAND PAINTED · 1952'], yearFrom: 1950, yearTo: 1965, dateConfidence: 'medium' })
    expect(stored.lookalikes).toEqual([expect.objectContaining({ markId: otherId, howToTell: 'The look-alike has **two** lines; ours is hand painted.' })])
    const notesList = (await owner.get(`/api/teams/${slug}/marks/${otherId}/notes`)).body.items
    expect(notesList).toHaveLength(1)
    expect(unexpected(problems)).toEqual([])
    await context.close()
  })

  it('shows the merge screen when two editors save the same revision, then history diffs and restores', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Wiki Merge'))
    const slug = team.slug
    const { person: editor } = await newMember(owner, slug, 'editor', 'Ines Editor')
    const id = await create(owner, slug, 'marks', { inscriptions: ['FERNLEIGH'], colour: 'blue', notes: 'First words about the glaze.' })

    const first = await signedIn(owner, DESKTOP)
    const second = await signedIn(editor, DESKTOP)
    const a = await first.newPage()
    const b = await second.newPage()
    const problems = [...watchPage(a), ...watchPage(b)]
    acceptDialogs(a)
    acceptDialogs(b)
    await open(a, `/t/${slug}/marks/${id}/edit`)
    await open(b, `/t/${slug}/marks/${id}/edit`)

    await a.getByLabel('Colour').fill('green')
    await a.getByRole('button', { name: 'Save mark' }).click()
    await arrived(a, `/t/${slug}/marks/${id}`)
    await poll(() => a.getByRole('status').first().textContent()).toContain('Saved as revision 2.')

    // The second editor started from revision 1: nothing is overwritten, the merge screen opens.
    await b.getByLabel('Colour').fill('cobalt blue')
    await b.getByLabel('What we know').fill('My own words about the glaze.')
    await b.getByRole('button', { name: 'Save mark' }).click()
    const merge = b.getByRole('region', { name: 'Someone saved this mark while you were editing' })
    await poll(() => merge.count()).toBe(1)
    const colour = merge.locator('fieldset[data-field="colour"]')
    await poll(() => colour.textContent()).toContain('you both changed this')
    await poll(() => colour.textContent()).toContain('cobalt blue')
    await poll(() => colour.textContent()).toContain('green')
    const notesChoice = merge.locator('fieldset[data-field="notes"]')
    await poll(() => notesChoice.textContent()).toContain('you changed this')
    expect(await merge.locator('fieldset[data-field="title"]').count()).toBe(0)
    await shot(b, 'wiki-desktop-merge')
    // The stored entry is untouched until a choice is saved.
    expect((await owner.get(`/api/teams/${slug}/marks/${id}`)).body).toMatchObject({ revision: 2, colour: 'green', notes: 'First words about the glaze.' })

    await colour.getByLabel('The saved version').check()
    await poll(() => notesChoice.getByLabel('Your version').isChecked()).toBe(true)
    await merge.getByRole('button', { name: 'Save with these choices' }).click()
    await arrived(b, `/t/${slug}/marks/${id}`)
    await poll(() => b.getByRole('status').first().textContent()).toContain('Saved as revision 3.')
    expect((await owner.get(`/api/teams/${slug}/marks/${id}`)).body).toMatchObject({ revision: 3, colour: 'green', notes: 'My own words about the glaze.' })

    // History: both edits, who made them, and a readable diff of the newest two.
    await b.getByRole('link', { name: 'History' }).first().click()
    await arrived(b, `/t/${slug}/marks/${id}/history`)
    const revisions = b.getByRole('region', { name: /Revisions/ })
    await poll(() => revisions.locator('li[data-revision]').count()).toBe(3)
    await poll(() => revisions.locator('li[data-revision="3"]').textContent()).toContain('Ines Editor')
    await poll(() => revisions.locator('li[data-revision="2"]').textContent()).toContain('Owner Person')
    await poll(() => revisions.locator('li[data-revision="2"]').textContent()).toContain('Changed: Colour')
    const diff = b.getByRole('region', { name: /Revision 2 → revision 3/ })
    await poll(() => diff.locator('[data-field="notes"] del').allTextContents()).toEqual([expect.stringContaining('First')])
    await poll(() => diff.locator('[data-field="notes"] ins').allTextContents()).toEqual([expect.stringContaining('My own')])
    expect(await diff.locator('[data-field="colour"]').count()).toBe(0)

    // Any two revisions: 1 → 3 also shows the colour.
    await revisions.getByLabel('From revision 1').check()
    await poll(() => b.url()).toContain('from=1')
    const wider = b.getByRole('region', { name: /Revision 1 → revision 3/ })
    await poll(() => wider.locator('[data-field="colour"] del').textContent()).toContain('blue')
    await poll(() => wider.locator('[data-field="colour"] ins').textContent()).toContain('green')
    await noHorizontalScroll(b)
    await shot(b, 'wiki-desktop-history')

    // Restoring revision 1 makes a new revision 4 with its content.
    await revisions.getByRole('button', { name: 'Restore this revision (1)' }).click()
    await poll(() => b.getByRole('status').first().textContent()).toContain('Revision 1 was restored as revision 4.')
    await poll(() => revisions.locator('li[data-revision]').count()).toBe(4)
    expect((await owner.get(`/api/teams/${slug}/marks/${id}`)).body).toMatchObject({ revision: 4, colour: 'blue', notes: 'First words about the glaze.' })
    await shot(b, 'wiki-desktop-history-restored')

    expect(unexpected(problems)).toEqual([])
    await Promise.all([first.close(), second.close()])
  })

  it('soft deletes an entry and brings it back from Recently deleted; an owner purges with a confirm', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Wiki Delete'))
    const slug = team.slug
    const keep = await create(owner, slug, 'makers', { name: 'Wrenfield Pottery', otherNames: ['Wrenfield & Sons'], country: 'Erland' })
    const gone = await create(owner, slug, 'makers', { name: 'Short-lived Works' })

    const context = await signedIn(owner, PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)
    const dialogs = acceptDialogs(page)

    await open(page, `/t/${slug}/makers/${keep}`)
    await page.getByRole('button', { name: 'Delete this maker' }).click()
    await arrived(page, `/t/${slug}/makers`)
    expect(dialogs.at(-1)).toContain('Recently deleted')
    await poll(() => page.getByRole('status').first().textContent()).toContain('moved to Recently deleted')
    expect((await owner.get(`/api/teams/${slug}/makers/${keep}`)).status).toBe(404)
    expect((await owner.delete(`/api/teams/${slug}/makers/${gone}`)).status).toBe(200)

    await page.getByRole('main').getByRole('link', { name: 'Recently deleted' }).click()
    await arrived(page, `/t/${slug}/deleted`)
    const list = page.getByRole('list', { name: 'Deleted entries' })
    await poll(() => list.getByRole('listitem').count()).toBe(2)
    await noHorizontalScroll(page)
    await shot(page, 'wiki-phone-deleted')
    await page.getByRole('button', { name: 'Restore Wrenfield Pottery' }).click()
    await poll(() => page.getByRole('status').first().textContent()).toContain('is back in makers')
    await poll(() => list.getByRole('listitem').count()).toBe(1)
    expect((await owner.get(`/api/teams/${slug}/makers/${keep}`)).body).toMatchObject({ name: 'Wrenfield Pottery', otherNames: ['Wrenfield & Sons'] })

    await page.getByRole('button', { name: 'Purge for good Short-lived Works' }).click()
    expect(dialogs.at(-1)).toContain('cannot be undone')
    await poll(() => page.getByText('Nothing has been deleted.').count()).toBe(1)
    expect((await owner.get(`/api/teams/${slug}/makers/${gone}?includeDeleted=1`)).status).toBe(404)

    // The restored maker is whole again, and its page works.
    await open(page, `/t/${slug}/makers/${keep}`)
    await poll(() => page.locator('h1').textContent()).toContain('Wrenfield Pottery')
    await poll(() => page.getByText('Wrenfield & Sons').count()).toBeGreaterThan(0)
    expect(unexpected(problems)).toEqual([])
    await context.close()
  })

  it('filters, sorts and pages lists through the URL, on a desktop table and phone cards', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Wiki Lists'))
    const slug = team.slug
    const maker = await create(owner, slug, 'makers', { name: 'Alderbank', country: 'Erland' })
    await create(owner, slug, 'marks', { inscriptions: ['ALDER WARE'], makerId: maker, country: 'Erland', yearFrom: 1950, yearTo: 1960, markType: 'printed', tags: ['gilt'] })
    await create(owner, slug, 'marks', { inscriptions: ['BIRCH LANE'], country: 'Erland', yearFrom: 1930, yearTo: 1945, markType: 'impressed', tags: ['gilt'] })
    await create(owner, slug, 'marks', { inscriptions: ['CEDAR ROW'], country: 'Norland', yearFrom: 1970, markType: 'printed' })
    await create(owner, slug, 'marks', { inscriptions: ['DAMSON'], country: 'Erland', yearFrom: 1985 })

    const context = await signedIn(owner, DESKTOP)
    const page = await context.newPage()
    const problems = watchPage(page)
    const rows = () => page.locator('table tbody tr td:nth-child(2) a').allTextContents()

    await open(page, `/t/${slug}/marks?country=Erland&sort=-yearFrom&pageSize=2`)
    await poll(rows).toEqual(['DAMSON', 'ALDER WARE'])
    await poll(() => page.getByRole('status').first().textContent()).toContain('3 marks match')
    await poll(() => page.getByLabel('Country').inputValue()).toBe('Erland')
    await poll(() => page.locator('th[aria-sort="descending"]').textContent()).toContain('Years')
    await page.getByRole('link', { name: 'Next' }).click()
    await poll(() => new URL(page.url()).searchParams.get('page')).toBe('2')
    await poll(rows).toEqual(['BIRCH LANE'])
    // The URL is the state: a reload shows the same page.
    await page.reload()
    await hydrated(page)
    await poll(rows).toEqual(['BIRCH LANE'])

    // Sorting by a column header starts again at page 1.
    await page.getByRole('button', { name: /^Years/ }).click()
    await poll(() => new URL(page.url()).searchParams.get('sort')).toBe('yearFrom')
    expect(new URL(page.url()).searchParams.get('page')).toBeNull()
    await poll(rows).toEqual(['BIRCH LANE', 'ALDER WARE'])

    // A select filter applies at once and lands in the URL.
    await page.getByLabel('Kind of mark').selectOption('printed')
    await poll(() => new URL(page.url()).searchParams.get('markType')).toBe('printed')
    await poll(rows).toEqual(['ALDER WARE'])
    await noHorizontalScroll(page)
    await shot(page, 'wiki-desktop-marks-list')

    await open(page, `/t/${slug}/marks?tag=gilt&year=1955`)
    await poll(rows).toEqual(['ALDER WARE'])
    await open(page, `/t/${slug}/marks?makerId=${maker}`)
    await poll(() => page.getByLabel('Maker', { exact: true }).inputValue()).toBe(String(maker))
    await poll(rows).toEqual(['ALDER WARE'])
    await page.getByRole('button', { name: 'Clear filters' }).click()
    await poll(rows).toEqual(['ALDER WARE', 'BIRCH LANE', 'CEDAR ROW', 'DAMSON'])

    // A bad value in a shared URL explains itself instead of failing silently.
    await open(page, `/t/${slug}/marks?sort=colour`)
    await poll(() => page.getByRole('alert').first().textContent()).toContain('sort must be one of')

    // Phones get cards with big tap targets and a sort menu instead of the table.
    const phone = await signedIn(owner, PHONE)
    const small = await phone.newPage()
    const smallProblems = watchPage(small)
    await open(small, `/t/${slug}/marks?country=Erland&sort=-yearFrom`)
    const cards = small.getByRole('list', { name: 'Marks' }).getByRole('link')
    await poll(() => cards.allTextContents()).toEqual([
      expect.stringContaining('DAMSON'), expect.stringContaining('ALDER WARE'), expect.stringContaining('BIRCH LANE'),
    ])
    const box = await cards.first().boundingBox()
    expect(box!.height).toBeGreaterThanOrEqual(44)
    expect(await small.locator('table').isVisible()).toBe(false)
    await small.getByLabel('Sort by').selectOption('title')
    await poll(() => new URL(small.url()).searchParams.get('sort')).toBeNull()
    await poll(() => cards.first().textContent()).toContain('ALDER WARE')
    await noHorizontalScroll(small)
    await shot(small, 'wiki-phone-marks-list')

    expect(unexpected(problems)).toEqual([])
    expect(unexpected(smallProblems)).toEqual([])
    await Promise.all([context.close(), phone.close()])
  })

  it('shows makers, materials and categories for a phone, and edits one through the shared editor', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Wiki Pages'))
    const slug = team.slug
    const glass = await create(owner, slug, 'categories', { name: 'Glass' })
    const pressed = await create(owner, slug, 'categories', { name: 'Pressed glass', parentId: glass })
    const material = await create(owner, slug, 'materials', {
      name: 'Uranium glass',
      recognition: 'Yellow-green glass that glows under UV.',
      checks: { uvGlow: 'Bright green glow under a 365 nm lamp.', weight: 'Like other soda glass.' },
      cautions: 'Contains a small amount of uranium: keep pieces out of bedrooms and do not grind or drill them.',
      handbookPath: '/handbook/safety',
    })
    const maker = await create(owner, slug, 'makers', { name: 'Kestrel Glassworks', otherNames: ['Kestrel & Finch'], country: 'Erland', yearFrom: 1890, yearFromApprox: true, yearTo: 1931 })
    const mark = await create(owner, slug, 'marks', { inscriptions: ['KESTREL'], makerId: maker, materialIds: [material], categoryIds: [pressed] })

    const context = await signedIn(owner, PHONE)
    const page = await context.newPage()
    const problems = watchPage(page)

    await open(page, `/t/${slug}/materials/${material}`)
    const checks = page.getByRole('table', { name: 'Checks for Uranium glass' })
    await poll(() => checks.getByRole('row', { name: /UV glow/ }).textContent()).toContain('365 nm')
    await poll(() => checks.getByRole('row', { name: /Seams/ }).textContent()).toContain('Not written down yet')
    await poll(() => page.getByRole('complementary', { name: 'Cautions' }).textContent()).toContain('uranium')
    await poll(() => page.getByRole('link', { name: 'Read the handbook page' }).getAttribute('href')).toBe('/handbook/safety')
    await noHorizontalScroll(page)
    await shot(page, 'wiki-phone-material')

    await open(page, `/t/${slug}/makers/${maker}`)
    await poll(() => page.getByText('c. 1890–1931').count()).toBe(1)
    await poll(() => page.getByRole('region', { name: 'Marks by this maker' }).getByRole('link', { name: 'KESTREL' }).count()).toBe(1)
    await shot(page, 'wiki-phone-maker')

    await open(page, `/t/${slug}/categories/${pressed}`)
    await poll(() => page.getByRole('navigation', { name: 'Where this category sits' }).textContent()).toMatch(/Categories.*Glass.*Pressed glass/)
    await open(page, `/t/${slug}/categories/${glass}`)
    await poll(() => page.getByRole('region', { name: 'Subcategories' }).getByRole('link').allInnerTexts()).toEqual(['Pressed glass'])
    await shot(page, 'wiki-phone-category')

    // The same editor shell edits a material. Typed text survives a reload on this device.
    acceptDialogs(page)
    await open(page, `/t/${slug}/materials/${material}/edit`)
    await page.getByLabel('Seams').fill('No mould seams on blown pieces.')
    await poll(() => page.evaluate(() => Object.keys(localStorage).some(k => k.startsWith('tm-wiki-draft:')))).toBe(true)
    await page.reload()
    await hydrated(page)
    await poll(() => page.getByLabel('Seams').inputValue()).toBe('')
    await page.getByRole('button', { name: 'Bring back my draft' }).click()
    await poll(() => page.getByLabel('Seams').inputValue()).toBe('No mould seams on blown pieces.')
    await page.getByLabel('Damage and wear').fill('Look for *sickness*: a cloudy film.')
    await poll(() => page.getByTestId('wiki-damage-preview').locator('em').textContent()).toBe('sickness')
    await shot(page, 'wiki-phone-material-editor')
    await page.getByRole('button', { name: 'Save material' }).click()
    await arrived(page, `/t/${slug}/materials/${material}`)
    await poll(() => checks.getByRole('row', { name: /Seams/ }).textContent()).toContain('No mould seams')
    const saved = (await owner.get(`/api/teams/${slug}/materials/${material}`)).body
    expect(saved).toMatchObject({ revision: 2, damage: 'Look for *sickness*: a cloudy film.' })
    expect(saved.checks).toMatchObject({ seams: 'No mould seams on blown pieces.', uvGlow: 'Bright green glow under a 365 nm lamp.' })
    expect(await page.evaluate(() => Object.keys(localStorage).filter(k => k.startsWith('tm-wiki-draft:')))).toEqual([])

    // Photos of a mark: a file that is not an image is refused with the server's words; a PNG is added.
    await open(page, `/t/${slug}/marks/${mark}/edit`)
    const photoInput = page.getByLabel('Add photos')
    await photoInput.setInputFiles({ name: 'notes.png', mimeType: 'image/png', buffer: Buffer.from('not really a picture') })
    await poll(() => page.locator('#wiki-photo-problems').textContent()).toContain('notes.png: This file is not a JPEG, PNG or WebP image.')
    const png = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#6d7f5a' } }).png().toBuffer()
    await photoInput.setInputFiles({ name: 'base.png', mimeType: 'image/png', buffer: png })
    await poll(() => page.getByRole('img', { name: 'Photo 1' }).count()).toBe(1)
    await shot(page, 'wiki-phone-photo-upload')
    await page.getByRole('link', { name: 'Cancel' }).click()
    await arrived(page, `/t/${slug}/marks/${mark}`)
    await poll(() => page.getByRole('region', { name: 'As read on the base' }).getByRole('img', { name: 'Photo of the mark' }).count()).toBe(1)
    await open(page, `/t/${slug}/marks`)
    await poll(() => page.getByRole('list', { name: 'Marks' }).locator('img').count()).toBe(1)
    expect(unexpected(problems)).toEqual([])
    await context.close()
  })
})
