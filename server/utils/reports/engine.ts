// The reports, entry outcomes, sourcing sheet and buy check, given a way to run SQL. Plain imports only: the
// routes run it on the app's pool (server/utils/reports/run.ts), the benchmark on a connection of its own, so
// "the same SQL run directly" is exactly this code without HTTP, sessions and JSON.
import { sql, type SQL } from 'drizzle-orm'
import { DEFAULT_CONDITION_SCALE } from '../../../shared/ledger/item-rules'
import { NO_FEES, type FeeProfile } from '../../../shared/ledger/fees'
import { EXAMPLE_RATE_TABLE, estimatePostage } from '../../../shared/ledger/postage'
import { roundHalfUp } from '../../../shared/ledger/money'
import { buyCheckConditionNote, buyCheckEvaluate, BUY_CHECK_MIN_COMPARABLES, DEFAULT_BUY_TARGETS } from '../../../shared/reports/buy-check'
import { EMPTY_COUNTS, reportDefinitions, reportFigures, reportQuartileCents, reportWhole, type ReportCountsRow, type ReportStatsRow } from '../../../shared/reports/figures'
import { REPORT_MAX_MONTHS, type OutcomeType, type ReportDimension } from '../../../shared/schemas/reports'
import type {
  BuyCheckBasis, BuyCheckCaution, BuyCheckResponse, BuyCheckSpread, BuyTargets, OutcomeItem, OutcomesResponse, ReportFigures,
  ReportResponse, ReportRow, SourcingLists, SourcingSheetResponse, SourcingSheetRow,
} from '../../../shared/reports/types'
import type { ItemStatus } from '../../../shared/ledger/item-rules'
import {
  buyCheckLevelCountsSql, buyCheckStatsSql, reportCountsSql, reportFirstMonthSql, reportLabelsSql, reportMonthCountsSql,
  reportGroupSoldStatsSql, reportRecentItemsSql, reportSoldTotalsSql, type BuyCheckLevel, type ReportMonthRange, type ReportSqlFilters, type ReportSqlInput,
} from './sql'

/**
 * Runs one statement. `figures` marks a statement that reads only items and wiki entries: its answer may be
 * reused while the team's ledger and wiki versions stand (cache.ts). Names of stores and people, fee profiles,
 * targets and settings change without either version moving, so those statements are always run.
 */
export type ReportExec = (query: SQL, reads?: 'figures') => Promise<Record<string, unknown>[]>

/** A 400 or 404 from the engine; the routes turn it into the API's error shape. */
export class ReportProblem extends Error {
  constructor(public statusCode: 400 | 404, message: string, public fieldErrors?: Record<string, string[]>) {
    super(message)
  }
}

// ---- Dates (calendar days, UTC, as the ledger stores them)

const DAY_MS = 86_400_000
const dayNumber = (iso: string) => Date.parse(`${iso}T00:00:00Z`) / DAY_MS
const isoOf = (days: number) => new Date(days * DAY_MS).toISOString().slice(0, 10)
const monthStart = (iso: string) => `${iso.slice(0, 7)}-01`
function monthEnd(iso: string): string {
  const [y, m] = iso.split('-').map(Number) as [number, number]
  return new Date(Date.UTC(y, m, 0)).toISOString().slice(0, 10)
}
function addMonths(first: string, months: number): string {
  const [y, m] = first.split('-').map(Number) as [number, number]
  return new Date(Date.UTC(y, m - 1 + months, 1)).toISOString().slice(0, 10)
}
const monthsBetween = (first: string, last: string) =>
  (Number(last.slice(0, 4)) - Number(first.slice(0, 4))) * 12 + Number(last.slice(5, 7)) - Number(first.slice(5, 7)) + 1
const monthLabel = (ym: string) => new Date(`${ym}-01T00:00:00Z`).toLocaleString('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' })
const minDay = (a: string, b: string) => (a < b ? a : b)

/** Today's date in UTC less `days`. */
export function reportDaysBefore(today: string, days: number): string {
  return isoOf(dayNumber(today) - days)
}

// ---- Reports

const NONE_LABEL: Record<Exclude<ReportDimension, 'month'>, string> = {
  category: 'No category', mark: 'No mark', maker: 'No maker', material: 'No material', store: 'No store', member: 'Not recorded',
}

