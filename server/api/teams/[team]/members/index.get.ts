export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  return { members: await listMembers(access.team.id) }
})
