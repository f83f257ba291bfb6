// Selling fees of one order on one channel. A channel usually takes a percentage of what the buyer pays
// (item price plus the shipping charged to the buyer) plus a fixed amount per order; the payment
// processor does the same on the same base. Sales tax collected on the buyer's behalf is left out.
//
// Rounding: each percentage component is rounded to the cent on its own (ties away from zero, see
// money.ts) before its fixed part is added. The total is the exact sum of the two rounded fees.
import { assertCents, BASIS_POINTS_PER_WHOLE, percentOf } from './money'

export interface FeeProfile {
  /** Channel's share of sale price + shipping charged, in basis points (1290 = 12.9 %). */
  percentBp: number
  /** Channel's fixed fee per order, in cents. */
  fixedCents: number
  /** Payment processing share of the same base, in basis points. */
  paymentPercentBp: number
  /** Payment processing fixed fee per order, in cents. */
  paymentFixedCents: number
}

export interface FeeBreakdown {
  marketplaceFeeCents: number
  paymentFeeCents: number
  totalCents: number
}

/** A sale in person, paid in cash: nothing is taken. */
export const NO_FEES: FeeProfile = Object.freeze({ percentBp: 0, fixedCents: 0, paymentPercentBp: 0, paymentFixedCents: 0 })

/** Throws unless the profile holds whole, non-negative numbers and each percentage is at most 100 %. */
export function assertFeeProfile(profile: FeeProfile): void {
  for (const key of ['percentBp', 'paymentPercentBp'] as const) {
    const value = profile[key]
    if (!Number.isInteger(value) || value < 0 || value > BASIS_POINTS_PER_WHOLE) {
      throw new RangeError(`${key} must be whole basis points between 0 and 10000, got ${value}`)
    }
  }
  assertCents('fixedCents', profile.fixedCents)
  assertCents('paymentFixedCents', profile.paymentFixedCents)
}

export function computeFees(profile: FeeProfile, salePriceCents: number, shippingChargedCents: number): FeeBreakdown {
  assertFeeProfile(profile)
  assertCents('salePriceCents', salePriceCents)
  assertCents('shippingChargedCents', shippingChargedCents)
  const buyerPaysCents = salePriceCents + shippingChargedCents
  const marketplaceFeeCents = percentOf(buyerPaysCents, profile.percentBp) + profile.fixedCents
  const paymentFeeCents = percentOf(buyerPaysCents, profile.paymentPercentBp) + profile.paymentFixedCents
  return { marketplaceFeeCents, paymentFeeCents, totalCents: marketplaceFeeCents + paymentFeeCents }
}
