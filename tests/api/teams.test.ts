// Teams and their members: creating and renaming teams, listing members, role changes, removal, leaving,
// the last-owner rule, session revocation and isolation between teams.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, newMember, newOwner, Person, uniqueTeamName } from '../support/api'
import { auditEvents, closeTestDb, teamIdOf } from '../support/db'

afterAll(closeTestDb)

describe('POST /api/teams', () => {
  it('creates a team with the caller as owner', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const name = uniqueTeamName('Kestrel & Sons')
    const res = await person.post('/api/teams', { name: `  ${name} ` })
    expect(res.status).toBe(201)
    expect(res.body).toEqual({ team: { slug: expect.stringMatching(/^kestrel-and-sons-[0-9a-f]{8}$/), name, role: 'owner' } })
    const me = await person.get('/api/me')
    expect(me.body.teams).toContainEqual(expect.objectContaining({ slug: res.body.team.slug, name, role: 'owner' }))
    const teamId = await teamIdOf(res.body.team.slug)
    expect(await auditEvents('team.created', { teamId })).toHaveLength(1)
  })

  it('gives teams of one name created at the same moment each their own address (no 500)', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const name = uniqueTeamName('Same Name')
    const results = await Promise.all([1, 2, 3, 4].map(() => person.post('/api/teams', { name })))
    expect(results.map(r => r.status), JSON.stringify(results.map(r => r.body))).toEqual([201, 201, 201, 201])
    const slugs = results.map(r => r.body.team.slug as string)
    expect(new Set(slugs).size).toBe(4)
    const base = slugs.find(s => !/-[0-9a-f]{8}-/.test(s))
    expect(base).toMatch(/^same-name-[0-9a-f]{8}$/)
    for (const slug of slugs) expect(slug.startsWith(base!)).toBe(true)
    expect((await person.get('/api/me')).body.teams.filter((t: { name: string }) => t.name === name)).toHaveLength(4)
  })

  it('refuses a bad name with 400 and needs a session', async () => {
    const { person } = await newOwner(uniqueTeamName())
    expect(expectError(await person.post('/api/teams', { name: 'x' }), 400).fieldErrors).toEqual({ name: ['Team names need at least 2 characters.'] })
    expectError(await new Person().post('/api/teams', { name: 'Nobody Team' }), 401)
  })
})

