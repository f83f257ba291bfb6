// CSV of any filtered view of the items (the item list's filters), streamed in pages of 1,000 rows.
import { itemFilterQuery } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const filters = validQuery(event, itemFilterQuery)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${access.team.slug}-items.csv"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  return sendStream(event, ledgerExportItems(access, filters))
})
