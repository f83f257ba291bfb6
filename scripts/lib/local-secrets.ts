// Secrets for a local install, generated once and kept under .data/ (never committed).
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'

export function localSecret(file: string, bytes = 32): string {
  if (existsSync(file)) return readFileSync(file, 'utf8').trim()
  mkdirSync(dirname(file), { recursive: true })
  const value = randomBytes(bytes).toString('base64url')
  writeFileSync(file, `${value}\n`, { mode: 0o600 })
  return value
}
