// One wiki entry's own sale outcomes (a mark, maker, material or category with its subcategories): counts,
// price spread, days to sell, net, ROI, sell-through and its ten most recent items.
import { outcomesQuery } from '../../../../../shared/schemas/reports'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, outcomesQuery)
  return await reportOutcomes(access, query)
})
