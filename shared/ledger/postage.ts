// Billable weight and a postage estimate. Carriers change their divisors, so divisors are data with
// effective dates (inclusive), looked up for the ship date, never constants in the arithmetic.
// Lengths and weights are physical measures, not money: they may be fractional floats. Before
// rounding, a value is snapped to 12 significant digits so conversion noise (30.48 cm / 2.54 =
// 12.000000000000002) cannot push it across a rounding boundary.

export type LengthUnit = 'in' | 'cm'
export type WeightUnit = 'oz' | 'lb' | 'g' | 'kg'
export type MeasurementSystem = 'imperial' | 'metric'

export interface BoxDimensions { length: number, width: number, height: number, unit: LengthUnit }
export interface Weight { value: number, unit: WeightUnit }

export interface DimDivisorEntry {
  /** Lookup key; several entries share one when a divisor changed over time. */
  id: string
  label: string
  /** imperial: in³ / divisor = lb; metric: cm³ / divisor = kg. */
  system: MeasurementSystem
  divisor: number
  effectiveFrom: string | null
  effectiveUntil: string | null
  /** Dimensional weight applies only to boxes larger than this volume (in³ or cm³). */
  appliesAboveVolume: number | null
  source: string
}

const TRADE_FACTS = 'shared trade-facts.md §4'

export const DIM_DIVISORS: readonly DimDivisorEntry[] = Object.freeze([
  { id: 'usps', label: 'USPS, parcels over 1 cubic foot', system: 'imperial', divisor: 166, effectiveFrom: '2019-06-23', effectiveUntil: null, appliesAboveVolume: 1728, source: TRADE_FACTS },
  { id: 'fedex', label: 'FedEx', system: 'imperial', divisor: 166, effectiveFrom: null, effectiveUntil: '2017-01-01', appliesAboveVolume: null, source: `${TRADE_FACTS}; start date not on record` },
  { id: 'fedex', label: 'FedEx', system: 'imperial', divisor: 139, effectiveFrom: '2017-01-02', effectiveUntil: null, appliesAboveVolume: null, source: TRADE_FACTS },
  { id: 'ups-daily', label: 'UPS, daily rates', system: 'imperial', divisor: 139, effectiveFrom: null, effectiveUntil: null, appliesAboveVolume: null, source: `${TRADE_FACTS}; dates not on record` },
  { id: 'ups-retail', label: 'UPS, retail rates', system: 'imperial', divisor: 166, effectiveFrom: null, effectiveUntil: null, appliesAboveVolume: null, source: `${TRADE_FACTS}; dates not on record` },
  { id: 'metric-5000', label: 'International, metric', system: 'metric', divisor: 5000, effectiveFrom: null, effectiveUntil: null, appliesAboveVolume: null, source: TRADE_FACTS },
] satisfies DimDivisorEntry[])

/** How each system rounds: dimensions to the nearest whole unit, weights up to the next step. */
export const BILLING_ROUNDING: Record<MeasurementSystem, { weightUnit: 'lb' | 'kg', weightStep: number, source: string }> = {
  imperial: { weightUnit: 'lb', weightStep: 1, source: `${TRADE_FACTS} (nearest inch, next pound)` },
  metric: { weightUnit: 'kg', weightStep: 0.5, source: 'nearest cm and next 0.5 kg: from memory; carriers differ' },
}

/** The entry for `id` in force on `onDate` (ISO yyyy-mm-dd; ISO dates compare as strings). */
export function findDimDivisor(id: string, onDate: string, table: readonly DimDivisorEntry[] = DIM_DIVISORS): DimDivisorEntry | null {
  return table.find(entry => entry.id === id
    && (entry.effectiveFrom === null || entry.effectiveFrom <= onDate)
    && (entry.effectiveUntil === null || onDate <= entry.effectiveUntil)) ?? null
}

const CM_PER_INCH = 2.54 // exact by definition
const GRAMS_PER: Record<WeightUnit, number> = { g: 1, kg: 1000, lb: 453.59237, oz: 453.59237 / 16 } // exact definitions

const snap = (value: number) => Number(value.toPrecision(12))

function assertMeasure(name: string, value: number, allowZero: boolean): void {
  if (!Number.isFinite(value) || value < 0 || (!allowZero && value === 0)) throw new RangeError(`${name} must be a positive number, got ${value}`)
}

