import { teamIdParams } from '../../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const { id } = validParams(event, teamIdParams)
  await revokeInvitation(event, access, id)
  return { ok: true }
})
