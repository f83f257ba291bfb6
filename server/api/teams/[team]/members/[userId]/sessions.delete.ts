import { teamUserParams } from '../../../../../../shared/schemas/auth'

// An owner ends every session of a member (a lost phone, a shared computer).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const { userId } = validParams(event, teamUserParams)
  await endMemberSessions(event, access, userId)
  return { ok: true }
})
