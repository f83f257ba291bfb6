// Query and body rules of the reports, outcomes, buy check and buy targets, shared by the pages and the
// server so both show the same words. Money is integer cents, calendar dates yyyy-mm-dd.
import { z } from 'zod'
import { idParam, teamSlug } from './common'
import { LEDGER_LIMITS } from './ledger'

export const REPORT_DIMENSIONS = ['category', 'mark', 'maker', 'material', 'store', 'member', 'month'] as const
export type ReportDimension = typeof REPORT_DIMENSIONS[number]

export const OUTCOME_TYPES = ['mark', 'maker', 'material', 'category'] as const
export type OutcomeType = typeof OUTCOME_TYPES[number]

/** The longest month report: twenty years of rows. */
export const REPORT_MAX_MONTHS = 240

const queryId = idParam.optional()
const queryDate = (what: string) => z.iso.date({ message: `${what} is a date like 2026-03-14.` }).optional()
const condition = z.string().trim().toLowerCase().max(LEDGER_LIMITS.conditionGrade, `condition is at most ${LEDGER_LIMITS.conditionGrade} characters.`)
  .regex(/^[a-z0-9_]+$/, 'condition is a grade of the team\'s scale, like very_good.')

function fromBeforeTo<T extends { from?: string, to?: string }>(value: T, ctx: z.RefinementCtx) {
  if (value.from && value.to && value.from > value.to) {
    ctx.addIssue({ code: 'custom', path: ['to'], message: `The period ends (${value.to}) before it starts (${value.from}).` })
  }
}

/** Filters every report, outcome and sourcing-sheet query understands. */
export const reportFilterFields = {
  from: queryDate('from'),
  to: queryDate('to'),
  // Items in this category or any of its subcategories.
  categoryId: queryId,
  storeId: queryId,
  // Sourced by this member.
  memberId: queryId,
  // The fee profile (sales channel) of the item.
  channel: queryId,
  condition: condition.optional(),
}

export const reportQuery = z.object({
  ...reportFilterFields,
  // Category report only: the rows are this category's children (each with its own subcategories rolled up).
  parentId: queryId,
  format: z.enum(['json', 'csv'], { message: 'format is json or csv.' }).default('json'),
}).superRefine(fromBeforeTo)

export const reportParams = z.object({
  team: teamSlug,
  // "category" or "category.csv": the suffix asks for the CSV of the same rows.
  dimension: z.string().transform((raw, ctx) => {
    const csv = raw.endsWith('.csv')
    const name = csv ? raw.slice(0, -4) : raw
    if (!(REPORT_DIMENSIONS as readonly string[]).includes(name)) {
      ctx.addIssue({ code: 'custom', message: `The report is one of: ${REPORT_DIMENSIONS.join(', ')}.` })
      return z.NEVER
    }
    return { dimension: name as ReportDimension, csv }
  }),
})

export const outcomesQuery = z.object({
  type: z.enum(OUTCOME_TYPES, { message: `type is one of: ${OUTCOME_TYPES.join(', ')}.` }),
  id: idParam,
  from: queryDate('from'),
  to: queryDate('to'),
}).superRefine(fromBeforeTo)

export const sourcingSheetQuery = z.object(reportFilterFields).superRefine(fromBeforeTo)

const cents = (what: string) => z.coerce.number({ message: `${what} is an amount in cents (a whole number).` })
  .int(`${what} is a whole number of cents.`).min(0, `${what} cannot be negative.`).max(LEDGER_LIMITS.maxCents, `${what} is too large.`)

export const buyCheckQuery = z.object({
  markId: queryId,
  makerId: queryId,
  categoryId: queryId,
  // The tag price of one piece; a set's cost is the piece price times the count. Without it the answer still
  // gives the expected sale and the most to pay.
  priceCents: cents('priceCents').optional(),
  quantity: z.coerce.number({ message: 'quantity is a whole number of pieces.' }).int('quantity is a whole number of pieces.')
    .min(1, 'quantity is at least 1.').max(LEDGER_LIMITS.quantity, `quantity is at most ${LEDGER_LIMITS.quantity}.`).default(1),
  condition: condition.optional(),
})

export const BUY_TARGET_LIMITS = { maxProfitCents: 1_000_000_00, maxRoiPercent: 10_000, maxDays: 3_650 } as const

export const buyTargetsPatchSchema = z.object({
  // 0 until the targets were first saved.
  revision: z.number({ message: 'Send the revision your edit is based on (0 before the first save).' }).int().min(0),
  minProfitCents: z.number({ message: 'The minimum profit is in cents (a whole number).' }).int('The minimum profit is a whole number of cents.')
    .min(0, 'The minimum profit cannot be negative.').max(BUY_TARGET_LIMITS.maxProfitCents, 'The minimum profit is too large.'),
  // Read to the hundredth of a percent (stored as basis points).
  minRoiPercent: z.number({ message: 'The minimum ROI is a percentage.' }).min(0, 'The minimum ROI cannot be negative.')
    .max(BUY_TARGET_LIMITS.maxRoiPercent, `The minimum ROI is at most ${BUY_TARGET_LIMITS.maxRoiPercent} %.`)
    .refine(v => Math.abs(v * 100 - Math.round(v * 100)) < 1e-9, 'The minimum ROI is read to the hundredth of a percent.'),
  maxDaysToSell: z.number({ message: 'The longest time to sell is a whole number of days.' }).int('The longest time to sell is a whole number of days.')
    .min(1, 'The longest time to sell is at least 1 day.').max(BUY_TARGET_LIMITS.maxDays, `The longest time to sell is at most ${BUY_TARGET_LIMITS.maxDays} days.`),
}).partial().required({ revision: true })

export type ReportQueryInput = z.input<typeof reportQuery>
export type ReportFilters = z.infer<typeof sourcingSheetQuery>
export type BuyCheckQueryInput = z.input<typeof buyCheckQuery>
export type BuyTargetsPatchInput = z.input<typeof buyTargetsPatchSchema>
