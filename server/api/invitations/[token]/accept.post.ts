import { invitationAcceptSchema } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token') ?? ''
  const input = await validBody(event, invitationAcceptSchema)
  return await acceptInvitation(event, token, input)
})