export interface ReportComputeInput {
  teamId: number
  dimension: ReportDimension
  filters: ReportSqlFilters
  /** Today (UTC), yyyy-mm-dd. */
  today: string
}

/** The key that joins a group's counts to its price statistics; items without a group are group 0 in both. */
function groupKey(value: unknown): string {
  return value === null || value === undefined ? '0' : String(value)
}

/**
 * The period's counts from its month rows (the months cover the whole period): what happened in the period is
 * the sum over the months, the stock at its start is the first month's, the unsold stock at its end the last one's.
 */
function monthTotals(rows: Record<string, unknown>[]): Record<string, unknown> | undefined {
  const first = rows[0]
  const last = rows.at(-1)
  if (!first || !last) return undefined
  const sum = (key: string) => rows.reduce((total, r) => total + reportWhole(r[key]), 0)
  return {
    bought: sum('bought'), listed: sum('listed'), sold: sum('sold'), revenue: sum('revenue'), net: sum('net'), sold_cost: sum('sold_cost'),
    on_start: first.on_start, unsold: last.unsold, unsold_cost: last.unsold_cost, unsold_age_days: last.unsold_age_days,
  }
}

/** Splits grouped counts into the groups and the WITH ROLLUP totals row (group NULL). */
function splitRollup(rows: Record<string, unknown>[]): { groups: Record<string, unknown>[], totals: Record<string, unknown> | undefined } {
  return { groups: rows.filter(r => r.g !== null && r.g !== undefined), totals: rows.find(r => r.g === null || r.g === undefined) }
}

async function categoryName(exec: ReportExec, teamId: number, id: number): Promise<string> {
  const [row] = await exec(sql`SELECT name FROM categories WHERE team_id = ${teamId} AND id = ${id}`, 'figures')
  if (!row) throw new ReportProblem(404, `No category with id ${id} in this team.`)
  return String(row.name)
}

async function labelsOf(exec: ReportExec, teamId: number, dimension: Exclude<ReportDimension, 'month'>, ids: number[]) {
  const statement = reportLabelsSql(teamId, dimension, ids)
  // Entries' names move the wiki version on when they change; stores' and people's names do not.
  const rows = statement ? await exec(statement, dimension === 'store' || dimension === 'member' ? undefined : 'figures') : []
  return new Map(rows.map(r => [Number(r.id), { label: String(r.label ?? ''), deleted: Boolean(Number(r.deleted)) }]))
}

