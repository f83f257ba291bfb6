// Ledger input rules (stores, sourcing trips, items, fee profiles, the calculator and imports), shared by the
// forms and the server so both show the same words. Money is integer cents, calendar dates yyyy-mm-dd.
import { z } from 'zod'
import { idParam, teamSlug } from './common'
import { DAMAGE_FLAGS, ITEM_STATUSES, STORE_KINDS } from '../ledger/item-rules'
import { LEDGER_CURRENCIES } from '../ledger/currencies'

export { DAMAGE_FLAGS, ITEM_STATUSES, STORE_KINDS }

export const LEDGER_LIMITS = {
  name: 120,
  title: 200,
  town: 120,
  notes: 10_000,
  damageNotes: 2_000,
  maxCents: 100_000_000_00, // one hundred million: far beyond any one piece, well inside the exact range
  quantity: 10_000,
  maxGrams: 1_000_000,
  maxSide: 100_000,
  maxMiles: 100_000,
  members: 20,
  pageSize: 100,
  conditionScale: 12,
  conditionGrade: 40,
  externalId: 120,
} as const

const L = LEDGER_LIMITS

const entityId = z.number({ message: 'Expected an id (a number).' }).int().positive().max(Number.MAX_SAFE_INTEGER)
const cents = (what: string) => z.number({ message: `${what} is an amount in cents (a whole number).` })
  .int(`${what} is a whole number of cents.`).min(0, `${what} cannot be negative.`).max(L.maxCents, `${what} is too large.`)
const isoDate = (what: string) => z.iso.date({ message: `${what} is a date like 2026-03-14.` })
const text = (what: string, max: number) => z.string().trim().max(max, `${what} is at most ${max.toLocaleString('en')} characters.`)
const revision = z.number({ message: 'Send the revision your edit is based on.' }).int().positive()
const basisPoints = (what: string) => z.number({ message: `${what} is in basis points (1290 = 12.9 %).` })
  .int(`${what} is a whole number of basis points.`).min(0, `${what} cannot be negative.`).max(10_000, `${what} is at most 10000 (100 %).`)

// ---- Lists
const page = z.coerce.number().int('page must be a whole number.').min(1, 'page starts at 1.').max(1_000_000).default(1)
const pageSize = z.coerce.number().int('pageSize must be a whole number.').min(1, 'pageSize is at least 1.')
  .max(L.pageSize, `pageSize is at most ${L.pageSize}.`).default(25)
const queryText = z.string().trim().max(200, 'The search text is at most 200 characters.').optional()
const queryId = idParam.optional()
const queryDate = (what: string) => z.iso.date({ message: `${what} is a date like 2026-03-14.` }).optional()

function sortParam<const F extends readonly string[]>(fields: F) {
  const allowed = [...fields, ...fields.map(f => `-${f}`)] as unknown as [F[number] | `-${F[number]}`, ...(F[number] | `-${F[number]}`)[]]
  return z.enum(allowed, { message: `sort must be one of: ${fields.join(', ')} (prefix - for descending).` }).optional()
}

// ---- Settings
export const ledgerSettingsPatchSchema = z.object({
  mileageRateCents: z.number({ message: 'The mileage rate is in cents per mile.' }).int().min(0).max(10_000),
  conditionScale: z.array(z.string().trim().toLowerCase().min(1).max(L.conditionGrade).regex(/^[a-z0-9_]+$/, 'Condition grades are short words: letters, digits and _.'))
    .min(2, 'A condition scale needs at least two grades.').max(L.conditionScale, `At most ${L.conditionScale} grades.`)
    .refine(list => new Set(list).size === list.length, 'Each grade can appear once.'),
  currency: z.string().trim().toUpperCase().pipe(z.enum(LEDGER_CURRENCIES, { message: `The currency is one of: ${LEDGER_CURRENCIES.join(', ')} (ISO 4217 codes of currencies with cents).` })),
}).partial()

// ---- Stores
const storeFields = {
  name: z.string().trim().min(1, 'Enter the store\'s name.').max(L.name, `A name is at most ${L.name} characters.`),
  kind: z.enum(STORE_KINDS, { message: `kind must be one of: ${STORE_KINDS.join(', ')}.` }),
  town: text('Town', L.town),
  notes: text('Notes', L.notes),
}
export const storeCreateSchema = z.object(storeFields).partial().required({ name: true })
export const storePatchSchema = z.object(storeFields).partial().extend({ revision })
export const STORE_SORTS = ['name', 'kind', 'town', 'createdAt'] as const
export const storeListQuery = z.object({
  page, pageSize, q: queryText, sort: sortParam(STORE_SORTS),
  kind: z.enum(STORE_KINDS, { message: `kind must be one of: ${STORE_KINDS.join(', ')}.` }).optional(),
})

