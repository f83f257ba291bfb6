// Edits a store; the body carries the revision it is based on (409 with `current` when stale).
import { ledgerIdParams, storePatchSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, ledgerIdParams)
  const patch = await validBody(event, storePatchSchema)
  return await ledgerUpdateStore(access, id, patch)
})
