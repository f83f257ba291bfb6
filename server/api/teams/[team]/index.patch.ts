import { teamPatchSchema } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const patch = await validBody(event, teamPatchSchema)
  await updateTeam(access.team.id, patch)
  await recordAudit(event, 'team.updated', { teamId: access.team.id, userId: access.user.id, detail: patch })
  return { team: { slug: access.team.slug, name: patch.name ?? access.team.name, timeZone: patch.timeZone ?? access.team.timeZone } }
})
