// Helpers for the reference wiki API tests: a team with one signed-in member per role, and entry builders.
import { expect } from 'vitest'
import { type Person, newMember, newOwner, uniqueTeamName } from './api'

export type WikiPath = 'marks' | 'makers' | 'materials' | 'categories'

export interface WikiTeam {
  slug: string
  owner: Person
  editor: Person
  contributor: Person
  viewer: Person
  /** /api/teams/<slug><path> */
  api: (path: string) => string
}

/** A new team whose owner invited an editor, a contributor and a viewer; all four are signed in. */
export async function newWikiTeam(name = 'Wiki Team'): Promise<WikiTeam> {
  const { person: owner, team } = await newOwner(uniqueTeamName(name))
  // One after the other: each acceptance hashes a password, and a busy two-core box can push mail past its wait.
  const editor = await newMember(owner, team.slug, 'editor')
  const contributor = await newMember(owner, team.slug, 'contributor')
  const viewer = await newMember(owner, team.slug, 'viewer')
  return {
    slug: team.slug,
    owner,
    editor: editor.person,
    contributor: contributor.person,
    viewer: viewer.person,
    api: path => `/api/teams/${team.slug}${path}`,
  }
}

/** Creates an entry and returns its id; fails the test with the answer when it is not a 201. */
export async function createEntry(person: Person, team: WikiTeam, path: WikiPath, body: Record<string, unknown>): Promise<number> {
  const res = await person.post(team.api(`/${path}`), body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  expect(res.body.revision).toBe(1)
  return res.body.id as number
}

export async function getEntry(person: Person, team: WikiTeam, path: WikiPath, id: number, query = '') {
  const res = await person.get(team.api(`/${path}/${id}${query}`))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body
}

/** A minimal valid body per type, for tests that only need an entry to exist. */
export const MINIMAL_BODY: Record<WikiPath, Record<string, unknown>> = {
  marks: { inscriptions: ['FERNWOOD POTTERY'] },
  makers: { name: 'Fernwood Pottery' },
  materials: { name: 'Pressed glass' },
  categories: { name: 'Kitchenware' },
}
