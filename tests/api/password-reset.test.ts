// Password reset: the request (always 202), the mail and its link, single use, expiry, session revocation, throttling.
// All tests share one client address, which may ask for 30 resets an hour (server/utils/accounts.ts); this file asks ~15.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, linkIn, mailTo, newOwner, Person, secondSession, STRONG_PASSWORD, tokenOf, uniqueEmail, uniqueTeamName, waitForMail } from '../support/api'
import { auditEvents, closeTestDb, exec, query, tokenHash } from '../support/db'

afterAll(closeTestDb)

const NEW_PASSWORD = 'moss-on-the-north-wall'

async function requestReset(email: string) {
  const before = mailTo(email).length
  const res = await new Person().post('/api/auth/password-reset', { email })
  expect(res.status).toBe(202)
  const mail = await waitForMail(email, before + 1)
  return { res, mail, token: tokenOf(linkIn(mail, '/reset/')) }
}

function confirm(token: string, password = NEW_PASSWORD) {
  return new Person().post('/api/auth/password-reset/confirm', { token, password })
}

describe('POST /api/auth/password-reset', () => {
  it('answers 202 with the same body whether or not an account exists, and mails only a real account', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const unknownEmail = uniqueEmail('nobody')
    const unknown = await new Person().post('/api/auth/password-reset', { email: unknownEmail })
    const known = await new Person().post('/api/auth/password-reset', { email: person.email })
    expect(unknown.status).toBe(202)
    expect(known.status).toBe(202)
    expect(known.body).toEqual(unknown.body)
    expect(known.body).toEqual({ ok: true, message: 'If an account exists for this address, a reset link is on its way.' })
    // The mail is handed to SMTP before the answer, so the catcher has it (or not) by now.
    expect(mailTo(person.email)).toHaveLength(1)
    expect(mailTo(unknownEmail)).toEqual([])
  })

  it('mails a link to the reset page that names the account\'s teams', async () => {
    const { person, team, user } = await newOwner(uniqueTeamName('Lantern Quay'))
    const { mail, token } = await requestReset(person.email)
    expect(mail.subject).toBe('Reset your Tallymark password')
    expect(mail.text).toContain(team.name)
    expect(mail.text).toMatch(/expires in 1 hour/)
    expect(linkIn(mail, '/reset/')).toMatch(new RegExp(`^${process.env.TALLYMARK_TEST_URL}/reset/`))
    const rows = await query<{ user_id: number, used_at: Date | null }>('select user_id, used_at from password_reset_tokens where token_hash = ?', [tokenHash(token)])
    expect(rows).toHaveLength(1)
    expect(Number(rows[0]!.user_id)).toBe(user.id)
    expect(rows[0]!.used_at).toBeNull()
    expect(await auditEvents('auth.password_reset_requested', { userId: user.id })).toHaveLength(1)
  })

  it('finds the account whatever the letter case of the address', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const res = await new Person().post('/api/auth/password-reset', { email: `  ${person.email.toUpperCase()}` })
    expect(res.status).toBe(202)
    await waitForMail(person.email)
  })

  it('refuses a malformed address with 400', async () => {
    expect(expectError(await new Person().post('/api/auth/password-reset', { email: 'not-an-address' }), 400).fieldErrors)
      .toEqual({ email: ['Enter an e-mail address like name@example.com.'] })
  })

  it('answers 429 with Retry-After after 5 requests for one address within the hour', async () => {
    const { person } = await newOwner(uniqueTeamName())
    for (let i = 0; i < 5; i++) expect((await new Person().post('/api/auth/password-reset', { email: person.email })).status).toBe(202)
    const blocked = await new Person().post('/api/auth/password-reset', { email: person.email })
    expectError(blocked, 429, /Too many reset requests/)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(mailTo(person.email)).toHaveLength(5)
  })
})

describe('POST /api/auth/password-reset/confirm', () => {
  it('sets the new password: the old one stops working, the new one signs in', async () => {
    const { person, user } = await newOwner(uniqueTeamName())
    const { token } = await requestReset(person.email)
    const res = await confirm(token)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true })
    expectError(await new Person().post('/api/auth/login', { email: person.email, password: STRONG_PASSWORD }), 401)
    expect((await new Person().post('/api/auth/login', { email: person.email, password: NEW_PASSWORD })).status).toBe(200)
    expect(await auditEvents('auth.password_reset', { userId: user.id })).toHaveLength(1)
  })

  it('ends every session of the account', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const phone = await secondSession(person)
    const { token } = await requestReset(person.email)
    expect((await confirm(token)).status).toBe(200)
    expectError(await person.get('/api/me'), 401)
    expectError(await phone.get('/api/me'), 401)
  })

  it('works once', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const { token } = await requestReset(person.email)
    expect((await confirm(token)).status).toBe(200)
    const again = await confirm(token, 'yet-another-fresh-passphrase')
    expect(expectError(again, 400, /not valid any more/).fieldErrors).toHaveProperty('token')
    expect((await new Person().post('/api/auth/login', { email: person.email, password: NEW_PASSWORD })).status).toBe(200)
  })

  it('lets only one of two simultaneous uses through', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const { token } = await requestReset(person.email)
    const results = await Promise.all([confirm(token, 'first-of-two-passphrases'), confirm(token, 'second-of-two-passphrases')])
    const statuses = results.map(r => r.status).sort()
    expect(statuses, JSON.stringify(results.map(r => r.body))).toEqual([200, 400])
    const winner = results[0]!.status === 200 ? 'first-of-two-passphrases' : 'second-of-two-passphrases'
    expect((await new Person().post('/api/auth/login', { email: person.email, password: winner })).status).toBe(200)
  })

  it('refuses an expired link and keeps the password', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const { token } = await requestReset(person.email)
    expect(await exec('update password_reset_tokens set expires_at = ? where token_hash = ?', [new Date(Date.now() - 60_000), tokenHash(token)])).toBe(1)
    const [row] = await query<{ expired: number }>('select expires_at < utc_timestamp(3) as expired from password_reset_tokens where token_hash = ?', [tokenHash(token)])
    expect(Number(row!.expired)).toBe(1)
    const res = await confirm(token)
    expect(expectError(res, 400, /not valid any more/).fieldErrors).toHaveProperty('token')
    expect((await new Person().post('/api/auth/login', { email: person.email, password: STRONG_PASSWORD })).status).toBe(200)
    expect((await person.get('/api/me')).status).toBe(200)
  })

  it('refuses a token that was never issued', async () => {
    expectError(await confirm('x'.repeat(43)), 400, /not valid any more/)
  })

  it('applies the password policy, and a refused password does not use up the link', async () => {
    const { person } = await newOwner(uniqueTeamName())
    const { token } = await requestReset(person.email)
    const common = await confirm(token, 'qwerty123')
    expect(expectError(common, 400, /commonly used/).fieldErrors).toEqual({ password: [expect.stringMatching(/commonly used/)] })
    const mine = await confirm(token, person.email)
    expect(expectError(mine, 400, /e-mail address/).fieldErrors).toHaveProperty('password')
    const short = await confirm(token, 'short')
    expect(expectError(short, 400).fieldErrors).toEqual({ password: ['Use at least 8 characters.'] })
    expect((await confirm(token)).status).toBe(200)
  })

  it('refuses a malformed request with 400', async () => {
    const res = await new Person().post('/api/auth/password-reset/confirm', { token: 'short' })
    expect(Object.keys(expectError(res, 400).fieldErrors!).sort()).toEqual(['password', 'token'])
  })
})
