// The sourcing sheet: the marks and makers that earned the most, sold fastest, and the ones to leave on the shelf.
import { sourcingSheetQuery } from '../../../../../shared/schemas/reports'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, sourcingSheetQuery)
  return await reportSourcingSheet(access, query)
})
