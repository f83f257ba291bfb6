// The buy-price calculator: before buying, what must it sell for and what may it cost. All arithmetic is
// shared/ledger's (fees, profit, postage); this module only picks the fee profile and the postage.
import type { z } from 'zod'
import { computeFees } from '../../../shared/ledger/fees'
import { EXAMPLE_RATE_TABLE, estimatePostage } from '../../../shared/ledger/postage'
import { breakEvenSalePrice, maxBuyPrice, roiPercent, saleNetProfit } from '../../../shared/ledger/profit'
import type { calculatorSchema } from '../../../shared/schemas/ledger'

export async function ledgerCalculate(access: TeamAccess, input: z.infer<typeof calculatorSchema>) {
  const db = useDb()
  const row = input.feeProfileId !== undefined
    ? await ledgerFindFeeProfile(db, access.team.id, input.feeProfileId)
    : await ledgerDefaultFeeProfile(db, access.team.id)
  if (input.feeProfileId !== undefined && !row) {
    throw httpError(400, `Please check the form: feeProfileId: no fee profile with id ${input.feeProfileId} in this team.`, { feeProfileId: [`No fee profile with id ${input.feeProfileId} in this team.`] })
  }
  const profile = ledgerFeeTerms(row)

  let postage: { cents: number, source: 'given' | 'estimate' | 'none', estimate?: ReturnType<typeof estimatePostage>, rateTable?: string }
  if (input.postageCents !== undefined) postage = { cents: input.postageCents, source: 'given' }
  else if (input.weight && input.box) {
    const box = input.box.unit === 'mm'
      ? { length: input.box.length / 10, width: input.box.width / 10, height: input.box.height / 10, unit: 'cm' as const }
      : { length: input.box.length, width: input.box.width, height: input.box.height, unit: input.box.unit }
    const estimate = estimatePostage(input.weight, box)
    if (estimate.priceCents === null) {
      throw httpError(400, `Please check the form: weight: the billable weight (${estimate.billable.billable} ${estimate.billable.unit}) is above the rate table's heaviest band: enter postageCents instead.`,
        { weight: ['Above the heaviest band of the rate table: enter postageCents instead.'] })
    }
    postage = { cents: estimate.priceCents, source: 'estimate', estimate, rateTable: EXAMPLE_RATE_TABLE.name }
  }
  else postage = { cents: 0, source: 'none' }

  const shipping = input.shippingChargedCents
  const supplies = input.suppliesCents
  const atPrice = input.atPriceCents ?? input.expectedSaleCents
  const cost = input.costCents
  const atSale = cost === undefined
    ? null
    : saleNetProfit({ salePriceCents: atPrice, shippingChargedCents: shipping, costCents: cost, profile, postageCents: postage.cents, suppliesCents: supplies })
  return {
    feeProfile: row ? ledgerPresentFeeProfile(row) : null,
    postage,
    feesAtExpectedCents: computeFees(profile, input.expectedSaleCents, shipping).totalCents,
    breakEvenSalePriceCents: cost === undefined ? null : breakEvenSalePrice(cost, profile, postage.cents, supplies, shipping),
    maxBuyPriceCents: maxBuyPrice({
      expectedSaleCents: input.expectedSaleCents, shippingChargedCents: shipping, profile, postageCents: postage.cents, suppliesCents: supplies,
      targetProfitCents: input.targetProfitCents, targetRoiPercent: input.targetRoiPercent,
    }),
    atPrice: atSale === null || cost === undefined
      ? null
      : { priceCents: atPrice, feesCents: atSale.fees.totalCents, netProfitCents: atSale.netCents, roi: roiPercent(atSale.netCents, cost) },
  }
}
