import { createHash, randomBytes } from 'node:crypto'

/** A URL-safe random token and the SHA-256 hex digest that is stored instead of it. */
export function newSecretToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashSecretToken(token) }
}

export function hashSecretToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}
