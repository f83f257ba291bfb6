// One sourcing trip.
import { ledgerIdParams } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, ledgerIdParams)
  return await tripGet(access, id)
})
