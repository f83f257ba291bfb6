// Known cross-site scripting payloads (tests/support/xss-corpus.ts) pushed through every text and markdown
// field an editor, an owner or a member can fill, then every page that shows them is opened in Chromium.
// Two passes: desktop with the Content-Security-Policy switched off in the browser (so a payload that got
// into the page as markup really runs and is caught, instead of being quietly blocked), and phone with the
// shipped policy (which must report no violation caused by the app's own code). In both: no payload runs,
// no payload becomes markup (event-handler attributes, script-bearing URLs, frames), every page answers
// 200 and hydrates, and the payload text is visible as text where the field is shown.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DESKTOP, PHONE, hydrated, launchBrowser, shot } from '../support/browser'
import { baseUrl, newMember, newOwner, uniqueTeamName, type Person } from '../support/api'
import { XSS_CORPUS, corpusMarkdown, joinPayloads, payloadsFor, xssIdsIn, type XssPayload } from '../support/xss-corpus'

const POLL = { timeout: 10_000 }
let browser: Browser
let owner: Person
let editor: Person
let slug: string
const ids: Record<string, number> = {}

// ---- Spreading the corpus over the fields

/** Field key -> the payload ids it carries (plain fields) or renders (markdown fields). */
const plainFields = new Map<string, string[]>()
const markdownFields = new Map<string, string[]>()
let cursor = 0

function take(key: string, list: XssPayload[]) {
  plainFields.set(key, list.map(p => p.id))
  cursor += list.length
  return list
}
/** A few payloads (three unless told) for a single-line field of at most `max` characters. */
function plain(key: string, max: number, count = 3): string {
  return joinPayloads(take(key, payloadsFor(cursor, count, max)))
}
/** One payload per list entry (inscriptions, other names, sources, column names). */
function each(key: string, max: number, count = 3): string[] {
  return take(key, payloadsFor(cursor, count, Infinity, '', max)).map(p => p.payload)
}
/** Short payloads for tags (at most 40 characters, lower-cased by the server; the ids already are). */
function tags(key: string, count = 3): string[] {
  return take(key, payloadsFor(cursor, count, Infinity, '', 40)).map(p => p.payload.toLowerCase())
}
/** A markdown field: the whole corpus unless told, one paragraph per payload. */
function markdown(key: string, list: XssPayload[] = XSS_CORPUS): string {
  markdownFields.set(key, list.filter(p => !p.attributeInMarkdown).map(p => p.id))
  return list.map(p => p.payload).join('\n\n')
}
function markdownSome(key: string, max: number, count = 8): string {
  const list = payloadsFor(cursor, count, max, '\n\n')
  cursor += list.length
  return markdown(key, list)
}
/** The ids a page is expected to show as text: those of the named fields. */
function expected(...keys: string[]): string[] {
  const out = new Set<string>()
  for (const key of keys) {
    const list = plainFields.get(key) ?? markdownFields.get(key)
    if (!list) throw new Error(`no field ${key}`)
    for (const id of list) out.add(id)
  }
  return [...out].sort()
}

// ---- Recording what ran

interface Hit { id: string, how: string, url: string, pass: string }
interface Violation { directive: string, blocked: string, sample: string, source: string, url: string, pass: string }
const hits: Hit[] = []
const violations: Violation[] = []
const cspConsole: string[] = []
const pageErrors: string[] = []

