// A report by category, mark, maker, material, store, member or month: counts, sell-through, days to sell,
// revenue, net, ROI, sale-price quartiles and unsold stock per group, with totals and the formulas used.
// "/reports/mark.csv" or ?format=csv gives the same rows as CSV.
import { reportParams, reportQuery } from '../../../../../shared/schemas/reports'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { dimension: { dimension, csv } } = validParams(event, reportParams)
  const query = validQuery(event, reportQuery)
  const report = await reportRun(access, dimension, query)
  if (!csv && query.format !== 'csv') return report
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${access.team.slug}-report-${dimension}.csv"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  return reportCsv(report)
})
