// GET /api/teams/[team]/dating: the clue engine behind the team guard.
import { describe, expect, it } from 'vitest'
import { Person, newOwner } from '../support/api'

describe('dating clues route', () => {
  it('reads "Made in Occupied Japan" as 1947–1952 (SCAPIN-1535 of 20 Feb 1947; occupation ended 28 Apr 1952)', async () => {
    const { person, team } = await newOwner('Dating Team')
    const res = await person.get(`/api/teams/${team.slug}/dating?text=${encodeURIComponent('MADE IN OCCUPIED JAPAN')}`)
    expect(res.status).toBe(200)
    expect(res.body.range).toMatchObject({ yearFrom: 1947, yearTo: 1952 })
    expect(res.body.conflict).toBe(false)
    expect(res.body.clues.map((c: { rule: string }) => c.rule)).not.toContain('japan')
    expect(res.body.clues[0]).toMatchObject({ matched: expect.stringMatching(/occupied japan/i), source: expect.stringContaining('SCAPIN') })
  })

  it('flags a conflict: "Nippon" (to 1921) with "Microwave safe" (1967 or later)', async () => {
    const { person, team } = await newOwner('Dating Conflict')
    const res = await person.get(`/api/teams/${team.slug}/dating?text=${encodeURIComponent('Nippon · Microwave safe')}`)
    expect(res.status).toBe(200)
    expect(res.body.conflict).toBe(true)
    expect(res.body.explanation).toMatch(/reproduction|relabel|misread/i)
  })

  it('validates the text and guards the team', async () => {
    const { person, team } = await newOwner('Dating Guard')
    expect((await person.get(`/api/teams/${team.slug}/dating?text=`)).status).toBe(400)
    expect((await person.get(`/api/teams/${team.slug}/dating?text=${'x'.repeat(2001)}`)).status).toBe(400)
    expect((await new Person().get(`/api/teams/${team.slug}/dating?text=Japan`)).status).toBe(401)
    const other = await newOwner('Dating Other')
    expect((await other.person.get(`/api/teams/${team.slug}/dating?text=Japan`)).status).toBe(404)
  })
})
