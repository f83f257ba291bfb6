// The team's ledger settings: mileage rate (cents per mile) and condition scale.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  return await ledgerSettingsOf(useDb(), access.team.id)
})
