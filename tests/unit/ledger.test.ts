// Ledger arithmetic. Each worked example names its source beside the check:
// "trade-facts §4" is section 4 of the team's trade-facts notes; "hand computation" means the expected value
// was worked out by hand from the formula stated in the comment.
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  averageSaleCents, billableWeight, breakEvenSalePrice, computeFees, daysInInventory, daysToSell,
  dimensionalWeight, estimatePostage, EXAMPLE_RATE_TABLE, findDimDivisor, formatCents, grossMarginPercent,
  inventoryTurnover, markupFromMarginPercent, markupPercent, maxBuyPrice, medianSaleCents, netProfit,
  NO_FEES, parseMoney, percentOf, quartilesCents, roiPercent, roundHalfUp, saleNetProfit, sellThrough, sumCents,
} from '#shared/ledger'
import type { BoxDimensions, DimDivisorEntry, FeeProfile, NetProfitParts } from '#shared/ledger'

const rule = (id: string, onDate: string): DimDivisorEntry => {
  const found = findDimDivisor(id, onDate)
  if (!found) throw new Error(`no divisor for ${id} on ${onDate}`)
  return found
}
const cube = (side: number, unit: BoxDimensions['unit'] = 'in'): BoxDimensions => ({ length: side, width: side, height: side, unit })

// Invented fee profile for examples; not any channel's real schedule.
const EXAMPLE_PROFILE: FeeProfile = { percentBp: 1325, fixedCents: 30, paymentPercentBp: 290, paymentFixedCents: 30 }

describe('money', () => {
  it('rounds rationals to the nearest integer, ties away from zero (ledger rule, documented in money.ts)', () => {
    expect(roundHalfUp(5, 2)).toBe(3)
    expect(roundHalfUp(-5, 2)).toBe(-3)
    expect(roundHalfUp(7, 4)).toBe(2)
    expect(roundHalfUp(5, 4)).toBe(1)
    expect(() => roundHalfUp(1, 0)).toThrow(RangeError)
  })

  it('rounds 100.5 cents up where float formatting would not (trade-facts §4, Money: (1.005).toFixed(2) gives "1.00")', () => {
    expect((1.005).toFixed(2)).toBe('1.00')
    expect(roundHalfUp(1005, 10)).toBe(101)
  })

  it('takes basis-point percentages of cents (hand computation: 13.25 % of 2,500 = 331.25 → 331; 0.05 % of 1,000 = 0.5 → 1)', () => {
    expect(percentOf(2500, 1325)).toBe(331)
    expect(percentOf(1000, 5)).toBe(1)
    expect(percentOf(-1000, 5)).toBe(-1)
  })

  it('sums cents exactly and refuses fractions of a cent', () => {
    expect(sumCents([10, 20, -5])).toBe(25)
    expect(() => sumCents([0.1, 0.2])).toThrow(RangeError)
  })

  it.each([
    ['12.50', 1250], ['$12.50', 1250], ['12,50', 1250], ['1,234.56', 123456], ['1.234,56', 123456], ['12', 1200],
    ['1 234,56 €', 123456], ['CHF 1\'234.50', 123450], ['-$3', -300], ['(3.00)', -300], ['.5', 50],
    ['1,234', 123400], ['USD 5', 500], ['12 USD', 1200], ['1,23,456.00', 12345600],
  ])('parses %j as %i cents (common formats, hand computation)', (text, cents) => {
    expect(parseMoney(text)).toEqual({ ok: true, cents })
  })

  it.each(['', 'abc', '12 apples', '12.345.6', '1,234,56', '1,234.567', '--3', '0,123'])('rejects %j with a message', (text) => {
    const result = parseMoney(text)
    expect(result.ok).toBe(false)
    if (!result.ok) expect(result.error.length).toBeGreaterThan(0)
  })

  it('reads a lone separator before three digits as grouping unless told the decimal separator', () => {
    expect(parseMoney('12.500')).toEqual({ ok: true, cents: 1250000 })
    expect(parseMoney('12.500', { decimalSeparator: '.' }).ok).toBe(false)
    expect(parseMoney('12,5', { decimalSeparator: ',' })).toEqual({ ok: true, cents: 1250 })
  })

  it('formats for display with Intl and refuses currencies without two decimals', () => {
    expect(formatCents(123456, 'USD', 'en-US')).toBe('$1,234.56')
    expect(formatCents(-5, 'USD', 'en-US')).toBe('-$0.05')
    expect(() => formatCents(100, 'JPY', 'ja-JP')).toThrow(RangeError)
  })
})

