// The buy-price calculator over HTTP. Each expected figure is a hand computation from the formulas named:
// net profit and ROI from trade-facts §4; dimensional weight from trade-facts §4 (USPS divisor 166 above
// 1,728 in³, since 23 Jun 2019); postage from the invented example rate table in shared/ledger/postage.ts.
import { describe, expect, it } from 'vitest'
import { expectError } from '../support/api'
import { newFeeProfile, newLedgerTeam } from '../support/ledger'

describe('calculator', async () => {
  const team = await newLedgerTeam('Calculator')
  // Invented: 13.25 % + 30 ¢, no separate payment fee.
  const profile = await newFeeProfile(team.editor, team, { name: 'Lanternpost standard', percentBp: 1325, fixedCents: 30 })
  const calc = (body: Record<string, unknown>) => team.viewer.post(team.api('/calculator'), body)

  it('answers break-even, max buy price and the net and ROI at a price', async () => {
    const res = await calc({ expectedSaleCents: 3000, postageCents: 550, suppliesCents: 50, costCents: 400, targetRoiPercent: 100 })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    // Fees at 3,000: 13.25 % = 397.5 → 398, + 30 = 428.
    expect(res.body.feesAtExpectedCents).toBe(428)
    expect(res.body.feeProfile).toMatchObject({ id: profile.id, isDefault: true })
    // Net = 3,000 − 400 − 428 − 550 − 50 = 1,572; ROI = 1,572 / 400 = 393 %.
    expect(res.body.atPrice).toMatchObject({ priceCents: 3000, feesCents: 428, netProfitCents: 1572 })
    expect(res.body.atPrice.roi).toBeCloseTo(393, 10)
    // Break-even: net = s − (round(13.25 % of s) + 30) − (400 + 550 + 50). At 1,187: 157.3 → 157, fees 187, net 0;
    // at 1,186: 157.1 → 157, fees 187, net −1. So 1,187 is the lowest price that breaks even.
    expect(res.body.breakEvenSalePriceCents).toBe(1187)
    // Max buy price for 100 % ROI: proceeds before cost A = 3,000 − 428 − 550 − 50 = 1,972; cost ≤ A / 2 = 986.
    expect(res.body.maxBuyPriceCents).toBe(986)
  })

  it('estimates postage from the weight and box when no postage is given', async () => {
    // 14 × 14 × 14 in = 2,744 in³ > 1,728 → dimensional 2,744 / 166 = 16.5 → 17 lb; actual 2 lb; billable 17 → band ≤ 20 lb: $26.00.
    const res = await calc({ expectedSaleCents: 9000, weight: { value: 2, unit: 'lb' }, box: { length: 14, width: 14, height: 14, unit: 'in' }, targetProfitCents: 2000 })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.postage).toMatchObject({ cents: 2600, source: 'estimate' })
    expect(res.body.postage.estimate.billable).toMatchObject({ billable: 17, unit: 'lb' })
    // Fees at 9,000: 1,192.5 → 1,193 + 30 = 1,223; A = 9,000 − 1,223 − 2,600 = 5,177; cost ≤ 5,177 − 2,000 = 3,177.
    expect(res.body.maxBuyPriceCents).toBe(3177)
    expect(res.body.atPrice).toBeNull()
    expect(res.body.breakEvenSalePriceCents).toBeNull()
  })

  it('uses the fee profile asked for, and refuses another team\'s', async () => {
    const flat = await newFeeProfile(team.editor, team, { name: 'Cash table', percentBp: 0, fixedCents: 0 })
    const res = await calc({ expectedSaleCents: 1000, feeProfileId: flat.id, costCents: 200 })
    expect(res.body).toMatchObject({ feesAtExpectedCents: 0, atPrice: { netProfitCents: 800 }, breakEvenSalePriceCents: 200, maxBuyPriceCents: 1000 })
    const other = await newLedgerTeam('Other calculator')
    const foreign = await newFeeProfile(other.editor, other, { name: 'Foreign' })
    expect(expectError(await calc({ expectedSaleCents: 1000, feeProfileId: foreign.id }), 400).fieldErrors?.feeProfileId).toBeDefined()
    expectError(await calc({ expectedSaleCents: -5 }), 400)
  })
})
