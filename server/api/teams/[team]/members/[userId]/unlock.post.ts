import { teamUserParams } from '../../../../../../shared/schemas/auth'

// An owner unlocks a member's account after too many failed sign-ins (the 423 answer points here).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const { userId } = validParams(event, teamUserParams)
  return await unlockMember(event, access, userId)
})
