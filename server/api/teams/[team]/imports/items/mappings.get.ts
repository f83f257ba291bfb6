// The column mappings the team's imports used, newest first.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  return await ledgerListImportMappings(access)
})
