// Invitations: sending (mail with link and team name), looking one up, accepting as a new or an existing account,
// single use, revocation, expiry, and who may invite.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, invite, mailTo, newMember, newOwner, Person, STRONG_PASSWORD, uniqueEmail, uniqueTeamName } from '../support/api'
import { auditEvents, closeTestDb, exec, query, teamIdOf, tokenHash } from '../support/db'

afterAll(closeTestDb)

const GONE = /not valid any more/

describe('POST /api/teams/[team]/invitations', () => {
  it('sends the invitee a mail with a link and the team name, answers 201 and records the event', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName('Pebble Wharf'), 'Hollis Grange')
    const email = uniqueEmail('invitee')
    const res = await person.post(`/api/teams/${team.slug}/invitations`, { email, role: 'contributor' })
    expect(res.status).toBe(201)
    expect(res.body).toEqual({ invitation: { id: expect.any(Number), email, role: 'contributor', expiresAt: expect.any(String) } })
    const days = (Date.parse(res.body.invitation.expiresAt) - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(6.9)
    expect(days).toBeLessThanOrEqual(7)

    const [mail] = mailTo(email)
    expect(mail).toBeDefined()
    expect(mail!.subject).toBe(`Hollis Grange invited you to ${team.name} on Tallymark`)
    expect(mail!.text).toContain(`join ${team.name} on Tallymark as contributor`)
    const link = /https?:\/\/\S+\/invitations\/([\w-]+)/.exec(mail!.text)
    expect(link).not.toBeNull()
    expect(link![1]!.length).toBeGreaterThanOrEqual(40)
    // Only the hash of the token is stored.
    const stored = await query<{ token_hash: string }>('select token_hash from invitations where id = ?', [res.body.invitation.id])
    expect(stored[0]!.token_hash).toBe(tokenHash(link![1]!))

    const events = await auditEvents('invitation.created', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: user.id, targetType: 'invitation', targetId: String(res.body.invitation.id), detail: { email, role: 'contributor' } })
  })

  it('escapes the team name in the HTML part of the mail', async () => {
    const { person, team } = await newOwner(uniqueTeamName('Marsh <&> Pine'))
    const email = uniqueEmail('escape')
    const { mail } = await invite(person, team.slug, email, 'viewer')
    expect(mail.text).toContain(`Join ${team.name.replace('<&>', '&lt;&amp;&gt;')}</h1>`)
    expect(mail.text).not.toContain(`Join ${team.name}</h1>`)
  })

  it('lowers the case of the address; refuses bad fields with 400 and existing members with 409', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const email = uniqueEmail('CaseInvite')
    const res = await person.post(`/api/teams/${team.slug}/invitations`, { email: email.toUpperCase(), role: 'viewer' })
    expect(res.status).toBe(201)
    expect(res.body.invitation.email).toBe(email.toLowerCase())

    const bad = await person.post(`/api/teams/${team.slug}/invitations`, { email: 'nope', role: 'chief' })
    expect(Object.keys(expectError(bad, 400).fieldErrors!).sort()).toEqual(['email', 'role'])
    const member = await newMember(person, team.slug, 'viewer')
    const already = await person.post(`/api/teams/${team.slug}/invitations`, { email: member.person.email, role: 'editor' })
    expect(expectError(already, 409, /already a member/).fieldErrors).toEqual({ email: ['Already a member.'] })
    expect(await person.post(`/api/teams/${team.slug}/invitations`, { email: person.email, role: 'viewer' })).toHaveProperty('status', 409)
  })

  it('refuses viewers, contributors and editors with 403 and sends nothing', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    for (const role of ['viewer', 'contributor', 'editor'] as const) {
      const member = await newMember(person, team.slug, role)
      const email = uniqueEmail(`from-${role}`)
      expectError(await member.person.post(`/api/teams/${team.slug}/invitations`, { email, role: 'viewer' }), 403, new RegExp(`you are an? ${role}`))
      expectError(await member.person.get(`/api/teams/${team.slug}/invitations`), 403)
      expect(mailTo(email)).toEqual([])
    }
    expectError(await new Person().post(`/api/teams/${team.slug}/invitations`, { email: uniqueEmail('anon'), role: 'viewer' }), 401)
  })
})

