// The authorisation matrix's table (tests/api/authorisation-matrix.test.ts): one entry per API route, keyed
// "METHOD path" as scripts/lib/routes.ts lists them, with the minimum role (as the route's guard call says)
// and how to build a request that succeeds for a caller who has it. The matrix fails when a route file has no
// entry, so add one here with every new route. tests/api/object-isolation.test.ts tries every entry whose path
// names a row (:id, :noteId, :rev, :userId) with another team's ids, and every `queryIds` with another team's ids.
import { expect } from 'vitest'
import type { Role } from '../../shared/roles'
import { invite, linkIn, Person, STRONG_PASSWORD, uniqueEmail, uniqueTeamName, waitForMail } from './api'
import { photoForm } from './photos'
import { created, fresh, smallPng, throwawayMember, uploadPhoto, type FixtureRows, type TeamFixture, type WikiPath } from './route-fixtures'

export type Access = 'public' | 'signed in' | Role

export interface BuiltRequest {
  /** The whole path, from /api. */
  path: string
  /** JSON, or FormData for uploads. */
  body?: unknown
  /** The answer when the caller may do this. */
  status: number
  /** Sent by this person instead of the team's member of the role (someone who leaves the team). */
  person?: Person
}

export interface RouteContext {
  team: TeamFixture
  /** The role the request is built for. */
  role: Role
  /** Who makes a throwaway row: the caller when their role may make it (so it is their own), else the owner. */
  maker: (minimum: Role) => Person
}

export type Builder = (c: RouteContext) => BuiltRequest | Promise<BuiltRequest>

export interface QueryIdSet {
  params: Record<string, string | number>
  /** 404: the ids are looked up and another team's are not found. 'unseen': a filter; another team's id answers
   * exactly as an id that exists nowhere. In 'unseen' sets every parameter is an id. */
  foreign: 404 | 'unseen'
}

export interface RouteRule {
  access: Access
  build: Builder
  /** The request changes or removes what it names: built again, on rows of its own, for every call that may succeed. */
  fresh?: boolean
  /** A second form of the same route with a higher minimum (wiki deletes with ?purge=1 are for owners). */
  purge?: { minimum: Role, build: Builder }
  /** Query parameters that name rows, each set tried with another team's ids by the isolation test. */
  queryIds?: (team: TeamFixture) => QueryIdSet[]
}

const RANK: Record<Role, number> = { viewer: 1, contributor: 2, editor: 3, owner: 4 }
export const roleAtLeastRank = (role: Role, minimum: Role) => RANK[role] >= RANK[minimum]

export function routeContext(team: TeamFixture, role: Role): RouteContext {
  return { team, role, maker: minimum => roleAtLeastRank(role, minimum) ? team.people[role] : team.owner }
}

/** What scripts/lib/routes.ts reads from the route's guard call, for comparing with the table. */
export function accessLabel(rule: RouteRule): string {
  return rule.purge ? `${rule.access} (purge: ${rule.purge.minimum})` : rule.access
}

const answer = (path: string, status = 200, body?: unknown): BuiltRequest => ({ path, status, body })

/** A read of the team's data that every member may make. */
const read = (path: (t: TeamFixture) => string, queryIds?: RouteRule['queryIds']): RouteRule =>
  ({ access: 'viewer', build: c => answer(c.team.api(path(c.team))), queryIds })

// ---- Throwaway rows, made by the caller when their role may (contributors change only their own rows).

const WIKI_BODY: Record<WikiPath, (name: string) => Record<string, unknown>> = {
  marks: name => ({ inscriptions: [name.toUpperCase()] }),
  makers: name => ({ name }),
  materials: name => ({ name }),
  categories: name => ({ name }),
}

function entryOf(t: TeamFixture, path: WikiPath): number {
  return { marks: t.rows.mark, makers: t.rows.maker, materials: t.rows.material, categories: t.rows.category }[path]
}

async function newEntry(c: RouteContext, path: WikiPath, options: { deleted?: boolean } = {}): Promise<number> {
  const { id } = await created(c.maker('editor'), c.team.api(`/${path}`), WIKI_BODY[path](`${c.team.word} spare ${fresh()}`))
  if (options.deleted) {
    const res = await c.team.owner.delete(c.team.api(`/${path}/${id}`))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
  }
  return id
}

async function newNote(c: RouteContext, path: WikiPath): Promise<number> {
  return (await created(c.maker('contributor'), c.team.api(`/${path}/${entryOf(c.team, path)}/notes`), { body: `${c.team.word} spare note` })).id
}

