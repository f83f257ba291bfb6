// Every API route against every kind of caller, from the table in tests/support/route-rules.ts: signed out
// → 401, a member of another team only → 404, a role below the minimum → 403, the minimum role and above →
// the route's real answer. The table must cover exactly the route files, and name the role each route's guard
// call asks for (scripts/lib/routes.ts reads it), so the table and the code cannot drift apart.
import { afterAll, describe, expect, it } from 'vitest'
import { listApiRoutes } from '../../scripts/lib/routes'
import { ROLES, type Role } from '../../shared/roles'
import { expectError, Person, type ApiResponse } from '../support/api'
import { closeTestDb } from '../support/db'
import { buildTeamFixture } from '../support/route-fixtures'
import { accessLabel, roleAtLeastRank, routeContext, ROUTE_RULES, type BuiltRequest, type Builder, type RouteRule } from '../support/route-rules'

afterAll(closeTestDb)

const routes = listApiRoutes()
const keyOf = (r: { method: string, path: string }) => `${r.method} ${r.path}`
// Lowest role first, as the cases below are tried.
const MEMBER_ROLES = [...ROLES].reverse() as Role[]

describe('the route table', () => {
  it('has one entry per route file and none for a route that is gone', () => {
    const files = new Set(routes.map(keyOf))
    expect(routes.length).toBeGreaterThan(100)
    expect({
      missing: [...files].filter(key => !(key in ROUTE_RULES)),
      gone: Object.keys(ROUTE_RULES).filter(key => !files.has(key)),
    }).toEqual({ missing: [], gone: [] })
  })

  it('names for each route the access its guard call asks for', () => {
    const declared = Object.fromEntries(routes.filter(r => ROUTE_RULES[keyOf(r)]).map(r => [keyOf(r), accessLabel(ROUTE_RULES[keyOf(r)]!)]))
    const inCode = Object.fromEntries(routes.filter(r => ROUTE_RULES[keyOf(r)]).map(r => [keyOf(r), r.access]))
    expect(declared).toEqual(inCode)
  })
})

describe('authorisation matrix', async () => {
  const team = await buildTeamFixture({ allRoles: true })
  // Signed in and a full member, but of another team only.
  const outsider = (await buildTeamFixture({ allRoles: false })).owner
  let cases = 0

  afterAll(() => {
    console.log(`authorisation matrix: ${cases} route × caller cases`)
  })

  async function send(method: string, person: Person, request: BuiltRequest): Promise<ApiResponse> {
    return await person.request(method, request.path, request.body)
  }

  function expectStatus(res: ApiResponse, status: number, what: string) {
    cases++
    if (status === 401 || status === 403 || status === 404) expectError(res, status)
    else expect(res.status, `${what}: ${JSON.stringify(res.body)?.slice(0, 400)}`).toBe(status)
  }

  /** One form of a team route: signed out, another team, and each role against the minimum. */
  async function teamCases(key: string, rule: RouteRule, minimum: Role, build: Builder) {
    const method = key.split(' ')[0]!
    // Built by the owner; the calls that must be refused use it, so they find a real row to be refused.
    const shared = await build(routeContext(team, 'owner'))
    const label = (who: string) => `${key}${build === rule.build ? '' : ' (purge)'} as ${who}`
    expectStatus(await send(method, new Person(), shared), 401, label('signed out'))
    expectStatus(await send(method, outsider, shared), 404, label('a member of another team'))
    for (const role of MEMBER_ROLES) {
      if (!roleAtLeastRank(role, minimum)) {
        expectStatus(await send(method, team.people[role], shared), 403, label(role))
        continue
      }
      const request = rule.fresh ? await build(routeContext(team, role)) : shared
      expectStatus(await send(method, request.person ?? team.people[role], request), request.status, label(role))
    }
  }

  for (const route of routes) {
    const key = keyOf(route)
    const rule = ROUTE_RULES[key]
    if (!rule) continue
    it(`${key} (${accessLabel(rule)})`, async () => {
      const method = route.method
      if (rule.access === 'public') {
        const request = await rule.build(routeContext(team, 'viewer'))
        expectStatus(await send(method, request.person ?? new Person(), request), request.status, `${key} signed out`)
        return
      }
      if (rule.access === 'signed in') {
        expectStatus(await send(method, new Person(), await rule.build(routeContext(team, 'viewer'))), 401, `${key} signed out`)
        const request = await rule.build(routeContext(team, 'viewer'))
        expectStatus(await send(method, request.person ?? team.people.viewer, request), request.status, `${key} signed in`)
        return
      }
      expect(route.path.startsWith('/api/teams/:team'), 'a route with a role is a team route').toBe(true)
      await teamCases(key, rule, rule.access, rule.build)
      if (rule.purge) await teamCases(key, rule, rule.purge.minimum, rule.purge.build)
    })
  }

  it('ran a case for every caller of every team route', () => {
    const teamForms = routes.filter(r => r.path.startsWith('/api/teams/:team'))
      .reduce((n, r) => n + (ROUTE_RULES[keyOf(r)]?.purge ? 2 : 1), 0)
    // Signed out, another team, and the four roles: six callers per form of a team route.
    expect(cases).toBeGreaterThanOrEqual(teamForms * 6)
  })
})
