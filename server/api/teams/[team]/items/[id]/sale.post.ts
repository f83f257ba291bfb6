// Mark as sold: the sale, its status event and optional timeline notes on the mark and category, in one transaction.
import { itemSaleSchema, ledgerIdParams } from '../../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  const input = await validBody(event, itemSaleSchema)
  return await itemRecordSale(access, id, input)
})
