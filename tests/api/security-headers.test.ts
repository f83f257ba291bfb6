// Browser-facing HTTP hardening (OWASP ASVS 5.0 V3): security headers, CSP with a nonce, cookie flags,
// and in production HSTS plus a Secure __Host- session cookie.
import { afterAll, describe, expect, it } from 'vitest'
import { Person, STRONG_PASSWORD, baseUrl, newOwner } from '../support/api'
import { startAppServer, type AppServer } from '../../scripts/lib/app-server'
import { freePort } from '../../scripts/lib/ports'

describe('security headers', () => {
  it('sends a nonce-based CSP and the usual headers on pages', async () => {
    const res = await fetch(`${baseUrl}/login`)
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    expect(csp).toMatch(/script-src [^;]*'nonce-[A-Za-z0-9+/=_-]{16,}'/)
    expect(csp).toContain('object-src \'none\'')
    expect(csp).toContain('frame-ancestors \'none\'')
    const nonce = /'nonce-([^']+)'/.exec(csp)![1]
    const html = await res.text()
    // Every inline script carries the nonce of this response.
    const scripts = [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>/g)].map(m => m[0])
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('x-frame-options')).toMatch(/deny|sameorigin/i)
    expect(res.headers.get('referrer-policy')).toBeTruthy()
    expect(res.headers.get('strict-transport-security')).toBeNull()
  })

  it('marks the session cookie HttpOnly and SameSite=Lax', async () => {
    const { person } = await newOwner('Cookie Team')
    const res = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: person.email, password: STRONG_PASSWORD }) })
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('tallymark-session='))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })

  it('refuses an oversized JSON body with a clear 413', async () => {
    const res = await new Person().request('POST', '/api/auth/login', JSON.stringify({ email: 'a@example.test', password: 'x'.repeat(3_000_000) }))
    expect(res.status).toBe(413)
  })
})

describe('in production', async () => {
  let server: AppServer | undefined
  afterAll(async () => { await server?.stop() })

  it('adds HSTS and a Secure, __Host- prefixed session cookie', async () => {
    const port = await freePort()
    server = await startAppServer({ port, env: { NODE_ENV: 'production', PUBLIC_URL: `https://tallymark.example` } })
    const { person } = await newOwner('Prod Cookie Team')
    const res = await fetch(`${server.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: person.email, password: STRONG_PASSWORD }) })
    expect(res.status).toBe(200)
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('__Host-tallymark-session='))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/;\s*Secure/i)
    expect(cookie).toMatch(/;\s*Path=\//i)
    expect(cookie).not.toMatch(/Domain=/i)
    expect(res.headers.get('strict-transport-security')).toContain('max-age=')
  })
})
