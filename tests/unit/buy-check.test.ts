// The buy check's verdict and arithmetic (shared/reports/buy-check.ts) and the report figures built from SQL
// sums (shared/reports/figures.ts). Every expected figure is worked out by hand in the comment beside it.
// Formula sources: trade-facts §4 — net profit = sale price + shipping charged − item cost − selling fees −
// payment fees − postage − supplies; ROI = net profit / total cost × 100 (1,000 in, 1,200 back → 20 %);
// sell-through = units sold / units available × 100 (650 of 1,000 → 65 %), one-of-a-kind variant
// sold / (on hand at start + acquired in period).
import { describe, expect, it } from 'vitest'
import { NO_FEES } from '../../shared/ledger/fees'
import { BUY_CHECK_MIN_COMPARABLES, buyCheckConditionNote, buyCheckEvaluate, DEFAULT_BUY_TARGETS, type BuyCheckInput } from '../../shared/reports/buy-check'
import { EMPTY_COUNTS, reportFigures, reportQuartileCents } from '../../shared/reports/figures'

const targets = { minProfitCents: 1000, minRoiPercent: 100, maxDaysToSell: 90 }
const comparables = { count: 8, q1Cents: 1500, medianCents: 2000, q3Cents: 2600, medianDaysToSell: 20 }
const base: BuyCheckInput = {
  priceCents: 300, quantity: 1, comparables, shippingChargedCents: 0, suppliesCents: 0, profile: NO_FEES, postageCents: 550, targets,
}
// An invented channel: 12.9 % + 30 ¢ per order, no separate payment fee.
const channel = { percentBp: 1290, fixedCents: 30, paymentPercentBp: 0, paymentFixedCents: 0 }

