// Fee profiles per channel (editors and owners manage them; exactly one is the default): the list, filtered, sorted and paged.
import { feeProfileListQuery } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, feeProfileListQuery)
  return await ledgerListFeeProfiles(access, query)
})
