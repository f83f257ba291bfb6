// Every wiki route against every role, signed out, and from another team.
import { describe, expect, it } from 'vitest'
import { newOwner, Person, uniqueTeamName } from '../support/api'
import { createEntry, getEntry, MINIMAL_BODY, newWikiTeam, type WikiPath, type WikiTeam } from '../support/wiki'
import type { Role } from '../../shared/roles'

const PATHS: WikiPath[] = ['marks', 'makers', 'materials', 'categories']

interface Route { method: 'GET' | 'POST' | 'PATCH' | 'DELETE', path: string, body?: unknown, minimum: Role }

/** Every route of one entry type, for one entry and one of its notes. */
function entryRoutes(path: WikiPath, id: number, noteId: number): Route[] {
  return [
    { method: 'GET', path: `/${path}`, minimum: 'viewer' },
    { method: 'POST', path: `/${path}`, body: MINIMAL_BODY[path], minimum: 'editor' },
    { method: 'GET', path: `/${path}/${id}`, minimum: 'viewer' },
    { method: 'PATCH', path: `/${path}/${id}`, body: { revision: 1, notes: 'changed' }, minimum: 'editor' },
    { method: 'DELETE', path: `/${path}/${id}`, minimum: 'editor' },
    { method: 'DELETE', path: `/${path}/${id}?purge=1`, minimum: 'owner' },
    { method: 'POST', path: `/${path}/${id}/restore`, minimum: 'editor' },
    { method: 'GET', path: `/${path}/${id}/revisions`, minimum: 'viewer' },
    { method: 'GET', path: `/${path}/${id}/revisions/1`, minimum: 'viewer' },
    { method: 'POST', path: `/${path}/${id}/revisions/1/restore`, body: { revision: 1 }, minimum: 'editor' },
    { method: 'GET', path: `/${path}/${id}/notes`, minimum: 'viewer' },
    { method: 'POST', path: `/${path}/${id}/notes`, body: { body: 'a note' }, minimum: 'contributor' },
    { method: 'PATCH', path: `/${path}/${id}/notes/${noteId}`, body: { body: 'edited' }, minimum: 'contributor' },
    { method: 'DELETE', path: `/${path}/${id}/notes/${noteId}`, minimum: 'contributor' },
  ]
}

const TEAM_ROUTES: Route[] = [
  { method: 'GET', path: '/deleted', minimum: 'editor' },
  { method: 'GET', path: '/entries/lookup?q=a', minimum: 'viewer' },
]

const RANK: Record<Role, number> = { viewer: 1, contributor: 2, editor: 3, owner: 4 }

function send(person: Person, team: { api: (p: string) => string }, route: Route) {
  return person.request(route.method, team.api(route.path), route.body)
}

