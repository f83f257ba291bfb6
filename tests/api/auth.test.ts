// Registration, sign-in, sign-out, the current user, password change, sign-in throttling and the error body.
// All tests share one client address, which may fail 100 sign-ins per 15 minutes (server/utils/accounts.ts): keep failures few.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, newOwner, Person, secondSession, STRONG_PASSWORD, uniqueEmail, uniqueTeamName } from '../support/api'
import { auditEvents, closeTestDb, query } from '../support/db'

afterAll(closeTestDb)

const SESSION_COOKIE = 'tallymark-session'
const BAD_CREDENTIALS = 'That e-mail and password do not match an account.'

function register(person: Person, fields: Partial<{ email: string, password: string, name: string, teamName: string }> = {}) {
  return person.post('/api/auth/register', { email: person.email, password: STRONG_PASSWORD, name: 'Juniper Oakes', teamName: uniqueTeamName('Saltmarsh Finds'), ...fields })
}

describe('POST /api/auth/register', () => {
  it('creates the account and its team, answers 201 { user, team } and signs the person in', async () => {
    const person = new Person(uniqueEmail('reg'))
    const teamName = uniqueTeamName('Saltmarsh Finds')
    const res = await register(person, { teamName })
    expect(res.status).toBe(201)
    expect(res.body).toEqual({
      user: { id: expect.any(Number), email: person.email, name: 'Juniper Oakes' },
      team: { slug: expect.stringMatching(/^saltmarsh-finds-[0-9a-f]{8}$/), name: teamName },
    })
    expect(person.cookieHeader()).toContain(`${SESSION_COOKIE}=`)
    const me = await person.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user).toEqual(res.body.user)
    expect(me.body.teams).toEqual([expect.objectContaining({ slug: res.body.team.slug, name: teamName, role: 'owner' })])
    expect(await auditEvents('auth.register', { userId: res.body.user.id })).toHaveLength(1)
  })

  it('stores the e-mail trimmed and in lower case, so sign-in works with any letter case', async () => {
    const email = uniqueEmail('Mixed.Case')
    const person = new Person()
    const res = await register(person, { email: `  ${email.toUpperCase()} ` })
    expect(res.status).toBe(201)
    expect(res.body.user.email).toBe(email.toLowerCase())
    expect((await new Person().post('/api/auth/login', { email: email.toUpperCase(), password: STRONG_PASSWORD })).status).toBe(200)
  })

  it('gives a second team of the same name its own address', async () => {
    const teamName = uniqueTeamName('Twin Name')
    const first = await register(new Person(uniqueEmail('twin')), { teamName })
    const second = await register(new Person(uniqueEmail('twin')), { teamName })
    expect(first.status).toBe(201)
    expect(second.status).toBe(201)
    expect(second.body.team.name).toBe(teamName)
    expect(second.body.team.slug).toBe(`${first.body.team.slug}-2`)
  })

  it('refuses an e-mail that already has an account with 409, also in another letter case', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const again = await register(new Person(person.email))
    expect(expectError(again, 409, /already exists/).fieldErrors).toEqual({ email: ['An account with this e-mail already exists.'] })
    const upper = await register(new Person(person.email.toUpperCase()))
    expectError(upper, 409)
    expect(await query('select id from users where email = ?', [person.email])).toHaveLength(1)
  })

  it('makes one account when the same e-mail registers several times at once; the others get 409, not 500', async () => {
    const email = uniqueEmail('race')
    const results = await Promise.all([1, 2, 3].map(() => register(new Person(email))))
    const detail = JSON.stringify(results.map(r => [r.status, r.body]))
    expect(results.filter(r => r.status === 201), detail).toHaveLength(1)
    for (const r of results.filter(r => r.status !== 201)) expectError(r, 409, /already exists/)
    expect(await query('select id from users where email = ?', [email])).toHaveLength(1)
  })

  it('answers bad fields with 400 and a message per field', async () => {
    const person = new Person()
    const res = await person.post('/api/auth/register', { email: 'not-an-address', password: 'short', name: '', teamName: 'x' })
    const body = expectError(res, 400, /^Please check the form: /)
    expect(body.fieldErrors).toEqual({
      email: ['Enter an e-mail address like name@example.com.'],
      password: ['Use at least 8 characters.'],
      name: ['Enter your name.'],
      teamName: ['Team names need at least 2 characters.'],
    })
    expect(person.cookieHeader()).toBe('')
  })

  it('refuses a commonly used password and creates nothing', async () => {
    for (const password of ['password1', 'qwerty123']) {
      const person = new Person(uniqueEmail('common'))
      const res = await register(person, { password })
      expect(expectError(res, 400, /commonly used/).fieldErrors).toEqual({ password: [expect.stringMatching(/commonly used/)] })
      expect(person.cookieHeader()).toBe('')
      expect(await query('select id from users where email = ?', [person.email])).toEqual([])
    }
  })

  it('refuses the e-mail address as the password', async () => {
    const email = uniqueEmail('selfpass')
    expectError(await register(new Person(email), { password: email }), 400, /e-mail address/)
  })

  it('accepts a passphrase with no digits, capitals or symbols (no composition rules)', async () => {
    const person = new Person(uniqueEmail('phrase'))
    expect((await register(person, { password: 'correct horse battery' })).status).toBe(201)
  })
})