export async function reportCompute(exec: ReportExec, input: ReportComputeInput): Promise<ReportResponse> {
  const { teamId, dimension, today } = input
  const filters: ReportSqlFilters = { ...input.filters }
  if (filters.parentId && dimension !== 'category') {
    throw new ReportProblem(400, 'Please check the query: parentId: a parent applies to the category report only.', { parentId: ['A parent applies to the category report only.'] })
  }
  const parent = filters.parentId ? { id: filters.parentId, name: await categoryName(exec, teamId, filters.parentId) } : null

  let range: ReportMonthRange | null = null
  if (dimension === 'month') {
    // Whole months, so each row's counts and medians cover the same days.
    if (filters.from) filters.from = monthStart(filters.from)
    if (filters.to) filters.to = monthEnd(filters.to)
    const last = monthStart(minDay(filters.to ?? today, today))
    let first = filters.from
    if (!first) {
      const [row] = await exec(reportFirstMonthSql({ teamId, dimension, filters, ageDay: today }), 'figures')
      first = row?.first ? String(row.first) : undefined
    }
    if (first && monthsBetween(first, last) > REPORT_MAX_MONTHS) {
      if (filters.from) {
        throw new ReportProblem(400, `Please check the query: from: a month report covers at most ${REPORT_MAX_MONTHS} months.`, { from: [`A month report covers at most ${REPORT_MAX_MONTHS} months.`] })
      }
      first = addMonths(last, 1 - REPORT_MAX_MONTHS)
      filters.from = first
    }
    if (first && first <= last) range = { first, last }
  }
  // An end on or after today adds nothing (nothing is recorded later), and the statements are cheaper without it.
  const sqlFilters = filters.to && filters.to >= today ? { ...filters, to: null } : filters
  const sqlInput: ReportSqlInput = { teamId, dimension, filters: sqlFilters, ageDay: minDay(filters.to ?? today, today) }

  // The grouped counts carry their totals (WITH ROLLUP); the month rows carry them too (see monthTotals).
  const [grouped, stats, totalStats] = await Promise.all([
    dimension === 'month' ? (range ? exec(reportMonthCountsSql(sqlInput, range), 'figures') : Promise.resolve([])) : exec(reportCountsSql(sqlInput, true), 'figures'),
    exec(reportGroupSoldStatsSql(sqlInput), 'figures'),
    exec(reportSoldTotalsSql(sqlInput), 'figures'),
  ])
  const { groups: counts, totals: rollupTotals } = dimension === 'month' ? { groups: grouped, totals: monthTotals(grouped) } : splitRollup(grouped)
  const statsByGroup = new Map(stats.map(r => [groupKey(r.g), r as unknown as ReportStatsRow]))

  let rows: ReportRow[]
  if (dimension === 'month') {
    rows = counts.map(r => ({
      key: String(r.g), label: monthLabel(String(r.g)), deleted: false,
      ...reportFigures(r as unknown as ReportCountsRow, statsByGroup.get(groupKey(r.g))),
    }))
  }
  else {
    const ids = counts.map(r => Number(r.g)).filter(id => id > 0)
    const labels = await labelsOf(exec, teamId, dimension, ids)
    rows = counts.map((r) => {
      const id = Number(r.g) > 0 ? Number(r.g) : null
      const named = id === null ? null : labels.get(id)
      return {
        key: id,
        label: id === null ? NONE_LABEL[dimension] : named?.label || `#${id} (removed)`,
        deleted: named?.deleted ?? false,
        ...reportFigures(r as unknown as ReportCountsRow, statsByGroup.get(groupKey(r.g))),
      }
    })
    rows.sort((a, b) => Number(a.key === null) - Number(b.key === null) || b.netProfitCents - a.netProfitCents
      || b.sold - a.sold || a.label.localeCompare(b.label))
  }
  const appliedFilters = Object.fromEntries(Object.entries(input.filters).filter(([, v]) => v !== null && v !== undefined && v !== '')) as Record<string, string | number>
  return {
    dimension,
    period: { from: filters.from ?? null, to: filters.to ?? null, ageDay: sqlInput.ageDay },
    filters: appliedFilters,
    parent,
    rows,
    totals: reportFigures((rollupTotals ?? EMPTY_COUNTS) as unknown as ReportCountsRow, totalStats[0] as unknown as ReportStatsRow | undefined),
    definitions: reportDefinitions(dimension),
  }
}

// ---- Entry outcomes

const OUTCOME_TABLES: Record<OutcomeType, { table: string, name: string, filter: keyof ReportSqlFilters, ledger: string }> = {
  mark: { table: 'marks', name: 'title', filter: 'markId', ledger: 'markId' },
  maker: { table: 'makers', name: 'name', filter: 'makerId', ledger: 'makerId' },
  material: { table: 'materials', name: 'name', filter: 'materialId', ledger: 'materialId' },
  category: { table: 'categories', name: 'name', filter: 'categoryId', ledger: 'categoryId' },
}

export interface ReportOutcomesInput { teamId: number, type: OutcomeType, id: number, from?: string | null, to?: string | null, today: string }

