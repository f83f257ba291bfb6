// .env.example must list every variable the server's configuration reads (conventions: keep it in sync).
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'

const example = readFileSync('.env.example', 'utf8')
const listed = new Set([...example.matchAll(/^([A-Z][A-Z0-9_]+)=/gm)].map(m => m[1]))

describe('.env.example', () => {
  it('lists every variable read in server/utils/config.ts', () => {
    const source = readFileSync('server/utils/config.ts', 'utf8')
    const read = [...new Set([...source.matchAll(/env\.([A-Z][A-Z0-9_]+)/g)].map(m => m[1]!))]
    expect(read.length).toBeGreaterThan(5)
    expect(read.filter(name => !listed.has(name) && name !== 'NODE_ENV')).toEqual([])
  })

  it('lists the variables the start script reads', () => {
    const source = readFileSync('scripts/start.ts', 'utf8') + readFileSync('scripts/lib/services.ts', 'utf8')
    const read = [...new Set([...source.matchAll(/process\.env\.([A-Z][A-Z0-9_]+)/g)].map(m => m[1]!))]
    expect(read.filter(name => !listed.has(name) && name !== 'NODE_ENV')).toEqual([])
  })
})
