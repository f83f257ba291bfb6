import { z } from 'zod'

export const PASSWORD_MIN = 8
export const PASSWORD_MAX = 128

export const email = z.string().trim().toLowerCase().max(254, 'E-mail addresses are at most 254 characters.')
  .pipe(z.email({ message: 'Enter an e-mail address like name@example.com.' }))

// Length only: NIST SP 800-63B forbids composition rules; the common-password list is checked on the server.
export const password = z.string()
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
  .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`)

export const personName = z.string().trim().min(1, 'Enter your name.').max(120, 'Names are at most 120 characters.')
export const teamName = z.string().trim().min(2, 'Team names need at least 2 characters.').max(120, 'Team names are at most 120 characters.')
export const teamSlug = z.string().regex(/^[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?$/, 'Not a team address.')
export const idParam = z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER)
