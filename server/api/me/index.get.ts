export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const teams = await listUserTeams(user.id)
  return { user: publicUser(user), teams }
})