// ---- Sourcing trips
const tripFields = {
  storeId: entityId,
  tripDate: isoDate('tripDate'),
  memberIds: z.array(entityId).max(L.members, `At most ${L.members} members on one trip.`).transform(ids => [...new Set(ids)].sort((a, b) => a - b)),
  bagsCents: cents('bagsCents'),
  parkingCents: cents('parkingCents'),
  fuelCents: cents('fuelCents'),
  // Miles driven, to a tenth of a mile; costed at the team's rate per mile.
  miles: z.number({ message: 'miles is a number.' }).min(0, 'miles cannot be negative.').max(L.maxMiles)
    .refine(v => Math.abs(v * 10 - Math.round(v * 10)) < 1e-9, 'miles is read to a tenth of a mile.'),
  notes: text('Notes', L.notes),
}
export const tripCreateSchema = z.object(tripFields).partial().required({ storeId: true, tripDate: true })
export const tripPatchSchema = z.object(tripFields).partial().extend({ revision })
export const TRIP_SORTS = ['tripDate', 'createdAt'] as const
export const tripListQuery = z.object({
  page, pageSize, sort: sortParam(TRIP_SORTS), q: queryText,
  storeId: queryId, memberId: queryId, from: queryDate('from'), to: queryDate('to'),
})

// ---- Fee profiles (one per channel and deal; exactly one is the team's default)
const feeProfileFields = {
  name: z.string().trim().min(1, 'Name the fee profile.').max(L.name, `A name is at most ${L.name} characters.`),
  channel: text('Channel', L.name),
  percentBp: basisPoints('percentBp'),
  fixedCents: cents('fixedCents'),
  paymentPercentBp: basisPoints('paymentPercentBp'),
  paymentFixedCents: cents('paymentFixedCents'),
  isDefault: z.boolean(),
}
export const feeProfileCreateSchema = z.object(feeProfileFields).partial().required({ name: true })
export const feeProfilePatchSchema = z.object(feeProfileFields).partial().extend({ revision })
export const feeProfileListQuery = z.object({ page, pageSize, q: queryText })

// ---- Items
const box = z.object({
  length: z.number().positive('Box sides must be positive.').max(L.maxSide),
  width: z.number().positive('Box sides must be positive.').max(L.maxSide),
  height: z.number().positive('Box sides must be positive.').max(L.maxSide),
  unit: z.enum(['cm', 'in', 'mm'], { message: 'The box unit is cm, in or mm.' }),
})
const damage = z.object({
  flags: z.array(z.enum(DAMAGE_FLAGS, { message: `Damage flags are: ${DAMAGE_FLAGS.join(', ')}.` })).max(DAMAGE_FLAGS.length)
    .transform(list => [...new Set(list)]).default([]),
  notes: text('Damage notes', L.damageNotes).default(''),
})
const optionalRef = entityId.nullable()
const itemFields = {
  title: z.string().trim().min(1, 'Give the item a title.').max(L.title, `A title is at most ${L.title} characters.`),
  categoryId: optionalRef,
  markId: optionalRef,
  makerId: optionalRef,
  materialId: optionalRef,
  quantity: z.number().int('quantity is a whole number of pieces.').min(1, 'A lot or set counts at least 1 piece.').max(L.quantity),
  condition: z.string().trim().toLowerCase().max(L.conditionGrade).nullable(),
  damage,
  weightGrams: z.number().int('weightGrams is whole grams.').min(0).max(L.maxGrams).nullable(),
  box: box.nullable(),
  tripId: optionalRef,
  storeId: optionalRef,
  acquiredOn: isoDate('acquiredOn').nullable(),
  costCents: cents('costCents'),
  sourcedBy: optionalRef,
  listedBy: optionalRef,
  listedOn: isoDate('listedOn').nullable(),
  askingCents: cents('askingCents').nullable(),
  feeProfileId: optionalRef,
  soldOn: isoDate('soldOn').nullable(),
  shippedOn: isoDate('shippedOn').nullable(),
  salePriceCents: cents('salePriceCents').nullable(),
  shippingChargedCents: cents('shippingChargedCents').nullable(),
  postageCents: cents('postageCents').nullable(),
  suppliesCents: cents('suppliesCents').nullable(),
  // Given: entered by hand (feesManual). Left out on a sale: computed from the fee profile.
  feesCents: cents('feesCents').nullable(),
  refundCents: cents('refundCents').nullable(),
  externalId: text('externalId', L.externalId).nullable(),
  notes: text('Notes', L.notes),
}
export const itemCreateSchema = z.object({
  ...itemFields,
  // Created directly in any status with its dates and figures, as an import would.
  status: z.enum(ITEM_STATUSES, { message: `status must be one of: ${ITEM_STATUSES.join(', ')}.` }),
}).partial().required({ title: true })
// Status changes go through POST .../status (recorded as events), so a PATCH cannot change the status.
// feesManual: false hands hand-entered fees back to the fee profile.
export const itemPatchSchema = z.object({ ...itemFields, feesManual: z.boolean() }).partial().extend({ revision })

