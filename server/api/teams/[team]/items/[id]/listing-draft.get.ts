// A listing title and description assembled from the item's mark, maker, era, material, measurements and condition.
import { ledgerIdParams } from '../../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, ledgerIdParams)
  return await itemListingDraft(access, id)
})
