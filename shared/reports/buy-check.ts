// The buy check's arithmetic and verdict: from the team's comparable sales (per piece), the tag price and the
// owner's targets to the expected net, ROI, the most to pay and buy / maybe / pass with its reasons.
// All money arithmetic is shared/ledger's (computeFees, saleNetProfit, roiPercent, maxBuyPrice,
// breakEvenSalePrice); this module only decides. Pure: no Vue, no Nitro.
import type { FeeProfile } from '../ledger/fees'
import { computeFees } from '../ledger/fees'
import { formatCents } from '../ledger/money'
import { breakEvenSalePrice, maxBuyPrice, roiPercent, saleNetProfit } from '../ledger/profit'
import type { BuyCheckReason, BuyCheckSpread, BuyVerdict } from './types'

/** Fewer comparable sales than this and the answer says so, and never says "buy". */
export const BUY_CHECK_MIN_COMPARABLES = 5

/** Targets a team starts with until its owner sets its own. */
export const DEFAULT_BUY_TARGETS = { minProfitCents: 1_000, minRoiPercent: 100, maxDaysToSell: 90 } as const

export interface BuyCheckTargets { minProfitCents: number, minRoiPercent: number, maxDaysToSell: number }

export interface BuyCheckInput {
  /** Tag price of one piece; null when only the expected sale and the most to pay are asked for. */
  priceCents: number | null
  quantity: number
  /** Sale price per piece of the comparable sales. */
  comparables: BuyCheckSpread & { medianDaysToSell: number | null }
  shippingChargedCents: number
  suppliesCents: number
  profile: FeeProfile
  /** Null when the postage could not be estimated (heavier than the rate table). */
  postageCents: number | null
  targets: BuyCheckTargets
  /** ISO 4217 code the reasons word amounts in (the team's); USD when left out. */
  currency?: string
}

export interface BuyCheckOutcome {
  costCents: number | null
  expectedSaleCents: number | null
  feesCents: number | null
  expectedNetCents: number | null
  expectedRoi: number | null
  netSpread: { lowCents: number | null, highCents: number | null }
  breakEvenSaleCents: number | null
  maxBuyTotalCents: number | null
  maxBuyPerPieceCents: number | null
  lowData: boolean
  verdict: BuyVerdict | null
  reasons: BuyCheckReason[]
}

const percent = (value: number) => `${Math.round(value * 10) / 10} %`

/** The lot's sale: the per-piece figure times the pieces (a set of four sells for four pieces' worth). */
function lotCents(perPiece: number | null, quantity: number): number | null {
  return perPiece === null ? null : perPiece * quantity
}

