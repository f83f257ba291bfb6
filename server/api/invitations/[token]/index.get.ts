export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token') ?? ''
  return { invitation: await describeInvitation(token) }
})
