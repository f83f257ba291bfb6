// Adds a fee profile.
import { feeProfileCreateSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const input = await validBody(event, feeProfileCreateSchema)
  const created = await ledgerCreateFeeProfile(access, input)
  setResponseStatus(event, 201)
  return created
})