describe('POST /api/auth/login', () => {
  it('answers 200 { user } with an http-only session cookie', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const fresh = new Person()
    const res = await fresh.post('/api/auth/login', { email: person.email, password: person.password })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ user: { id: user.id, email: person.email, name: 'Owner Person' } })
    const cookie = res.headers.getSetCookie().find(c => c.startsWith(`${SESSION_COOKIE}=`))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect((await fresh.get('/api/me')).status).toBe(200)
    const logins = await auditEvents('auth.login', { userId: user.id })
    expect(logins).toHaveLength(1)
    expect(logins[0]!.ip).toBeTruthy()
  })

  it('answers a wrong password and an unknown e-mail alike: 401 with the same body', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const failuresBefore = (await auditEvents('auth.login_failed', { userId: user.id })).length
    const unknownBefore = (await query<{ n: number }>(`select count(*) as n from audit_events where action = 'auth.login_failed' and json_value(detail, '$.reason') = 'unknown-email'`))[0]!.n

    const wrong = await new Person().post('/api/auth/login', { email: person.email, password: 'not-the-right-one' })
    const unknown = await new Person().post('/api/auth/login', { email: uniqueEmail('nobody'), password: 'not-the-right-one' })
    expectError(wrong, 401, BAD_CREDENTIALS)
    expectError(unknown, 401, BAD_CREDENTIALS)
    expect(unknown.body).toEqual(wrong.body)
    expect(wrong.body).toEqual({ statusCode: 401, message: BAD_CREDENTIALS })
    expect(wrong.headers.getSetCookie().some(c => c.startsWith(`${SESSION_COOKIE}=`) && !/max-age=0/i.test(c))).toBe(false)

    const failed = await auditEvents('auth.login_failed', { userId: user.id })
    expect(failed).toHaveLength(failuresBefore + 1)
    expect(failed.at(-1)!.detail).toEqual({ failures: 1 })
    const unknownAfter = (await query<{ n: number }>(`select count(*) as n from audit_events where action = 'auth.login_failed' and json_value(detail, '$.reason') = 'unknown-email'`))[0]!.n
    expect(Number(unknownAfter)).toBe(Number(unknownBefore) + 1)
  })

  it('asks for missing fields with 400', async () => {
    const body = expectError(await new Person().post('/api/auth/login', { email: 'someone@example.test', password: '' }), 400)
    expect(body.fieldErrors).toEqual({ password: ['Enter your password.'] })
    expect(Object.keys(expectError(await new Person().post('/api/auth/login', {}), 400).fieldErrors!).sort()).toEqual(['email', 'password'])
  })
})