describe('fees', () => {
  it('rounds each percentage component on its own, then adds the fixed part (hand computation)', () => {
    // Base 2,000 + 500 = 2,500. 13.25 % = 331.25 → 331, + 30 = 361. 2.9 % = 72.5 → 73 (tie up), + 30 = 103.
    expect(computeFees(EXAMPLE_PROFILE, 2000, 500)).toEqual({ marketplaceFeeCents: 361, paymentFeeCents: 103, totalCents: 464 })
    expect(computeFees(NO_FEES, 2000, 500).totalCents).toBe(0)
  })

  it('rejects malformed profiles', () => {
    expect(() => computeFees({ ...EXAMPLE_PROFILE, percentBp: 12.5 }, 100, 0)).toThrow(RangeError)
    expect(() => computeFees({ ...EXAMPLE_PROFILE, fixedCents: -1 }, 100, 0)).toThrow(RangeError)
  })
})

describe('profit and ratios (trade-facts §4)', () => {
  it('price 10, cost 8 → margin 20 %, markup 25 % (trade-facts §4)', () => {
    expect(grossMarginPercent(1000, 800)).toBeCloseTo(20, 10)
    expect(markupPercent(1000, 800)).toBeCloseTo(25, 10)
    expect(markupFromMarginPercent(20)).toBeCloseTo(25, 10)
  })

  it('price 100, cost 75 → margin 25 %, markup 33.3 % (trade-facts §4)', () => {
    expect(grossMarginPercent(10000, 7500)).toBeCloseTo(25, 10)
    expect(markupPercent(10000, 7500)).toBeCloseTo(33.3, 1)
    expect(markupFromMarginPercent(25)).toBeCloseTo(33.3, 1)
  })

  it('1,000 in, 1,200 back → ROI 20 % (trade-facts §4)', () => {
    const { netCents } = saleNetProfit({ salePriceCents: 120000, shippingChargedCents: 0, costCents: 100000, profile: NO_FEES, postageCents: 0, suppliesCents: 0 })
    expect(netCents).toBe(20000)
    expect(roiPercent(netCents, 100000)).toBeCloseTo(20, 10)
  })

  it('has no ROI, markup or margin where the divisor is zero', () => {
    expect(roiPercent(500, 0)).toBeNull()
    expect(markupPercent(500, 0)).toBeNull()
    expect(grossMarginPercent(0, 0)).toBeNull()
    expect(markupFromMarginPercent(100)).toBeNull()
  })

  it('net profit subtracts every cost from sale + shipping (trade-facts §4 reseller definition, plus refunds)', () => {
    const parts: NetProfitParts = { salePriceCents: 4000, shippingChargedCents: 800, costCents: 500, marketplaceFeeCents: 666, paymentFeeCents: 169, postageCents: 750, suppliesCents: 60, refundsCents: 100 }
    expect(netProfit(parts)).toBe(4000 + 800 - 500 - 666 - 169 - 750 - 60 - 100)
  })

  it('counts days to sell in UTC calendar days (sale date − acquisition date: trade-facts §4, "memory; common practice")', () => {
    expect(daysToSell('2024-02-27', '2024-03-01')).toBe(3) // hand computation: 2024 is a leap year
    expect(daysToSell('2023-02-27', '2023-03-01')).toBe(2)
    expect(daysToSell('2024-05-01', '2024-05-01')).toBe(0)
    expect(daysToSell('2024-01-01T23:30:00-05:00', '2024-01-02')).toBe(0) // 04:30 UTC on the 2nd
    expect(() => daysToSell('2024-05-02', '2024-05-01')).toThrow(RangeError)
    expect(() => daysToSell('2023-02-30', '2023-03-01')).toThrow(RangeError)
  })

  it('finds the exact break-even price (hand computation with the example profile)', () => {
    // Costs 500 + 450 + 50 and fixed fees 60: 1,060 / (1 − 0.1615) ≈ 1,264.2. At 1,264 the fees are
    // 167.48 → 167 + 30 and 36.66 → 37 + 30 = 264, net 0; at 1,263 they are still 264, net −1.
    expect(breakEvenSalePrice(500, EXAMPLE_PROFILE, 450, 50, 0)).toBe(1264)
    expect(breakEvenSalePrice(0, NO_FEES, 0, 0, 0)).toBe(0)
    expect(breakEvenSalePrice(100, { percentBp: 6000, fixedCents: 0, paymentPercentBp: 4000, paymentFixedCents: 0 }, 0, 0, 0)).toBeNull()
  })

  it('finds the largest buy price for a target ROI (hand computation with the example profile)', () => {
    // Sale 4,000: fees 530 + 30 and 116 + 30 = 706; proceeds 4,000 − 706 − 600 − 50 = 2,644; ROI 100 % → cost ≤ 1,322.
    const input = { expectedSaleCents: 4000, shippingChargedCents: 0, profile: EXAMPLE_PROFILE, postageCents: 600, suppliesCents: 50 }
    expect(maxBuyPrice({ ...input, targetRoiPercent: 100 })).toBe(1322)
    expect(maxBuyPrice({ ...input, targetProfitCents: 1500 })).toBe(1144)
    expect(maxBuyPrice({ ...input, targetProfitCents: 1500, targetRoiPercent: 100 })).toBe(1144)
    expect(maxBuyPrice(input)).toBe(2644)
    expect(maxBuyPrice({ ...input, expectedSaleCents: 0, targetRoiPercent: 10 })).toBeNull()
  })
})