export async function reportOutcomesCompute(exec: ReportExec, input: ReportOutcomesInput): Promise<OutcomesResponse> {
  const meta = OUTCOME_TABLES[input.type]
  const [entry] = await exec(sql`SELECT ${sql.raw(meta.name)} AS name FROM ${sql.raw(meta.table)} WHERE team_id = ${input.teamId} AND id = ${input.id}`, 'figures')
  if (!entry) throw new ReportProblem(404, `No ${input.type} with id ${input.id} in this team.`)
  const sqlInput: ReportSqlInput = {
    teamId: input.teamId, dimension: input.type,
    filters: { from: input.from ?? null, to: input.to ?? null, [meta.filter]: input.id },
    ageDay: minDay(input.to ?? input.today, input.today),
  }
  const [counts, stats, recent] = await Promise.all([
    exec(reportCountsSql(sqlInput, false), 'figures'),
    exec(reportSoldTotalsSql(sqlInput), 'figures'),
    exec(reportRecentItemsSql(sqlInput, 10), 'figures'),
  ])
  const day = (v: unknown) => v === null || v === undefined ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10)
  return {
    type: input.type,
    id: input.id,
    name: String(entry.name),
    includesSubcategories: input.type === 'category',
    figures: reportFigures((counts[0] ?? EMPTY_COUNTS) as unknown as ReportCountsRow, stats[0] as unknown as ReportStatsRow | undefined),
    recent: recent.map((r): OutcomeItem => {
      const acquiredOn = day(r.acquired_on)!
      const soldOn = day(r.sold_on)
      return {
        id: Number(r.id), title: String(r.title), status: String(r.status) as ItemStatus, acquiredOn, soldOn,
        costCents: reportWhole(r.cost_cents),
        salePriceCents: r.sale_price_cents === null ? null : reportWhole(r.sale_price_cents),
        netProfitCents: r.net_profit_cents === null ? null : reportWhole(r.net_profit_cents),
        daysToSell: soldOn && acquiredOn <= soldOn ? dayNumber(soldOn) - dayNumber(acquiredOn) : null,
      }
    }),
    // A category's figures count its subcategories' items: so does the list its link opens.
    ledgerQuery: input.type === 'category' ? { [meta.ledger]: String(input.id), subcategories: '1' } : { [meta.ledger]: String(input.id) },
    definitions: reportDefinitions(),
  }
}

// ---- Sourcing sheet

export const REPORT_SOURCING_RULES = { fastMinSold: 3, shelfMinAvailable: 3, shelfMaxSellThrough: 25, listLength: 8 } as const

export interface ReportSourcingInput { teamId: number, filters: ReportSqlFilters, today: string }

export async function reportSourcingCompute(exec: ReportExec, input: ReportSourcingInput): Promise<SourcingSheetResponse> {
  const filters = { ...input.filters }
  // A sheet for the next trip looks at the last year unless a period is given.
  if (!filters.from && !filters.to) filters.from = reportDaysBefore(input.today, 364)
  const ageDay = minDay(filters.to ?? input.today, input.today)
  const [marks, makers] = await Promise.all((['mark', 'maker'] as const).map(async (type) => {
    const sqlInput: ReportSqlInput = { teamId: input.teamId, dimension: type, filters, ageDay }
    const [counts, stats] = await Promise.all([exec(reportCountsSql(sqlInput, true), 'figures'), exec(reportGroupSoldStatsSql(sqlInput), 'figures')])
    const byGroup = new Map(stats.map(r => [groupKey(r.g), r as unknown as ReportStatsRow]))
    const figures = splitRollup(counts).groups.filter(r => Number(r.g) > 0)
      .map(r => ({ id: Number(r.g), figures: reportFigures(r as unknown as ReportCountsRow, byGroup.get(groupKey(r.g))) }))
    return await sourcingLists(exec, input.teamId, type, figures)
  }))
  const { listLength: _listLength, ...rules } = REPORT_SOURCING_RULES
  return { period: { from: filters.from ?? null, to: filters.to ?? null, ageDay }, marks: marks!, makers: makers!, rules, definitions: reportDefinitions() }
}

async function sourcingLists(exec: ReportExec, teamId: number, type: 'mark' | 'maker', groups: { id: number, figures: ReportFigures }[]): Promise<SourcingLists> {
  const n = REPORT_SOURCING_RULES.listLength
  const topEarners = groups.filter(g => g.figures.sold > 0 && g.figures.netProfitCents > 0)
    .sort((a, b) => b.figures.netProfitCents - a.figures.netProfitCents || b.figures.sold - a.figures.sold).slice(0, n)
  const fastSellers = groups.filter(g => g.figures.sold >= REPORT_SOURCING_RULES.fastMinSold && g.figures.medianDaysToSell !== null)
    .sort((a, b) => a.figures.medianDaysToSell! - b.figures.medianDaysToSell! || b.figures.sold - a.figures.sold).slice(0, n)
  const leaveOnShelf = groups.filter(g => (g.figures.available >= REPORT_SOURCING_RULES.shelfMinAvailable && (g.figures.sellThrough ?? 0) < REPORT_SOURCING_RULES.shelfMaxSellThrough)
    || (g.figures.sold >= 2 && g.figures.netProfitCents < 0))
    .sort((a, b) => (a.figures.sellThrough ?? 0) - (b.figures.sellThrough ?? 0) || b.figures.unsold - a.figures.unsold || a.figures.netProfitCents - b.figures.netProfitCents)
    .slice(0, n)
  const ids = [...new Set([...topEarners, ...fastSellers, ...leaveOnShelf].map(g => g.id))]
  const labels = await labelsOf(exec, teamId, type, ids)
  const row = (g: { id: number, figures: ReportFigures }): SourcingSheetRow => ({
    type, id: g.id, name: labels.get(g.id)?.label || `#${g.id} (removed)`,
    sold: g.figures.sold, available: g.figures.available, sellThrough: g.figures.sellThrough, netProfitCents: g.figures.netProfitCents,
    roi: g.figures.roi, medianSaleCents: g.figures.medianSaleCents, medianDaysToSell: g.figures.medianDaysToSell,
    unsold: g.figures.unsold, unsoldAvgAgeDays: g.figures.unsoldAvgAgeDays,
  })
  return { topEarners: topEarners.map(row), fastSellers: fastSellers.map(row), leaveOnShelf: leaveOnShelf.map(row) }
}

