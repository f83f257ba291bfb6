import { memberPatchSchema, teamUserParams } from '../../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const { userId } = validParams(event, teamUserParams)
  const { role } = await validBody(event, memberPatchSchema)
  await changeMemberRole(event, access, userId, role)
  return { userId, role }
})
