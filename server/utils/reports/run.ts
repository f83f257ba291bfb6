// The routes' side of the reports: the engine (engine.ts) on the app's pool with its figures cached (cache.ts),
// its problems as API errors, the CSV of a report and the owner's buy targets.
import { and, eq } from 'drizzle-orm'
import Papa from 'papaparse'
import type { z } from 'zod'
import { csvTextCell } from '../../../shared/csv-cells'
import { centsToDecimalText } from '../../../shared/ledger/import-values'
import type { buyCheckQuery, buyTargetsPatchSchema, outcomesQuery, reportQuery, ReportDimension, sourcingSheetQuery } from '../../../shared/schemas/reports'
import type { BuyTargets, ReportResponse, ReportRow } from '../../../shared/reports/types'
import { buyCheckCompute, buyCheckTargetsOf, reportCompute, reportOutcomesCompute, ReportProblem, reportSourcingCompute, type ReportExec } from './engine'
import { reportCachingExec } from './cache'

export const reportExec: ReportExec = async (statement) => {
  const [rows] = await useDb().execute(statement) as unknown as [Record<string, unknown>[]]
  return rows
}

/** The exec of one request: a report, the sourcing sheet and entry outcomes reuse figures while they hold. */
const teamExec = (access: TeamAccess): ReportExec => reportCachingExec(access.team.id, reportExec)

async function answer<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  }
  catch (error) {
    if (error instanceof ReportProblem) throw httpError(error.statusCode, error.message, error.fieldErrors)
    throw error
  }
}

export async function reportRun(access: TeamAccess, dimension: ReportDimension, query: z.infer<typeof reportQuery>): Promise<ReportResponse> {
  const { format: _format, ...filters } = query
  return await answer(() => reportCompute(teamExec(access), { teamId: access.team.id, dimension, filters, today: ledgerToday() }))
}

export const REPORT_CSV_COLUMNS = [
  'key', 'label', 'bought', 'listed', 'sold', 'onHandAtStart', 'available', 'sellThrough', 'medianDaysToSell', 'revenue', 'netProfit',
  'costOfSold', 'roi', 'medianSale', 'q1Sale', 'q3Sale', 'unsold', 'unsoldCost', 'unsoldAvgAgeDays',
] as const

/** The report's rows as CSV (money as decimal text, percentages to two decimals), with the totals last. */
export function reportCsv(report: ReportResponse): string {
  const money = (cents: number | null) => cents === null ? '' : centsToDecimalText(cents)
  const ratio = (value: number | null) => value === null ? '' : value.toFixed(2)
  const line = (row: Omit<ReportRow, 'deleted'>) => [
    row.key ?? '', csvTextCell(row.label), row.bought, row.listed, row.sold, row.onHandAtStart, row.available, ratio(row.sellThrough),
    row.medianDaysToSell ?? '', money(row.revenueCents), money(row.netProfitCents), money(row.costOfSoldCents), ratio(row.roi),
    money(row.medianSaleCents), money(row.q1SaleCents), money(row.q3SaleCents), row.unsold, money(row.unsoldCostCents), row.unsoldAvgAgeDays ?? '',
  ]
  const data = [...report.rows.map(line), line({ key: 'total', label: 'All rows', ...report.totals })]
  return `${Papa.unparse({ fields: [...REPORT_CSV_COLUMNS], data }, { newline: '\r\n' })}\r\n`
}

export async function reportOutcomes(access: TeamAccess, query: z.infer<typeof outcomesQuery>) {
  return await answer(() => reportOutcomesCompute(teamExec(access), { teamId: access.team.id, ...query, today: ledgerToday() }))
}

export async function reportSourcingSheet(access: TeamAccess, query: z.infer<typeof sourcingSheetQuery>) {
  return await answer(() => reportSourcingCompute(teamExec(access), { teamId: access.team.id, filters: query, today: ledgerToday() }))
}

export async function buyCheckRun(access: TeamAccess, query: z.infer<typeof buyCheckQuery>) {
  return await answer(() => buyCheckCompute(reportExec, { teamId: access.team.id, ...query }))
}

export async function buyCheckTargets(access: TeamAccess): Promise<BuyTargets> {
  return await buyCheckTargetsOf(reportExec, access.team.id)
}

function targetsConflict(current: BuyTargets) {
  return httpError(409, `Someone saved the buy targets while you were editing (they are now at revision ${current.revision}). `
    + 'Your changes were not saved: compare them with the current targets and save again.', undefined, { current })
}

/** Owner only (the route checks): saves the targets, refusing a stale revision in the write itself. */
export async function buyCheckUpdateTargets(access: TeamAccess, patch: z.infer<typeof buyTargetsPatchSchema>): Promise<BuyTargets> {
  const teamId = access.team.id
  const current = await buyCheckTargets(access)
  if (patch.revision !== current.revision) throw targetsConflict(current)
  const next = {
    minProfitCents: patch.minProfitCents ?? current.minProfitCents,
    minRoiBp: Math.round((patch.minRoiPercent ?? current.minRoiPercent) * 100),
    maxDaysToSell: patch.maxDaysToSell ?? current.maxDaysToSell,
  }
  const t = tables.buyTargets
  try {
    if (current.revision === 0) await useDb().insert(t).values({ teamId, revision: 1, ...next, updatedBy: access.user.id })
    else {
      const [result] = await useDb().update(t).set({ ...next, revision: current.revision + 1, updatedBy: access.user.id })
        .where(and(eq(t.teamId, teamId), eq(t.revision, current.revision)))
      if (result.affectedRows !== 1) throw targetsConflict(await buyCheckTargets(access))
    }
  }
  catch (error) {
    if (isDuplicateKey(error)) throw targetsConflict(await buyCheckTargets(access))
    throw error
  }
  return await buyCheckTargets(access)
}