describe('buy check verdict', () => {
  it('says buy when the median sale meets every target, with the figures of trade-facts §4', () => {
    const out = buyCheckEvaluate(base)
    // Net (trade-facts §4): 2,000 − 300 − 550 = 1,150. ROI (trade-facts §4): 1,150 / 300 × 100 = 383.33 %.
    expect(out.expectedSaleCents).toBe(2000)
    expect(out.expectedNetCents).toBe(1150)
    expect(out.expectedRoi).toBeCloseTo(383.333333, 5)
    expect(out.netSpread).toEqual({ lowCents: 1500 - 300 - 550, highCents: 2600 - 300 - 550 })
    // The most to pay: 2,000 − 550 = 1,450 left before cost; profit ≥ 10.00 → cost ≤ 450;
    // ROI ≥ 100 % → 1,450 − cost ≥ cost → cost ≤ 725. The tighter bound wins: 450.
    expect(out.maxBuyTotalCents).toBe(450)
    expect(out.maxBuyPerPieceCents).toBe(450)
    // Break-even: the sale must cover 300 + 550 = 850 with no fees.
    expect(out.breakEvenSaleCents).toBe(850)
    expect(out.lowData).toBe(false)
    expect(out.verdict).toBe('buy')
    expect(out.reasons.every(r => r.ok)).toBe(true)
  })

  it('takes the fees of the fee profile and says maybe when only the upper quartile meets the targets', () => {
    const out = buyCheckEvaluate({ ...base, profile: channel })
    // Fees at 2,000: 12.9 % = 258 + 30 = 288. Net 2,000 − 300 − 288 − 550 = 862 < 1,000.
    expect(out.feesCents).toBe(288)
    expect(out.expectedNetCents).toBe(862)
    // Upper quartile 2,600: fees 335.4 → 335 + 30 = 365; net 2,600 − 300 − 365 − 550 = 1,385 ≥ 1,000 and ROI 461.7 %.
    expect(out.netSpread.highCents).toBe(1385)
    expect(out.verdict).toBe('maybe')
    expect(out.reasons.find(r => !r.ok)?.text).toMatch(/\$8\.62/)
  })

  it('says pass when even the upper-quartile sale falls short', () => {
    const out = buyCheckEvaluate({ ...base, priceCents: 1500 })
    // Net at the median: 2,000 − 1,500 − 550 = −50; at the upper quartile 2,600 − 1,500 − 550 = 550 < 1,000.
    expect(out.expectedNetCents).toBe(-50)
    expect(out.netSpread.highCents).toBe(550)
    expect(out.verdict).toBe('pass')
  })

  it('counts the target profit as met when the net equals it exactly', () => {
    // Price p with 2,000 − p − 550 = 1,000 → p = 450; ROI 1,000 / 450 = 222 % ≥ 100 %.
    const out = buyCheckEvaluate({ ...base, priceCents: 450 })
    expect(out.expectedNetCents).toBe(1000)
    expect(out.verdict).toBe('buy')
    expect(buyCheckEvaluate({ ...base, priceCents: 451 }).verdict).toBe('maybe')
  })

  it('never says buy on fewer than five comparable sales, and says why', () => {
    expect(BUY_CHECK_MIN_COMPARABLES).toBe(5)
    const out = buyCheckEvaluate({ ...base, comparables: { ...comparables, count: 4 } })
    expect(out.lowData).toBe(true)
    expect(out.verdict).toBe('maybe')
    expect(out.reasons.at(-1)).toEqual({ ok: false, text: expect.stringMatching(/Only 4 comparable sales/) })
    // Five are enough.
    expect(buyCheckEvaluate({ ...base, comparables: { ...comparables, count: 5 } }).verdict).toBe('buy')
  })

  it('says maybe when the comparables sold slower than the longest time the owner accepts', () => {
    const out = buyCheckEvaluate({ ...base, comparables: { ...comparables, medianDaysToSell: 91 } })
    expect(out.verdict).toBe('maybe')
    expect(out.reasons.find(r => !r.ok)?.text).toMatch(/91 days, target at most 90/)
  })

  it('prices a set by the piece: cost = tag price × count, sale = median per piece × count', () => {
    const out = buyCheckEvaluate({ ...base, priceCents: 250, quantity: 4, comparables: { ...comparables, q1Cents: 600, medianCents: 800, q3Cents: 1000 } })
    // Cost 4 × 250 = 1,000; sale 4 × 800 = 3,200; net 3,200 − 1,000 − 550 = 1,650; ROI 165 %.
    expect(out.costCents).toBe(1000)
    expect(out.expectedSaleCents).toBe(3200)
    expect(out.expectedNetCents).toBe(1650)
    expect(out.expectedRoi).toBeCloseTo(165, 10)
    // Most to pay: 3,200 − 550 = 2,650; profit bound 1,650; ROI bound 2,650 / 2 = 1,325 → 1,325 for the set, 331 a piece.
    expect(out.maxBuyTotalCents).toBe(1325)
    expect(out.maxBuyPerPieceCents).toBe(331)
    expect(out.verdict).toBe('buy')
  })

  it('leaves ROI out for a free piece (nothing put in) and lets the net decide', () => {
    const out = buyCheckEvaluate({ ...base, priceCents: 0 })
    expect(out.expectedRoi).toBeNull()
    expect(out.reasons[1]).toEqual({ ok: true, text: expect.stringMatching(/ROI does not apply/) })
    expect(out.verdict).toBe('buy')
  })

  it('does not say buy when the postage could not be estimated', () => {
    const out = buyCheckEvaluate({ ...base, postageCents: null })
    expect(out.verdict).toBe('maybe')
    expect(out.reasons.some(r => !r.ok && /Postage could not be estimated/.test(r.text))).toBe(true)
  })

  it('says maybe without comparable sales, and has no price to expect', () => {
    const out = buyCheckEvaluate({ ...base, comparables: { count: 0, q1Cents: null, medianCents: null, q3Cents: null, medianDaysToSell: null } })
    expect(out).toMatchObject({ expectedSaleCents: null, expectedNetCents: null, maxBuyTotalCents: null, verdict: 'maybe', lowData: true })
    expect(out.reasons[0]!.text).toMatch(/No comparable sales/)
  })

  it('without a tag price gives the expected sale and the most to pay but no verdict', () => {
    const out = buyCheckEvaluate({ ...base, priceCents: null })
    expect(out).toMatchObject({ expectedSaleCents: 2000, maxBuyTotalCents: 450, costCents: null, expectedNetCents: null, verdict: null, reasons: [] })
  })

  it('starts a team with stated default targets', () => {
    expect(DEFAULT_BUY_TARGETS).toEqual({ minProfitCents: 1000, minRoiPercent: 100, maxDaysToSell: 90 })
  })
})

