// CSRF: state-changing requests from another origin are refused; the app's own origin and plain tools pass.
import { describe, expect, it } from 'vitest'
import { Person, STRONG_PASSWORD, baseUrl, newOwner } from '../support/api'

describe('origin check on state-changing requests', () => {
  it('refuses a sign-in posted from another site', async () => {
    const { person } = await newOwner('Origin Team')
    const res = await new Person().request('POST', '/api/auth/login', { email: person.email, password: STRONG_PASSWORD }, { origin: 'https://evil.example' })
    expect(res.status).toBe(403)
    expect(res.body.message).toMatch(/cross-site/i)
  })

  it('refuses Sec-Fetch-Site: cross-site even without Origin', async () => {
    const { person, team } = await newOwner('Origin Fetch')
    const res = await person.request('POST', `/api/teams/${team.slug}/invitations`, { email: 'x@example.test', role: 'viewer' }, { 'sec-fetch-site': 'cross-site' })
    expect(res.status).toBe(403)
  })

  it('accepts the app\'s own origin', async () => {
    const { person } = await newOwner('Origin Own')
    const res = await new Person().request('POST', '/api/auth/login', { email: person.email, password: STRONG_PASSWORD }, { 'origin': baseUrl, 'sec-fetch-site': 'same-origin' })
    expect(res.status).toBe(200)
  })
})

describe('an owner ends a member\'s sessions', () => {
  it('signs the member out everywhere; only owners may', async () => {
    const { person: owner, team } = await newOwner('Sessions Team')
    const member = new Person(`m.${Date.now()}@example.test`, STRONG_PASSWORD)
    const invite = await owner.post(`/api/teams/${team.slug}/invitations`, { email: member.email, role: 'editor' })
    expect(invite.status).toBe(201)
    const { waitForMail, linkIn } = await import('../support/api')
    const token = linkIn(await waitForMail(member.email), '/invitations/').split('/').pop()
    expect((await member.post(`/api/invitations/${token}/accept`, { name: 'Member', password: STRONG_PASSWORD })).status).toBe(200)
    const me = await member.get('/api/me')
    expect(me.status).toBe(200)
    expect((await member.delete(`/api/teams/${team.slug}/members/${me.body.user.id}/sessions`)).status).toBe(403)
    expect((await owner.delete(`/api/teams/${team.slug}/members/${me.body.user.id}/sessions`)).status).toBe(200)
    expect((await member.get('/api/me')).status).toBe(401)
  })
})
