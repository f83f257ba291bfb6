// From the sums and ranks MariaDB returns to a report's figures, with the ledger's own formulas
// (shared/ledger): sell-through (one-of-a-kind variant), ROI and half-up rounding of the quartiles.
// Pure: the server uses it on grouped rows, the tests and the pages can read the same definitions.
import { roundHalfUp } from '../ledger/money'
import { roiPercent } from '../ledger/profit'
import { sellThrough } from '../ledger/stats'
import type { ReportDefinition, ReportDimension, ReportFigures } from './types'

/** The counts and sums of one group as the statement returns them (DECIMAL sums arrive as strings). */
export interface ReportCountsRow {
  bought: unknown
  listed: unknown
  sold: unknown
  on_start: unknown
  revenue: unknown
  net: unknown
  sold_cost: unknown
  unsold: unknown
  unsold_cost: unknown
  unsold_age_days: unknown
}

/** Four times each quartile (see server/utils/reports/sql.ts), and the count they rest on. */
export interface ReportStatsRow {
  n: unknown
  q1x4: unknown
  q2x4: unknown
  q3x4: unknown
  d2x4: unknown
}

/** A whole number from SQL (COUNT, SUM of integers, a DECIMAL string); null and undefined read as 0. */
export function reportWhole(value: unknown): number {
  if (value === null || value === undefined) return 0
  const n = typeof value === 'bigint' ? Number(value) : Number(value)
  if (!Number.isSafeInteger(n)) throw new Error(`expected a whole number from SQL, got ${String(value)}`)
  return n
}

/** A quartile from four times its value, rounded half-up to the cent like quartilesCents. */
export function reportQuartileCents(timesFour: unknown, count: number): number | null {
  return count === 0 ? null : roundHalfUp(reportWhole(timesFour), 4)
}

export const EMPTY_STATS: ReportStatsRow = { n: 0, q1x4: 0, q2x4: 0, q3x4: 0, d2x4: 0 }

export function reportFigures(counts: ReportCountsRow, stats: ReportStatsRow = EMPTY_STATS): ReportFigures {
  const sold = reportWhole(counts.sold)
  const onHandAtStart = reportWhole(counts.on_start)
  const bought = reportWhole(counts.bought)
  const through = sellThrough({ variant: 'one-of-a-kind', unitsSold: sold, onHandAtStart, acquiredInPeriod: bought })
  const costOfSoldCents = reportWhole(counts.sold_cost)
  const netProfitCents = reportWhole(counts.net)
  const n = reportWhole(stats.n)
  const unsold = reportWhole(counts.unsold)
  const ageSum = reportWhole(counts.unsold_age_days)
  return {
    bought,
    listed: reportWhole(counts.listed),
    sold,
    onHandAtStart,
    available: through.unitsAvailable,
    sellThrough: through.percent,
    medianDaysToSell: n === 0 ? null : reportWhole(stats.d2x4) / 4,
    revenueCents: reportWhole(counts.revenue),
    netProfitCents,
    costOfSoldCents,
    roi: sold === 0 ? null : roiPercent(netProfitCents, costOfSoldCents),
    medianSaleCents: reportQuartileCents(stats.q2x4, n),
    q1SaleCents: reportQuartileCents(stats.q1x4, n),
    q3SaleCents: reportQuartileCents(stats.q3x4, n),
    unsold,
    unsoldCostCents: reportWhole(counts.unsold_cost),
    unsoldAvgAgeDays: unsold === 0 ? null : roundHalfUp(ageSum * 10, unsold) / 10,
  }
}

export const EMPTY_COUNTS: ReportCountsRow = {
  bought: 0, listed: 0, sold: 0, on_start: 0, revenue: 0, net: 0, sold_cost: 0, unsold: 0, unsold_cost: 0, unsold_age_days: 0,
}

const GROUPING: Record<ReportDimension, string> = {
  category: 'Subcategories are rolled up into their top-level category (or, with a parent chosen, into the parent\'s child they sit under; items filed directly in the parent are a row of their own).',
  mark: 'One row per mark the items carry.',
  maker: 'One row per maker recorded on the items.',
  material: 'One row per material recorded on the items.',
  store: 'One row per store the items were bought at.',
  member: 'One row per member who sourced the items.',
  month: 'One row per calendar month: bought by acquisition date, listed by listing date, sold by sale date; each month\'s stock base is what was on hand on its first day. The period is widened to whole months.',
}

/** The formulas behind every figure, sent with each report so the screen can state them. */
export function reportDefinitions(dimension?: ReportDimension): ReportDefinition[] {
  const list: ReportDefinition[] = [
    {
      name: 'Sell-through',
      formula: 'sold / (on hand at start + acquired in period) × 100 — the variant for one-of-a-kind stock. On hand at start: acquired before the period and not sold or returned before it. Donated, written-off and kept items leave the base (the ledger dates them only in their status history).',
      source: 'Sell-through rate, one-of-a-kind variant (retail definition: units sold / units received × 100)',
    },
    { name: 'ROI', formula: 'net profit / cost of the items sold × 100; empty when they cost nothing.', source: 'ROI = net profit / total cost × 100' },
    { name: 'Net profit', formula: 'sale price + shipping charged − item cost − fees − postage − supplies − refunds, as stored on each item sold.' },
    { name: 'Sold', formula: 'items sold or shipped with their sale date in the period; returned sales are not counted.' },
    { name: 'Revenue', formula: 'sale price + shipping charged of the items sold.' },
    { name: 'Days to sell', formula: 'sale date − acquisition date, per item; the median is shown.' },
    {
      name: 'Quartiles',
      formula: 'Q1, median and Q3 of the sale prices by linear interpolation between order statistics (Hyndman & Fan type 7, as R\'s quantile() and QUARTILE.INC), rounded half-up to the cent.',
      source: 'Hyndman & Fan (1996), Sample quantiles in statistical packages, definition 7',
    },
    { name: 'Unsold', formula: 'items on hand at the end of the period (acquired by then, not sold or returned by then, not donated, written off or kept); age = days from acquisition to the end of the period (today if earlier).' },
    { name: 'Counts', formula: 'ledger items: a lot or set recorded as one item counts once.' },
  ]
  if (dimension) list.push({ name: 'Grouping', formula: GROUPING[dimension] })
  return list
}