async function signedIn(person: Person, viewport: { width: number, height: number }, pass: string, bypassCSP: boolean): Promise<BrowserContext> {
  const context = await browser.newContext({ viewport, baseURL: baseUrl, locale: 'en-US', timezoneId: 'America/Chicago', bypassCSP })
  context.setDefaultTimeout(15_000)
  await context.addCookies(person.cookieHeader().split('; ').filter(Boolean).map((pair) => {
    const eq = pair.indexOf('=')
    return { name: pair.slice(0, eq), value: pair.slice(eq + 1), url: baseUrl }
  }))
  // Every frame of every page gets window.__xss, the signal the payloads call when they run.
  await context.exposeBinding('__xss', ({ page }, id: unknown) => { hits.push({ id: String(id), how: '__xss', url: page.url(), pass }) })
  await context.exposeBinding('__cspReport', ({ page }, v: Omit<Violation, 'url' | 'pass'>) => { violations.push({ ...v, url: page.url(), pass }) })
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __cspReport: (v: unknown) => void }).__cspReport({
        directive: e.violatedDirective, blocked: e.blockedURI, sample: e.sample, source: `${e.sourceFile}:${e.lineNumber}`,
      })
    })
  })
  context.on('page', (page) => {
    page.on('dialog', (dialog) => {
      // Leaving an editor with unsaved text asks before unloading: that one is the app's, not a payload's.
      if (dialog.type() === 'beforeunload') void dialog.accept().catch(() => {})
      else {
        hits.push({ id: dialog.message(), how: dialog.type(), url: page.url(), pass })
        void dialog.dismiss().catch(() => {})
      }
    })
    page.on('console', (m) => {
      if (/Content Security Policy|Refused to (?:execute|load|apply|frame|connect)/i.test(m.text())) cspConsole.push(`${pass} ${page.url()}: ${m.text()}`)
    })
    page.on('pageerror', e => pageErrors.push(`${pass} ${page.url()}: ${e.message}`))
  })
  return context
}

/**
 * Markup a payload would have produced, found in the live DOM whatever the policy blocked: event-handler
 * attributes, URLs whose scheme can run script, frames and plugins, a payload inside a script, style or
 * any attribute that is not plain text to the browser.
 */