describe('GET /api/teams/[team]/invitations', () => {
  it('lists the team\'s invitations to owners, newest first, without tokens', async () => {
    const { person, team } = await newOwner(uniqueTeamName(), 'Marit Vane')
    const first = await invite(person, team.slug, uniqueEmail('one'), 'viewer')
    const second = await invite(person, team.slug, uniqueEmail('two'), 'editor')
    expect(await exec('update invitations set created_at = ? where id = ?', [new Date(Date.now() - 60_000), first.id])).toBe(1)
    const res = await person.get(`/api/teams/${team.slug}/invitations`)
    expect(res.status).toBe(200)
    const list = res.body.invitations as Record<string, unknown>[]
    expect(list.map(i => i.id)).toEqual([second.id, first.id])
    expect(list[0]).toMatchObject({ role: 'editor', invitedBy: 'Marit Vane', acceptedAt: null, revokedAt: null })
    expect(JSON.stringify(res.body)).not.toMatch(/token/i)
    expect(JSON.stringify(res.body)).not.toContain(first.token)
  })
})

describe('GET /api/invitations/[token]', () => {
  it('describes an open invitation to anyone holding the link', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const email = uniqueEmail('lookup')
    const { token } = await invite(person, team.slug, email, 'editor')
    const res = await new Person().get(`/api/invitations/${token}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ invitation: { email, role: 'editor', team: { name: team.name }, accountExists: false, expiresAt: expect.any(String) } })
  })

  it('says when the invited address already has an account', async () => {
    const { person, team } = await newOwner(uniqueTeamName())
    const existing = await newOwner(uniqueTeamName())
    const { token } = await invite(person, team.slug, existing.person.email, 'viewer')
    expect((await new Person().get(`/api/invitations/${token}`)).body.invitation.accountExists).toBe(true)
  })

  it('answers 404 to an unknown token', async () => {
    expectError(await new Person().get('/api/invitations/this-token-was-never-issued-by-anyone-at-all'), 404, GONE)
  })
})

describe('POST /api/invitations/[token]/accept', () => {
  it('creates a new account from a name and a password, signs it in, and makes it a member with the invited role', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const newcomer = new Person(uniqueEmail('newcomer'), 'a-lamp-in-the-attic')
    const { token, id } = await invite(owner, team.slug, newcomer.email, 'contributor')
    const res = await newcomer.post(`/api/invitations/${token}/accept`, { name: ' Solveig Dunmore ', password: newcomer.password })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ team: { slug: team.slug, name: team.name }, role: 'contributor' })
    const me = await newcomer.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user).toEqual({ id: expect.any(Number), email: newcomer.email, name: 'Solveig Dunmore' })
    expect(me.body.teams).toEqual([expect.objectContaining({ slug: team.slug, name: team.name, role: 'contributor' })])
    expect((await new Person().post('/api/auth/login', { email: newcomer.email, password: newcomer.password })).status).toBe(200)

    const listed = (await owner.get(`/api/teams/${team.slug}/invitations`)).body.invitations.find((i: { id: number }) => i.id === id)
    expect(listed.acceptedAt).not.toBeNull()
    const events = await auditEvents('invitation.accepted', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: me.body.user.id, targetId: String(id) })
  })

  it('asks a newcomer for a name and a password, applies the password policy, and leaves the invitation open', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const newcomer = new Person(uniqueEmail('newcomer'))
    const { token } = await invite(owner, team.slug, newcomer.email, 'viewer')
    const empty = await newcomer.post(`/api/invitations/${token}/accept`, {})
    expect(expectError(empty, 400).fieldErrors).toEqual({ name: ['Enter your name.'], password: ['Choose a password.'] })
    const common = await newcomer.post(`/api/invitations/${token}/accept`, { name: 'Pell Arden', password: 'password1' })
    expect(expectError(common, 400, /commonly used/).fieldErrors).toEqual({ password: [expect.stringMatching(/commonly used/)] })
    const short = await newcomer.post(`/api/invitations/${token}/accept`, { name: 'Pell Arden', password: 'short' })
    expect(expectError(short, 400).fieldErrors).toEqual({ password: ['Use at least 8 characters.'] })
    expect(newcomer.cookieHeader()).toBe('')
    expect(await query('select id from users where email = ?', [newcomer.email])).toEqual([])
    expect((await new Person().get(`/api/invitations/${token}`)).status).toBe(200)
    expect((await newcomer.post(`/api/invitations/${token}/accept`, { name: 'Pell Arden', password: STRONG_PASSWORD })).status).toBe(200)
  })

  it('adds an existing, signed-in account to the team; its session goes on', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName('Zephyr Lot'))
    const existing = await newOwner(uniqueTeamName('Amber Lot'))
    const { token } = await invite(owner, team.slug, existing.person.email, 'editor')
    // A name and a password sent along are ignored: they change nothing of the existing account.
    const res = await existing.person.post(`/api/invitations/${token}/accept`, { name: 'Someone Else', password: 'an-entirely-other-phrase' })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ team: { slug: team.slug, name: team.name }, role: 'editor' })
    const me = await existing.person.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.id).toBe(existing.user.id)
    expect(me.body.teams.map((t: { slug: string, role: string }) => [t.slug, t.role])).toEqual([[existing.team.slug, 'owner'], [team.slug, 'editor']])
    expect(me.body.user.name).toBe('Owner Person')
    expect((await existing.person.get(`/api/teams/${team.slug}/members`)).status).toBe(200)
    expect((await new Person().post('/api/auth/login', { email: existing.person.email, password: existing.person.password })).status).toBe(200)
    expect(await query('select id from users where email = ?', [existing.person.email])).toHaveLength(1)
  })

  it('asks an existing account to sign in first (401)', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const existing = await newOwner(uniqueTeamName())
    const { token } = await invite(owner, team.slug, existing.person.email, 'viewer')
    const res = await new Person().post(`/api/invitations/${token}/accept`, { name: 'Imposter', password: 'a-takeover-attempt' })
    expectError(res, 401, /sign in first/)
    expect((await new Person().post('/api/auth/login', { email: existing.person.email, password: 'a-takeover-attempt' })).status).toBe(401)
    expect((await existing.person.post(`/api/invitations/${token}/accept`)).status).toBe(200)
  })

  it('refuses a signed-in account other than the invited one with 403, and the invitation stays usable', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const invited = new Person(uniqueEmail('rightful'))
    const { token } = await invite(owner, team.slug, invited.email, 'viewer')
    const wrong = await newOwner(uniqueTeamName())
    expectError(await wrong.person.post(`/api/invitations/${token}/accept`), 403, invited.email)
    expect((await wrong.person.get('/api/me')).body.teams).toHaveLength(1)
    expect((await invited.post(`/api/invitations/${token}/accept`, { name: 'Rightful Person', password: STRONG_PASSWORD })).status).toBe(200)
  })

  it('works once: reusing the token is refused, by anyone', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const invited = new Person(uniqueEmail('once'))
    const { token } = await invite(owner, team.slug, invited.email, 'viewer')
    expect((await invited.post(`/api/invitations/${token}/accept`, { name: 'Once Only', password: STRONG_PASSWORD })).status).toBe(200)
    expectError(await invited.post(`/api/invitations/${token}/accept`), 404, GONE)
    expectError(await new Person().post(`/api/invitations/${token}/accept`, { name: 'Second Go', password: STRONG_PASSWORD }), 404, GONE)
    expectError(await new Person().get(`/api/invitations/${token}`), 404, GONE)
  })

  it('makes exactly one account when the same link is accepted twice at once', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const email = uniqueEmail('double')
    const { token } = await invite(owner, team.slug, email, 'viewer')
    const results = await Promise.all([new Person(email), new Person(email)].map(p =>
      p.post(`/api/invitations/${token}/accept`, { name: 'Double Click', password: STRONG_PASSWORD })))
    expect(results.map(r => r.status).filter(s => s === 200), JSON.stringify(results.map(r => r.body))).toHaveLength(1)
    for (const r of results) expect(r.status).toBeLessThan(500)
    expect(await query('select id from users where email = ?', [email])).toHaveLength(1)
  })

  it('answers 409, not 500, when invitations of two teams for one new address are accepted at once', async () => {
    const a = await newOwner(uniqueTeamName())
    const b = await newOwner(uniqueTeamName())
    const email = uniqueEmail('twoteams')
    const first = await invite(a.person, a.team.slug, email, 'viewer')
    const second = await invite(b.person, b.team.slug, email, 'editor')
    const results = await Promise.all([first, second].map(i =>
      new Person(email).post(`/api/invitations/${i.token}/accept`, { name: 'Both At Once', password: STRONG_PASSWORD })))
    const detail = JSON.stringify(results.map(r => [r.status, r.body]))
    expect(results.filter(r => r.status === 200), detail).toHaveLength(1)
    const loser = results.findIndex(r => r.status !== 200)
    expectError(results[loser]!, 409, /just created/)
    expect(await query('select id from users where email = ?', [email])).toHaveLength(1)
    // The refused invitation is still open: signed in, the account accepts it.
    const person = new Person(email, STRONG_PASSWORD)
    await person.login()
    expect((await person.post(`/api/invitations/${[first, second][loser]!.token}/accept`)).status).toBe(200)
    expect((await person.get('/api/me')).body.teams).toHaveLength(2)
  })

  it('refuses a revoked invitation', async () => {
    const { person: owner, team, user } = await newOwner(uniqueTeamName())
    const invited = new Person(uniqueEmail('revoked'))
    const { token, id } = await invite(owner, team.slug, invited.email, 'editor')
    const res = await owner.delete(`/api/teams/${team.slug}/invitations/${id}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    expectError(await new Person().get(`/api/invitations/${token}`), 404, GONE)
    expectError(await invited.post(`/api/invitations/${token}/accept`, { name: 'Too Late', password: STRONG_PASSWORD }), 404, GONE)
    expect(await query('select id from users where email = ?', [invited.email])).toEqual([])
    // Revoking again, or an accepted one, or one of another team: 404.
    expectError(await owner.delete(`/api/teams/${team.slug}/invitations/${id}`), 404)
    const other = await newOwner(uniqueTeamName())
    const foreign = await invite(other.person, other.team.slug, uniqueEmail('foreign'), 'viewer')
    expectError(await owner.delete(`/api/teams/${team.slug}/invitations/${foreign.id}`), 404)
    expect((await new Person().get(`/api/invitations/${foreign.token}`)).status).toBe(200)
    const events = await auditEvents('invitation.revoked', { teamId: await teamIdOf(team.slug) })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: user.id, targetId: String(id) })
  })

  it('refuses revocation by non-owners with 403', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const editor = await newMember(owner, team.slug, 'editor')
    const { id, token } = await invite(owner, team.slug, uniqueEmail('keep'), 'viewer')
    expectError(await editor.person.delete(`/api/teams/${team.slug}/invitations/${id}`), 403)
    expect((await new Person().get(`/api/invitations/${token}`)).status).toBe(200)
  })

  it('refuses an expired invitation', async () => {
    const { person: owner, team } = await newOwner(uniqueTeamName())
    const invited = new Person(uniqueEmail('expired'))
    const { token } = await invite(owner, team.slug, invited.email, 'viewer')
    expect(await exec('update invitations set expires_at = ? where token_hash = ?', [new Date(Date.now() - 60_000), tokenHash(token)])).toBe(1)
    expectError(await new Person().get(`/api/invitations/${token}`), 404, GONE)
    expectError(await invited.post(`/api/invitations/${token}/accept`, { name: 'Too Late', password: STRONG_PASSWORD }), 404, GONE)
  })
})
