export default defineEventHandler(async (event) => {
  const { team, role } = await requireMember(event, 'viewer')
  return { team: { slug: team.slug, name: team.name, timeZone: team.timeZone }, role }
})