function injectedMarkup(): string[] {
  const PAYLOAD = /xss\d\d(?!\d)/
  const INERT = /^(?:aria-[\w-]+|title|alt|value|placeholder|label|data-[\w-]+)$/
  const URLS = new Set(['href', 'src', 'action', 'formaction', 'xlink:href', 'poster', 'background', 'cite', 'data'])
  const SAFE = new Set(['http:', 'https:', 'mailto:', 'blob:'])
  const out: string[] = []
  for (const el of document.querySelectorAll('*')) {
    const tag = el.tagName.toLowerCase()
    if (['iframe', 'frame', 'object', 'embed', 'base', 'applet'].includes(tag)) out.push(`<${tag}> element`)
    if (tag === 'meta' && el.getAttribute('http-equiv')?.toLowerCase() === 'refresh') out.push('<meta http-equiv=refresh>')
    if (tag === 'script' && el.getAttribute('type') !== 'application/json' && PAYLOAD.test(el.textContent ?? '')) out.push('a payload inside <script>')
    for (const a of el.attributes) {
      const name = a.name.toLowerCase()
      if (name.startsWith('on')) out.push(`<${tag} ${name}>`)
      else if (name === 'srcdoc') out.push(`<${tag} srcdoc>`)
      else if (URLS.has(name)) {
        let scheme = 'unparsable'
        try { scheme = new URL(a.value, location.href).protocol }
        catch { /* stays unparsable */ }
        if (!SAFE.has(scheme) && !(scheme === 'data:' && tag === 'img' && !PAYLOAD.test(a.value))) out.push(`<${tag} ${name}="${a.value.slice(0, 60)}">`)
      }
      else if (name === 'style' && /xss\d\d|expression\s*\(|javascript:/i.test(a.value)) out.push(`<${tag} style="${a.value.slice(0, 60)}">`)
      else if (!INERT.test(name) && PAYLOAD.test(a.value)) out.push(`<${tag} ${name}="${a.value.slice(0, 60)}">`)
    }
  }
  return out
}

/** After a page is shown: nothing ran, nothing became markup, and the expected payload ids are on screen as text. */
async function checkPage(page: Page, label: string, want: string[], scope = 'body') {
  // Event handlers of failed images fire a moment after load.
  await page.waitForTimeout(150)
  expect(await page.evaluate(injectedMarkup), `${label}: payload markup in the page`).toEqual([])
  if (want.length) {
    await expect.poll(async () => {
      const shown = new Set(xssIdsIn(await page.locator(scope).first().innerText()))
      return want.filter(id => !shown.has(id))
    }, { ...POLL, message: `${label}: payloads not shown as text` }).toEqual([])
  }
  expect(hits, `${label}: payloads that ran`).toEqual([])
}

async function open(page: Page, path: string) {
  const res = await page.goto(path)
  expect(res?.status(), `${path} answers 200`).toBe(200)
  await hydrated(page)
}

/** Types a payload word into the header search and checks the suggestions. */
async function headerSearch(page: Page, word: string, label: string, answeredBy?: string) {
  await page.getByRole('button', { name: 'Search', exact: true }).click()
  const box = page.getByRole('combobox', { name: 'Search marks, makers and notes' })
  await box.waitFor()
  await box.fill('')
  await page.keyboard.type(word, { delay: 30 })
  const list = page.getByRole('listbox')
  // The hits' titles and snippets carry the payloads as text.
  await expect.poll(async () => xssIdsIn(await list.innerText()).length, { ...POLL, message: `${label}: payload text in the suggestions for "${word}"` }).toBeGreaterThan(0)
  expect(await page.evaluate(injectedMarkup), `${label}: payload markup in the suggestions`).toEqual([])
  if (answeredBy) await page.getByText(answeredBy).waitFor()
  await page.keyboard.press('Escape')
  await page.keyboard.press('Escape')
}

// ---- The fixture team

async function post(person: Person, path: string, body: Record<string, unknown>) {
  const res = await person.post(`/api/teams/${slug}${path}`, body)
  expect(res.status, `${path}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(201)
  return res.body as { id: number, revision: number }
}

const LEGIT_MARKDOWN = [
  '## Kiln notes',
  '',
  '**Heavy** for its size; see [the glaze guide](https://example.com/glaze-guide).',
  '',
  '- rings when tapped',
  '- glows at `365 nm`',
].join('\n')

let importCsv = ''

beforeAll(async () => {
  browser = await launchBrowser()
  const registered = await newOwner(uniqueTeamName('Xss Fixture'))
  owner = registered.person
  slug = registered.team.slug
  const member = await newMember(owner, slug, 'editor')
  editor = member.person
  ids.owner = registered.user.id
  ids.editor = member.id

  // The team and the people: names shown in the header, member lists, revisions, trips and reports.
  expect((await owner.patch(`/api/teams/${slug}`, { name: plain('team.name', 120, 2) })).status).toBe(200)
  expect((await owner.patch('/api/me', { name: plain('owner.name', 120, 2) })).status).toBe(200)
  expect((await editor.patch('/api/me', { name: plain('editor.name', 120, 2) })).status).toBe(200)

  // The reference, written by the editor.
  ids.category = (await post(editor, '/categories', { name: plain('category.name', 200), notes: markdown('category.notes'), tags: tags('category.tags') })).id
  ids.subcategory = (await post(editor, '/categories', { name: plain('subcategory.name', 200), parentId: ids.category, notes: LEGIT_MARKDOWN, tags: tags('subcategory.tags') })).id
  ids.material = (await post(editor, '/materials', {
    name: plain('material.name', 200),
    recognition: markdown('material.recognition'),
    checks: Object.fromEntries(['weight', 'sound', 'touch', 'seams', 'uvGlow', 'translucency'].map(k => [k, plain(`material.checks.${k}`, 1000)])),
    damage: markdownSome('material.damage', 50_000),
    cautions: markdownSome('material.cautions', 50_000),
    sources: each('material.sources', 300),
    notes: markdown('material.notes'),
    tags: tags('material.tags'),
  })).id
  ids.maker = (await post(editor, '/makers', {
    name: plain('maker.name', 200), otherNames: each('maker.otherNames', 200), country: plain('maker.country', 120, 2),
    notes: markdown('maker.notes'), tags: tags('maker.tags'),
  })).id
  const markBody = (key: string) => ({
    title: plain(`${key}.title`, 200),
    inscriptions: each(`${key}.inscriptions`, 300),
    colour: plain(`${key}.colour`, 80, 2),
    position: plain(`${key}.position`, 120, 2),
    country: plain(`${key}.country`, 120, 2),
    makerId: ids.maker, materialIds: [ids.material], categoryIds: [ids.subcategory],
    notes: markdown(`${key}.notes`),
    tags: tags(`${key}.tags`),
  })
  ids.lookalike = (await post(editor, '/marks', markBody('lookalike'))).id
  const mark = await post(editor, '/marks', { ...markBody('mark'), lookalikes: [{ markId: ids.lookalike, howToTell: markdownSome('mark.howToTell', 2000) }] })
  ids.mark = mark.id
  // A second revision, so the history has a diff full of payloads.
  const revised = await editor.patch(`/api/teams/${slug}/marks/${ids.mark}`, {
    revision: mark.revision, title: plain('mark.title2', 200), notes: `${markdownSome('mark.notes2', 50_000)}\n\n${LEGIT_MARKDOWN}`,
  })
  expect(revised.status, JSON.stringify(revised.body).slice(0, 300)).toBe(200)
  const makerRevised = await editor.patch(`/api/teams/${slug}/makers/${ids.maker}`, { revision: 1, country: plain('maker.country2', 120, 2) })
  expect(makerRevised.status).toBe(200)

  // Timeline notes on every kind of entry, and a legitimate one that must render as markup.
  for (const [path, id] of [['marks', ids.mark], ['makers', ids.maker], ['materials', ids.material], ['categories', ids.category]] as const) {
    await post(editor, `/${path}/${id}/notes`, { body: markdown(`${path}.note`) })
  }
  await post(editor, `/marks/${ids.mark}/notes`, { body: LEGIT_MARKDOWN })

  // The ledger.
  ids.store = (await post(editor, '/stores', { name: plain('store.name', 120, 2), kind: 'thrift_store', town: plain('store.town', 120, 2), notes: plain('store.notes', 10_000, 8) })).id
  ids.feeProfile = (await post(editor, '/fee-profiles', { name: plain('feeProfile.name', 120, 2), channel: plain('feeProfile.channel', 120, 2), percentBp: 1000, fixedCents: 30 })).id
  ids.trip = (await post(editor, '/trips', { storeId: ids.store, tripDate: '2026-03-02', memberIds: [ids.owner, ids.editor], notes: plain('trip.notes', 10_000, 8) })).id
  for (const n of [1, 2, 3, 4]) {
    const item = await post(editor, '/items', {
      title: plain(`item${n}.title`, 200), status: 'sold', acquiredOn: '2026-03-02', soldOn: `2026-03-1${n}`, costCents: 300, salePriceCents: 1500 + n * 200,
      markId: ids.mark, makerId: ids.maker, materialId: ids.material, categoryId: ids.subcategory, storeId: ids.store, tripId: ids.trip,
      feeProfileId: ids.feeProfile, sourcedBy: ids.editor, condition: 'good',
      damage: { flags: [], notes: plain(`item${n}.damage`, 2000) }, externalId: plain(`item${n}.externalId`, 120, 2), notes: plain(`item${n}.notes`, 10_000, 6),
    })
    if (n === 1) ids.item = item.id
  }
  ids.stockItem = (await post(editor, '/items', {
    title: plain('stockItem.title', 200), acquiredOn: '2026-03-02', costCents: 250, markId: ids.mark, storeId: ids.store, tripId: ids.trip,
    damage: { flags: ['chip'], notes: plain('stockItem.damage', 2000) }, notes: plain('stockItem.notes', 10_000, 6),
  })).id

  // Something deleted, for the recently deleted list.
  ids.deleted = (await post(editor, '/categories', { name: plain('deleted.name', 200) })).id
  expect((await editor.delete(`/api/teams/${slug}/categories/${ids.deleted}`)).status).toBeLessThan(300)

  // A CSV whose column names and cells are payloads, chosen on the import page.
  const headers = each('import.headers', 200)
  const cells = each('import.cells', 200, 2)
  const quote = (v: string) => `"${v.replace(/"/g, '""')}"`
  importCsv = [['title', 'notes', 'acquiredOn', ...headers], [cells[0]!, cells[1]!, '2026-03-05', ...headers.map(() => 'x')], [cells[1]!, cells[0]!, '2026-03-06', ...headers.map(() => 'y')]]
    .map(row => row.map(quote).join(',')).join('\n')
}, 120_000)
afterAll(async () => { await browser?.close() })