export const ITEM_SORTS = ['acquiredOn', 'soldOn', 'listedOn', 'title', 'costCents', 'salePriceCents', 'netProfitCents', 'createdAt', 'id'] as const
const statusList = z.string().max(200).optional().transform((raw, ctx) => {
  if (!raw) return undefined
  const parts = raw.split(',').map(p => p.trim()).filter(Boolean)
  for (const part of parts) {
    if (!(ITEM_STATUSES as readonly string[]).includes(part)) {
      ctx.addIssue({ code: 'custom', message: `status is a comma-separated list of: ${ITEM_STATUSES.join(', ')}.` })
      return z.NEVER
    }
  }
  return parts as (typeof ITEM_STATUSES[number])[]
})
/** A yes/no query parameter: 1 or true, 0 or false; left out, no. */
const flag = z.enum(['1', '0', 'true', 'false'], { message: 'Use 1 or 0.' }).optional().transform(v => v === '1' || v === 'true')
export const itemFilterQuery = z.object({
  status: statusList,
  categoryId: queryId,
  // With categoryId: the items filed in its subcategories too, as the category's own figures count them.
  subcategories: flag,
  markId: queryId,
  makerId: queryId,
  materialId: queryId,
  storeId: queryId,
  tripId: queryId,
  sourcedBy: queryId,
  acquiredFrom: queryDate('acquiredFrom'),
  acquiredTo: queryDate('acquiredTo'),
  soldFrom: queryDate('soldFrom'),
  soldTo: queryDate('soldTo'),
  q: queryText,
})
export const itemListQuery = itemFilterQuery.extend({ page, pageSize, sort: sortParam(ITEM_SORTS) })

export const itemStatusSchema = z.object({
  to: z.enum(ITEM_STATUSES, { message: `to must be one of: ${ITEM_STATUSES.join(', ')}.` }),
  // The day it happened; today (UTC) when left out.
  on: isoDate('on').optional(),
  askingCents: cents('askingCents').optional(),
  feeProfileId: entityId.optional(),
  refundCents: cents('refundCents').optional(),
  revision: revision.optional(),
})

export const itemSaleSchema = z.object({
  soldOn: isoDate('soldOn').optional(),
  salePriceCents: cents('salePriceCents'),
  shippingChargedCents: cents('shippingChargedCents').default(0),
  postageCents: cents('postageCents').default(0),
  suppliesCents: cents('suppliesCents').default(0),
  // The channel; the item's own, else the team's default, when left out.
  feeProfileId: entityId.optional(),
  // Given: the fees as the channel charged them (kept as entered). Left out: computed from the fee profile.
  feesCents: cents('feesCents').optional(),
  revision: revision.optional(),
  // A timeline note on the item's mark and category, prefilled with the outcome unless a body is given.
  note: z.object({
    onMark: z.boolean().default(true),
    onCategory: z.boolean().default(true),
    body: z.string().trim().min(1).max(50_000).optional(),
  }).optional(),
})

// ---- Calculator
const weightInput = z.object({ value: z.number().min(0).max(L.maxGrams), unit: z.enum(['g', 'kg', 'oz', 'lb']) })
export const calculatorSchema = z.object({
  expectedSaleCents: cents('expectedSaleCents'),
  shippingChargedCents: cents('shippingChargedCents').default(0),
  feeProfileId: entityId.optional(),
  postageCents: cents('postageCents').optional(),
  // Without postageCents: estimated from the weight and box (invented example rates, see shared/ledger/postage.ts).
  weight: weightInput.optional(),
  box: box.optional(),
  suppliesCents: cents('suppliesCents').default(0),
  costCents: cents('costCents').optional(),
  atPriceCents: cents('atPriceCents').optional(),
  targetProfitCents: z.number().int().min(-L.maxCents).max(L.maxCents).optional(),
  targetRoiPercent: z.number().gt(-100, 'targetRoiPercent must be above −100.').max(100_000).optional(),
})

// ---- Imports
export const IMPORT_FIELDS = [
  'externalId', 'title', 'status', 'quantity', 'condition', 'damageFlags', 'damageNotes', 'weightGrams',
  'boxLengthMm', 'boxWidthMm', 'boxHeightMm', 'categoryId', 'category', 'markId', 'mark', 'makerId', 'maker',
  'materialId', 'material', 'tripId', 'store', 'acquiredOn', 'currency', 'cost', 'listedOn', 'asking', 'channel', 'soldOn',
  'shippedOn', 'salePrice', 'shippingCharged', 'postage', 'supplies', 'fees', 'refund', 'notes',
] as const
export type ImportField = typeof IMPORT_FIELDS[number]

export const importMappingSchema = z.record(
  z.string().max(200),
  z.union([z.enum(IMPORT_FIELDS, { message: `Map each column to one of: ${IMPORT_FIELDS.join(', ')} (or "" to skip it).` }), z.literal('')]),
).refine((mapping) => {
  const used = Object.values(mapping).filter(Boolean)
  return new Set(used).size === used.length
}, 'Map each field from one column only.')

export const importQuery = z.object({
  dryRun: flag,
  onlyValid: flag,
  dateOrder: z.enum(['mdy', 'dmy'], { message: 'dateOrder is mdy (03/05/2024 = 5 March) or dmy (05/03/2024 = 5 March).' }).default('mdy'),
  decimalSeparator: z.enum(['.', ',']).optional(),
})

export const ledgerIdParams = z.object({ team: teamSlug, id: idParam })
