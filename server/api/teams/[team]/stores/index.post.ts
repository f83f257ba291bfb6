// Adds a store.
import { storeCreateSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const input = await validBody(event, storeCreateSchema)
  const created = await ledgerCreateStore(access, input)
  setResponseStatus(event, 201)
  return created
})
