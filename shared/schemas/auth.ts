import { z } from 'zod'
import { ROLES } from '../roles'
import { email, password, personName, teamName, teamSlug, idParam } from './common'

export const registerSchema = z.object({ email, password, name: personName, teamName })
export const loginSchema = z.object({ email, password: z.string().min(1, 'Enter your password.').max(1024) })
export const logoutSchema = z.object({ everywhere: z.boolean().optional() }).optional()
export const passwordResetRequestSchema = z.object({ email })
export const passwordResetConfirmSchema = z.object({ token: z.string().min(20).max(200), password })
export const changePasswordSchema = z.object({ currentPassword: z.string().min(1, 'Enter your current password.').max(1024), newPassword: password })
export const roleSchema = z.enum(ROLES, { message: `Role must be one of: ${ROLES.join(', ')}.` })
export const invitationCreateSchema = z.object({ email, role: roleSchema })
export const invitationAcceptSchema = z.object({
  // A signed-in person accepts with no body; a newcomer sends a name and a password to create the account.
  name: personName.optional(),
  password: password.optional(),
})
export const memberPatchSchema = z.object({ role: roleSchema })
export const teamCreateSchema = z.object({ name: teamName })
export const teamPatchSchema = z.object({
  name: teamName.optional(),
  timeZone: z.string().max(64).refine(isTimeZone, 'Unknown time zone.').optional(),
})
export const teamParams = z.object({ team: teamSlug })
export const teamIdParams = z.object({ team: teamSlug, id: idParam })
export const teamUserParams = z.object({ team: teamSlug, userId: idParam })
export const profilePatchSchema = z.object({ name: personName })

function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value })
    return true
  }
  catch {
    return false
  }
}

export type RegisterInput = z.infer<typeof registerSchema>
export type LoginInput = z.infer<typeof loginSchema>
