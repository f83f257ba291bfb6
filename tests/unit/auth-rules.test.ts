// Foundation rules that need no server: the request schemas, the password policy and the team roles.
import { describe, expect, it } from 'vitest'
import {
  changePasswordSchema, invitationAcceptSchema, invitationCreateSchema, loginSchema, logoutSchema, memberPatchSchema,
  passwordResetConfirmSchema, passwordResetRequestSchema, profilePatchSchema, registerSchema, roleSchema,
  teamCreateSchema, teamIdParams, teamPatchSchema, teamUserParams,
} from '../../shared/schemas/auth'
import { idParam, PASSWORD_MAX, PASSWORD_MIN, teamSlug } from '../../shared/schemas/common'
import { assignableRoles, ROLE_DESCRIPTIONS, ROLE_LABELS, ROLES, roleAtLeast, type Role } from '../../shared/roles'
import { passwordProblem } from '../../server/utils/password-policy'

/** The messages zod reports, per field path ('' for the whole value). */
function problems(result: { success: boolean, error?: { issues: { path: PropertyKey[], message: string }[] } }): Record<string, string[]> {
  expect(result.success).toBe(false)
  const out: Record<string, string[]> = {}
  for (const issue of result.error!.issues) (out[issue.path.join('.')] ??= []).push(issue.message)
  return out
}

const goodRegistration = { email: 'wren.holloway@example.test', password: 'tin-kettle-on-a-shelf', name: 'Wren Holloway', teamName: 'Heron Lane Finds' }

describe('registerSchema', () => {
  it('accepts a complete registration and normalises the e-mail (trimmed, lower case) and names (trimmed)', () => {
    const parsed = registerSchema.parse({ ...goodRegistration, email: '  Wren.Holloway@Example.TEST ', name: '  Wren Holloway ', teamName: ' Heron Lane Finds  ' })
    expect(parsed).toEqual(goodRegistration)
  })

  it('names every bad field with its own message', () => {
    const found = problems(registerSchema.safeParse({ email: 'not-an-address', password: 'short', name: '   ', teamName: 'x' }))
    expect(found).toEqual({
      email: ['Enter an e-mail address like name@example.com.'],
      password: [`Use at least ${PASSWORD_MIN} characters.`],
      name: ['Enter your name.'],
      teamName: ['Team names need at least 2 characters.'],
    })
  })

  it('refuses missing fields', () => {
    const found = problems(registerSchema.safeParse({}))
    expect(Object.keys(found).sort()).toEqual(['email', 'name', 'password', 'teamName'])
  })

  it('limits lengths: e-mail 254, name 120, team name 120, password 128', () => {
    const longLocal = `${'a'.repeat(250)}@example.test`
    expect(problems(registerSchema.safeParse({ ...goodRegistration, email: longLocal })).email).toContain('E-mail addresses are at most 254 characters.')
    expect(problems(registerSchema.safeParse({ ...goodRegistration, name: 'n'.repeat(121) })).name).toEqual(['Names are at most 120 characters.'])
    expect(problems(registerSchema.safeParse({ ...goodRegistration, teamName: 't'.repeat(121) })).teamName).toEqual(['Team names are at most 120 characters.'])
    expect(problems(registerSchema.safeParse({ ...goodRegistration, password: 'p'.repeat(PASSWORD_MAX + 1) })).password).toEqual([`Use at most ${PASSWORD_MAX} characters.`])
    expect(registerSchema.safeParse({ ...goodRegistration, name: 'n'.repeat(120), teamName: 't'.repeat(120), password: 'p'.repeat(PASSWORD_MAX) }).success).toBe(true)
  })

  it('does not impose composition rules on the password (NIST SP 800-63B 5.1.1.2)', () => {
    expect(registerSchema.safeParse({ ...goodRegistration, password: 'alllowercaseletters' }).success).toBe(true)
    expect(registerSchema.safeParse({ ...goodRegistration, password: 'with spaces in it' }).success).toBe(true)
  })

  it('refuses values of the wrong type', () => {
    const found = problems(registerSchema.safeParse({ ...goodRegistration, email: 42, password: ['x'] }))
    expect(Object.keys(found).sort()).toEqual(['email', 'password'])
  })
})

