import { changePasswordSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { currentPassword, newPassword } = await validBody(event, changePasswordSchema)
  await changePassword(event, user.id, currentPassword, newPassword)
  return { ok: true }
})