// ---- Buy targets

export async function buyCheckTargetsOf(exec: ReportExec, teamId: number): Promise<BuyTargets> {
  const [row] = await exec(sql`SELECT revision, min_profit_cents, min_roi_bp, max_days_to_sell, updated_at FROM buy_targets WHERE team_id = ${teamId}`)
  if (!row) return { revision: 0, ...DEFAULT_BUY_TARGETS, updatedAt: null }
  return {
    revision: reportWhole(row.revision), minProfitCents: reportWhole(row.min_profit_cents), minRoiPercent: reportWhole(row.min_roi_bp) / 100,
    maxDaysToSell: reportWhole(row.max_days_to_sell), updatedAt: row.updated_at instanceof Date ? row.updated_at.toISOString() : row.updated_at ? String(row.updated_at) : null,
  }
}

// ---- Buy check

/** Used when no comparable has a weight or a box: a small parcel under the 1 cubic foot dimensional rule. */
export const BUY_CHECK_DEFAULT_PARCEL = { weightGrams: 900, box: { length: 30, width: 23, height: 15, unit: 'cm' as const } }

export interface BuyCheckComputeInput {
  teamId: number
  markId?: number | null
  makerId?: number | null
  categoryId?: number | null
  priceCents?: number | null
  quantity: number
  condition?: string | null
}

function parseJsonList(value: unknown): string[] | null {
  if (Array.isArray(value)) return value.map(String)
  if (typeof value !== 'string') return null
  try {
    const parsed = JSON.parse(value) as unknown
    return Array.isArray(parsed) ? parsed.map(String) : null
  }
  catch {
    return null
  }
}

function spreadOf(row: Record<string, unknown> | undefined): BuyCheckSpread & { medianDaysToSell: number | null } {
  const count = reportWhole(row?.n)
  return {
    count,
    q1Cents: reportQuartileCents(row?.q1x4, count),
    medianCents: reportQuartileCents(row?.q2x4, count),
    q3Cents: reportQuartileCents(row?.q3x4, count),
    medianDaysToSell: count === 0 ? null : reportWhole(row?.d2x4) / 4,
  }
}

