import { eq } from 'drizzle-orm'
import { profilePatchSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { name } = await validBody(event, profilePatchSchema)
  await useDb().update(tables.users).set({ name }).where(eq(tables.users.id, user.id))
  authCacheForgetUser(user.id)
  return { user: { ...publicUser(user), name } }
})
