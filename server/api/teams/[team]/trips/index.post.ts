// Adds a sourcing trip.
import { tripCreateSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const input = await validBody(event, tripCreateSchema)
  const created = await tripCreate(access, input)
  setResponseStatus(event, 201)
  return created
})