export async function buyCheckCompute(exec: ReportExec, input: BuyCheckComputeInput): Promise<BuyCheckResponse> {
  const { teamId } = input
  const one = async (statement: SQL) => (await exec(statement))[0]
  const [mark, maker, category, profileRow, targets, settings, markCategories, markMaterials] = await Promise.all([
    input.markId ? one(sql`SELECT id, title, maker_id FROM marks WHERE team_id = ${teamId} AND id = ${input.markId}`) : undefined,
    input.makerId ? one(sql`SELECT id, name FROM makers WHERE team_id = ${teamId} AND id = ${input.makerId}`) : undefined,
    input.categoryId ? one(sql`SELECT id, name FROM categories WHERE team_id = ${teamId} AND id = ${input.categoryId}`) : undefined,
    one(sql`SELECT id, name, percent_bp, fixed_cents, payment_percent_bp, payment_fixed_cents FROM fee_profiles WHERE team_id = ${teamId} AND default_flag = 1`),
    buyCheckTargetsOf(exec, teamId),
    one(sql`SELECT condition_scale, currency FROM ledger_settings WHERE team_id = ${teamId}`),
    input.markId && !input.categoryId
      ? exec(sql`SELECT c.id, c.name FROM mark_categories mc JOIN categories c ON c.team_id = mc.team_id AND c.id = mc.category_id
          WHERE mc.team_id = ${teamId} AND mc.mark_id = ${input.markId} ORDER BY c.name`)
      : Promise.resolve([]),
    input.markId
      ? exec(sql`SELECT m.id, m.name, m.cautions, m.damage FROM mark_materials mm JOIN materials m ON m.team_id = mm.team_id AND m.id = mm.material_id
          WHERE mm.team_id = ${teamId} AND mm.mark_id = ${input.markId} AND m.deleted_at IS NULL ORDER BY m.name`)
      : Promise.resolve([]),
  ])
  if (input.markId && !mark) throw new ReportProblem(404, `No mark with id ${input.markId} in this team.`)
  if (input.makerId && !maker) throw new ReportProblem(404, `No maker with id ${input.makerId} in this team.`)
  if (input.categoryId && !category) throw new ReportProblem(404, `No category with id ${input.categoryId} in this team.`)

  // The maker and categories to fall back on: as given, else the mark's own.
  let makerRow = maker
  const markMakerId = mark?.maker_id === null || mark?.maker_id === undefined ? null : Number(mark.maker_id)
  if (!makerRow && markMakerId) makerRow = await one(sql`SELECT id, name FROM makers WHERE team_id = ${teamId} AND id = ${markMakerId}`)
  const categories = category ? [{ id: Number(category.id), name: String(category.name) }] : markCategories.map(c => ({ id: Number(c.id), name: String(c.name) }))
  const markId = mark ? Number(mark.id) : null
  const makerId = makerRow ? Number(makerRow.id) : null
  const categoryIds = categories.map(c => c.id)

  const [levelCounts] = await exec(buyCheckLevelCountsSql(teamId, markId, makerId, categoryIds))
  const levels: BuyCheckResponse['levels'] = []
  if (markId) levels.push({ basis: 'mark', count: reportWhole(levelCounts?.mark_n) })
  if (makerId) levels.push({ basis: 'maker', count: reportWhole(levelCounts?.maker_n) })
  if (categoryIds.length) levels.push({ basis: 'category', count: reportWhole(levelCounts?.category_n) })
  // The most specific level with enough sales; without one, the most specific level with any.
  const chosen = levels.find(l => l.count >= BUY_CHECK_MIN_COMPARABLES) ?? levels.find(l => l.count > 0)
  const basis: BuyCheckBasis = chosen?.basis ?? 'none'
  const levelId = (level: BuyCheckLevel) => level === 'mark' ? markId : level === 'maker' ? makerId : null

  const [statsRow, conditionRow] = basis === 'none'
    ? [undefined, undefined]
    : await Promise.all([
        one(buyCheckStatsSql(teamId, basis, levelId(basis), categoryIds, null)),
        input.condition ? one(buyCheckStatsSql(teamId, basis, levelId(basis), categoryIds, input.condition)) : Promise.resolve(undefined),
      ])
  const comparables = spreadOf(statsRow)
  const count = comparables.count
  const profile: FeeProfile = profileRow
    ? { percentBp: reportWhole(profileRow.percent_bp), fixedCents: reportWhole(profileRow.fixed_cents), paymentPercentBp: reportWhole(profileRow.payment_percent_bp), paymentFixedCents: reportWhole(profileRow.payment_fixed_cents) }
    : NO_FEES

  // Postage: the comparables' median weight and box, else a default small parcel.
  const weighed = reportWhole(statsRow?.nw)
  const boxed = reportWhole(statsRow?.nb)
  const weightGrams = weighed > 0 ? roundHalfUp(reportWhole(statsRow?.w2x4), 4) : BUY_CHECK_DEFAULT_PARCEL.weightGrams
  const box = boxed > 0
    ? { length: reportWhole(statsRow?.l2x4) / 40, width: reportWhole(statsRow?.bw2x4) / 40, height: reportWhole(statsRow?.h2x4) / 40, unit: 'cm' as const }
    : BUY_CHECK_DEFAULT_PARCEL.box
  const estimate = estimatePostage({ value: Math.max(weightGrams, 1), unit: 'g' }, box)
  const shippingChargedCents = count === 0 ? 0 : roundHalfUp(reportWhole(statsRow?.shipping), count)
  const suppliesCents = count === 0 ? 0 : roundHalfUp(reportWhole(statsRow?.supplies), count)

  const outcome = buyCheckEvaluate({
    priceCents: input.priceCents ?? null, quantity: input.quantity, comparables, shippingChargedCents, suppliesCents, profile,
    postageCents: estimate.priceCents, targets, currency: settings?.currency ? String(settings.currency) : undefined,
  })

  const warnings: string[] = []
  if (basis === 'none') warnings.push(levels.length ? 'No sales of this mark, maker or category in the ledger yet: nothing to compare with.' : 'Pick a mark, maker or category to compare with.')
  else if (outcome.lowData) warnings.push(`Only ${count} comparable sale${count === 1 ? '' : 's'} (fewer than ${BUY_CHECK_MIN_COMPARABLES}): treat the expected price as a rough guide.`)
  const levelCount = levels.find(l => l.basis === basis)?.count ?? 0
  if (levelCount > count) warnings.push(`Prices from the latest ${count.toLocaleString('en-US')} of ${levelCount.toLocaleString('en-US')} sales.`)
  if (basis !== 'none' && levels[0] && levels[0].basis !== basis) {
    warnings.push(`Too few sales of this ${levels[0].basis} (${levels[0].count}): the price comes from the ${basis}${basis === 'category' && categories.length > 1 ? ' list' : ''}.`)
  }
  if (weighed === 0) warnings.push(`No comparable has a weight: postage is for a default ${BUY_CHECK_DEFAULT_PARCEL.weightGrams} g parcel.`)
  if (estimate.priceCents === null) warnings.push('The parcel is heavier than the rate table: postage is not in the net.')
  if (!profileRow) warnings.push('The team has no default fee profile: fees are taken as none.')

  const cautions: BuyCheckCaution[] = []
  for (const material of markMaterials) {
    const source = { type: 'material' as const, id: Number(material.id), name: String(material.name) }
    if (String(material.cautions ?? '').trim()) cautions.push({ kind: 'material', title: `${source.name}: cautions`, text: String(material.cautions).trim(), source })
    if (String(material.damage ?? '').trim()) cautions.push({ kind: 'damage', title: `${source.name}: damage`, text: String(material.damage).trim(), source })
  }
  let condition: BuyCheckResponse['condition'] = null
  if (input.condition) {
    const scale = parseJsonList(settings?.condition_scale) ?? [...DEFAULT_CONDITION_SCALE]
    const inGrade = spreadOf(conditionRow)
    condition = { grade: input.condition, spread: { count: inGrade.count, q1Cents: inGrade.q1Cents, medianCents: inGrade.medianCents, q3Cents: inGrade.q3Cents } }
    const note = buyCheckConditionNote(input.condition, scale, condition.spread, comparables, settings?.currency ? String(settings.currency) : undefined)
    if (note) cautions.push({ kind: 'condition', title: `Condition: ${input.condition.replace(/_/g, ' ')}`, text: note })
  }

  return {
    subject: {
      mark: mark ? { id: Number(mark.id), title: String(mark.title) } : null,
      maker: makerRow ? { id: Number(makerRow.id), name: String(makerRow.name) } : null,
      categories,
    },
    basis,
    levels,
    comparables,
    lowData: outcome.lowData,
    warnings,
    quantity: input.quantity,
    priceCents: input.priceCents ?? null,
    costCents: outcome.costCents,
    expectedSaleCents: outcome.expectedSaleCents,
    shippingChargedCents,
    suppliesCents,
    feeProfile: profileRow ? { id: Number(profileRow.id), name: String(profileRow.name) } : null,
    feesCents: outcome.feesCents,
    postage: { cents: estimate.priceCents, weightGrams, from: weighed > 0 ? 'comparables' : 'default', rateTable: EXAMPLE_RATE_TABLE.name },
    expectedNetCents: outcome.expectedNetCents,
    expectedRoi: outcome.expectedRoi,
    netSpread: outcome.netSpread,
    breakEvenSaleCents: outcome.breakEvenSaleCents,
    maxBuyTotalCents: outcome.maxBuyTotalCents,
    maxBuyPerPieceCents: outcome.maxBuyPerPieceCents,
    targets,
    verdict: outcome.verdict,
    reasons: outcome.reasons,
    condition,
    cautions,
  }
}
