// Edits a fee profile; the body carries the revision it is based on (409 with `current` when stale).
import { feeProfilePatchSchema, ledgerIdParams } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const { id } = validParams(event, ledgerIdParams)
  const patch = await validBody(event, feeProfilePatchSchema)
  return await ledgerUpdateFeeProfile(access, id, patch)
})
