import { logoutSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const body = await validBody(event, logoutSchema)
  const user = event.context.currentUser
  if (user && body?.everywhere) await signOutEverywhere(event, user.id)
  await clearUserSession(event)
  return { ok: true }
})
