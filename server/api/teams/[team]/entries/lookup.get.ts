import { wikiLookupQuery } from '../../../../../shared/schemas/wiki'

// The editor's link picker: entries by title, for writing links like /t/<team>/marks/<id>.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { q, types } = validQuery(event, wikiLookupQuery)
  return await wikiLookup(access, q, types)
})
