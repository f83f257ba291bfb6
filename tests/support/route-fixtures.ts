// Teams for the authorisation matrix and the isolation tests: one member per role, a row of every kind
// (each name carries the team's own word, so an answer that shows another team's data can be caught), and
// throwaway rows and members for requests that change or remove what they name.
import { randomBytes } from 'node:crypto'
import sharp from 'sharp'
import { expect } from 'vitest'
import { invite, Person, STRONG_PASSWORD, uniqueEmail } from './api'
import { exec, query, teamIdOf } from './db'
import { photoForm } from './photos'
import type { Role } from '../../shared/roles'

export type WikiPath = 'marks' | 'makers' | 'materials' | 'categories'
export const WIKI_PATHS: WikiPath[] = ['marks', 'makers', 'materials', 'categories']

export interface FixtureRows {
  mark: number
  maker: number
  material: number
  category: number
  /** An owner-written note on each entry. */
  notes: Record<WikiPath, number>
  store: number
  trip: number
  feeProfile: number
  /** In stock, with the mark, maker, material, category, store and trip. */
  item: number
  /** Sold, with the same links, so reports and outcomes have figures. */
  soldItem: number
  /** Attached to `item`. */
  photo: number
}

export interface TeamFixture {
  slug: string
  id: number
  name: string
  /** A made-up word in every name of this team's rows and people, and in no other team's. */
  word: string
  owner: Person
  /** One signed-in member per role; a team built with the owner only has the owner in every role. */
  people: Record<Role, Person>
  userIds: Record<Role, number>
  names: Record<Role, string>
  rows: FixtureRows
  api: (path: string) => string
}

let counter = 0
/** A suffix no other row of this run has. */
export function fresh(): string {
  return `${Date.now().toString(36)}${randomBytes(2).toString('hex')}${++counter}`
}

/** A made-up word of letters only (search splits words at digits). */
export function madeUpWord(): string {
  const letters = 'bcdfghjklmnpqrstvwxz'
  const vowels = 'aeiou'
  let word = ''
  for (const byte of randomBytes(8)) word += word.length % 2 ? vowels[byte % vowels.length] : letters[byte % letters.length]
  return word
}

const capital = (word: string) => word[0]!.toUpperCase() + word.slice(1)

export async function created(person: Person, path: string, body: unknown): Promise<any> {
  const res = await person.request('POST', path, body)
  expect(res.status, `POST ${path}: ${JSON.stringify(res.body)}`).toBe(201)
  return res.body
}

let png: Buffer | undefined
/** A small PNG, for uploads. */
export async function smallPng(): Promise<Buffer> {
  png ??= await sharp({ create: { width: 48, height: 32, channels: 3, background: '#7a5230' } }).png().toBuffer()
  return png
}

