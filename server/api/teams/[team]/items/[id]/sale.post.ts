// Mark as sold: the sale, its status event and optional timeline notes on the mark and category, in one transaction.
import { itemSaleSchema, ledgerIdParams } from '../../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  const input = await validBody(event, itemSaleSchema)
  // The id is part of the route, so the same key on another item is a different request (422).
  return await idempotentCall(event, access, input, () => itemRecordSale(access, id, input))
})