describe('GET and PATCH /api/teams/[team]', () => {
  it('shows the team and the caller\'s role to every member', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const res = await person.get(`/api/teams/${team.slug}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ team: { slug: team.slug, name: team.name, timeZone: 'UTC' }, role: 'owner' })
    const viewer = await newMember(person, team.slug, 'viewer')
    expect((await viewer.person.get(`/api/teams/${team.slug}`)).body.role).toBe('viewer')
  })

  it('lets owners rename the team and set its time zone; the address stays', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const res = await person.patch(`/api/teams/${team.slug}`, { name: 'Renamed Yard', timeZone: 'Europe/Lisbon' })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ team: { slug: team.slug, name: 'Renamed Yard', timeZone: 'Europe/Lisbon' } })
    expect((await person.get(`/api/teams/${team.slug}`)).body.team).toEqual({ slug: team.slug, name: 'Renamed Yard', timeZone: 'Europe/Lisbon' })
    expect(expectError(await person.patch(`/api/teams/${team.slug}`, { timeZone: 'Nowhere/Special' }), 400).fieldErrors).toEqual({ timeZone: ['Unknown time zone.'] })
    expect(await auditEvents('team.updated', { teamId: await teamIdOf(team.slug) })).toHaveLength(1)
  })

  it('refuses team changes by editors with 403', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const editor = await newMember(person, team.slug, 'editor')
    expectError(await editor.person.patch(`/api/teams/${team.slug}`, { name: 'Editor Was Here' }), 403, /owner role/)
    expect((await person.get(`/api/teams/${team.slug}`)).body.team.name).toBe(team.name)
  })
})

describe('GET /api/teams/[team]/members', () => {
  it('lists every member with role, to every role', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const viewer = await newMember(person, team.slug, 'viewer', 'Vesna Viewer')
    const contributor = await newMember(person, team.slug, 'contributor', 'Corin Contributor')
    for (const who of [person, viewer.person, contributor.person]) {
      const res = await who.get(`/api/teams/${team.slug}/members`)
      expect(res.status).toBe(200)
      const members = res.body.members as { userId: number, name: string, email: string, role: string, locked: unknown, joinedAt: string }[]
      // Sorted by name.
      expect(members.map(m => [m.userId, m.name, m.email, m.role])).toEqual([
        [contributor.id, 'Corin Contributor', contributor.person.email, 'contributor'],
        [user.id, 'Owner Person', person.email, 'owner'],
        [viewer.id, 'Vesna Viewer', viewer.person.email, 'viewer'],
      ])
      for (const m of members) {
        expect(Boolean(m.locked)).toBe(false)
        expect(Number.isNaN(Date.parse(m.joinedAt))).toBe(false)
      }
      expect(JSON.stringify(res.body)).not.toMatch(/password|hash/i)
    }
  })
})

describe('PATCH /api/teams/[team]/members/[userId]', () => {
  it('lets an owner change a role; the member\'s sessions are revoked and the new role applies after sign-in', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const member = await newMember(person, team.slug, 'viewer')
    const res = await person.patch(`/api/teams/${team.slug}/members/${member.id}`, { role: 'editor' })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ userId: member.id, role: 'editor' })
    const listed = (await person.get(`/api/teams/${team.slug}/members`)).body.members
    expect(listed.find((m: { userId: number }) => m.userId === member.id).role).toBe('editor')

    expectError(await member.person.get(`/api/teams/${team.slug}`), 401)
    expectError(await member.person.get('/api/me'), 401)
    await member.person.login()
    expect((await member.person.get(`/api/teams/${team.slug}`)).body.role).toBe('editor')
    // The owner's own session goes on.
    expect((await person.get('/api/me')).status).toBe(200)

    const events = await auditEvents('member.role_changed', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: user.id, targetType: 'user', targetId: String(member.id), detail: { from: 'viewer', to: 'editor' } })
  })

  it('refuses role changes by editors, contributors and viewers with 403, and changes nothing', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const target = await newMember(person, team.slug, 'viewer')
    for (const role of ['editor', 'contributor', 'viewer'] as const) {
      const actor = await newMember(person, team.slug, role)
      expectError(await actor.person.patch(`/api/teams/${team.slug}/members/${target.id}`, { role: 'owner' }), 403)
      expectError(await actor.person.patch(`/api/teams/${team.slug}/members/${actor.id}`, { role: 'owner' }), 403)
      expect((await actor.person.get(`/api/teams/${team.slug}`)).body.role).toBe(role)
    }
    expect((await target.person.get(`/api/teams/${team.slug}`)).body.role).toBe('viewer')
  })

  it('answers a bad role with 400 and an unknown member with 404', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const member = await newMember(person, team.slug, 'viewer')
    const bad = await person.patch(`/api/teams/${team.slug}/members/${member.id}`, { role: 'admin' })
    expect(expectError(bad, 400).fieldErrors).toEqual({ role: ['Role must be one of: owner, editor, contributor, viewer.'] })
    expectError(await person.patch(`/api/teams/${team.slug}/members/999999999`, { role: 'editor' }), 404)
    expectError(await person.patch(`/api/teams/${team.slug}/members/not-a-number`, { role: 'editor' }), 404)
    // A person from another team is not a member here either.
    const stranger = await newOwner(uniqueTeamName())
    expectError(await person.patch(`/api/teams/${team.slug}/members/${stranger.user.id}`, { role: 'editor' }), 404)
  })

  it('refuses to demote the last owner with 409', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const res = await person.patch(`/api/teams/${team.slug}/members/${user.id}`, { role: 'editor' })
    expectError(res, 409, /at least one owner/)
    expect((await person.get(`/api/teams/${team.slug}`)).body.role).toBe('owner')
  })

  it('lets one of two owners be demoted, then protects the one left', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const second = await newMember(person, team.slug, 'owner')
    expect((await second.person.patch(`/api/teams/${team.slug}/members/${user.id}`, { role: 'editor' })).status).toBe(200)
    expectError(await second.person.patch(`/api/teams/${team.slug}/members/${second.id}`, { role: 'viewer' }), 409)
    expectError(await second.person.delete(`/api/teams/${team.slug}/members/${second.id}`), 409, /last owner/)
  })

  it('keeps an owner when two owners demote each other at the same moment', async () => {
    // Several rounds, so that at least some of them really overlap. When one request finishes before the other
    // starts, the other is refused 401 (the role change ended its session); when its session check ran before
    // the change but its role check after, 403 (it is an editor by then); when they overlap, 409.
    for (let round = 0; round < 4; round++) {
      const { person, team, user } = await newOwner(uniqueTeamName())
      const second = await newMember(person, team.slug, 'owner')
      const results = await Promise.all([
        person.patch(`/api/teams/${team.slug}/members/${second.id}`, { role: 'editor' }),
        second.person.patch(`/api/teams/${team.slug}/members/${user.id}`, { role: 'editor' }),
      ])
      const detail = JSON.stringify(results.map(r => [r.status, r.body]))
      expect(results.filter(r => r.status === 200), detail).toHaveLength(1)
      expect([401, 403, 409], detail).toContain(results.find(r => r.status !== 200)!.status)
      const fresh = new Person(person.email, person.password)
      await fresh.login()
      const members = (await fresh.get(`/api/teams/${team.slug}/members`)).body.members as { role: string }[]
      expect(members.filter(m => m.role === 'owner'), detail).toHaveLength(1)
    }
  })
})

describe('DELETE /api/teams/[team]/members/[userId]', () => {
  it('lets an owner remove a member: the member\'s session is refused, then the team is hidden from them', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const member = await newMember(person, team.slug, 'editor')
    const res = await person.delete(`/api/teams/${team.slug}/members/${member.id}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    const after = await member.person.get(`/api/teams/${team.slug}/members`)
    expect([401, 404]).toContain(after.status)
    expectError(after, after.status)
    // Signed in again, the account exists but the team is gone for it.
    await member.person.login()
    expectError(await member.person.get(`/api/teams/${team.slug}`), 404)
    expectError(await member.person.get(`/api/teams/${team.slug}/members`), 404)
    expect((await member.person.get('/api/me')).body.teams).toEqual([])
    expect((await person.get(`/api/teams/${team.slug}/members`)).body.members.map((m: { userId: number }) => m.userId)).toEqual([user.id])
    const events = await auditEvents('member.removed', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: user.id, targetId: String(member.id) })
  })

  it('refuses removal of others by non-owners with 403', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    const editor = await newMember(person, team.slug, 'editor')
    const viewer = await newMember(person, team.slug, 'viewer')
    expectError(await editor.person.delete(`/api/teams/${team.slug}/members/${viewer.id}`), 403)
    expectError(await viewer.person.delete(`/api/teams/${team.slug}/members/${user.id}`), 403)
    expect((await person.get(`/api/teams/${team.slug}/members`)).body.members).toHaveLength(3)
  })

  it('lets any member leave; the rest of their account goes on', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const member = await newMember(person, team.slug, 'contributor')
    const own = await member.person.post('/api/teams', { name: uniqueTeamName('Own Yard') })
    const res = await member.person.delete(`/api/teams/${team.slug}/members/${member.id}`)
    expect(res.status).toBe(200)
    expectError(await member.person.get(`/api/teams/${team.slug}`), 404)
    const me = await member.person.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.teams.map((t: { slug: string }) => t.slug)).toEqual([own.body.team.slug])
    const events = await auditEvents('member.left', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: member.id, targetId: String(member.id) })
  })

  it('refuses to let the last owner leave with 409', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName())
    await newMember(person, team.slug, 'editor')
    expectError(await person.delete(`/api/teams/${team.slug}/members/${user.id}`), 409, /last owner/)
    expect((await person.get(`/api/teams/${team.slug}`)).body.role).toBe('owner')
  })
})

