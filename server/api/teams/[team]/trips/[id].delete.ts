// Deletes a sourcing trip.
import { ledgerIdParams } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  return await tripDelete(access, id)
})
