// The server's API routes, read from the file tree (Nuxt's naming: index.get.ts, [id].patch.ts ...).
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'

export interface ApiRoute { method: string, path: string, file: string, access: string }

const METHODS = ['get', 'post', 'patch', 'put', 'delete']

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? walk(full) : [full]
  })
}

let utilsSource: string | undefined

/** A route made by a handler factory (defineXHandler) is guarded inside the factory, in server/utils. */
function factorySource(source: string): string | null {
  const factory = /\b(define\w+Handler)\(/.exec(source)?.[1]
  if (!factory || factory === 'defineEventHandler') return null
  utilsSource ??= walk('server/utils').filter(f => f.endsWith('.ts')).map(f => readFileSync(f, 'utf8')).join('\n')
  const start = utilsSource.search(new RegExp(`(function|const)\\s+${factory}\\b`))
  if (start < 0) return null
  const next = utilsSource.slice(start + factory.length).search(/\nexport /)
  return utilsSource.slice(start, next < 0 ? undefined : start + factory.length + next)
}

/** Who may call a route, read from its guard call: the guard module is the one place access is decided. */
function accessOf(source: string): string {
  const body = factorySource(source) ?? source
  const member = /requireMember\(event(?:,\s*'(\w+)')?/.exec(body)
  if (member) {
    const purge = /requireMember\(event,\s*'owner'\)/.test(body) && member[1] !== 'owner' ? ' (purge: owner)' : ''
    return (member[1] ?? 'viewer') + purge
  }
  if (/requireUser\(event\)/.test(body)) return 'signed in'
  return 'public'
}

export function listApiRoutes(root = 'server/api'): ApiRoute[] {
  return walk(root).flatMap((file) => {
    const rel = relative(root, file).replace(/\\/g, '/')
    const match = /^(.*?)(?:\.(get|post|patch|put|delete))?\.ts$/.exec(rel)
    if (!match) return []
    const method = match[2] ?? 'all'
    if (method !== 'all' && !METHODS.includes(method)) return []
    const segments = match[1]!.split('/').filter(s => s !== 'index')
    const path = `/api/${segments.map(s => s.replace(/^\[\.\.\.(\w+)\]$/, '**:$1').replace(/^\[(\w+)\]$/, ':$1')).join('/')}`.replace(/\/$/, '')
    return [{ method: method.toUpperCase(), path, file, access: accessOf(readFileSync(file, 'utf8')) }]
  }).sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method))
}

export function routesMarkdown(routes = listApiRoutes()): string {
  const lines = ['| method | route | who may call it |', '|---|---|---|']
  for (const r of routes) lines.push(`| ${r.method} | \`${r.path}\` | ${r.access} |`)
  return lines.join('\n')
}