function lengthIn(value: number, from: LengthUnit, to: LengthUnit): number {
  return from === to ? value : from === 'cm' ? value / CM_PER_INCH : value * CM_PER_INCH
}

function weightIn(weight: Weight, to: 'lb' | 'kg'): number {
  return (weight.value * GRAMS_PER[weight.unit]) / GRAMS_PER[to]
}

export interface DimensionalWeight {
  /** Each side rounded to the nearest whole inch or centimetre. */
  roundedSides: [number, number, number]
  volume: number
  /** In the rule's weight unit; null when the box is too small for the rule to apply. */
  weight: number | null
  unit: 'lb' | 'kg'
}

export function dimensionalWeight(box: BoxDimensions, rule: DimDivisorEntry): DimensionalWeight {
  const sideUnit: LengthUnit = rule.system === 'imperial' ? 'in' : 'cm'
  const { weightUnit, weightStep } = BILLING_ROUNDING[rule.system]
  const roundedSides = ([box.length, box.width, box.height] as const).map((side) => {
    assertMeasure('box side', side, false)
    return Math.round(snap(lengthIn(side, box.unit, sideUnit)))
  }) as [number, number, number]
  const volume = roundedSides[0] * roundedSides[1] * roundedSides[2]
  const applies = rule.appliesAboveVolume === null || volume > rule.appliesAboveVolume
  // Ceiling of volume / divisor in weight steps, in integers: sides are whole, so is the volume.
  const stepsPerUnit = Math.round(1 / weightStep)
  const scaled = volume * stepsPerUnit
  const steps = (scaled - (scaled % rule.divisor)) / rule.divisor + (scaled % rule.divisor > 0 ? 1 : 0)
  return { roundedSides, volume, weight: applies ? steps / stepsPerUnit : null, unit: weightUnit }
}

export interface BillableWeight {
  /** Actual weight rounded up to the next step. */
  actual: number
  dimensional: DimensionalWeight
  /** max(actual, dimensional). */
  billable: number
  unit: 'lb' | 'kg'
}

export function billableWeight(weight: Weight, box: BoxDimensions, rule: DimDivisorEntry): BillableWeight {
  assertMeasure('weight', weight.value, true)
  const { weightUnit, weightStep } = BILLING_ROUNDING[rule.system]
  const actual = (Math.ceil(snap(weightIn(weight, weightUnit) / weightStep)) * weightStep)
  const dimensional = dimensionalWeight(box, rule)
  return { actual, dimensional, billable: Math.max(actual, dimensional.weight ?? 0), unit: weightUnit }
}

export interface PostageRateBand {
  /** Inclusive upper bound of billable weight, in the table's unit. */
  upToWeight: number
  priceCents: number
}

export interface PostageRateTable {
  name: string
  /** True for tables made up for illustration, which the team must replace with its carrier's rates. */
  inventedExample: boolean
  dimDivisor: DimDivisorEntry
  /** Sorted by weight, lightest first. */
  bands: readonly PostageRateBand[]
}

/** Invented example rates, not any carrier's: replace with the rates your carrier publishes. */
export const EXAMPLE_RATE_TABLE: PostageRateTable = Object.freeze({
  name: 'Example ground rates (invented; replace with your carrier\'s table)',
  inventedExample: true,
  dimDivisor: findDimDivisor('usps', '2019-06-23')!,
  bands: Object.freeze([
    { upToWeight: 1, priceCents: 550 },
    { upToWeight: 2, priceCents: 700 },
    { upToWeight: 3, priceCents: 850 },
    { upToWeight: 5, priceCents: 1100 },
    { upToWeight: 10, priceCents: 1600 },
    { upToWeight: 20, priceCents: 2600 },
    { upToWeight: 70, priceCents: 5500 },
  ]),
})

export interface PostageEstimate {
  billable: BillableWeight
  band: PostageRateBand | null
  /** Null when the billable weight is above the table's heaviest band. */
  priceCents: number | null
}

export function estimatePostage(weight: Weight, box: BoxDimensions, rateTable: PostageRateTable = EXAMPLE_RATE_TABLE): PostageEstimate {
  const billable = billableWeight(weight, box, rateTable.dimDivisor)
  const band = rateTable.bands.find(candidate => billable.billable <= candidate.upToWeight) ?? null
  return { billable, band, priceCents: band?.priceCents ?? null }
}