describe('team isolation', () => {
  it('answers 404, never 403, to people outside the team, as for a team that does not exist', async () => {
    const a = await newOwner(uniqueTeamName('Alder Row'))
    const b = await newOwner(uniqueTeamName('Birch Row'))
    const bEditor = await newMember(b.person, b.team.slug, 'editor')
    const aMember = await newMember(a.person, a.team.slug, 'viewer')
    const attempts: [string, string, unknown?][] = [
      ['GET', `/api/teams/${a.team.slug}`],
      ['PATCH', `/api/teams/${a.team.slug}`, { name: 'Taken Over' }],
      ['GET', `/api/teams/${a.team.slug}/members`],
      ['PATCH', `/api/teams/${a.team.slug}/members/${aMember.id}`, { role: 'owner' }],
      ['DELETE', `/api/teams/${a.team.slug}/members/${aMember.id}`],
      ['GET', `/api/teams/${a.team.slug}/invitations`],
      ['POST', `/api/teams/${a.team.slug}/invitations`, { email: 'intruder@example.test', role: 'owner' }],
      ['DELETE', `/api/teams/${a.team.slug}/invitations/1`],
    ]
    for (const outsider of [b.person, bEditor.person]) {
      for (const [method, path, body] of attempts) {
        const res = await outsider.request(method, path, body)
        expect(expectError(res, 404), `${method} ${path}`).toEqual({ statusCode: 404, message: 'Team not found.' })
        const missing = await outsider.request(method, path.replace(a.team.slug, 'no-such-team-at-all'), body)
        expect(missing.body, `${method} ${path}`).toEqual(res.body)
      }
    }
    // Nothing changed in team A.
    expect((await a.person.get(`/api/teams/${a.team.slug}`)).body.team.name).toBe(a.team.name)
    expect((await a.person.get(`/api/teams/${a.team.slug}/members`)).body.members).toHaveLength(2)
  })

  it('answers 401 on team routes when signed out, and 404 to a malformed team address', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    expectError(await new Person().get(`/api/teams/${team.slug}`), 401)
    expectError(await new Person().get(`/api/teams/${team.slug}/members`), 401)
    expectError(await person.get('/api/teams/Not_A_Slug'), 404)
  })
})
