// Idempotency keys for POSTs a phone may send twice: the offline queue retries a change whose answer was lost
// (the signal dropped after the server saved it), and the retry must not add a second row. The client sends
// a UUID it chose in `Idempotency-Key`; the first request's answer is stored for 24 hours under
// team + person + key, with the route and a hash of the request, and a repeat gets that answer again.
// Rules follow the IETF HTTPAPI draft "The Idempotency-Key HTTP Header Field" (draft-ietf-httpapi-
// idempotency-key-header): the same key with another request is 422, a repeat while the first is still
// being handled is 409. Only successful answers are kept: a refused request saved nothing (every write is
// one transaction), so sending it again simply runs it again.
// Imports are explicit (not Nitro's auto-imports) so the unit tests can load the pure parts.
import { createHash } from 'node:crypto'
import { createError, getRequestHeader, setResponseHeader, setResponseStatus, type H3Event } from 'h3'
import { and, eq, isNull, lt } from 'drizzle-orm'
import { isDuplicateKey, tables, useDb } from './db'
import type { TeamAccess } from './guard'

export const IDEMPOTENCY_HEADER = 'idempotency-key'
export const IDEMPOTENCY_TTL_MS = 24 * 60 * 60 * 1000
/** A first request still unfinished after this long died with its server: a repeat may run it again. */
export const IDEMPOTENCY_ABANDONED_MS = 60 * 1000
const KEY_PATTERN = /^[\w-]{8,100}$/
const SWEEP_EVERY_MS = 60 * 1000

export type IdempotencyRow = typeof tables.idempotencyKeys.$inferSelect

// The API's error shape (http-errors.ts httpError), built from h3 itself so the unit tests need no Nitro.
const httpError = (statusCode: number, message: string, extra: Record<string, unknown> = {}) =>
  createError({ statusCode, message, statusMessage: undefined, data: { ...extra } })

/** JSON with object keys sorted, so the same body sent with its keys in another order is the same request. */
export function idempotencyCanonical(value: unknown): string {
  if (value === undefined) return 'null'
  if (value === null || typeof value !== 'object') return JSON.stringify(value)
  if (Buffer.isBuffer(value)) return JSON.stringify(`sha256:${createHash('sha256').update(value).digest('hex')}`)
  if (Array.isArray(value)) return `[${value.map(idempotencyCanonical).join(',')}]`
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${idempotencyCanonical(v)}`).join(',')}}`
}

export function idempotencyHash(value: unknown): string {
  return createHash('sha256').update(idempotencyCanonical(value)).digest('hex')
}

/** A key as the header carries it: 8–100 letters, digits, - or _ (a UUID fits); anything else is a 400. */
export function idempotencyKeyOf(header: string | undefined): string | null {
  if (header === undefined) return null
  const key = header.trim()
  if (!KEY_PATTERN.test(key)) throw httpError(400, 'The Idempotency-Key header must be 8 to 100 letters, digits, - or _ (a UUID fits).')
  return key
}

export type IdempotencyDecision
  = | { action: 'replay', statusCode: number, response: unknown }
    | { action: 'mismatch' }
    | { action: 'in-progress' }
  /** The stored row is over (expired, or its request was abandoned): remove it and run the request. */
    | { action: 'take-over' }

/** What a repeat of a stored key gets, from the stored row alone (pure, so the rules have unit tests). */
export function idempotencyDecide(row: Pick<IdempotencyRow, 'route' | 'requestHash' | 'statusCode' | 'response' | 'createdAt' | 'expiresAt'>, route: string, requestHash: string, now: number): IdempotencyDecision {
  if (row.expiresAt.getTime() <= now) return { action: 'take-over' }
  if (row.route !== route || row.requestHash !== requestHash) return { action: 'mismatch' }
  if (row.statusCode === null) return now - row.createdAt.getTime() > IDEMPOTENCY_ABANDONED_MS ? { action: 'take-over' } : { action: 'in-progress' }
  return { action: 'replay', statusCode: row.statusCode, response: row.response }
}

let lastSweep = 0
/** Drops expired keys now and then (at most once a minute per app instance). */
async function sweepExpired(now: number) {
  if (now - lastSweep < SWEEP_EVERY_MS) return
  lastSweep = now
  const k = tables.idempotencyKeys
  await useDb().delete(k).where(lt(k.expiresAt, new Date(now))).limit(1000)
}

type Claim = { replay: false, id: number } | { replay: true, statusCode: number, response: unknown }

async function claim(teamId: number, userId: number, key: string, route: string, requestHash: string): Promise<Claim> {
  const db = useDb()
  const k = tables.idempotencyKeys
  for (let attempt = 0; attempt < 3; attempt++) {
    const now = Date.now()
    try {
      const [row] = await db.insert(k).values({ teamId, userId, key, route, requestHash, expiresAt: new Date(now + IDEMPOTENCY_TTL_MS) }).$returningId()
      return { replay: false, id: row!.id }
    }
    catch (error) {
      if (!isDuplicateKey(error, 'idempotency_keys_team_user_key_unique')) throw error
    }
    const [row] = await db.select().from(k).where(and(eq(k.teamId, teamId), eq(k.userId, userId), eq(k.key, key))).limit(1)
    if (!row) continue
    const decision = idempotencyDecide(row, route, requestHash, now)
    if (decision.action === 'replay') return { replay: true, statusCode: decision.statusCode, response: decision.response }
    if (decision.action === 'mismatch') {
      throw httpError(422, 'This Idempotency-Key was already used for a different request. Send a new key with each new change.')
    }
    if (decision.action === 'in-progress') {
      throw httpError(409, 'This change is still being saved from an earlier attempt. Try again in a moment.', { inProgress: true })
    }
    // Taken over: only this exact row, so two repeats racing here cannot both delete a fresh claim.
    await db.delete(k).where(and(eq(k.id, row.id), row.statusCode === null ? isNull(k.statusCode) : eq(k.statusCode, row.statusCode)))
  }
  throw httpError(409, 'This change is still being saved from an earlier attempt. Try again in a moment.', { inProgress: true })
}

/**
 * Runs `work` once per Idempotency-Key: without the header it simply runs; with it, a repeat of the same
 * request by the same person in the same team answers what the first one answered, without running again.
 * `request` is what identifies the request (the validated body; an upload's bytes and fields).
 */
export async function idempotentCall<T>(event: H3Event, access: TeamAccess, request: unknown, work: () => Promise<T>, options: { status?: number } = {}): Promise<T> {
  const status = options.status ?? 200
  const key = idempotencyKeyOf(getRequestHeader(event, IDEMPOTENCY_HEADER))
  if (key === null) {
    const result = await work()
    setResponseStatus(event, status)
    return result
  }
  const route = `${event.method} ${event.path.split('?')[0]}`.slice(0, 255)
  const now = Date.now()
  await sweepExpired(now)
  const claimed = await claim(access.team.id, access.user.id, key, route, idempotencyHash(request))
  if (claimed.replay) {
    setResponseStatus(event, claimed.statusCode)
    setResponseHeader(event, 'idempotent-replayed', 'true')
    return claimed.response as T
  }
  let result: T
  try {
    result = await work()
  }
  catch (error) {
    await useDb().delete(tables.idempotencyKeys).where(eq(tables.idempotencyKeys.id, claimed.id)).catch(() => {})
    throw error
  }
  await useDb().update(tables.idempotencyKeys).set({ statusCode: status, response: JSON.parse(JSON.stringify(result ?? null)) })
    .where(eq(tables.idempotencyKeys.id, claimed.id))
  setResponseStatus(event, status)
  return result
}
