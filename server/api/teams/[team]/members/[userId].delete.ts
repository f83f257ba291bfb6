import { teamUserParams } from '../../../../../shared/schemas/auth'

// Owners remove members; any member removes themself (leaves the team).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { userId } = validParams(event, teamUserParams)
  await removeMember(event, access, userId)
  return { ok: true }
})