describe('stats', () => {
  it('averages and takes medians in cents, halves rounded up (hand computation)', () => {
    expect(averageSaleCents([100, 200, 400])).toBe(233)
    expect(averageSaleCents([1, 2])).toBe(2)
    expect(medianSaleCents([400, 100, 200])).toBe(200)
    expect(medianSaleCents([1, 2])).toBe(2)
    expect(averageSaleCents([])).toBeNull()
    expect(medianSaleCents([])).toBeNull()
  })

  it('quartiles by R-7 match the QUARTILE.INC worked example (Microsoft Excel documentation, QUARTILE.INC: data 1,2,4,7,8,9,10,12 → first quartile 3.5)', () => {
    // Q1 from the published example; median 7.5 and Q3 9 + 0.25 × 1 = 9.25 by hand computation.
    expect(quartilesCents([100, 200, 400, 700, 800, 900, 1000, 1200])).toEqual({ q1: 350, median: 750, q3: 925 })
  })

  it('quartiles of 1..10 are 3.25, 5.5, 7.75 (hand computation, Hyndman & Fan type 7: h = 9j/4)', () => {
    expect(quartilesCents([1, 2, 3, 4, 5, 6, 7, 8, 9, 10].map(v => v * 100))).toEqual({ q1: 325, median: 550, q3: 775 })
    expect(quartilesCents([0, 1])).toEqual({ q1: 0, median: 1, q3: 1 }) // 0.25 → 0, 0.5 → 1, 0.75 → 1
  })

  it('retail sell-through 650 of 1,000 → 65 % (trade-facts §4), naming the variant', () => {
    const result = sellThrough({ variant: 'retail', unitsSold: 650, unitsReceived: 1000 })
    expect(result.percent).toBeCloseTo(65, 10)
    expect(result.variant).toBe('retail')
    expect(result.formula).toContain('units received')
  })

  it('one-of-a-kind sell-through = sold / (on hand at start + acquired) (trade-facts §4; hand computation 30 / (40 + 60) = 30 %)', () => {
    const result = sellThrough({ variant: 'one-of-a-kind', unitsSold: 30, onHandAtStart: 40, acquiredInPeriod: 60 })
    expect(result).toMatchObject({ variant: 'one-of-a-kind', unitsAvailable: 100 })
    expect(result.percent).toBeCloseTo(30, 10)
    expect(result.formula).toContain('on hand at start + acquired in period')
    expect(sellThrough({ variant: 'retail', unitsSold: 0, unitsReceived: 0 }).percent).toBeNull()
  })

  it('turnover 600,000 / 120,000 = 5 turns; 365 / 3 ≈ 122 days (trade-facts §4)', () => {
    // Average (100,000 + 140,000) / 2 = 120,000.
    expect(inventoryTurnover({ costOfGoodsSoldCents: 600000, beginningInventoryCents: 100000, endingInventoryCents: 140000 })).toBe(5)
    expect(Math.round(daysInInventory(3)!)).toBe(122)
    expect(daysInInventory(null)).toBeNull()
    expect(inventoryTurnover({ costOfGoodsSoldCents: 5, beginningInventoryCents: 0, endingInventoryCents: 0 })).toBeNull()
  })
})