describe('loginSchema', () => {
  it('accepts any non-empty password, so old passwords that the policy would now refuse still sign in', () => {
    expect(loginSchema.parse({ email: ' Ada@Example.test', password: 'x' })).toEqual({ email: 'ada@example.test', password: 'x' })
  })

  it('asks for the password when it is empty, and refuses absurdly long ones', () => {
    expect(problems(loginSchema.safeParse({ email: 'ada@example.test', password: '' }))).toEqual({ password: ['Enter your password.'] })
    expect(Object.keys(problems(loginSchema.safeParse({ email: 'ada@example.test', password: 'p'.repeat(1025) })))).toEqual(['password'])
  })

  it('asks for a real e-mail address', () => {
    expect(problems(loginSchema.safeParse({ email: 'ada@', password: 'whatever' }))).toEqual({ email: ['Enter an e-mail address like name@example.com.'] })
  })
})

describe('password change and reset schemas', () => {
  it('change: current password required, new password 8..128', () => {
    expect(changePasswordSchema.safeParse({ currentPassword: 'old', newPassword: 'a new long one' }).success).toBe(true)
    expect(problems(changePasswordSchema.safeParse({ currentPassword: '', newPassword: 'short' }))).toEqual({
      currentPassword: ['Enter your current password.'],
      newPassword: [`Use at least ${PASSWORD_MIN} characters.`],
    })
  })

  it('reset request: only an e-mail address', () => {
    expect(passwordResetRequestSchema.parse({ email: 'Ada@Example.test' })).toEqual({ email: 'ada@example.test' })
    expect(Object.keys(problems(passwordResetRequestSchema.safeParse({ email: 'nobody' })))).toEqual(['email'])
  })

  it('reset confirm: a token of plausible length and a policy-length password', () => {
    const token = 'A'.repeat(43)
    expect(passwordResetConfirmSchema.safeParse({ token, password: 'plenty long enough' }).success).toBe(true)
    expect(Object.keys(problems(passwordResetConfirmSchema.safeParse({ token: 'short', password: 'plenty long enough' })))).toEqual(['token'])
    expect(Object.keys(problems(passwordResetConfirmSchema.safeParse({ token: 'A'.repeat(201), password: 'plenty long enough' })))).toEqual(['token'])
    expect(problems(passwordResetConfirmSchema.safeParse({ token, password: 'seven77' }))).toEqual({ password: [`Use at least ${PASSWORD_MIN} characters.`] })
  })

  it('logout: no body, an empty body, or { everywhere: boolean }', () => {
    expect(logoutSchema.safeParse(undefined).success).toBe(true)
    expect(logoutSchema.parse({})).toEqual({})
    expect(logoutSchema.parse({ everywhere: true })).toEqual({ everywhere: true })
    expect(Object.keys(problems(logoutSchema.safeParse({ everywhere: 'yes' })))).toEqual(['everywhere'])
  })

  it('profile: a trimmed, non-empty name', () => {
    expect(profilePatchSchema.parse({ name: ' Ada Quill ' })).toEqual({ name: 'Ada Quill' })
    expect(problems(profilePatchSchema.safeParse({ name: '' }))).toEqual({ name: ['Enter your name.'] })
  })
})