describe('POST /api/auth/logout', () => {
  it('ends the session of this client', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const res = await person.post('/api/auth/logout')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    expect(person.cookieHeader()).not.toContain(`${SESSION_COOKIE}=`)
    expectError(await person.get('/api/me'), 401)
  })

  it('is harmless when signed out', async () => {
    const res = await new Person().post('/api/auth/logout')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
  })

  it('with { everywhere: true } also ends the sessions of other clients', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const laptop = await secondSession(person)
    const bystander = await secondSession(person)
    expect((await laptop.get('/api/me')).status).toBe(200)
    expect((await person.post('/api/auth/logout', { everywhere: true })).status).toBe(200)
    expectError(await laptop.get('/api/me'), 401)
    expectError(await bystander.get('/api/me'), 401)
    expectError(await person.get('/api/me'), 401)
    expect(await auditEvents('auth.logout_everywhere', { userId: user.id })).toHaveLength(1)
    // Signing in again works.
    await laptop.login()
    expect((await laptop.get('/api/me')).status).toBe(200)
  })
})

describe('GET /api/me', () => {
  it('answers { user: { id, email, name }, teams: [{ slug, name, role }] } and nothing secret', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName('Gull Street'), 'Ines Marlow')
    const second = await person.post('/api/teams', { name: uniqueTeamName('Aardvark Annex') })
    expect(second.status).toBe(201)
    const res = await person.get('/api/me')
    expect(res.status).toBe(200)
    expect(Object.keys(res.body).sort()).toEqual(['teams', 'user'])
    expect(res.body.user).toEqual({ id: user.id, email: person.email, name: 'Ines Marlow' })
    // Sorted by team name.
    expect(res.body.teams).toEqual([
      expect.objectContaining({ slug: second.body.team.slug, name: second.body.team.name, role: 'owner' }),
      expect.objectContaining({ slug: team.slug, name: team.name, role: 'owner' }),
    ])
    expect(JSON.stringify(res.body)).not.toMatch(/password|hash|session_?version/i)
  })

  it('answers 401 when signed out', async () => {
    const res = await new Person().get('/api/me')
    expect(expectError(res, 401)).toEqual({ statusCode: 401, message: 'Sign in to continue.' })
  })

  it('answers 401, not 500, to a forged or garbled session cookie', async () => {
    for (const value of ['garbage', 'Fe26.2**deadbeef*abc*def**ghi*jkl', '']) {
      const res = await new Person().request('GET', '/api/me', undefined, { cookie: `${SESSION_COOKIE}=${value}` })
      expectError(res, 401)
    }
  })

  it('PATCH changes the name', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const res = await person.patch('/api/me', { name: '  Odile Brack ' })
    expect(res.status).toBe(200)
    expect(res.body.user.name).toBe('Odile Brack')
    expect((await person.get('/api/me')).body.user.name).toBe('Odile Brack')
    expect(expectError(await person.patch('/api/me', { name: '' }), 400).fieldErrors).toEqual({ name: ['Enter your name.'] })
    expectError(await new Person().patch('/api/me', { name: 'Nobody' }), 401)
  })
})

describe('error bodies', () => {
  it('are JSON { statusCode, message } and never cached', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const res = await person.get('/api/teams/no-such-team-here')
    expect(expectError(res, 404)).toEqual({ statusCode: 404, message: 'Team not found.' })
    expect(res.headers.get('cache-control')).toBe('no-store')
  })

  it('carry fieldErrors for bad fields', async () => {
    const res = await new Person().post('/api/auth/password-reset', { email: 'bad' })
    expect(expectError(res, 400).fieldErrors).toEqual({ email: ['Enter an e-mail address like name@example.com.'] })
  })

  it('answer a body that is not JSON with 400, not 500', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const cases: [Person, string][] = [
      [new Person(), '/api/auth/login'],
      [new Person(), '/api/auth/register'],
      [new Person(), '/api/auth/password-reset'],
      [person, '/api/auth/password'],
      [person, '/api/teams'],
    ]
    for (const [who, path] of cases) {
      for (const raw of ['{"email": ', 'email=a@example.test', '[1, 2', '"just a string"', '[]', 'null']) {
        const res = await who.post(path, raw)
        expect(res.status, `${path} ${raw}: ${JSON.stringify(res.body)}`).toBe(400)
        expectError(res, 400)
      }
    }
    // The session is untouched by the refused requests.
    expect((await person.get('/api/me')).status).toBe(200)
  })
})

