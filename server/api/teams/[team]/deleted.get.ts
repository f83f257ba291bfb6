// Recently deleted entries of every type, for editors to restore (owners may purge them).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  return await wikiListDeleted(access)
})
