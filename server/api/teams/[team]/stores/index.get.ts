// Stores the team sources from (contributors edit their own, editors all): the list, filtered, sorted and paged.
import { storeListQuery } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, storeListQuery)
  return await ledgerListStores(access, query)
})
