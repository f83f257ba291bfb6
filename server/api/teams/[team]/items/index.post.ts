// Adds a item.
import { itemCreateSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const input = await validBody(event, itemCreateSchema)
  const created = await itemCreate(access, input)
  setResponseStatus(event, 201)
  return created
})