const newStore = async (c: RouteContext): Promise<number> =>
  (await created(c.maker('contributor'), c.team.api('/stores'), { name: `${c.team.word} store ${fresh()}`, kind: 'thrift_store' })).id
const newTrip = async (c: RouteContext): Promise<number> =>
  (await created(c.maker('contributor'), c.team.api('/trips'), { storeId: c.team.rows.store, tripDate: '2026-03-02' })).id
const newFeeProfile = async (c: RouteContext): Promise<number> =>
  (await created(c.maker('editor'), c.team.api('/fee-profiles'), { name: `${c.team.word} profile ${fresh()}` })).id
const newItem = async (c: RouteContext): Promise<number> =>
  (await created(c.maker('contributor'), c.team.api('/items'), { title: `${c.team.word} piece ${fresh()}`, acquiredOn: '2026-03-01', costCents: 300 })).id
const newInvitation = async (c: RouteContext): Promise<number> =>
  (await created(c.team.owner, c.team.api('/invitations'), { email: uniqueEmail(`${c.team.word}.invited`), role: 'viewer' })).invitation.id

async function csvForm(c: RouteContext): Promise<FormData> {
  const form = new FormData()
  form.append('file', new Blob([`title,acquiredOn,cost\n${c.team.word} imported ${fresh()},2026-03-01,1.50\n`], { type: 'text/csv' }), 'items.csv')
  return form
}

function teamZipForm(): FormData {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array([0x50, 0x4B, 0x05, 0x06, ...new Array(18).fill(0)])], { type: 'application/zip' }), 'team.zip')
  return form
}

// ---- The four reference entry types share their routes.

const wiki = {
  list: (p: WikiPath) => read(() => `/${p}`),
  create: (p: WikiPath): RouteRule => ({ access: 'editor', fresh: true, build: c => answer(c.team.api(`/${p}`), 201, WIKI_BODY[p](`${c.team.word} new ${fresh()}`)) }),
  get: (p: WikiPath) => read(t => `/${p}/${entryOf(t, p)}`),
  patch: (p: WikiPath): RouteRule => ({
    access: 'editor', fresh: true,
    build: async c => answer(c.team.api(`/${p}/${await newEntry(c, p)}`), 200, { revision: 1, notes: 'Changed by the matrix.' }),
  }),
  delete: (p: WikiPath): RouteRule => ({
    access: 'editor', fresh: true,
    build: async c => answer(c.team.api(`/${p}/${await newEntry(c, p)}`)),
    purge: { minimum: 'owner', build: async c => answer(c.team.api(`/${p}/${await newEntry(c, p, { deleted: true })}?purge=1`)) },
  }),
  restore: (p: WikiPath): RouteRule => ({ access: 'editor', fresh: true, build: async c => answer(c.team.api(`/${p}/${await newEntry(c, p, { deleted: true })}/restore`), 200, {}) }),
  revisions: (p: WikiPath) => read(t => `/${p}/${entryOf(t, p)}/revisions`),
  revision: (p: WikiPath) => read(t => `/${p}/${entryOf(t, p)}/revisions/1`),
  restoreRevision: (p: WikiPath): RouteRule => ({
    access: 'editor', fresh: true, build: async c => answer(c.team.api(`/${p}/${await newEntry(c, p)}/revisions/1/restore`), 200, { revision: 1 }),
  }),
  notes: (p: WikiPath) => read(t => `/${p}/${entryOf(t, p)}/notes`),
  addNote: (p: WikiPath): RouteRule => ({ access: 'contributor', build: c => answer(c.team.api(`/${p}/${entryOf(c.team, p)}/notes`), 201, { body: `${c.team.word} matrix note` }) }),
  editNote: (p: WikiPath): RouteRule => ({
    access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/${p}/${entryOf(c.team, p)}/notes/${await newNote(c, p)}`), 200, { body: 'Edited by the matrix.' }),
  }),
  removeNote: (p: WikiPath): RouteRule => ({
    access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/${p}/${entryOf(c.team, p)}/notes/${await newNote(c, p)}`)),
  }),
}

// ---- Filters that name rows.

const filters = (sets: Record<string, number>[]): QueryIdSet[] => sets.map(params => ({ params, foreign: 'unseen' }))

