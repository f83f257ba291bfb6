// NIST SP 800-63B (5.1.1.2): length 8+ and up to at least 64, no composition rules, and a check
// against a list of commonly used or compromised passwords. The list is the 49k-entry common-password
// dictionary published in @zxcvbn-ts/language-common.
import { dictionary } from '@zxcvbn-ts/language-common'
import { PASSWORD_MAX, PASSWORD_MIN } from '../../shared/schemas/common'

let common: Set<string> | undefined

function commonPasswords(): Set<string> {
  common ??= new Set((dictionary['passwords-common'] as string[]).map(p => p.toLowerCase()))
  return common
}

/** Returns the reason a password is refused, or null when it is acceptable. */
export function passwordProblem(password: string, context: { email?: string, name?: string } = {}): string | null {
  if (password.length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters.`
  if (password.length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`
  const lower = password.toLowerCase()
  if (commonPasswords().has(lower)) return 'This password is on a list of commonly used passwords. Choose another one.'
  if (/^(.)\1+$/.test(password)) return 'A single repeated character is too easy to guess.'
  const local = context.email?.split('@')[0]?.toLowerCase()
  if (local && local.length >= 4 && lower === local) return 'Do not use your e-mail address as your password.'
  if (context.email && lower === context.email.toLowerCase()) return 'Do not use your e-mail address as your password.'
  return null
}

export function assertPasswordAcceptable(password: string, field: string, context: { email?: string, name?: string } = {}) {
  const problem = passwordProblem(password, context)
  if (problem) throw httpError(400, problem, { [field]: [problem] })
}