describe('POST /api/auth/password', () => {
  it('changes the password: this session continues, every other session is refused', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const elsewhere = await secondSession(person)
    const res = await person.post('/api/auth/password', { currentPassword: STRONG_PASSWORD, newPassword: 'a-brand-new-passphrase' })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    expect((await person.get('/api/me')).status).toBe(200)
    expectError(await elsewhere.get('/api/me'), 401)
    expectError(await new Person().post('/api/auth/login', { email: person.email, password: STRONG_PASSWORD }), 401)
    expect((await new Person().post('/api/auth/login', { email: person.email, password: 'a-brand-new-passphrase' })).status).toBe(200)
    expect(await auditEvents('auth.password_changed', { userId: user.id })).toHaveLength(1)
  })

  it('refuses a wrong current password and keeps the old one', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const res = await person.post('/api/auth/password', { currentPassword: 'not-my-password', newPassword: 'a-brand-new-passphrase' })
    expect(expectError(res, 400).fieldErrors).toEqual({ currentPassword: ['This is not your current password.'] })
    expect((await person.get('/api/me')).status).toBe(200)
    expect((await new Person().post('/api/auth/login', { email: person.email, password: STRONG_PASSWORD })).status).toBe(200)
    expect(await auditEvents('auth.password_changed', { userId: user.id })).toEqual([])
  })

  it('applies the password policy to the new password', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const common = await person.post('/api/auth/password', { currentPassword: STRONG_PASSWORD, newPassword: 'qwerty123' })
    expect(expectError(common, 400, /commonly used/).fieldErrors).toEqual({ newPassword: [expect.stringMatching(/commonly used/)] })
    const short = await person.post('/api/auth/password', { currentPassword: STRONG_PASSWORD, newPassword: 'tiny' })
    expect(expectError(short, 400).fieldErrors).toEqual({ newPassword: ['Use at least 8 characters.'] })
    expect((await new Person().post('/api/auth/login', { email: person.email, password: STRONG_PASSWORD })).status).toBe(200)
  })

  it('needs a session', async () => {
    expectError(await new Person().post('/api/auth/password', { currentPassword: STRONG_PASSWORD, newPassword: 'a-brand-new-passphrase' }), 401)
  })
})

describe('sign-in throttling', () => {
  it('after 10 failed sign-ins for one account answers 429 with Retry-After, even to the right password', async () => {
    // A dedicated account: its counter must not be touched by other tests.
    const { person, user } = await newOwner(uniqueTeamName('Throttle'))
    for (let i = 1; i <= 10; i++) {
      const res = await new Person().post('/api/auth/login', { email: person.email, password: `wrong-guess-${i}` })
      expectError(res, 401, BAD_CREDENTIALS)
    }
    const blocked = await new Person().post('/api/auth/login', { email: person.email, password: 'wrong-guess-11' })
    expectError(blocked, 429, /Too many failed sign-ins/)
    const retryAfter = Number(blocked.headers.get('retry-after'))
    expect(Number.isInteger(retryAfter)).toBe(true)
    expect(retryAfter).toBeGreaterThan(0)
    expect(retryAfter).toBeLessThanOrEqual(15 * 60)

    const right = new Person()
    expectError(await right.post('/api/auth/login', { email: person.email, password: person.password }), 429)
    expect(right.cookieHeader()).toBe('')
    // The block is per account: the account's existing session and other accounts are unaffected.
    expect((await person.get('/api/me')).status).toBe(200)
    const other = await newOwner(uniqueTeamName())
    expect((await new Person().post('/api/auth/login', { email: other.person.email, password: other.person.password })).status).toBe(200)
    expect(await auditEvents('auth.login_failed', { userId: user.id })).toHaveLength(10)
  })
})
