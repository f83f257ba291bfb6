// Items with computed net, ROI and days to sell, and SQL totals for the filtered rows: the list, filtered, sorted and paged.
import { itemListQuery } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, itemListQuery)
  return await itemList(access, query)
})
