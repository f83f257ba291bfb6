// Profit of a sale and the questions asked before buying: what must it sell for, what may it cost.
// Amounts are integer cents. Ratios (margin, markup, ROI) are plain numbers in percent, not rounded:
// they are not money, and the screen rounds them for display.
import { assertCents, sumCents } from './money'
import { assertFeeProfile, computeFees } from './fees'
import type { FeeBreakdown, FeeProfile } from './fees'

export interface NetProfitParts {
  salePriceCents: number
  shippingChargedCents: number
  costCents: number
  marketplaceFeeCents: number
  paymentFeeCents: number
  postageCents: number
  suppliesCents: number
  /** Money given back to the buyer. Fee credits from the channel, if any, belong in the fees recorded. */
  refundsCents: number
}

/** sale price + shipping charged − cost − marketplace fees − payment fees − postage − supplies − refunds */
export function netProfit(parts: NetProfitParts): number {
  for (const [name, value] of Object.entries(parts)) assertCents(name, value)
  return sumCents([parts.salePriceCents, parts.shippingChargedCents])
    - sumCents([parts.costCents, parts.marketplaceFeeCents, parts.paymentFeeCents, parts.postageCents, parts.suppliesCents, parts.refundsCents])
}

export interface SaleInput {
  salePriceCents: number
  shippingChargedCents: number
  costCents: number
  profile: FeeProfile
  postageCents: number
  suppliesCents: number
  refundsCents?: number
}

/** Fees from the profile, then the net profit of the sale. */
export function saleNetProfit(sale: SaleInput): { fees: FeeBreakdown, netCents: number } {
  const fees = computeFees(sale.profile, sale.salePriceCents, sale.shippingChargedCents)
  const netCents = netProfit({
    salePriceCents: sale.salePriceCents,
    shippingChargedCents: sale.shippingChargedCents,
    costCents: sale.costCents,
    marketplaceFeeCents: fees.marketplaceFeeCents,
    paymentFeeCents: fees.paymentFeeCents,
    postageCents: sale.postageCents,
    suppliesCents: sale.suppliesCents,
    refundsCents: sale.refundsCents ?? 0,
  })
  return { fees, netCents }
}

/** (price − cost) / price × 100; null for a price of 0, where no share of the price exists. */
export function grossMarginPercent(priceCents: number, costCents: number): number | null {
  return priceCents === 0 ? null : ((priceCents - costCents) / priceCents) * 100
}

/** (price − cost) / cost × 100; null for a cost of 0 (an item received free has no markup). */
export function markupPercent(priceCents: number, costCents: number): number | null {
  return costCents === 0 ? null : ((priceCents - costCents) / costCents) * 100
}

/** markup = margin / (1 − margin), in percent; null at a 100 % margin (cost 0). */
export function markupFromMarginPercent(marginPercent: number): number | null {
  return marginPercent === 100 ? null : (marginPercent / (100 - marginPercent)) * 100
}

/**
 * ROI = net profit / total cost × 100. Total cost is what was paid to acquire the stock (item costs, and
 * for a sourcing trip its expenses); fees and postage are already inside the net profit.
 * Null when the cost is 0: ROI measures return per unit of money put in, and with nothing put in the
 * ratio is a division by zero, not "infinitely good". Show the net profit for free items instead.
 */
export function roiPercent(netProfitCents: number, totalCostCents: number): number | null {
  assertCents('totalCostCents', totalCostCents)
  return totalCostCents === 0 ? null : (netProfitCents / totalCostCents) * 100
}

const DAY_MS = 86_400_000

/** UTC calendar day number of "2024-03-05" or of a full ISO timestamp (taken at its UTC date). */
function utcDayNumber(name: string, iso: string): number {
  const dateOnly = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso)
  if (dateOnly) {
    const [year, month, day] = dateOnly.slice(1).map(Number) as [number, number, number]
    const time = Date.UTC(year, month - 1, day)
    // Date.UTC rolls 2023-02-30 over to March; a real date survives the round trip.
    if (new Date(time).toISOString().slice(0, 10) !== iso) throw new RangeError(`${name} is not a real date: ${iso}`)
    return time / DAY_MS
  }
  const time = /^\d{4}-\d{2}-\d{2}T/.test(iso) ? Date.parse(iso) : Number.NaN
  if (Number.isNaN(time)) throw new RangeError(`${name} must be an ISO date like 2024-03-05, got "${iso}"`)
  return Math.floor(time / DAY_MS)
}

/** Whole UTC calendar days from acquisition to sale (same day = 0). Throws if sold before acquired. */
export function daysToSell(acquiredOn: string, soldOn: string): number {
  const days = utcDayNumber('soldOn', soldOn) - utcDayNumber('acquiredOn', acquiredOn)
  if (days < 0) throw new RangeError(`sold on ${soldOn}, before it was acquired on ${acquiredOn}`)
  return days
}