describe('team and invitation schemas', () => {
  it('roles: one of the four, with a message that lists them', () => {
    for (const role of ROLES) expect(roleSchema.parse(role)).toBe(role)
    expect(problems(roleSchema.safeParse('admin'))).toEqual({ '': ['Role must be one of: owner, editor, contributor, viewer.'] })
    expect(roleSchema.safeParse('Owner').success).toBe(false)
  })

  it('invitation: an e-mail address and a role', () => {
    expect(invitationCreateSchema.parse({ email: ' Newcomer@Example.test', role: 'viewer' })).toEqual({ email: 'newcomer@example.test', role: 'viewer' })
    expect(problems(invitationCreateSchema.safeParse({ email: 'nope', role: 'boss' }))).toEqual({
      email: ['Enter an e-mail address like name@example.com.'],
      role: ['Role must be one of: owner, editor, contributor, viewer.'],
    })
  })

  it('accepting: an empty body (signed in) or a name and a password (new account)', () => {
    expect(invitationAcceptSchema.parse({})).toEqual({})
    expect(invitationAcceptSchema.parse({ name: ' Tove ', password: 'brass-hinge-lantern' })).toEqual({ name: 'Tove', password: 'brass-hinge-lantern' })
    expect(problems(invitationAcceptSchema.safeParse({ name: '', password: 'short' }))).toEqual({
      name: ['Enter your name.'],
      password: [`Use at least ${PASSWORD_MIN} characters.`],
    })
  })

  it('member patch: a valid role only', () => {
    expect(memberPatchSchema.parse({ role: 'editor' })).toEqual({ role: 'editor' })
    expect(Object.keys(problems(memberPatchSchema.safeParse({})))).toEqual(['role'])
  })

  it('team create and patch: names of 2..120 characters, real IANA time zones', () => {
    expect(teamCreateSchema.parse({ name: ' Cobble Yard ' })).toEqual({ name: 'Cobble Yard' })
    expect(problems(teamCreateSchema.safeParse({ name: 'x' }))).toEqual({ name: ['Team names need at least 2 characters.'] })
    expect(teamPatchSchema.parse({})).toEqual({})
    expect(teamPatchSchema.parse({ timeZone: 'Europe/Lisbon' })).toEqual({ timeZone: 'Europe/Lisbon' })
    expect(teamPatchSchema.parse({ timeZone: 'UTC', name: 'Cobble Yard' })).toEqual({ timeZone: 'UTC', name: 'Cobble Yard' })
    expect(problems(teamPatchSchema.safeParse({ timeZone: 'Mars/Olympus_Mons' }))).toEqual({ timeZone: ['Unknown time zone.'] })
  })

  it('team slugs: lower-case letters, digits and inner hyphens, 1..64 characters', () => {
    for (const ok of ['a', 'heron-lane-finds', 'team-2', '9lives', 'a'.repeat(64)]) expect(teamSlug.safeParse(ok).success, ok).toBe(true)
    for (const bad of ['', '-lead', 'trail-', 'Upper', 'under_score', 'sp ace', 'dot.ted', 'a'.repeat(65), '../etc']) {
      expect(teamSlug.safeParse(bad).success, bad).toBe(false)
    }
  })

  it('id parameters: positive safe integers, coerced from the path text', () => {
    expect(idParam.parse('17')).toBe(17)
    for (const bad of ['0', '-3', '1.5', 'abc', '9007199254740993']) expect(idParam.safeParse(bad).success, bad).toBe(false)
    expect(teamUserParams.parse({ team: 'heron-lane', userId: '5' })).toEqual({ team: 'heron-lane', userId: 5 })
    expect(teamIdParams.safeParse({ team: 'Heron Lane', id: '5' }).success).toBe(false)
  })
})

