// An owner unlocks a member's account after it was locked by failed sign-ins (the 423 answer sends people
// to them): owners of the member's team only, the lock and the failure count cleared, an audit event written.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, newMember, newOwner, Person, STRONG_PASSWORD, uniqueTeamName } from '../support/api'
import { auditEvents, closeTestDb, exec, query, teamIdOf } from '../support/db'

afterAll(closeTestDb)

/** What 100 consecutive failed sign-ins leave (reached over HTTP only after the throttle's waits). */
async function lock(userId: number) {
  await exec('update users set locked_at = utc_timestamp(), failed_logins = 100 where id = ?', [userId])
}

async function lockState(userId: number) {
  const [row] = await query<{ locked_at: Date | null, failed_logins: number }>('select locked_at, failed_logins from users where id = ?', [userId])
  return { locked: row!.locked_at !== null, failedLogins: Number(row!.failed_logins) }
}

describe('POST /api/teams/[team]/members/[userId]/unlock', async () => {
  const { person: owner, team, user: ownerUser } = await newOwner(uniqueTeamName('Unlock Yard'))
  const teamId = await teamIdOf(team.slug)
  const editor = await newMember(owner, team.slug, 'editor')
  const member = await newMember(owner, team.slug, 'contributor')
  const unlock = (person: Person, userId: number, slug = team.slug) => person.post(`/api/teams/${slug}/members/${userId}/unlock`)
  const listed = async (person: Person) => (await person.get(`/api/teams/${team.slug}/members`)).body.members
    .find((m: { userId: number }) => m.userId === member.id) as { locked: boolean }

  it('shows the member as locked, and after an owner unlocks them they sign in again', async () => {
    await lock(member.id)
    expectError(await new Person().post('/api/auth/login', { email: member.person.email, password: STRONG_PASSWORD }), 423, /ask a team owner to unlock it/)
    expect((await listed(editor.person)).locked).toBe(true)

    // The right password on a locked account is refused but is not one more failure; the refusal is audited.
    expect(await lockState(member.id)).toEqual({ locked: true, failedLogins: 100 })
    expect(await auditEvents('auth.login_locked', { userId: member.id })).toHaveLength(1)
    // A wrong password still counts.
    expectError(await new Person().post('/api/auth/login', { email: member.person.email, password: 'not the password at all' }), 401)
    expect(await lockState(member.id)).toEqual({ locked: true, failedLogins: 101 })
    const res = await unlock(owner, member.id)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toEqual({ userId: member.id, locked: false })
    expect(await lockState(member.id)).toEqual({ locked: false, failedLogins: 0 })
    const events = await auditEvents('member.unlocked', { teamId, targetId: member.id })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ userId: ownerUser.id, targetType: 'user', detail: { wasLocked: true, failedLogins: 101 } })
    expect(events[0]!.ip).toBeTruthy()

    const back = await new Person().post('/api/auth/login', { email: member.person.email, password: STRONG_PASSWORD })
    expect(back.status, JSON.stringify(back.body)).toBe(200)
    expect((await listed(owner)).locked).toBe(false)
  })

  it('is for owners of a team the member is on: 403 below owner, 404 from other teams, 401 signed out', async () => {
    await lock(member.id)
    const before = (await auditEvents('member.unlocked', { targetId: member.id })).length
    expectError(await unlock(editor.person, member.id), 403, /needs the owner role/)
    expectError(await unlock(new Person(), member.id), 401)
    const other = await newOwner(uniqueTeamName('Other Yard'))
    // Through the member's team (not theirs) and through their own (the member is not on it).
    expectError(await unlock(other.person, member.id), 404)
    expectError(await unlock(other.person, member.id, other.team.slug), 404)
    expectError(await unlock(owner, 2_000_000_000), 404)
    expect(await lockState(member.id)).toEqual({ locked: true, failedLogins: 100 })
    expect(await auditEvents('member.unlocked', { targetId: member.id })).toHaveLength(before)
    // Put right for the next test.
    expect((await unlock(owner, member.id)).status).toBe(200)
  })

  it('answers 200 for an account that is not locked, and writes no event for it', async () => {
    const before = (await auditEvents('member.unlocked', { teamId })).length
    const res = await unlock(owner, editor.id)
    expect(res.status).toBe(200)
    expect(await lockState(editor.id)).toEqual({ locked: false, failedLogins: 0 })
    expect(await auditEvents('member.unlocked', { teamId })).toHaveLength(before)
  })
})
