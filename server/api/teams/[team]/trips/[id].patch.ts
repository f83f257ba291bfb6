// Edits a sourcing trip; the body carries the revision it is based on (409 with `current` when stale).
import { ledgerIdParams, tripPatchSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  const patch = await validBody(event, tripPatchSchema)
  return await tripUpdate(access, id, patch)
})