describe('passwordProblem (server password policy)', () => {
  // NIST SP 800-63B 5.1.1.2: memorized secrets of at least 8 characters.
  it('refuses fewer than 8 characters and accepts 8', () => {
    expect(PASSWORD_MIN).toBe(8)
    expect(passwordProblem('7chars!')).toBe('Use at least 8 characters.')
    expect(passwordProblem('')).toBe('Use at least 8 characters.')
    expect(passwordProblem('8chars!x')).toBeNull()
  })

  // NIST SP 800-63B 5.1.1.2: verifiers SHOULD permit at least 64 characters; Tallymark allows up to 128.
  it('accepts 64 and 128 characters, refuses 129', () => {
    expect(PASSWORD_MAX).toBe(128)
    const phrase = 'the blue jug behind the counter '
    expect(passwordProblem(phrase.repeat(2))).toBeNull()
    expect(passwordProblem(phrase.repeat(4))).toBeNull()
    expect(phrase.repeat(4)).toHaveLength(128)
    expect(passwordProblem(`${phrase.repeat(4)}x`)).toBe('Use at most 128 characters.')
  })

  // NIST SP 800-63B 5.1.1.2: compare against a list of commonly used or compromised values.
  it('refuses commonly used passwords, whatever their letter case', () => {
    const common = 'This password is on a list of commonly used passwords. Choose another one.'
    for (const p of ['password1', 'qwerty123', 'PASSWORD1', 'QwErTy123', '12345678', 'iloveyou1']) expect(passwordProblem(p), p).toBe(common)
  })

  // NIST SP 800-63B 5.1.1.2: no composition rules (no required mix of character types).
  it('imposes no composition rule: passphrases of plain lower-case words are fine', () => {
    expect(passwordProblem('correct horse battery')).toBeNull()
    expect(passwordProblem('lowercaseonlywords')).toBeNull()
    expect(passwordProblem('9173640285')).toBeNull()
  })

  // NIST SP 800-63B 5.1.1.2: all printing characters, spaces and Unicode are allowed.
  it('accepts spaces, punctuation and Unicode', () => {
    expect(passwordProblem('  ~!@#$%^&*()  ')).toBeNull()
    expect(passwordProblem('çà et là, ünïcødé')).toBeNull()
  })

  it('refuses a single repeated character', () => {
    expect(passwordProblem('~~~~~~~~~~')).toBe('A single repeated character is too easy to guess.')
    expect(passwordProblem('zzzzzzzzzzzz')).toBe('A single repeated character is too easy to guess.')
    expect(passwordProblem('zzzzzzzzzzzy')).toBeNull()
  })

  // NIST SP 800-63B 5.1.1.2: context-specific words such as the user name are refused.
  it('refuses the e-mail address or its local part as the password', () => {
    const email = 'tamsin.vale@example.test'
    const mine = 'Do not use your e-mail address as your password.'
    expect(passwordProblem('tamsin.vale@example.test', { email })).toBe(mine)
    expect(passwordProblem('Tamsin.Vale@Example.Test', { email })).toBe(mine)
    expect(passwordProblem('tamsin.vale', { email })).toBe(mine)
    expect(passwordProblem('TAMSIN.VALE', { email })).toBe(mine)
    expect(passwordProblem('tamsin.vale', {})).toBeNull()
    expect(passwordProblem('tamsin.vale-and-more', { email })).toBeNull()
  })
})

describe('roles', () => {
  it('are ordered from most to least powerful', () => {
    expect(ROLES).toEqual(['owner', 'editor', 'contributor', 'viewer'])
  })

  it('roleAtLeast compares by rank: a role satisfies itself and every role below it, never one above', () => {
    for (const [i, role] of ROLES.entries()) {
      for (const [j, minimum] of ROLES.entries()) expect(roleAtLeast(role, minimum), `${role} >= ${minimum}`).toBe(i <= j)
    }
    expect(roleAtLeast('viewer', 'owner')).toBe(false)
    expect(roleAtLeast('owner', 'viewer')).toBe(true)
    expect(roleAtLeast('contributor', 'editor')).toBe(false)
  })

  it('only owners hand out roles, and they may hand out every role', () => {
    expect(assignableRoles('owner')).toEqual(['owner', 'editor', 'contributor', 'viewer'])
    for (const role of ['editor', 'contributor', 'viewer'] satisfies Role[]) expect(assignableRoles(role), role).toEqual([])
    // A copy: a caller that changes the list does not change the rule.
    assignableRoles('owner').pop()
    expect(assignableRoles('owner')).toHaveLength(4)
  })

  it('every role has a label and a description', () => {
    expect(Object.keys(ROLE_LABELS).sort()).toEqual([...ROLES].sort())
    expect(Object.keys(ROLE_DESCRIPTIONS).sort()).toEqual([...ROLES].sort())
    expect(ROLE_LABELS).toEqual({ owner: 'Owner', editor: 'Editor', contributor: 'Contributor', viewer: 'Viewer' })
    for (const role of ROLES) expect(ROLE_DESCRIPTIONS[role].length, role).toBeGreaterThan(10)
  })
})
