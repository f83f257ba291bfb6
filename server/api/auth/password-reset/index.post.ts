import { passwordResetRequestSchema } from '../../../../shared/schemas/auth'

// Always 202: the answer never tells whether an account exists for the address.
export default defineEventHandler(async (event) => {
  const { email } = await validBody(event, passwordResetRequestSchema)
  await requestPasswordReset(event, email)
  setResponseStatus(event, 202)
  return { ok: true, message: 'If an account exists for this address, a reset link is on its way.' }
})
