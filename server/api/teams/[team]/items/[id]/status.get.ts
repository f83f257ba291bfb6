// The item's status history: who moved it, when, from what to what.
import { ledgerIdParams } from '../../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, ledgerIdParams)
  return await itemStatusHistory(access, id)
})