export function buyCheckEvaluate(input: BuyCheckInput): BuyCheckOutcome {
  const { comparables, quantity, targets, profile } = input
  const money = (cents: number) => formatCents(cents, input.currency ?? 'USD')
  const postage = input.postageCents ?? 0
  const shipping = input.shippingChargedCents
  const supplies = input.suppliesCents
  const expectedSaleCents = lotCents(comparables.medianCents, quantity)
  const costCents = input.priceCents === null ? null : input.priceCents * quantity
  const lowData = comparables.count < BUY_CHECK_MIN_COMPARABLES
  const netAt = (sale: number | null) => sale === null || costCents === null
    ? null
    : saleNetProfit({ salePriceCents: sale, shippingChargedCents: shipping, costCents, profile, postageCents: postage, suppliesCents: supplies }).netCents
  const expectedNetCents = netAt(expectedSaleCents)
  const expectedRoi = expectedNetCents === null || costCents === null ? null : roiPercent(expectedNetCents, costCents)
  const maxBuyTotalCents = expectedSaleCents === null
    ? null
    : maxBuyPrice({
        expectedSaleCents, shippingChargedCents: shipping, profile, postageCents: postage, suppliesCents: supplies,
        targetProfitCents: targets.minProfitCents, targetRoiPercent: targets.minRoiPercent,
      })
  const outcome: BuyCheckOutcome = {
    costCents,
    expectedSaleCents,
    feesCents: expectedSaleCents === null ? null : computeFees(profile, expectedSaleCents, shipping).totalCents,
    expectedNetCents,
    expectedRoi,
    netSpread: { lowCents: netAt(lotCents(comparables.q1Cents, quantity)), highCents: netAt(lotCents(comparables.q3Cents, quantity)) },
    breakEvenSaleCents: costCents === null ? null : breakEvenSalePrice(costCents, profile, postage, supplies, shipping),
    maxBuyTotalCents,
    maxBuyPerPieceCents: maxBuyTotalCents === null ? null : Math.floor(maxBuyTotalCents / quantity),
    lowData,
    verdict: null,
    reasons: [],
  }
  if (costCents === null) return outcome
  const reasons: BuyCheckReason[] = []
  if (comparables.count === 0 || expectedNetCents === null) {
    reasons.push({ ok: false, text: 'No comparable sales in the ledger: there is no price to expect. Record a few sales first, or decide on what you know.' })
    return { ...outcome, verdict: 'maybe', reasons }
  }

  const profitOk = expectedNetCents >= targets.minProfitCents
  reasons.push({ ok: profitOk, text: `Expected net ${money(expectedNetCents)} at the median sale, target at least ${money(targets.minProfitCents)}.` })
  const roiOk = expectedRoi === null || expectedRoi >= targets.minRoiPercent
  reasons.push({
    ok: roiOk,
    text: expectedRoi === null
      ? 'Cost 0: ROI does not apply (nothing is put in); the net decides.'
      : `Expected ROI ${percent(expectedRoi)}, target at least ${percent(targets.minRoiPercent)}.`,
  })
  const days = comparables.medianDaysToSell
  const daysOk = days !== null && days <= targets.maxDaysToSell
  reasons.push({
    ok: daysOk,
    text: days === null ? 'No days to sell on record.' : `Comparables sold in a median of ${days} days, target at most ${targets.maxDaysToSell}.`,
  })
  // The upper quartile: a quarter of the comparables sold for this much or more.
  const highNet = outcome.netSpread.highCents!
  const highRoi = roiPercent(highNet, costCents)
  const upsideOk = highNet >= targets.minProfitCents && (highRoi === null || highRoi >= targets.minRoiPercent)
  if (!profitOk || !roiOk) {
    reasons.push({
      ok: upsideOk,
      text: upsideOk
        ? `At the upper-quartile sale the net would be ${money(highNet)}: it can meet the targets if it sells well.`
        : `Even at the upper-quartile sale the net would be ${money(highNet)}: short of the targets.`,
    })
  }
  if (input.postageCents === null) reasons.push({ ok: false, text: 'Postage could not be estimated (heavier than the rate table): it is not in the net.' })
  if (lowData) {
    reasons.push({ ok: false, text: `Only ${comparables.count} comparable sale${comparables.count === 1 ? '' : 's'} (fewer than ${BUY_CHECK_MIN_COMPARABLES}): not enough to be sure either way.` })
  }

  let verdict: BuyVerdict
  if (lowData) verdict = 'maybe'
  else if (profitOk && roiOk && daysOk && input.postageCents !== null) verdict = 'buy'
  else if ((!profitOk || !roiOk) && !upsideOk) verdict = 'pass'
  else verdict = 'maybe'
  return { ...outcome, verdict, reasons }
}

/**
 * What the grade means for this piece: its place on the team's scale (best first) and how the comparables in
 * that grade sold against all of them. Null when no grade was given.
 */
export function buyCheckConditionNote(grade: string | null | undefined, scale: readonly string[], inGrade: BuyCheckSpread, all: BuyCheckSpread, currency = 'USD'): string | null {
  if (!grade) return null
  const money = (cents: number) => formatCents(cents, currency)
  const label = grade.replace(/_/g, ' ')
  const parts: string[] = []
  const at = scale.indexOf(grade)
  if (at < 0) parts.push(`"${label}" is not on the team's condition scale (${scale.map(s => s.replace(/_/g, ' ')).join(', ')}).`)
  else if (at >= Math.ceil(scale.length / 2)) parts.push(`"${label}" is in the lower half of the team's scale: chips, cracks, crazing and worn gilding lower what a piece fetches.`)
  if (inGrade.count === 0 || inGrade.medianCents === null) {
    parts.push(`No comparable sales in ${label} condition: the expected price comes from all conditions.`)
  }
  else {
    const spread = inGrade.q1Cents !== null && inGrade.q3Cents !== null ? ` (middle half ${money(inGrade.q1Cents)}–${money(inGrade.q3Cents)})` : ''
    const against = all.medianCents === null ? '' : ` against ${money(all.medianCents)} over all ${all.count}`
    parts.push(`In ${label} condition ${inGrade.count} comparable${inGrade.count === 1 ? '' : 's'} sold for a median of ${money(inGrade.medianCents)}${spread}${against}.`)
    if (inGrade.count < BUY_CHECK_MIN_COMPARABLES) parts.push('Few sales: read it as a hint.')
  }
  return parts.join(' ')
}
