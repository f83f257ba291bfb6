// Fee profiles over HTTP: several per team, exactly one default (also under concurrent writes), editors only.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { closeTestDb, query, teamIdOf } from '../support/db'
import { newFeeProfile, newItem, newLedgerTeam } from '../support/ledger'

afterAll(closeTestDb)

async function defaults(slug: string): Promise<number> {
  const [row] = await query<{ n: number }>('select count(*) n from fee_profiles where team_id = ? and default_flag = 1', [await teamIdOf(slug)])
  return Number(row!.n)
}

describe('fee profiles', async () => {
  const team = await newLedgerTeam('Fees')
  const path = (suffix = '') => team.api(`/fee-profiles${suffix}`)

  it('makes the first profile the default and keeps exactly one default', async () => {
    const first = await newFeeProfile(team.editor, team, { name: 'Lanternpost standard' })
    expect(first).toMatchObject({ name: 'Lanternpost standard', isDefault: true, percentBp: 1325, fixedCents: 30, revision: 1 })
    const second = await newFeeProfile(team.editor, team, { name: 'Gleaner\'s Row', isDefault: false })
    expect(second.isDefault).toBe(false)
    const third = await newFeeProfile(team.owner, team, { name: 'Saturday table', percentBp: 0, fixedCents: 0, isDefault: true })
    expect(third.isDefault).toBe(true)
    const list = await team.viewer.get(path())
    expect(list.body.items.map((p: any) => [p.name, p.isDefault])).toEqual([['Saturday table', true], ['Gleaner\'s Row', false], ['Lanternpost standard', false]])
    expect(await defaults(team.slug)).toBe(1)

    const moved = await team.editor.patch(path(`/${second.id}`), { revision: 1, isDefault: true })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    expect(moved.body).toMatchObject({ isDefault: true, revision: 2 })
    expect((await team.viewer.get(path(`/${third.id}`))).body.isDefault).toBe(false)
    expect(await defaults(team.slug)).toBe(1)
  })

  it('refuses to leave the team without a default', async () => {
    const list = (await team.viewer.get(path())).body.items as any[]
    const current = list.find(p => p.isDefault)
    expect(expectError(await team.editor.patch(path(`/${current.id}`), { revision: current.revision, isDefault: false }), 400).fieldErrors?.isDefault).toBeDefined()
    expectError(await team.editor.delete(path(`/${current.id}`)), 409, /default/)
    expect(await defaults(team.slug)).toBe(1)
  })

  it('keeps one default when several profiles claim it at the same moment', async () => {
    const racing = await newLedgerTeam('Fee race')
    const results = await Promise.all(Array.from({ length: 6 }, (_, n) => racing.editor.post(racing.api('/fee-profiles'), { name: `Racer ${n}`, isDefault: n % 2 === 0 })))
    for (const res of results) expect([201, 409]).toContain(res.status)
    expect(await defaults(racing.slug)).toBe(1)
  })

  it('refuses duplicate names, bad rates and non-editors', async () => {
    expect(expectError(await team.editor.post(path(), { name: 'Lanternpost standard' }), 400).fieldErrors?.name).toBeDefined()
    expect(expectError(await team.editor.post(path(), { name: 'Too much', percentBp: 10_001 }), 400).fieldErrors?.percentBp).toBeDefined()
    expectError(await team.contributor.post(path(), { name: 'Contributor profile' }), 403)
    expect((await team.contributor.get(path())).status).toBe(200)
  })

  it('keeps a profile that sales used, and deletes an unused one', async () => {
    const used = await newFeeProfile(team.editor, team, { name: 'Used once' })
    await newItem(team.editor, team, { status: 'sold', soldOn: '2026-03-02', salePriceCents: 1000, feeProfileId: used.id })
    expectError(await team.editor.delete(path(`/${used.id}`)), 409)
    const unused = await newFeeProfile(team.editor, team, { name: 'Never used' })
    expect((await team.editor.delete(path(`/${unused.id}`))).status).toBe(200)
    expect((await team.viewer.get(path(`/${unused.id}`))).status).toBe(404)
  })
})
