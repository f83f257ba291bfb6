// Deletes a fee profile.
import { ledgerIdParams } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const { id } = validParams(event, ledgerIdParams)
  return await ledgerDeleteFeeProfile(access, id)
})
