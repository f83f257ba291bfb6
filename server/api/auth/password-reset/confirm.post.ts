import { passwordResetConfirmSchema } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token, password } = await validBody(event, passwordResetConfirmSchema)
  await confirmPasswordReset(event, token, password)
  return { ok: true }
})
