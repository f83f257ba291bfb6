import { invitationCreateSchema } from '../../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const { email, role } = await validBody(event, invitationCreateSchema)
  const invitation = await createInvitation(event, access, email, role)
  setResponseStatus(event, 201)
  return { invitation }
})