export async function uploadPhoto(person: Person, team: TeamFixture | { api: (p: string) => string }, attach?: { entityType: 'item' | 'mark' | 'maker', entityId: number }): Promise<number> {
  const form = photoForm(await smallPng(), { name: 'base.png', type: 'image/png', fields: attach ?? {} })
  const res = await person.request('POST', team.api('/uploads'), form)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

async function userIdOf(person: Person): Promise<number> {
  const me = await person.get('/api/me')
  expect(me.status).toBe(200)
  return me.body.user.id as number
}

/**
 * A team for the matrix: its owner registers it, and with `allRoles` invites an editor, a contributor and a
 * viewer; the owner then adds one row of every kind.
 */
export async function buildTeamFixture(options: { allRoles: boolean }): Promise<TeamFixture> {
  const word = madeUpWord()
  const Word = capital(word)
  const owner = new Person(uniqueEmail(`${word}.owner`), STRONG_PASSWORD)
  const names = { owner: `${Word} Owner`, editor: `${Word} Editor`, contributor: `${Word} Contributor`, viewer: `${Word} Viewer` }
  const registered = await owner.post('/api/auth/register', { email: owner.email, password: STRONG_PASSWORD, name: names.owner, teamName: `${Word} Finds ${fresh()}` })
  expect(registered.status, JSON.stringify(registered.body)).toBe(201)
  const { slug, name } = registered.body.team as { slug: string, name: string }
  const people: Record<Role, Person> = { owner, editor: owner, contributor: owner, viewer: owner }
  const userIds: Record<Role, number> = { owner: registered.body.user.id, editor: 0, contributor: 0, viewer: 0 }
  if (options.allRoles) {
    // One after the other: each acceptance hashes a password, and mail on a busy machine can lag.
    for (const role of ['editor', 'contributor', 'viewer'] as const) {
      const person = new Person(uniqueEmail(`${word}.${role}`), STRONG_PASSWORD)
      const { token } = await invite(owner, slug, person.email, role)
      const accepted = await person.post(`/api/invitations/${token}/accept`, { name: names[role], password: STRONG_PASSWORD })
      expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
      people[role] = person
      userIds[role] = await userIdOf(person)
    }
  }
  else for (const role of ['editor', 'contributor', 'viewer'] as const) userIds[role] = userIds.owner
  const api = (path: string) => `/api/teams/${slug}${path}`

  const category = (await created(owner, api('/categories'), { name: `${Word} kitchenware` })).id as number
  const maker = (await created(owner, api('/makers'), { name: `${Word} Pottery` })).id as number
  const material = (await created(owner, api('/materials'), { name: `${Word} glass` })).id as number
  const mark = (await created(owner, api('/marks'), {
    inscriptions: [`${word.toUpperCase()} WARE`], makerId: maker, materialIds: [material], categoryIds: [category],
  })).id as number
  const notes = {} as Record<WikiPath, number>
  const ids: Record<WikiPath, number> = { marks: mark, makers: maker, materials: material, categories: category }
  for (const path of WIKI_PATHS) notes[path] = (await created(owner, api(`/${path}/${ids[path]}/notes`), { body: `${Word} note on the ${path}` })).id
  const store = (await created(owner, api('/stores'), { name: `${Word} Thrift`, kind: 'thrift_store', town: 'Hollowbrook' })).id as number
  const trip = (await created(owner, api('/trips'), { storeId: store, tripDate: '2026-03-01', memberIds: [userIds.owner], notes: `${Word} trip` })).id as number
  const feeProfile = (await created(owner, api('/fee-profiles'), { name: `${Word} profile`, channel: `${Word} market`, percentBp: 1200, fixedCents: 30 })).id as number
  const links = { markId: mark, makerId: maker, materialId: material, categoryId: category, tripId: trip, acquiredOn: '2026-03-01', costCents: 400 }
  const item = (await created(owner, api('/items'), { title: `${Word} jug`, ...links })).id as number
  const soldItem = (await created(owner, api('/items'), { title: `${Word} vase`, ...links })).id as number
  const sale = await owner.post(api(`/items/${soldItem}/sale`), { salePriceCents: 2500, soldOn: '2026-03-10' })
  expect(sale.status, JSON.stringify(sale.body)).toBe(200)
  const photo = await uploadPhoto(owner, { api }, { entityType: 'item', entityId: item })
  return {
    slug, id: await teamIdOf(slug), name, word, owner, people, userIds, names, api,
    rows: { mark, maker, material, category, notes, store, trip, feeProfile, item, soldItem, photo },
  }
}

export interface ThrowawayMember { id: number, email: string, person?: Person }

/**
 * A member added straight to the database (no invitation mail, no password hashing: the hash is the owner's,
 * so the password is the same), for requests that change or end a membership. Signed in when asked.
 */
export async function throwawayMember(team: TeamFixture, role: Role, options: { signIn?: boolean, locked?: boolean } = {}): Promise<ThrowawayMember> {
  const email = uniqueEmail(`${team.word}.spare`)
  const inserted = await query<never>(
    'insert into users (email, name, password_hash) select ?, ?, password_hash from users where id = ?',
    [email, `${capital(team.word)} Spare`, team.userIds.owner],
  ) as unknown as { insertId: number }
  const id = Number(inserted.insertId)
  await exec('insert into memberships (team_id, user_id, role) values (?, ?, ?)', [team.id, id, role])
  let person: Person | undefined
  if (options.signIn) {
    person = new Person(email, STRONG_PASSWORD)
    await person.login()
  }
  if (options.locked) await exec('update users set locked_at = utc_timestamp(), failed_logins = 100 where id = ?', [id])
  return { id, email, person }
}