// ---- The pages

interface Visit { label: string, path: () => string, want: () => string[], scope?: string, act?: (page: Page) => Promise<void>, shot?: boolean }

const P = (rest = '') => `/t/${slug}${rest}`
const HEADER = ['team.name']
const markPage = () => expected(...HEADER, 'mark.title2', 'mark.inscriptions', 'mark.colour', 'mark.position', 'mark.country', 'mark.notes2', 'mark.tags',
  'mark.howToTell', 'maker.name', 'marks.note', 'material.cautions', 'editor.name')

const VISITS: Visit[] = [
  { label: 'team home', path: () => P(), want: () => expected(...HEADER) },
  { label: 'marks list', path: () => P('/marks'), want: () => expected('mark.title2', 'lookalike.title') },
  { label: 'mark page', path: () => P(`/marks/${ids.mark}`), want: markPage, shot: true },
  { label: 'lookalike mark page', path: () => P(`/marks/${ids.lookalike}`), want: () => expected('lookalike.title', 'lookalike.inscriptions', 'lookalike.notes', 'lookalike.tags') },
  { label: 'mark history (diff)', path: () => P(`/marks/${ids.mark}/history`), want: () => expected('mark.title', 'mark.title2', 'mark.notes2', 'editor.name'), shot: true },
  {
    label: 'mark editor with the markdown preview',
    path: () => P(`/marks/${ids.mark}/edit`),
    want: () => expected('mark.notes2'),
    shot: true,
    act: async (page) => {
      // Typed into the editor: the preview renders it in the browser with the same renderer.
      const notes = page.getByRole('textbox', { name: /^What we know/ })
      await notes.fill(corpusMarkdown())
      const preview = page.getByTestId(`${await notes.getAttribute('id')}-preview`)
      await expect.poll(async () => xssIdsIn(await preview.innerText()).length, POLL).toBeGreaterThanOrEqual(XSS_CORPUS.filter(p => !p.attributeInMarkdown).length)
    },
  },
  { label: 'makers list', path: () => P('/makers'), want: () => expected('maker.name') },
  { label: 'maker page', path: () => P(`/makers/${ids.maker}`), want: () => expected('maker.name', 'maker.otherNames', 'maker.country2', 'maker.notes', 'maker.tags', 'makers.note') },
  { label: 'maker history (diff)', path: () => P(`/makers/${ids.maker}/history`), want: () => expected('maker.country', 'maker.country2') },
  { label: 'materials list', path: () => P('/materials'), want: () => expected('material.name') },
  {
    label: 'material page', path: () => P(`/materials/${ids.material}`), shot: true,
    want: () => expected('material.name', 'material.recognition', 'material.checks.weight', 'material.checks.uvGlow', 'material.damage', 'material.cautions',
      'material.sources', 'material.notes', 'material.tags', 'materials.note'),
  },
  { label: 'categories list', path: () => P('/categories'), want: () => expected('category.name') },
  { label: 'category page', path: () => P(`/categories/${ids.category}`), want: () => expected('category.name', 'category.notes', 'category.tags', 'categories.note', 'subcategory.name') },
  { label: 'subcategory page', path: () => P(`/categories/${ids.subcategory}`), want: () => expected('subcategory.name', 'subcategory.tags') },
  { label: 'search results page', path: () => P('/search?q=onerror'), want: () => [], shot: true, act: async (page) => {
    // The hits themselves (the filters beside them list payload names too).
    const hits = page.getByRole('region', { name: 'Results' }).locator('li')
    await expect.poll(async () => xssIdsIn((await hits.allInnerTexts()).join('\n')).length, POLL).toBeGreaterThan(0)
  } },
  { label: 'header search', path: () => P('/stores'), want: () => [], act: page => headerSearch(page, 'onerror', 'header search') },
  { label: 'items list', path: () => P('/items'), want: () => expected('item1.title', 'item2.title', 'item3.title', 'item4.title', 'stockItem.title'), shot: true },
  {
    label: 'item page with its listing draft', path: () => P(`/items/${ids.item}`), shot: true,
    want: () => expected('item1.title', 'item1.damage', 'item1.externalId', 'item1.notes', 'mark.title2', 'store.name', 'editor.name'),
    act: async (page) => {
      await page.getByRole('button', { name: 'Write the listing draft' }).click()
      const draft = page.locator('#draft-text')
      await expect.poll(async () => xssIdsIn(await draft.inputValue()).length, POLL).toBeGreaterThan(0)
    },
  },
  { label: 'stock item page', path: () => P(`/items/${ids.stockItem}`), want: () => expected('stockItem.title', 'stockItem.damage', 'stockItem.notes') },
  { label: 'trips list', path: () => P('/trips'), want: () => expected('store.name') },
  { label: 'trip page', path: () => P(`/trips/${ids.trip}`), want: () => expected('store.name', 'trip.notes', 'owner.name', 'editor.name', 'item1.title') },
  { label: 'stores', path: () => P('/stores'), want: () => expected('store.name', 'store.town') },
  { label: 'fee profiles', path: () => P('/settings/fee-profiles'), want: () => expected('feeProfile.name', 'feeProfile.channel') },
  ...(['category', 'mark', 'maker', 'material', 'store', 'member'] as const).map((by): Visit => ({
    label: `report by ${by}`,
    path: () => P(`/reports?by=${by}&period=all`),
    shot: by === 'mark',
    want: () => expected(({ category: 'category.name', mark: 'mark.title2', maker: 'maker.name', material: 'material.name', store: 'store.name', member: 'editor.name' })[by]),
  })),
  { label: 'buy check', path: () => P(`/buy-check?markId=${ids.mark}&priceCents=400`), want: () => expected('mark.title2', 'material.cautions'), shot: true },
  { label: 'sourcing sheet', path: () => P('/sourcing-sheet'), want: () => expected('mark.title2') },
  { label: 'members', path: () => P('/members'), want: () => expected('owner.name', 'editor.name') },
  { label: 'recently deleted', path: () => P('/deleted'), want: () => expected('deleted.name') },
  { label: 'quick add', path: () => P('/quick-add'), want: () => [] },
  { label: 'account', path: () => '/account', want: () => expected('team.name') },
  {
    label: 'import with payload column names', path: () => P('/import'), want: () => [],
    act: async (page) => {
      await page.locator('#import-file').setInputFiles({ name: 'payloads.csv', mimeType: 'text/csv', buffer: Buffer.from(importCsv) })
      const table = page.locator('table').first()
      await expect.poll(async () => xssIdsIn(await table.innerText()), POLL).toEqual(expect.arrayContaining(expected('import.headers', 'import.cells')))
      // Choosing the file checks it at once; the first pass imports it (so the mapping of these columns is
      // remembered), the second finds the rows already imported.
      await page.getByTestId('import-report').waitFor()
      const importButton = page.getByRole('button', { name: /^Import \d+ items?$/ })
      if (await importButton.isEnabled()) {
        await importButton.click()
        await page.getByTestId('import-done').waitFor()
      }
    },
  },
]

