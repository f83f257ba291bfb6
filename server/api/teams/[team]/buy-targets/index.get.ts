// The team's buy targets (minimum profit, minimum ROI, longest time to sell); the defaults until the owner saves.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  return await buyCheckTargets(access)
})
