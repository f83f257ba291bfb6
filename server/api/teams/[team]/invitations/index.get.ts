export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  return { invitations: await listInvitations(access.team.id) }
})
