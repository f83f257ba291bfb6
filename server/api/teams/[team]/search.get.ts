// GET /api/teams/<team>/search?q=&types=&country=&materialId=&categoryId=&makerId=&year=&limit=
import { searchQuerySchema } from '../../../../shared/search/schema'
import { useSearchService } from '../../../utils/search/service'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const params = validQuery(event, searchQuerySchema)
  setResponseHeader(event, 'cache-control', 'no-store')
  // JSON text straight from the search worker: no second copy of the answer on this thread.
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return await useSearchService().searchJson(access.team, params)
})
