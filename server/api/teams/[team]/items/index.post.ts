// Adds an item. With an Idempotency-Key (the phone's queue sends one), a repeat answers the first item again.
import { itemCreateSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const input = await validBody(event, itemCreateSchema)
  return await idempotentCall(event, access, input, () => itemCreate(access, input), { status: 201 })
})
