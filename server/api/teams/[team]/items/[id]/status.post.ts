// Moves an item to another status along the transitions table (shared/ledger/item-rules.ts), recorded as an event.
// Who may: per transition, contributors for their own items and editors for all (the table says).
import { itemStatusSchema, ledgerIdParams } from '../../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  const input = await validBody(event, itemStatusSchema)
  return await idempotentCall(event, access, input, () => itemChangeStatus(access, id, input))
})
