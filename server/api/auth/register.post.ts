import { registerSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const input = await validBody(event, registerSchema)
  const { user, team } = await registerAccount(event, input)
  await startSession(event, user)
  setResponseStatus(event, 201)
  return { user: publicUser(user), team: { slug: team.slug, name: team.name } }
})
