// The rules of the session and membership memory (server/utils/auth-cache.ts): kept for the TTL, forgotten on
// a change, never filled by a read that a change overtook, and left empty while a change may still commit.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import {
  authCacheClear, authCacheForgetTeam, authCacheForgetUser, authCacheMembership, authCacheRememberSession, authCacheSession, authCacheUser,
} from '../../server/utils/auth-cache'
import { useServerConfig } from '../../server/utils/config'

const user = (sessionVersion: number) => ({ id: 7, email: 'wren@example.test', name: 'Wren', sessionVersion })
const membership = (teamId: number, role: 'owner' | 'viewer') => ({ team: { id: teamId, slug: `t${teamId}`, name: 'Yard', timeZone: 'UTC' }, role })

describe('auth cache', () => {
  const ttl = useServerConfig().sessionCacheMs

  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(new Date('2026-07-01T10:00:00Z'))
    authCacheClear()
  })
  afterEach(() => { vi.useRealTimers() })

  it('has a TTL of one second by default, at most two', () => {
    expect(ttl).toBe(1000)
  })

  it('remembers a user row for the TTL, then reads it again', async () => {
    const load = vi.fn(async () => user(1))
    await authCacheUser(7, load)
    await authCacheUser(7, load)
    expect(load).toHaveBeenCalledTimes(1)
    vi.advanceTimersByTime(ttl + 1)
    await authCacheUser(7, load)
    expect(load).toHaveBeenCalledTimes(2)
  })

  it('reads again at once after a forget, and keeps nothing while the change may still commit', async () => {
    await authCacheUser(7, async () => user(1))
    authCacheForgetUser(7)
    const load = vi.fn(async () => user(2))
    expect((await authCacheUser(7, load))?.sessionVersion).toBe(2)
    // Within the next 10 s every request reads the database (the forget may have run inside a transaction).
    expect((await authCacheUser(7, load))?.sessionVersion).toBe(2)
    expect(load).toHaveBeenCalledTimes(2)
    vi.advanceTimersByTime(10_001)
    await authCacheUser(7, load)
    await authCacheUser(7, load)
    expect(load).toHaveBeenCalledTimes(3)
  })

  it('does not keep a row read before a forget that happened while it was read', async () => {
    let finish!: (row: ReturnType<typeof user>) => void
    const slow = authCacheUser(7, () => new Promise((resolve) => { finish = resolve }))
    authCacheForgetUser(8)
    finish(user(1))
    expect((await slow)?.sessionVersion).toBe(1)
    const load = vi.fn(async () => user(2))
    expect((await authCacheUser(7, load))?.sessionVersion).toBe(2)
    expect(load).toHaveBeenCalledTimes(1)
  })

  it('remembers memberships per person and team; a team change or a person change drops them', async () => {
    const load = vi.fn(async () => membership(1, 'owner'))
    await authCacheMembership(7, 't1', load)
    await authCacheMembership(7, 't1', load)
    expect(load).toHaveBeenCalledTimes(1)
    const other = vi.fn(async () => membership(2, 'viewer'))
    await authCacheMembership(7, 't2', other)
    authCacheForgetTeam(1)
    await authCacheMembership(7, 't1', load)
    await authCacheMembership(7, 't2', other)
    expect(load).toHaveBeenCalledTimes(2)
    expect(other).toHaveBeenCalledTimes(1)
    authCacheForgetUser(7)
    await authCacheMembership(7, 't2', other)
    expect(other).toHaveBeenCalledTimes(2)
  })

  it('never remembers that someone is not a member', async () => {
    const load = vi.fn(async () => undefined)
    await authCacheMembership(7, 't1', load)
    await authCacheMembership(7, 't1', load)
    expect(load).toHaveBeenCalledTimes(2)
  })

  it('hands out copies of an unsealed session, for the TTL only', () => {
    authCacheRememberSession('sealed-value', { id: 's1', createdAt: 1, data: { user: { id: 7 }, version: 1 } })
    const first = authCacheSession('sealed-value')!
    ;(first.data.user as { id: number }).id = 99
    expect(authCacheSession('sealed-value')!.data).toEqual({ user: { id: 7 }, version: 1 })
    expect(authCacheSession('another-value')).toBeUndefined()
    vi.advanceTimersByTime(ttl + 1)
    expect(authCacheSession('sealed-value')).toBeUndefined()
  })
})