describe('postage and dimensional weight (trade-facts §4; expected values by hand computation)', () => {
  const usps = rule('usps', '2024-01-01')

  it('USPS 166: a 14 in cube is 2,744 in³ / 166 = 16.53 → 17 lb', () => {
    expect(dimensionalWeight(cube(14), usps)).toMatchObject({ volume: 2744, weight: 17, unit: 'lb' })
    expect(billableWeight({ value: 3, unit: 'lb' }, cube(14), usps).billable).toBe(17)
    expect(billableWeight({ value: 25, unit: 'lb' }, cube(14), usps).billable).toBe(25) // max(actual, dim)
  })

  it('USPS applies only above 1,728 in³: a 12 in cube bills its actual weight', () => {
    expect(dimensionalWeight(cube(12), usps).weight).toBeNull()
    expect(billableWeight({ value: 40, unit: 'oz' }, cube(12), usps).billable).toBe(3) // 2.5 lb → next pound
  })

  it('rounds sides to the nearest inch first: 12.4 × 12.6 × 12 → 12 × 13 × 12 = 1,872 in³ / 166 = 11.28 → 12 lb', () => {
    expect(dimensionalWeight({ length: 12.4, width: 12.6, height: 12, unit: 'in' }, usps)).toMatchObject({ roundedSides: [12, 13, 12], volume: 1872, weight: 12 })
  })

  it('converts cm and grams: 35.56 cm = 14 in, 1,360.78 g ≈ 3 lb', () => {
    expect(billableWeight({ value: 1360.77711, unit: 'g' }, cube(35.56, 'cm'), usps)).toMatchObject({ actual: 3, billable: 17 })
  })

  it('uses the divisor in force on the date: FedEx 166 to 2017-01-01, 139 from 2017-01-02; USPS none before 2019-06-23', () => {
    expect(dimensionalWeight(cube(14), rule('fedex', '2017-01-01')).weight).toBe(17) // 2,744 / 166
    expect(dimensionalWeight(cube(14), rule('fedex', '2017-01-02')).weight).toBe(20) // 2,744 / 139 = 19.74
    expect(rule('ups-daily', '2024-01-01').divisor).toBe(139)
    expect(rule('ups-retail', '2024-01-01').divisor).toBe(166)
    expect(findDimDivisor('usps', '2019-06-22')).toBeNull()
  })

  it('metric: cm³ / 5,000 kg; 40 × 30 × 20 = 4.8 → 5 kg, 35 × 30 × 20 = 4.2 → 4.5 kg (0.5 kg step: from memory)', () => {
    const metric = rule('metric-5000', '2024-01-01')
    expect(dimensionalWeight({ length: 40, width: 30, height: 20, unit: 'cm' }, metric).weight).toBe(5)
    expect(billableWeight({ value: 2, unit: 'kg' }, { length: 35, width: 30, height: 20, unit: 'cm' }, metric).billable).toBe(4.5)
  })

  it('prices by band from the invented example table, and says when the weight is off the table', () => {
    expect(EXAMPLE_RATE_TABLE.inventedExample).toBe(true)
    expect(estimatePostage({ value: 3, unit: 'lb' }, cube(14)).priceCents).toBe(2600) // 17 lb → "up to 20" band
    expect(estimatePostage({ value: 71, unit: 'lb' }, cube(10)).priceCents).toBeNull()
  })
})

