// The README's API table is generated from the route files: a new route must be documented (npm run docs:routes).
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { listApiRoutes, routesMarkdown } from '../../scripts/lib/routes'

describe('README API table', () => {
  it('lists every route with who may call it', () => {
    const routes = listApiRoutes()
    expect(routes.length).toBeGreaterThan(15)
    const readme = readFileSync('README.md', 'utf8')
    const block = readme.slice(readme.indexOf('<!-- routes:start -->'), readme.indexOf('<!-- routes:end -->'))
    expect(block.trim()).toContain(routesMarkdown(routes))
  })

  it('reads the guard of a team route', () => {
    const invite = listApiRoutes().find(r => r.method === 'POST' && r.path === '/api/teams/:team/invitations')
    expect(invite?.access).toBe('owner')
  })
})
