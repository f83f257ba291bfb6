// What the reports, outcomes, buy check, buy targets and sourcing sheet routes send. Money in integer cents,
// percentages as plain numbers (not rounded: the screen rounds), dates yyyy-mm-dd.
import type { OutcomeType, ReportDimension } from '../schemas/reports'
import type { ItemStatus } from '../ledger/item-rules'

export type { OutcomeType, ReportDimension }

export interface ReportFigures {
  /** Items acquired in the period (a lot or set is one item). */
  bought: number
  /** Items listed in the period. */
  listed: number
  /** Items sold (sold or shipped, not returned) with their sale date in the period. */
  sold: number
  /** Items on hand when the period began: acquired before it, not sold or returned before it. */
  onHandAtStart: number
  /** onHandAtStart + bought: the base of sell-through. */
  available: number
  /** sold ÷ available × 100; null when nothing was available. */
  sellThrough: number | null
  /** Median (type 7) of sale date − acquisition date over the items sold; null without sales. */
  medianDaysToSell: number | null
  /** Sale prices + shipping charged of the items sold. */
  revenueCents: number
  /** Stored net profit of the items sold. */
  netProfitCents: number
  /** What the items sold had cost. */
  costOfSoldCents: number
  /** netProfit ÷ costOfSold × 100; null when the items sold cost nothing (or nothing sold). */
  roi: number | null
  medianSaleCents: number | null
  q1SaleCents: number | null
  q3SaleCents: number | null
  /** Items still on hand at the end of the period. */
  unsold: number
  unsoldCostCents: number
  /** Mean age (days since acquired) of the unsold items at the end of the period, to one decimal. */
  unsoldAvgAgeDays: number | null
}

export interface ReportRow extends ReportFigures {
  /** The entry, store or member id; "yyyy-mm" for months; null for items without one. */
  key: number | string | null
  label: string
  /** The entry is in the deleted list (or the member left the team). */
  deleted: boolean
}

/** The figure a report chart draws. */
export type ReportMetric = 'netProfitCents' | 'revenueCents' | 'sold' | 'sellThrough'

export interface ReportDefinition { name: string, formula: string, source?: string }

export interface ReportPeriod {
  from: string | null
  to: string | null
  /** The day the unsold stock's ages are counted to: the end of the period, or today if that is earlier. */
  ageDay: string
}

export interface ReportResponse {
  dimension: ReportDimension
  period: ReportPeriod
  filters: Record<string, string | number>
  /** Category report with a parentId: the parent. */
  parent: { id: number, name: string } | null
  rows: ReportRow[]
  totals: ReportFigures
  definitions: ReportDefinition[]
}

export interface OutcomeItem {
  id: number
  title: string
  status: ItemStatus
  acquiredOn: string
  soldOn: string | null
  costCents: number
  salePriceCents: number | null
  netProfitCents: number | null
  daysToSell: number | null
}

export interface OutcomesResponse {
  type: OutcomeType
  id: number
  name: string
  /** Categories: the figures include the subcategories' items. */
  includesSubcategories: boolean
  figures: ReportFigures
  recent: OutcomeItem[]
  /** Query for the ledger's item list, filtered to this entry (as the item list's own filters read it). */
  ledgerQuery: Record<string, string>
  definitions: ReportDefinition[]
}

export interface BuyTargets {
  /** 0 while the team has not saved its own targets (the defaults apply). */
  revision: number
  minProfitCents: number
  minRoiPercent: number
  maxDaysToSell: number
  updatedAt: string | null
}

export type BuyCheckBasis = 'mark' | 'maker' | 'category' | 'none'
export type BuyVerdict = 'buy' | 'maybe' | 'pass'

export interface BuyCheckSpread {
  count: number
  q1Cents: number | null
  medianCents: number | null
  q3Cents: number | null
}

export interface BuyCheckCaution {
  kind: 'material' | 'damage' | 'condition' | 'data'
  title: string
  text: string
  /** The wiki entry it comes from, when there is one. */
  source?: { type: 'material', id: number, name: string }
}

export interface BuyCheckReason { ok: boolean, text: string }

export interface BuyCheckResponse {
  subject: {
    mark: { id: number, title: string } | null
    maker: { id: number, name: string } | null
    categories: { id: number, name: string }[]
  }
  basis: BuyCheckBasis
  /** Sales found at each level, most specific first. */
  levels: { basis: Exclude<BuyCheckBasis, 'none'>, count: number }[]
  /** Sale price per piece of the comparable sales. */
  comparables: BuyCheckSpread & { medianDaysToSell: number | null }
  lowData: boolean
  warnings: string[]
  quantity: number
  priceCents: number | null
  costCents: number | null
  expectedSaleCents: number | null
  shippingChargedCents: number
  suppliesCents: number
  feeProfile: { id: number, name: string } | null
  feesCents: number | null
  postage: { cents: number | null, weightGrams: number, from: 'comparables' | 'default', rateTable: string }
  expectedNetCents: number | null
  expectedRoi: number | null
  /** Net at the lower and upper quartile sale: the spread of the outcome. */
  netSpread: { lowCents: number | null, highCents: number | null }
  breakEvenSaleCents: number | null
  maxBuyTotalCents: number | null
  maxBuyPerPieceCents: number | null
  targets: BuyTargets
  verdict: BuyVerdict | null
  reasons: BuyCheckReason[]
  condition: { grade: string, spread: BuyCheckSpread } | null
  cautions: BuyCheckCaution[]
}

export interface SourcingSheetRow {
  type: 'mark' | 'maker'
  id: number
  name: string
  sold: number
  available: number
  sellThrough: number | null
  netProfitCents: number
  roi: number | null
  medianSaleCents: number | null
  medianDaysToSell: number | null
  unsold: number
  unsoldAvgAgeDays: number | null
}

export interface SourcingLists {
  /** Most net profit in the period. */
  topEarners: SourcingSheetRow[]
  /** Shortest median days to sell, among those with a few sales. */
  fastSellers: SourcingSheetRow[]
  /** Bought but hardly sold, or sold at a loss. */
  leaveOnShelf: SourcingSheetRow[]
}

export interface SourcingSheetResponse {
  period: ReportPeriod
  marks: SourcingLists
  makers: SourcingLists
  rules: { fastMinSold: number, shelfMinAvailable: number, shelfMaxSellThrough: number }
  definitions: ReportDefinition[]
}

/** The report page's filters as they stand in the address bar (empty string: not set). */
export interface ReportFilterValues {
  from: string
  to: string
  categoryId: string
  storeId: string
  memberId: string
  channel: string
  condition: string
}

export interface ReportFilterLists {
  categories: { id: number, title: string }[]
  stores: { id: number, name: string }[]
  members: { userId: number, name: string }[]
  channels: { id: number, name: string }[]
  conditions: string[]
}