// Property tests: each compares the module with an independent statement of the definition.
const cents = (max = 1_000_000) => fc.integer({ min: 0, max })
const feeProfile = fc.record({
  percentBp: fc.oneof(fc.integer({ min: 0, max: 3000 }), fc.integer({ min: 0, max: 10000 })),
  fixedCents: cents(500),
  paymentPercentBp: fc.integer({ min: 0, max: 1000 }),
  paymentFixedCents: cents(100),
})

/** A fee component meets the definition when −½ < (fee − fixed) − base × bp / 10,000 ≤ ½ (nearest cent, ties up). */
function isNearestCentTiesUp(component: number, fixed: number, base: number, bp: number): boolean {
  const scaledError = (BigInt(component - fixed) * 10_000n - BigInt(base) * BigInt(bp)) * 2n
  return scaledError > -10_000n && scaledError <= 10_000n
}

describe('properties', () => {
  it('fees are never off by a cent from the definition (compared in BigInt rationals)', () => {
    fc.assert(fc.property(feeProfile, cents(), cents(10_000), (profile, sale, shipping) => {
      const fees = computeFees(profile, sale, shipping)
      const base = sale + shipping
      expect(isNearestCentTiesUp(fees.marketplaceFeeCents, profile.fixedCents, base, profile.percentBp)).toBe(true)
      expect(isNearestCentTiesUp(fees.paymentFeeCents, profile.paymentFixedCents, base, profile.paymentPercentBp)).toBe(true)
      expect(fees.totalCents).toBe(fees.marketplaceFeeCents + fees.paymentFeeCents)
    }), { numRuns: 1000 })
  })

  it('net profit equals the sum of its parts', () => {
    const parts = fc.record({
      salePriceCents: cents(), shippingChargedCents: cents(), costCents: cents(), marketplaceFeeCents: cents(),
      paymentFeeCents: cents(), postageCents: cents(), suppliesCents: cents(), refundsCents: cents(),
    })
    fc.assert(fc.property(parts, (p) => {
      const expected = BigInt(p.salePriceCents) + BigInt(p.shippingChargedCents) - BigInt(p.costCents) - BigInt(p.marketplaceFeeCents)
        - BigInt(p.paymentFeeCents) - BigInt(p.postageCents) - BigInt(p.suppliesCents) - BigInt(p.refundsCents)
      expect(BigInt(netProfit(p))).toBe(expected)
    }))
  })

  const netAt = (sale: number, cost: number, profile: FeeProfile, postage: number, supplies: number, shipping: number) =>
    saleNetProfit({ salePriceCents: sale, shippingChargedCents: shipping, costCents: cost, profile, postageCents: postage, suppliesCents: supplies }).netCents

  it('the break-even price breaks even and one cent less does not', () => {
    fc.assert(fc.property(feeProfile, cents(100_000), cents(5000), cents(1000), cents(5000), (profile, cost, postage, supplies, shipping) => {
      const price = breakEvenSalePrice(cost, profile, postage, supplies, shipping)
      if (price === null) {
        // Only when the percentages take the whole price and something fixed must still be paid.
        expect(profile.percentBp + profile.paymentPercentBp).toBeGreaterThanOrEqual(10_000)
        expect(cost + postage + supplies + profile.fixedCents + profile.paymentFixedCents).toBeGreaterThan(0)
        for (const sale of [0, 1, cost, 10 * (cost + postage + supplies) + 99_999]) expect(netAt(sale, cost, profile, postage, supplies, shipping)).toBeLessThan(0)
        return
      }
      expect(netAt(price, cost, profile, postage, supplies, shipping)).toBeGreaterThanOrEqual(0)
      if (price > 0) expect(netAt(price - 1, cost, profile, postage, supplies, shipping)).toBeLessThan(0)
    }), { numRuns: 500 })
  })

  it('the break-even price is the smallest that breaks even (brute force over small amounts)', () => {
    const modestProfile = fc.record({
      percentBp: fc.integer({ min: 0, max: 4000 }), fixedCents: cents(100), paymentPercentBp: fc.integer({ min: 0, max: 1000 }), paymentFixedCents: cents(50),
    })
    fc.assert(fc.property(modestProfile, cents(2000), cents(500), cents(100), cents(500), (profile, cost, postage, supplies, shipping) => {
      const price = breakEvenSalePrice(cost, profile, postage, supplies, shipping)!
      let firstBreakingEven = 0
      while (netAt(firstBreakingEven, cost, profile, postage, supplies, shipping) < 0) firstBreakingEven++
      expect(price).toBe(firstBreakingEven)
    }), { numRuns: 200 })
  })

  it('the max buy price meets the targets and one cent more does not', () => {
    const input = fc.record({
      expectedSaleCents: cents(200_000), shippingChargedCents: cents(3000), profile: feeProfile, postageCents: cents(3000), suppliesCents: cents(500),
      targetProfitCents: fc.option(fc.integer({ min: -1000, max: 50_000 }), { nil: undefined }),
      targetRoiPercent: fc.option(fc.integer({ min: 0, max: 50_000 }).map(hundredths => hundredths / 100), { nil: undefined }),
    })
    fc.assert(fc.property(input, (i) => {
      const proceeds = netAt(i.expectedSaleCents, 0, i.profile, i.postageCents, i.suppliesCents, i.shippingChargedCents)
      const profitTarget = i.targetProfitCents ?? (i.targetRoiPercent === undefined ? 0 : undefined)
      const meets = (cost: number) => {
        const net = proceeds - cost
        if (profitTarget !== undefined && net < profitTarget) return false
        if (i.targetRoiPercent === undefined) return true
        // ROI ≥ target as an exact integer inequality: net × 10,000 ≥ bp × cost, cost > 0.
        return cost > 0 && BigInt(net) * 10_000n >= BigInt(Math.round(i.targetRoiPercent * 100)) * BigInt(cost)
      }
      expect(netAt(i.expectedSaleCents, 1234, i.profile, i.postageCents, i.suppliesCents, i.shippingChargedCents)).toBe(proceeds - 1234)
      const price = maxBuyPrice(i)
      if (price === null) {
        expect(meets(0) || meets(1)).toBe(false)
      }
      else {
        expect(meets(price)).toBe(true)
        expect(meets(price + 1)).toBe(false)
      }
    }), { numRuns: 1000 })
  })

  it('parseMoney reads back what formatCents wrote, across locales', () => {
    const localeCurrency = fc.constantFrom(
      ['en-US', 'USD'], ['en-GB', 'GBP'], ['de-DE', 'EUR'], ['fr-FR', 'EUR'], ['de-CH', 'CHF'], ['nl-NL', 'EUR'],
      ['sv-SE', 'SEK'], ['es-ES', 'EUR'], ['it-IT', 'EUR'], ['pt-BR', 'BRL'], ['fr-CA', 'CAD'], ['en-IN', 'INR'],
    )
    fc.assert(fc.property(fc.integer({ min: -1e13, max: 1e13 }), localeCurrency, (amount, [locale, currency]) => {
      expect(parseMoney(formatCents(amount, currency!, locale))).toEqual({ ok: true, cents: amount })
    }), { numRuns: 2000 })
  })

  it('parseMoney reads plain "d.dd" and "d,dd" text exactly', () => {
    fc.assert(fc.property(cents(1e12), (amount) => {
      const text = `${Math.floor(amount / 100)}.${String(amount % 100).padStart(2, '0')}`
      expect(parseMoney(text)).toEqual({ ok: true, cents: amount })
      expect(parseMoney(text.replace('.', ','))).toEqual({ ok: true, cents: amount })
    }))
  })
})