describe('wiki access: roles and teams', async () => {
  const team: WikiTeam = await newWikiTeam('Access')
  const entries = {} as Record<WikiPath, { id: number, noteId: number }>
  for (const path of PATHS) {
    const id = await createEntry(team.editor, team, path, MINIMAL_BODY[path])
    // The owner wrote the note: its author is above every role tried below, so a 403 is the role's, not authorship.
    const note = await team.owner.post(team.api(`/${path}/${id}/notes`), { body: 'Owner note' })
    expect(note.status).toBe(201)
    entries[path] = { id, noteId: note.body.id }
  }

  async function expectUntouched() {
    for (const path of PATHS) {
      const entry = await getEntry(team.owner, team, path, entries[path].id)
      expect(entry, path).toMatchObject({ revision: 1, deletedAt: null, notes: '' })
      const notes = (await team.owner.get(team.api(`/${path}/${entries[path].id}/notes`))).body.items
      expect(notes.map((n: { id: number, body: string }) => [n.id, n.body]), path).toEqual([[entries[path].noteId, 'Owner note']])
    }
    const counts = await Promise.all(PATHS.map(async p => (await team.owner.get(team.api(`/${p}`))).body.total))
    expect(counts).toEqual([1, 1, 1, 1])
  }

  it('answers 401 to a signed-out visitor on every route', async () => {
    const stranger = new Person()
    for (const route of [...PATHS.flatMap(p => entryRoutes(p, entries[p].id, entries[p].noteId)), ...TEAM_ROUTES]) {
      const res = await send(stranger, team, route)
      expect(res.status, `${route.method} ${route.path}`).toBe(401)
    }
    await expectUntouched()
  })

  for (const role of ['viewer', 'contributor', 'editor'] as const) {
    it(`answers 403 to a ${role} on every route that needs more`, async () => {
      const person = team[role]
      let refused = 0
      for (const route of [...PATHS.flatMap(p => entryRoutes(p, entries[p].id, entries[p].noteId)), ...TEAM_ROUTES]) {
        if (RANK[role] >= RANK[route.minimum]) continue
        const res = await send(person, team, route)
        expect(res.status, `${role} ${route.method} ${route.path}: ${JSON.stringify(res.body)}`).toBe(403)
        // Purging passes the editor check first, so those below editor hear about that one.
        const named = route.minimum === 'owner' && RANK[role] < RANK.editor ? 'editor' : route.minimum
        expect(res.body.message).toMatch(new RegExp(`needs the ${named} role`))
        refused++
      }
      expect(refused).toBeGreaterThan(0)
      await expectUntouched()
    })
  }

  it('lets a viewer read every read route', async () => {
    for (const route of [...PATHS.flatMap(p => entryRoutes(p, entries[p].id, entries[p].noteId)), ...TEAM_ROUTES]) {
      if (route.minimum !== 'viewer') continue
      const res = await send(team.viewer, team, route)
      expect(res.status, `${route.method} ${route.path}`).toBe(200)
    }
  })

  it('answers 404 through every route to another team\'s ids, and changes nothing', async () => {
    const other = await newOwner(uniqueTeamName('Intruder'))
    const intruderTeam = { api: (p: string) => `/api/teams/${other.team.slug}${p}` }
    // The intruder's own entry and note, to try the victim's note id on a real entry of theirs.
    for (const path of PATHS) {
      const own = await other.person.post(intruderTeam.api(`/${path}`), MINIMAL_BODY[path])
      expect(own.status).toBe(201)
      const ownNote = await other.person.post(intruderTeam.api(`/${path}/${own.body.id}/notes`), { body: 'mine' })
      expect(ownNote.status).toBe(201)
      const victim = entries[path]
      const routes = entryRoutes(path, victim.id, victim.noteId).filter(r => r.path.includes(`/${victim.id}`))
      expect(routes.length).toBe(12)
      for (const route of routes) {
        const res = await send(other.person, intruderTeam, route)
        expect(res.status, `${route.method} ${route.path}`).toBe(404)
      }
      for (const method of ['PATCH', 'DELETE'] as const) {
        const res = await other.person.request(method, intruderTeam.api(`/${path}/${own.body.id}/notes/${victim.noteId}`), method === 'PATCH' ? { body: 'x' } : undefined)
        expect(res.status, `${method} victim note on own entry`).toBe(404)
      }
      // Their lists and lookups show their own entries only.
      const list = await other.person.get(intruderTeam.api(`/${path}?pageSize=100`))
      expect(list.body.items.map((i: { id: number }) => i.id)).toEqual([own.body.id])
    }
    const lookup = await other.person.get(intruderTeam.api('/entries/lookup?q='))
    expect(lookup.body.map((i: { type: string, id: number }) => `${i.type}:${i.id}`)).not.toEqual(
      expect.arrayContaining([`mark:${entries.marks.id}`]),
    )
    expect(lookup.body).toHaveLength(4)
    // Naming the victim team in the address does not help either.
    for (const route of entryRoutes('marks', entries.marks.id, entries.marks.noteId)) {
      expect((await send(other.person, team, route)).status, `${route.method} ${route.path}`).toBe(404)
    }
    for (const route of TEAM_ROUTES) expect((await send(other.person, team, route)).status).toBe(404)
    await expectUntouched()
  })
})
