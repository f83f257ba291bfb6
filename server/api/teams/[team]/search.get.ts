// GET /api/teams/<team>/search?q=&types=&country=&materialId=&categoryId=&makerId=&year=&limit=
import { searchQuerySchema } from '../../../../shared/search/schema'
import { useSearchService } from '../../../utils/search/service'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const params = validQuery(event, searchQuerySchema)
  setResponseHeader(event, 'cache-control', 'no-store')
  return await useSearchService().search(access.team, params)
})
