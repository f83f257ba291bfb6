// Sourcing trips with their figures as the items sell, and totals for the filtered trips: the list, filtered, sorted and paged.
import { tripListQuery } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, tripListQuery)
  return await tripList(access, query)
})
