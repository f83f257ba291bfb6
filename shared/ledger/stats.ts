// Summary figures for a set of sales and for stock over a period.
// Money results are integer cents, rounded by the ledger rule (nearest cent, ties away from zero);
// the rounding happens once, at the end, on an exact rational.
import { assertCents, roundHalfUp, sumCents } from './money'

function sortedCents(values: readonly number[]): number[] {
  for (const value of values) assertCents('sale price', value)
  return [...values].sort((a, b) => a - b)
}

/** Mean sale price in cents (sum / count, rounded half-up); null when there are no sales. */
export function averageSaleCents(pricesCents: readonly number[]): number | null {
  return pricesCents.length === 0 ? null : roundHalfUp(sumCents(pricesCents), pricesCents.length)
}

/** Middle sale price; with an even count, the mean of the two middle ones rounded half-up to the cent. */
export function medianSaleCents(pricesCents: readonly number[]): number | null {
  const sorted = sortedCents(pricesCents)
  if (sorted.length === 0) return null
  const middle = sorted.length >> 1
  return sorted.length % 2 === 1 ? sorted[middle]! : roundHalfUp(sorted[middle - 1]! + sorted[middle]!, 2)
}

export interface QuartilesCents { q1: number, median: number, q3: number }

/**
 * Quartiles by linear interpolation between order statistics: Hyndman & Fan (1996) type 7, the default
 * of R's quantile(), NumPy's "linear" method and spreadsheet QUARTILE.INC. For quartile j of n sorted
 * values x[0..n−1]: h = (n − 1) × j / 4, value = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋ + 1] − x[⌊h⌋]).
 * h is a multiple of 1/4, so the value is exactly (x[lo](4 − k) + x[lo + 1]k) / 4 with k = (n − 1)j mod 4,
 * which is rounded half-up to the cent. The median from here equals medianSaleCents.
 */
export function quartilesCents(pricesCents: readonly number[]): QuartilesCents | null {
  const sorted = sortedCents(pricesCents)
  if (sorted.length === 0) return null
  const quartile = (j: number): number => {
    const quarterSteps = (sorted.length - 1) * j
    const lo = Math.floor(quarterSteps / 4)
    const k = quarterSteps % 4
    if (k === 0) return sorted[lo]!
    return roundHalfUp(BigInt(sorted[lo]!) * BigInt(4 - k) + BigInt(sorted[lo + 1]!) * BigInt(k), 4)
  }
  return { q1: quartile(1), median: quartile(2), q3: quartile(3) }
}

export type SellThroughInput
  = | { variant: 'retail', unitsSold: number, unitsReceived: number }
    | { variant: 'one-of-a-kind', unitsSold: number, onHandAtStart: number, acquiredInPeriod: number }

export interface SellThroughResult {
  variant: SellThroughInput['variant']
  /** Shown beside the figure, so the reader knows which definition was used. */
  formula: string
  unitsSold: number
  unitsAvailable: number
  /** Null when nothing was available in the period. */
  percent: number | null
}

const SELL_THROUGH_FORMULAS: Record<SellThroughInput['variant'], string> = {
  'retail': 'sell-through = units sold ÷ units received × 100',
  'one-of-a-kind': 'sell-through = units sold ÷ (on hand at start + acquired in period) × 100',
}

function assertUnits(name: string, value: number): void {
  if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${name} must be a whole count ≥ 0, got ${value}`)
}

/**
 * Sell-through for a period. Retail counts what was received in the period; for one-of-a-kind stock
 * (every piece unique, nothing reordered) the base is everything that could have sold.
 */
export function sellThrough(input: SellThroughInput): SellThroughResult {
  const counts = input.variant === 'retail'
    ? { unitsReceived: input.unitsReceived }
    : { onHandAtStart: input.onHandAtStart, acquiredInPeriod: input.acquiredInPeriod }
  assertUnits('unitsSold', input.unitsSold)
  for (const [name, value] of Object.entries(counts)) assertUnits(name, value)
  const unitsAvailable = Object.values(counts).reduce((a, b) => a + b, 0)
  return {
    variant: input.variant,
    formula: SELL_THROUGH_FORMULAS[input.variant],
    unitsSold: input.unitsSold,
    unitsAvailable,
    percent: unitsAvailable === 0 ? null : (input.unitsSold / unitsAvailable) * 100,
  }
}

export interface InventoryPeriod {
  costOfGoodsSoldCents: number
  beginningInventoryCents: number
  endingInventoryCents: number
}

/** (begin + end) / 2 at cost, rounded half-up to the cent, for display; turnover uses the exact average. */
export function averageInventoryCents(period: InventoryPeriod): number {
  return roundHalfUp(sumCents([period.beginningInventoryCents, period.endingInventoryCents]), 2)
}

/** Inventory turnover = COGS / ((begin + end) / 2), all at cost; null when the average is 0. */
export function inventoryTurnover(period: InventoryPeriod): number | null {
  for (const [name, value] of Object.entries(period)) assertCents(name, value)
  const doubledAverage = period.beginningInventoryCents + period.endingInventoryCents
  return doubledAverage === 0 ? null : (2 * period.costOfGoodsSoldCents) / doubledAverage
}

/** Days in inventory = days in period / turnover (365 for a year); null when nothing turned over. */
export function daysInInventory(turnover: number | null, daysInPeriod = 365): number | null {
  return turnover === null || turnover <= 0 ? null : daysInPeriod / turnover
}