describe('buy check condition note', () => {
  const scale = ['new', 'excellent', 'very_good', 'good', 'fair', 'poor']
  const all = { count: 20, q1Cents: 1500, medianCents: 2000, q3Cents: 2600 }

  it('places a grade in the lower half of the team scale and compares its sales with all', () => {
    const note = buyCheckConditionNote('fair', scale, { count: 6, q1Cents: 900, medianCents: 1100, q3Cents: 1300 }, all)
    expect(note).toMatch(/lower half of the team's scale/)
    expect(note).toMatch(/In fair condition 6 comparables sold for a median of \$11\.00 \(middle half \$9\.00–\$13\.00\) against \$20\.00 over all 20\./)
    expect(note).not.toMatch(/Few sales/)
  })

  it('says when there are no sales in the grade, and flags few', () => {
    expect(buyCheckConditionNote('very_good', scale, { count: 0, q1Cents: null, medianCents: null, q3Cents: null }, all))
      .toBe('No comparable sales in very good condition: the expected price comes from all conditions.')
    expect(buyCheckConditionNote('good', scale, { count: 2, q1Cents: 1800, medianCents: 1900, q3Cents: 2000 }, all)).toMatch(/Few sales/)
  })

  it('names a grade that is not on the scale, and gives nothing without a grade', () => {
    expect(buyCheckConditionNote('mint', scale, { count: 0, q1Cents: null, medianCents: null, q3Cents: null }, all)).toMatch(/"mint" is not on the team's condition scale/)
    expect(buyCheckConditionNote(null, scale, all, all)).toBeNull()
  })
})

describe('report figures from SQL sums', () => {
  it('computes sell-through with the one-of-a-kind variant, as in trade-facts §4', () => {
    // 650 sold of 400 on hand at the start + 600 acquired = 1,000 available → 65 %.
    const figures = reportFigures({ ...EMPTY_COUNTS, sold: '650', on_start: 400, bought: '600', net: '1200', sold_cost: '6000' })
    expect(figures).toMatchObject({ sold: 650, onHandAtStart: 400, bought: 600, available: 1000 })
    expect(figures.sellThrough).toBeCloseTo(65, 10)
    // ROI (trade-facts §4): 1,200 / 6,000 × 100 = 20 %.
    expect(figures.roi).toBeCloseTo(20, 10)
  })

  it('rounds four times a quartile half-up to the cent, like quartilesCents', () => {
    // 4 × 1,000.25 = 4,001 → 1,000; 4 × 1,000.5 = 4,002 → 1,001 (half-up); 4 × 1,000.75 = 4,003 → 1,001.
    expect([4001, 4002, 4003, '4000'].map(x => reportQuartileCents(x, 3))).toEqual([1000, 1001, 1001, 1000])
    expect(reportQuartileCents(0, 0)).toBeNull()
  })

  it('leaves ratios and medians empty for an empty group instead of dividing by zero', () => {
    const figures = reportFigures(EMPTY_COUNTS)
    expect(figures).toMatchObject({ sellThrough: null, roi: null, medianSaleCents: null, medianDaysToSell: null, unsoldAvgAgeDays: null, available: 0 })
  })

  it('averages the unsold stock\'s age to one decimal', () => {
    // Three items aged 10, 11 and 11 days: 32 / 3 = 10.67 → 10.7.
    expect(reportFigures({ ...EMPTY_COUNTS, unsold: 3, unsold_age_days: '32' }).unsoldAvgAgeDays).toBe(10.7)
  })

  it('refuses a figure that is not a whole number instead of passing it on', () => {
    expect(() => reportFigures({ ...EMPTY_COUNTS, net: '12.5' })).toThrow(/whole number/)
  })
})
