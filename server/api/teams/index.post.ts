import { teamCreateSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { name } = await validBody(event, teamCreateSchema)
  const team = await createTeam(useDb(), { name, ownerId: user.id })
  await recordAudit(event, 'team.created', { teamId: team.id, userId: user.id })
  setResponseStatus(event, 201)
  return { team: { slug: team.slug, name: team.name, role: 'owner' } }
})