async function runPass(pass: string, viewport: { width: number, height: number }, bypassCSP: boolean) {
  const context = await signedIn(owner, viewport, pass, bypassCSP)
  const page = await context.newPage()
  const seen: string[] = []
  try {
    for (const visit of VISITS) {
      await open(page, visit.path())
      if (visit.act) await visit.act(page)
      await checkPage(page, `${pass} ${visit.label}`, visit.want(), visit.scope)
      if (visit.shot) await shot(page, `xss-${pass}-${visit.label.split(' ').slice(0, 3).join('-')}`)
      seen.push(visit.label)
    }
  }
  catch (error) {
    await shot(page, `xss-${pass}-failed`).catch(() => {})
    throw error
  }
  return { context, page, seen }
}

describe('known XSS payloads in every field', () => {
  it('the corpus reaches every field: each field carries several payloads, each payload at least one plain field', () => {
    const plainCovered = new Set([...plainFields.values()].flat())
    expect(XSS_CORPUS.filter(p => !plainCovered.has(p.id)).map(p => p.id), 'payloads in no plain field').toEqual([])
    for (const [key, list] of [...plainFields, ...markdownFields]) expect(list.length, key).toBeGreaterThanOrEqual(2)
  })

  it('run nowhere on desktop with the policy off in the browser (so only escaping protects)', { timeout: 150_000 }, async () => {
    const { context, seen } = await runPass('desktop', DESKTOP, true)
    expect(seen).toHaveLength(VISITS.length)
    expect(hits).toEqual([])
    await context.close()
  })

  it('run nowhere on a phone with the shipped policy, which the app itself never violates; the phone\'s offline copy too', { timeout: 150_000 }, async () => {
    const { context, page } = await runPass('phone', PHONE, false)
    // The team's reference on the phone: downloaded, searched with no signal, a saved entry opened.
    await open(page, P('/offline'))
    await page.getByRole('button', { name: 'Download for offline' }).click()
    await expect.poll(() => page.getByTestId('offline-counts').innerText(), { timeout: 30_000 }).toMatch(/Marks\s+2\b/)
    await open(page, P(`/saved/mark/${ids.mark}`))
    await checkPage(page, 'phone saved mark', expected('mark.title2', 'mark.notes2', 'mark.howToTell', 'marks.note'))
    await context.setOffline(true)
    await headerSearch(page, 'onerror', 'offline header search', 'No signal: answered from this phone\'s copy')
    await context.setOffline(false)
    expect(hits).toEqual([])
    // Every violation would name a payload; the app's own scripts, styles and requests cause none.
    const report = [...violations.map(v => `${v.pass} ${v.url}: ${v.directive} blocked ${v.blocked} ${v.sample} (${v.source})`), ...cspConsole]
    console.log(`CSP violations seen: ${report.length ? `\n${report.join('\n')}` : 'none'}`)
    expect(report).toEqual([])
    expect(pageErrors).toEqual([])
    await context.close()
  })

  it('legitimate markdown is saved and still renders as markup', async () => {
    const context = await signedIn(editor, DESKTOP, 'markdown', false)
    const page = await context.newPage()
    await open(page, P(`/categories/${ids.subcategory}`))
    for (const scope of [page.locator('main .prose').first()]) {
      await scope.locator('h2', { hasText: 'Kiln notes' }).waitFor()
      await scope.locator('strong', { hasText: 'Heavy' }).waitFor()
      expect(await scope.locator('a', { hasText: 'the glaze guide' }).getAttribute('href')).toBe('https://example.com/glaze-guide')
      expect(await scope.locator('li').allInnerTexts()).toEqual(['rings when tapped', 'glows at 365 nm'])
      await scope.locator('code', { hasText: '365 nm' }).waitFor()
    }
    // The same text as a timeline note on the mark.
    await open(page, P(`/marks/${ids.mark}`))
    const note = page.locator('.prose', { has: page.locator('h2', { hasText: 'Kiln notes' }) })
    await expect.poll(() => note.count(), POLL).toBeGreaterThan(0)
    await note.last().locator('a[href="https://example.com/glaze-guide"]').waitFor()
    await note.last().locator('code', { hasText: '365 nm' }).waitFor()
    expect(hits).toEqual([])
    await context.close()
  })
})
