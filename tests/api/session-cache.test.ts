// The short-lived memory of session checks and memberships (server/utils/auth-cache.ts): a change of access
// counts at once on the instance that made it, and within SESSION_CACHE_MS on another instance that shares
// the database. Each case first makes both instances remember the person, then changes their access.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startAppServer, type AppServer } from '../../scripts/lib/app-server'
import { freePort } from '../../scripts/lib/ports'
import type { Person } from '../support/api'
import { expectError, newMember, newOwner, secondSession, uniqueTeamName } from '../support/api'

// The second instance keeps what it remembered as long as the setting allows (2 s).
const OTHER_TTL_MS = 2000
// Request time and polling on a busy machine, on top of the TTL.
const MARGIN_MS = 1000

describe('remembered session checks and memberships', () => {
  let other: AppServer

  beforeAll(async () => {
    const port = await freePort()
    other = await startAppServer({ port, env: { PUBLIC_URL: `http://127.0.0.1:${port}`, SESSION_CACHE_MS: String(OTHER_TTL_MS) } })
  })
  afterAll(async () => { await other?.stop() })

  /** A request through the other instance with these cookies (a Person's, or a copy taken earlier). */
  const viaOther = async (cookies: Person | string, path: string) => {
    const cookie = typeof cookies === 'string' ? cookies : cookies.cookieHeader()
    const res = await fetch(`${other.url}${path}`, { headers: { cookie, accept: 'application/json' } })
    return { status: res.status, body: await res.json().catch(() => null) as any }
  }

  /** Both instances answer 200 for this person on this path (so both have remembered them). */
  const warm = async (person: Person, path: string) => {
    for (let i = 0; i < 2; i++) {
      expect((await person.get(path)).status).toBe(200)
      expect((await viaOther(person, path)).status).toBe(200)
    }
  }

  /** Polls the other instance until it answers `status`; returns how long that took after `since`. */
  const otherAnswers = async (cookies: Person | string, path: string, status: number, since: number) => {
    for (;;) {
      const res = await viaOther(cookies, path)
      if (res.status === status) return Date.now() - since
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      if (Date.now() - since > OTHER_TTL_MS + MARGIN_MS) throw new Error(`the other instance still answers ${res.status} after ${Date.now() - since} ms`)
      await new Promise(r => setTimeout(r, 50))
    }
  }

  it('a removed member is refused at once here, and within the TTL on the other instance', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Cache Removal'))
    const member = await newMember(owner, team.slug, 'editor')
    const path = `/api/teams/${team.slug}`
    await warm(member.person, path)
    // The cookies as they are now: this instance's 401 below clears them from the member's jar.
    const frozen = member.person.cookieHeader()
    const removed = await owner.delete(`/api/teams/${team.slug}/members/${member.id}`)
    expect(removed.status).toBe(200)
    const done = Date.now()
    expectError(await member.person.get(path), 401)
    const elapsed = await otherAnswers(frozen, path, 401, done)
    expect(elapsed).toBeLessThanOrEqual(OTHER_TTL_MS + MARGIN_MS)
  })

  it('a demoted member loses the old role at once here, and within the TTL on the other instance', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Cache Demotion'))
    const member = await newMember(owner, team.slug, 'editor')
    const res = await member.person.post(`/api/teams/${team.slug}/marks`, { inscriptions: ['PELLOWBY WARE'] })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const mark = res.body.id as number
    const path = `/api/teams/${team.slug}/marks/${mark}`
    await warm(member.person, path)
    const frozen = member.person.cookieHeader()
    expect((await owner.patch(`/api/teams/${team.slug}/members/${member.id}`, { role: 'viewer' })).status).toBe(200)
    const done = Date.now()
    // The role change ends the member's sessions: the editor's session is refused at once ...
    expectError(await member.person.patch(path, { revision: 1, title: 'Pellowby Ware' }), 401)
    const elapsed = await otherAnswers(frozen, path, 401, done)
    expect(elapsed).toBeLessThanOrEqual(OTHER_TTL_MS + MARGIN_MS)
    // ... and signed in again, the member is a viewer on both instances.
    await member.person.login()
    expectError(await member.person.patch(path, { revision: 1, title: 'Pellowby Ware' }), 403)
    expect((await viaOther(member.person, `/api/teams/${team.slug}`)).body.role).toBe('viewer')
  })

  it('signing out everywhere ends the other sessions at once here, and within the TTL on the other instance', async () => {
    const { person, team } = await newOwner(uniqueTeamName('Cache Sign Out'))
    const phone = await secondSession(person)
    const path = `/api/teams/${team.slug}`
    await warm(person, path)
    await warm(phone, path)
    const frozen = phone.cookieHeader()
    expect((await person.post('/api/auth/logout', { everywhere: true })).status).toBe(200)
    const done = Date.now()
    expectError(await phone.get(path), 401)
    const elapsed = await otherAnswers(frozen, path, 401, done)
    expect(elapsed).toBeLessThanOrEqual(OTHER_TTL_MS + MARGIN_MS)
  })

  it('a password change ends the other sessions at once; the changing session goes on', async () => {
    const { person, team } = await newOwner(uniqueTeamName('Cache Password'))
    const phone = await secondSession(person)
    const path = `/api/teams/${team.slug}`
    await warm(phone, path)
    const changed = await person.post('/api/auth/password', { currentPassword: person.password, newPassword: 'kiln-shelf-and-saggar-2026' })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    expectError(await phone.get(path), 401)
    expect((await person.get(path)).status).toBe(200)
  })

  it('a member who leaves (sessions kept) loses the team at once here, and within the TTL on the other instance', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Cache Leaving'))
    const member = await newMember(owner, team.slug, 'contributor')
    const path = `/api/teams/${team.slug}`
    await warm(member.person, path)
    expect((await member.person.delete(`/api/teams/${team.slug}/members/${member.id}`)).status).toBe(200)
    const done = Date.now()
    expectError(await member.person.get(path), 404)
    expect((await member.person.get('/api/me')).status).toBe(200)
    const elapsed = await otherAnswers(member.person, path, 404, done)
    expect(elapsed).toBeLessThanOrEqual(OTHER_TTL_MS + MARGIN_MS)
  })

  it('a renamed team and a renamed person show their new names at once', async () => {
    const { person, team } = await newOwner(uniqueTeamName('Cache Rename'))
    const path = `/api/teams/${team.slug}`
    await warm(person, path)
    const name = uniqueTeamName('Renamed Yard')
    expect((await person.patch(path, { name })).status).toBe(200)
    expect((await person.get(path)).body.team.name).toBe(name)
    expect((await person.patch('/api/me', { name: 'Wren Halloway' })).status).toBe(200)
    expect((await person.get('/api/me')).body.user.name).toBe('Wren Halloway')
  })
})