/** Floor division for BigInt (BigInt `/` truncates toward zero). */
function floorDiv(n: bigint, d: bigint): bigint {
  const q = n / d
  return (n % d !== 0n) && ((n < 0n) !== (d < 0n)) ? q - 1n : q
}

/**
 * Smallest sale price (cents) whose net profit is ≥ 0, exact under the per-component fee rounding;
 * null when no price breaks even. Refunds are taken as none.
 *
 * With r = combined fee percentage and K = cost + postage + supplies + fixed fees, the exact net is
 * (s + shipping)(1 − r) − K − e, where e, the two roundings together, lies in (−1, 1]. So for r < 1
 * every break-even price lies above (K − 1)/(1 − r) − shipping and every price from (K + 1)/(1 − r) −
 * shipping breaks even: the window between is searched cent by cent. Net is not monotonic (two fees can
 * step up on the same cent), so the search looks for the first price that works, not a crossing.
 */
export function breakEvenSalePrice(costCents: number, profile: FeeProfile, postageCents: number, suppliesCents: number, shippingChargedCents: number): number | null {
  assertFeeProfile(profile)
  const netAt = (salePriceCents: number) =>
    saleNetProfit({ salePriceCents, shippingChargedCents, costCents, profile, postageCents, suppliesCents }).netCents
  const fixedCosts = BigInt(sumCents([costCents, postageCents, suppliesCents, profile.fixedCents, profile.paymentFixedCents]))
  const keptBp = 10_000n - BigInt(profile.percentBp + profile.paymentPercentBp)
  const shipping = BigInt(shippingChargedCents)
  let from = 0n
  let to: bigint
  if (keptBp > 0n) {
    from = floorDiv((fixedCosts - 1n) * 10_000n, keptBp) - shipping
    to = -floorDiv(-(fixedCosts + 1n) * 10_000n, keptBp) - shipping
  }
  else {
    // Fees take the whole price or more: net ≤ −K + (rounding), so only K = 0 can break even, and then
    // within one period of the fee fractions (10,000 cents).
    if (fixedCosts > 0n) return null
    to = 10_000n
  }
  // A window entirely below 0 means a price of 0 already clears the sufficient bound.
  const last = to < 0n ? 0 : Number(to)
  for (let price = from < 0n ? 0 : Number(from); price <= last; price++) {
    if (netAt(price) >= 0) return price
  }
  return null
}

export interface MaxBuyPriceInput {
  expectedSaleCents: number
  shippingChargedCents: number
  profile: FeeProfile
  postageCents: number
  suppliesCents: number
  /** Net profit wanted, in cents. With neither target given, 0 (break even). */
  targetProfitCents?: number
  /** ROI wanted, in percent, read to the hundredth (whole basis points). */
  targetRoiPercent?: number
}

/**
 * Largest cost (cents) at which the expected sale still meets every target given; null if none does.
 * Fees do not depend on the cost, so net = A − cost with A fixed, and each target is a bound on cost:
 * profit: cost ≤ A − target; ROI: (A − cost) × 10,000 ≥ bp × cost, i.e. cost ≤ 10,000·A / (10,000 + bp),
 * with cost ≥ 1 because ROI is undefined at cost 0.
 */
export function maxBuyPrice(input: MaxBuyPriceInput): number | null {
  const { netCents: proceeds } = saleNetProfit({
    salePriceCents: input.expectedSaleCents,
    shippingChargedCents: input.shippingChargedCents,
    costCents: 0,
    profile: input.profile,
    postageCents: input.postageCents,
    suppliesCents: input.suppliesCents,
  })
  const targetProfit = input.targetProfitCents ?? (input.targetRoiPercent === undefined ? 0 : undefined)
  let highest = BigInt(proceeds)
  let lowest = 0n
  if (targetProfit !== undefined) {
    assertCents('targetProfitCents', targetProfit, { allowNegative: true })
    highest = BigInt(proceeds - targetProfit)
  }
  if (input.targetRoiPercent !== undefined) {
    const roiBp = Math.round(input.targetRoiPercent * 100)
    if (!Number.isFinite(input.targetRoiPercent) || roiBp <= -10_000) {
      throw new RangeError(`targetRoiPercent must be above −100, got ${input.targetRoiPercent}`)
    }
    const roiBound = floorDiv(BigInt(proceeds) * 10_000n, 10_000n + BigInt(roiBp))
    if (roiBound < highest) highest = roiBound
    lowest = 1n
  }
  return highest < lowest ? null : Number(highest)
}
