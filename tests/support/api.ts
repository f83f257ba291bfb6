// HTTP client for API tests: one cookie jar per simulated person, JSON in and out.
import { randomBytes } from 'node:crypto'
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { expect } from 'vitest'
import type { Role } from '../../shared/roles'

export const baseUrl = process.env.TALLYMARK_TEST_URL ?? ''
if (!baseUrl) throw new Error('Run API tests through npm test (it starts the database and the app).')

export interface ApiResponse<T = any> { status: number, body: T, headers: Headers }

export class Person {
  private cookies = new Map<string, string>()
  constructor(public email = '', public password = '') {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    const init: RequestInit = { method, headers: { accept: 'application/json', ...headers }, redirect: 'manual' }
    if (body instanceof FormData) init.body = body
    else if (body !== undefined) {
      init.body = typeof body === 'string' ? body : JSON.stringify(body)
      ;(init.headers as Record<string, string>)['content-type'] = 'application/json'
    }
    const cookie = this.cookieHeader()
    if (cookie) (init.headers as Record<string, string>).cookie = cookie
    const res = await fetch(baseUrl + path, init)
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const eq = pair!.indexOf('=')
      const name = pair!.slice(0, eq)
      const value = pair!.slice(eq + 1)
      if (!value || /max-age=0/i.test(line) || /expires=Thu, 01 Jan 1970/i.test(line)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await res.text()
    let parsed: any = text
    try { parsed = text ? JSON.parse(text) : null }
    catch { /* not JSON */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  async login(email = this.email, password = this.password) {
    this.email = email
    this.password = password
    const res = await this.post('/api/auth/login', { email, password })
    if (res.status !== 200) throw new Error(`login ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
    return res
  }
}

let counter = 0
// A random part as well: each test file has its own counter, and files may start in the same millisecond.
export function uniqueEmail(prefix = 'user'): string {
  return `${prefix}.${Date.now().toString(36)}${randomBytes(3).toString('hex')}.${++counter}@example.test`
}

/** A team name no other test uses (slugs are derived from names). */
export function uniqueTeamName(base = 'Test Team'): string {
  return `${base} ${randomBytes(4).toString('hex')}`
}

export const STRONG_PASSWORD = 'glazed-teapot-under-felt'

/** Registers a new person with a new team and returns them signed in. */
export async function newOwner(teamName = 'Test Team', name = 'Owner Person') {
  const person = new Person(uniqueEmail('owner'), STRONG_PASSWORD)
  const res = await person.post('/api/auth/register', { email: person.email, password: person.password, name, teamName })
  if (res.status !== 201) throw new Error(`register failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { person, team: res.body.team as { slug: string, name: string }, user: res.body.user as { id: number, email: string, name: string } }
}

/** Another client (browser) of the same account, with its own cookie jar, signed in. */
export async function secondSession(person: Person): Promise<Person> {
  const other = new Person(person.email, person.password)
  await other.login()
  return other
}

/** The last path segment of a link from a mail: the secret token. */
export function tokenOf(link: string): string {
  return new URL(link).pathname.split('/').pop()!
}

/** An owner invites `email`; returns the invitation id, the mail and the token from its link. */
export async function invite(owner: Person, teamSlug: string, email: string, role: Role) {
  const before = mailTo(email).length
  const res = await owner.post(`/api/teams/${teamSlug}/invitations`, { email, role })
  if (res.status !== 201) throw new Error(`invite ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
  const mail = await waitForMail(email, before + 1)
  return { id: res.body.invitation.id as number, mail, token: tokenOf(linkIn(mail, '/invitations/')) }
}

/** A new account joins the team through an invitation and is signed in; returns it with its user id. */
export async function newMember(owner: Person, teamSlug: string, role: Role, name = `${role[0]!.toUpperCase()}${role.slice(1)} Person`) {
  const person = new Person(uniqueEmail(role), STRONG_PASSWORD)
  const { token } = await invite(owner, teamSlug, person.email, role)
  const res = await person.post(`/api/invitations/${token}/accept`, { name, password: person.password })
  if (res.status !== 200) throw new Error(`accept failed: ${res.status} ${JSON.stringify(res.body)}`)
  const me = await person.get('/api/me')
  return { person, id: me.body.user.id as number }
}

/** Checks the error body shape { statusCode, message, fieldErrors? } and returns the body. */
export function expectError(res: ApiResponse, status: number, message?: string | RegExp) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  expect(res.headers.get('content-type')).toMatch(/^application\/json/)
  expect(res.body.statusCode).toBe(status)
  expect(typeof res.body.message).toBe('string')
  expect(res.body.message.length).toBeGreaterThan(0)
  if (message !== undefined) expect(res.body.message).toMatch(message)
  for (const key of Object.keys(res.body)) expect(['statusCode', 'message', 'fieldErrors', 'retryAfter'], `unexpected key ${key}`).toContain(key)
  if (res.body.fieldErrors !== undefined) {
    for (const messages of Object.values(res.body.fieldErrors)) {
      expect(Array.isArray(messages)).toBe(true)
      for (const m of messages as unknown[]) expect(typeof m).toBe('string')
    }
  }
  return res.body as { statusCode: number, message: string, fieldErrors?: Record<string, string[]>, retryAfter?: number }
}

export interface CaughtMail { to: string[], raw: string, subject: string, text: string }

/** Mail caught by the local SMTP catcher, newest last. */
export function mailTo(address: string): CaughtMail[] {
  const dir = process.env.TALLYMARK_MAIL_DIR
  if (!dir) throw new Error('TALLYMARK_MAIL_DIR is not set')
  return readdirSync(dir).filter(f => f.endsWith('.json')).sort().flatMap((file) => {
    const meta = JSON.parse(readFileSync(join(dir, file), 'utf8')) as { to: string[] }
    if (!meta.to.includes(address)) return []
    const raw = readFileSync(join(dir, file.replace(/\.json$/, '.eml')), 'utf8')
    const subject = decodeHeader(/^Subject: (.*(?:\r?\n[ \t].*)*)/m.exec(raw)?.[1] ?? '')
    return [{ to: meta.to, raw, subject, text: decodeQuotedPrintable(raw) }]
  })
}

export async function waitForMail(address: string, count = 1, timeoutMs = 5000): Promise<CaughtMail> {
  const start = Date.now()
  for (;;) {
    const mails = mailTo(address)
    if (mails.length >= count) return mails[count - 1]!
    if (Date.now() - start > timeoutMs) throw new Error(`no mail #${count} to ${address} within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 50))
  }
}

export function linkIn(mail: CaughtMail, pathPrefix: string): string {
  const match = new RegExp(`https?://[^\\s"<>]*${pathPrefix}[A-Za-z0-9_-]+`).exec(mail.text)
  if (!match) throw new Error(`no ${pathPrefix} link in mail: ${mail.text.slice(0, 500)}`)
  return match[0]
}

function decodeQuotedPrintable(raw: string): string {
  return raw.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/g, (_, h: string) => String.fromCharCode(Number.parseInt(h, 16)))
}

function decodeHeader(value: string): string {
  return value.replace(/\r?\n[ \t]/g, ' ').replace(/=\?utf-8\?([QB])\?([^?]*)\?=/gi, (_, enc: string, text: string) =>
    enc.toUpperCase() === 'B' ? Buffer.from(text, 'base64').toString('utf8') : decodeQuotedPrintable(text.replace(/_/g, ' ')))
}
