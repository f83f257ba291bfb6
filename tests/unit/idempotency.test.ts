// The pure rules of the Idempotency-Key store (server/utils/idempotency.ts): how a request is identified and
// what a repeat gets. Rules from the IETF HTTPAPI draft "The Idempotency-Key HTTP Header Field"
// (draft-ietf-httpapi-idempotency-key-header): same key + other request → 422, repeat while in flight → 409.
import { describe, expect, it } from 'vitest'
import {
  IDEMPOTENCY_ABANDONED_MS, IDEMPOTENCY_TTL_MS, idempotencyCanonical, idempotencyDecide, idempotencyHash, idempotencyKeyOf,
} from '../../server/utils/idempotency'

describe('idempotency request identity', () => {
  it('reads a body the same whatever the order of its keys, and tells different bodies apart', () => {
    const a = { title: 'Jug', costCents: 350, box: { unit: 'cm', length: 10 }, tags: ['a', 'b'] }
    const b = { tags: ['a', 'b'], box: { length: 10, unit: 'cm' }, costCents: 350, title: 'Jug' }
    expect(idempotencyCanonical(a)).toBe(idempotencyCanonical(b))
    expect(idempotencyHash(a)).toBe(idempotencyHash(b))
    expect(idempotencyHash(a)).toMatch(/^[0-9a-f]{64}$/)
    // Array order is meaning (inscriptions in base order), a changed figure is another request.
    expect(idempotencyHash({ ...a, tags: ['b', 'a'] })).not.toBe(idempotencyHash(a))
    expect(idempotencyHash({ ...a, costCents: 351 })).not.toBe(idempotencyHash(a))
    // A field left out and a field sent as undefined are the same JSON body.
    expect(idempotencyCanonical({ x: 1, y: undefined })).toBe(idempotencyCanonical({ x: 1 }))
    expect(idempotencyCanonical({ x: null })).not.toBe(idempotencyCanonical({}))
  })

  it('identifies an upload by its bytes, not by the multipart framing', () => {
    const one = { file: Buffer.from('same bytes'), entityType: 'item', entityId: 7 }
    const again = { entityId: 7, entityType: 'item', file: Buffer.from('same bytes') }
    expect(idempotencyHash(one)).toBe(idempotencyHash(again))
    expect(idempotencyHash({ ...one, file: Buffer.from('other bytes') })).not.toBe(idempotencyHash(one))
    expect(idempotencyHash({ ...one, entityId: 8 })).not.toBe(idempotencyHash(one))
  })

  it('takes UUID-like keys and refuses anything else with a 400', () => {
    expect(idempotencyKeyOf(undefined)).toBeNull()
    expect(idempotencyKeyOf('3f0c1a52-8f7e-4a53-9f0e-1b2c3d4e5f60')).toBe('3f0c1a52-8f7e-4a53-9f0e-1b2c3d4e5f60')
    expect(idempotencyKeyOf('  key_12345  ')).toBe('key_12345')
    for (const bad of ['', 'short', 'has space inside', 'x'.repeat(101), 'quote"d-key']) {
      expect(() => idempotencyKeyOf(bad), bad).toThrow(expect.objectContaining({ statusCode: 400 }))
    }
  })
})

describe('what a repeat gets', () => {
  const now = Date.UTC(2026, 2, 14, 12)
  const row = (over: Partial<Parameters<typeof idempotencyDecide>[0]> = {}) => ({
    route: 'POST /api/teams/t/items', requestHash: 'h1', statusCode: 201 as number | null, response: { id: 5 },
    createdAt: new Date(now - 1000), expiresAt: new Date(now - 1000 + IDEMPOTENCY_TTL_MS), ...over,
  })

  it('replays the stored answer for the same route and request', () => {
    expect(idempotencyDecide(row(), 'POST /api/teams/t/items', 'h1', now)).toEqual({ action: 'replay', statusCode: 201, response: { id: 5 } })
  })

  it('refuses the same key with another body or on another route', () => {
    expect(idempotencyDecide(row(), 'POST /api/teams/t/items', 'h2', now)).toEqual({ action: 'mismatch' })
    expect(idempotencyDecide(row(), 'POST /api/teams/t/items/5/sale', 'h1', now)).toEqual({ action: 'mismatch' })
  })

  it('says "in progress" while the first request runs, and lets a repeat take over one that died', () => {
    expect(idempotencyDecide(row({ statusCode: null, response: null }), 'POST /api/teams/t/items', 'h1', now)).toEqual({ action: 'in-progress' })
    const stuck = row({ statusCode: null, response: null, createdAt: new Date(now - IDEMPOTENCY_ABANDONED_MS - 1) })
    expect(idempotencyDecide(stuck, 'POST /api/teams/t/items', 'h1', now)).toEqual({ action: 'take-over' })
  })

  it('forgets a key after 24 hours, whatever was stored', () => {
    expect(IDEMPOTENCY_TTL_MS).toBe(24 * 60 * 60 * 1000)
    const old = row({ createdAt: new Date(now - IDEMPOTENCY_TTL_MS - 5), expiresAt: new Date(now - 5) })
    expect(idempotencyDecide(old, 'POST /api/teams/t/items', 'h2', now)).toEqual({ action: 'take-over' })
    expect(idempotencyDecide(old, 'POST /api/teams/t/items', 'h1', now)).toEqual({ action: 'take-over' })
  })
})
