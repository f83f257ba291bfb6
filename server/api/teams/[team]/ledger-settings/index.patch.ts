// Changes the team's ledger settings (editors and owners). Trips keep the mileage rate they were recorded with.
import { ledgerSettingsPatchSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const patch = await validBody(event, ledgerSettingsPatchSchema)
  return await ledgerUpdateSettings(access, patch)
})