const itemFilters = (t: TeamFixture): QueryIdSet[] => filters([
  { markId: t.rows.mark }, { makerId: t.rows.maker }, { materialId: t.rows.material }, { categoryId: t.rows.category },
  { storeId: t.rows.store }, { tripId: t.rows.trip }, { sourcedBy: t.userIds.owner },
])

const reportFilters = (t: TeamFixture): QueryIdSet[] => filters([
  { categoryId: t.rows.category }, { storeId: t.rows.store }, { memberId: t.userIds.owner }, { channel: t.rows.feeProfile },
])

const entryLookups = (rows: FixtureRows, keys: Record<string, keyof FixtureRows>): QueryIdSet[] =>
  Object.entries(keys).map(([param, row]) => ({ params: { [param]: rows[row] as number }, foreign: 404 as const }))

export const ROUTE_RULES: Record<string, RouteRule> = {
  // ---- Accounts (no team)
  'POST /api/auth/login': { access: 'public', build: c => answer('/api/auth/login', 200, { email: c.team.people.viewer.email, password: STRONG_PASSWORD }) },
  'POST /api/auth/logout': { access: 'public', build: () => answer('/api/auth/logout', 200, {}) },
  'POST /api/auth/password': {
    access: 'signed in', fresh: true,
    build: async (c) => {
      const { person } = await throwawayMember(c.team, 'viewer', { signIn: true })
      return { ...answer('/api/auth/password', 200, { currentPassword: STRONG_PASSWORD, newPassword: `felt-lined-drawer-${fresh()}` }), person }
    },
  },
  'POST /api/auth/password-reset': { access: 'public', build: () => answer('/api/auth/password-reset', 202, { email: uniqueEmail('nobody') }) },
  'POST /api/auth/password-reset/confirm': {
    access: 'public',
    build: async (c) => {
      const { email } = await throwawayMember(c.team, 'viewer')
      expect((await new Person().post('/api/auth/password-reset', { email })).status).toBe(202)
      const token = linkIn(await waitForMail(email), '/reset/').split('/').pop()
      return answer('/api/auth/password-reset/confirm', 200, { token, password: `chipped-saucer-rim-${fresh()}` })
    },
  },
  'POST /api/auth/register': {
    access: 'public',
    build: () => answer('/api/auth/register', 201, { email: uniqueEmail('matrix'), password: STRONG_PASSWORD, name: 'Matrix Person', teamName: uniqueTeamName('Matrix') }),
  },
  'GET /api/health': { access: 'public', build: () => answer('/api/health') },
  'GET /api/invitations/:token': {
    access: 'public', build: async c => answer(`/api/invitations/${(await invite(c.team.owner, c.team.slug, uniqueEmail('matrix.invited'), 'viewer')).token}`),
  },
  'POST /api/invitations/:token/accept': {
    access: 'public',
    build: async (c) => {
      const { token } = await invite(c.team.owner, c.team.slug, uniqueEmail('matrix.joining'), 'viewer')
      return answer(`/api/invitations/${token}/accept`, 200, { name: 'Matrix Joiner', password: STRONG_PASSWORD })
    },
  },
  'GET /api/me': { access: 'signed in', build: () => answer('/api/me') },
  'PATCH /api/me': { access: 'signed in', build: c => answer('/api/me', 200, { name: c.team.names[c.role] }) },
  'POST /api/teams': { access: 'signed in', fresh: true, build: () => answer('/api/teams', 201, { name: uniqueTeamName('Matrix') }) },

  // ---- The team
  'GET /api/teams/:team': read(() => ''),
  'PATCH /api/teams/:team': { access: 'owner', build: c => answer(c.team.api(''), 200, { name: c.team.name }) },
  'GET /api/teams/:team/members': read(() => '/members'),
  // Any member leaves (removes themself); owners remove others.
  'DELETE /api/teams/:team/members/:userId': {
    access: 'viewer', fresh: true,
    build: async (c) => {
      if (c.role === 'owner') return answer(c.team.api(`/members/${(await throwawayMember(c.team, 'viewer')).id}`))
      const leaving = await throwawayMember(c.team, c.role, { signIn: true })
      return { ...answer(c.team.api(`/members/${leaving.id}`)), person: leaving.person }
    },
  },
  'PATCH /api/teams/:team/members/:userId': {
    access: 'owner', fresh: true, build: async c => answer(c.team.api(`/members/${(await throwawayMember(c.team, 'viewer')).id}`), 200, { role: 'contributor' }),
  },
  'DELETE /api/teams/:team/members/:userId/sessions': {
    access: 'owner', fresh: true, build: async c => answer(c.team.api(`/members/${(await throwawayMember(c.team, 'viewer')).id}/sessions`)),
  },
  'POST /api/teams/:team/members/:userId/unlock': {
    access: 'owner', fresh: true, build: async c => answer(c.team.api(`/members/${(await throwawayMember(c.team, 'viewer', { locked: true })).id}/unlock`), 200, {}),
  },
  'GET /api/teams/:team/invitations': { access: 'owner', build: c => answer(c.team.api('/invitations')) },
  'POST /api/teams/:team/invitations': {
    access: 'owner', fresh: true, build: c => answer(c.team.api('/invitations'), 201, { email: uniqueEmail(`${c.team.word}.invited`), role: 'viewer' }),
  },
  'DELETE /api/teams/:team/invitations/:id': { access: 'owner', fresh: true, build: async c => answer(c.team.api(`/invitations/${await newInvitation(c)}`)) },

  // ---- Reference entries
  'GET /api/teams/:team/marks': wiki.list('marks'),
  'POST /api/teams/:team/marks': wiki.create('marks'),
  'DELETE /api/teams/:team/marks/:id': wiki.delete('marks'),
  'GET /api/teams/:team/marks/:id': wiki.get('marks'),
  'PATCH /api/teams/:team/marks/:id': wiki.patch('marks'),
  'GET /api/teams/:team/marks/:id/notes': wiki.notes('marks'),
  'POST /api/teams/:team/marks/:id/notes': wiki.addNote('marks'),
  'DELETE /api/teams/:team/marks/:id/notes/:noteId': wiki.removeNote('marks'),
  'PATCH /api/teams/:team/marks/:id/notes/:noteId': wiki.editNote('marks'),
  'POST /api/teams/:team/marks/:id/restore': wiki.restore('marks'),
  'GET /api/teams/:team/marks/:id/revisions': wiki.revisions('marks'),
  'GET /api/teams/:team/marks/:id/revisions/:rev': wiki.revision('marks'),
  'POST /api/teams/:team/marks/:id/revisions/:rev/restore': wiki.restoreRevision('marks'),
  'GET /api/teams/:team/makers': wiki.list('makers'),
  'POST /api/teams/:team/makers': wiki.create('makers'),
  'DELETE /api/teams/:team/makers/:id': wiki.delete('makers'),
  'GET /api/teams/:team/makers/:id': wiki.get('makers'),
  'PATCH /api/teams/:team/makers/:id': wiki.patch('makers'),
  'GET /api/teams/:team/makers/:id/notes': wiki.notes('makers'),
  'POST /api/teams/:team/makers/:id/notes': wiki.addNote('makers'),
  'DELETE /api/teams/:team/makers/:id/notes/:noteId': wiki.removeNote('makers'),
  'PATCH /api/teams/:team/makers/:id/notes/:noteId': wiki.editNote('makers'),
  'POST /api/teams/:team/makers/:id/restore': wiki.restore('makers'),
  'GET /api/teams/:team/makers/:id/revisions': wiki.revisions('makers'),
  'GET /api/teams/:team/makers/:id/revisions/:rev': wiki.revision('makers'),
  'POST /api/teams/:team/makers/:id/revisions/:rev/restore': wiki.restoreRevision('makers'),
  'GET /api/teams/:team/materials': wiki.list('materials'),
  'POST /api/teams/:team/materials': wiki.create('materials'),
  'DELETE /api/teams/:team/materials/:id': wiki.delete('materials'),
  'GET /api/teams/:team/materials/:id': wiki.get('materials'),
  'PATCH /api/teams/:team/materials/:id': wiki.patch('materials'),
  'GET /api/teams/:team/materials/:id/notes': wiki.notes('materials'),
  'POST /api/teams/:team/materials/:id/notes': wiki.addNote('materials'),
  'DELETE /api/teams/:team/materials/:id/notes/:noteId': wiki.removeNote('materials'),
  'PATCH /api/teams/:team/materials/:id/notes/:noteId': wiki.editNote('materials'),
  'POST /api/teams/:team/materials/:id/restore': wiki.restore('materials'),
  'GET /api/teams/:team/materials/:id/revisions': wiki.revisions('materials'),
  'GET /api/teams/:team/materials/:id/revisions/:rev': wiki.revision('materials'),
  'POST /api/teams/:team/materials/:id/revisions/:rev/restore': wiki.restoreRevision('materials'),
  'GET /api/teams/:team/categories': wiki.list('categories'),
  'POST /api/teams/:team/categories': wiki.create('categories'),
  'DELETE /api/teams/:team/categories/:id': wiki.delete('categories'),
  'GET /api/teams/:team/categories/:id': wiki.get('categories'),
  'PATCH /api/teams/:team/categories/:id': wiki.patch('categories'),
  'GET /api/teams/:team/categories/:id/notes': wiki.notes('categories'),
  'POST /api/teams/:team/categories/:id/notes': wiki.addNote('categories'),
  'DELETE /api/teams/:team/categories/:id/notes/:noteId': wiki.removeNote('categories'),
  'PATCH /api/teams/:team/categories/:id/notes/:noteId': wiki.editNote('categories'),
  'POST /api/teams/:team/categories/:id/restore': wiki.restore('categories'),
  'GET /api/teams/:team/categories/:id/revisions': wiki.revisions('categories'),
  'GET /api/teams/:team/categories/:id/revisions/:rev': wiki.revision('categories'),
  'POST /api/teams/:team/categories/:id/revisions/:rev/restore': wiki.restoreRevision('categories'),
  'GET /api/teams/:team/deleted': { access: 'editor', build: c => answer(c.team.api('/deleted')) },
  'GET /api/teams/:team/entries/lookup': read(t => `/entries/lookup?q=${t.word}`),
  'GET /api/teams/:team/dating': read(() => `/dating?text=${encodeURIComponent('MADE IN ENGLAND')}`),
  'GET /api/teams/:team/search': read(t => `/search?q=${t.word}`, t => filters([
    { makerId: t.rows.maker }, { categoryId: t.rows.category }, { materialId: t.rows.material },
  ])),
  'GET /api/teams/:team/offline/reference': read(() => '/offline/reference'),

  // ---- Photos
  'POST /api/teams/:team/uploads': {
    access: 'contributor', fresh: true, build: async c => answer(c.team.api('/uploads'), 201, photoForm(await smallPng(), { name: 'base.png', type: 'image/png' })),
  },
  'GET /api/teams/:team/photos/:id/:size': read(t => `/photos/${t.rows.photo}/thumb`),
  'PATCH /api/teams/:team/photos/:id': {
    access: 'contributor', fresh: true,
    build: async c => answer(c.team.api(`/photos/${await uploadPhoto(c.maker('contributor'), c.team)}`), 200, { entityType: 'item', entityId: c.team.rows.item }),
  },
  'DELETE /api/teams/:team/photos/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/photos/${await uploadPhoto(c.maker('contributor'), c.team)}`)) },

  // ---- Ledger
  'GET /api/teams/:team/stores': read(() => '/stores'),
  'POST /api/teams/:team/stores': { access: 'contributor', fresh: true, build: c => answer(c.team.api('/stores'), 201, { name: `${c.team.word} store ${fresh()}`, kind: 'estate_sale' }) },
  'DELETE /api/teams/:team/stores/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/stores/${await newStore(c)}`)) },
  'GET /api/teams/:team/stores/:id': read(t => `/stores/${t.rows.store}`),
  'PATCH /api/teams/:team/stores/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/stores/${await newStore(c)}`), 200, { revision: 1, town: 'Elsewhere' }) },
  'GET /api/teams/:team/trips': read(() => '/trips', t => filters([{ storeId: t.rows.store }, { memberId: t.userIds.owner }])),
  'POST /api/teams/:team/trips': { access: 'contributor', fresh: true, build: c => answer(c.team.api('/trips'), 201, { storeId: c.team.rows.store, tripDate: '2026-03-03' }) },
  'DELETE /api/teams/:team/trips/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/trips/${await newTrip(c)}`)) },
  'GET /api/teams/:team/trips/:id': read(t => `/trips/${t.rows.trip}`),
  'PATCH /api/teams/:team/trips/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/trips/${await newTrip(c)}`), 200, { revision: 1, notes: 'Changed by the matrix.' }) },
  'GET /api/teams/:team/fee-profiles': read(() => '/fee-profiles'),
  'POST /api/teams/:team/fee-profiles': { access: 'editor', fresh: true, build: c => answer(c.team.api('/fee-profiles'), 201, { name: `${c.team.word} profile ${fresh()}` }) },
  'DELETE /api/teams/:team/fee-profiles/:id': { access: 'editor', fresh: true, build: async c => answer(c.team.api(`/fee-profiles/${await newFeeProfile(c)}`)) },
  'GET /api/teams/:team/fee-profiles/:id': read(t => `/fee-profiles/${t.rows.feeProfile}`),
  'PATCH /api/teams/:team/fee-profiles/:id': {
    access: 'editor', fresh: true, build: async c => answer(c.team.api(`/fee-profiles/${await newFeeProfile(c)}`), 200, { revision: 1, fixedCents: 25 }),
  },
  'GET /api/teams/:team/items': read(() => '/items', itemFilters),
  'POST /api/teams/:team/items': {
    access: 'contributor', fresh: true, build: c => answer(c.team.api('/items'), 201, { title: `${c.team.word} new piece`, acquiredOn: '2026-03-01', costCents: 250 }),
  },
  'DELETE /api/teams/:team/items/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/items/${await newItem(c)}`)) },
  'GET /api/teams/:team/items/:id': read(t => `/items/${t.rows.item}`),
  'PATCH /api/teams/:team/items/:id': { access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/items/${await newItem(c)}`), 200, { revision: 1, notes: 'Changed by the matrix.' }) },
  'GET /api/teams/:team/items/:id/listing-draft': read(t => `/items/${t.rows.item}/listing-draft`),
  'POST /api/teams/:team/items/:id/sale': {
    access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/items/${await newItem(c)}/sale`), 200, { salePriceCents: 1800, soldOn: '2026-03-05' }),
  },
  'GET /api/teams/:team/items/:id/status': read(t => `/items/${t.rows.item}/status`),
  'POST /api/teams/:team/items/:id/status': {
    access: 'contributor', fresh: true, build: async c => answer(c.team.api(`/items/${await newItem(c)}/status`), 200, { to: 'listed', on: '2026-03-02', askingCents: 1500 }),
  },
  'GET /api/teams/:team/exports/items.csv': read(() => '/exports/items.csv', itemFilters),
  'POST /api/teams/:team/imports/items': { access: 'contributor', fresh: true, build: async c => answer(c.team.api('/imports/items'), 200, await csvForm(c)) },
  'GET /api/teams/:team/imports/items/mappings': read(() => '/imports/items/mappings'),
  'GET /api/teams/:team/exports/team.zip': { access: 'owner', build: c => answer(c.team.api('/exports/team.zip')) },
  // The fixture team holds data, so an owner's team import is refused as not empty (409): past the guard, nothing written.
  'POST /api/teams/:team/imports/team': { access: 'owner', build: c => answer(c.team.api('/imports/team'), 409, teamZipForm()) },
  'GET /api/teams/:team/ledger-settings': read(() => '/ledger-settings'),
  'PATCH /api/teams/:team/ledger-settings': { access: 'editor', build: c => answer(c.team.api('/ledger-settings'), 200, { mileageRateCents: 0 }) },
  'POST /api/teams/:team/calculator': { access: 'viewer', build: c => answer(c.team.api('/calculator'), 200, { expectedSaleCents: 2000, costCents: 300 }) },

  // ---- Reports
  // The category report: the one that also takes a parent category.
  'GET /api/teams/:team/reports/:dimension': read(() => '/reports/category', t => [
    ...reportFilters(t), { params: { parentId: t.rows.category }, foreign: 404 },
  ]),
  'GET /api/teams/:team/sourcing-sheet': read(() => '/sourcing-sheet', reportFilters),
  'GET /api/teams/:team/outcomes': read(t => `/outcomes?type=mark&id=${t.rows.mark}`, t => (['mark', 'maker', 'material', 'category'] as const)
    .map(type => ({ params: { type, id: t.rows[type] }, foreign: 404 as const }))),
  'GET /api/teams/:team/buy-check': read(t => `/buy-check?markId=${t.rows.mark}&priceCents=500`, t =>
    entryLookups(t.rows, { markId: 'mark', makerId: 'maker', categoryId: 'category' })),
  'GET /api/teams/:team/buy-targets': read(() => '/buy-targets'),
  'PATCH /api/teams/:team/buy-targets': {
    access: 'owner', fresh: true,
    build: async (c) => {
      const current = await c.team.owner.get(c.team.api('/buy-targets'))
      return answer(c.team.api('/buy-targets'), 200, { revision: current.body.revision, minProfitCents: 500 })
    },
  },
}
