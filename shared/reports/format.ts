// How the report screens word their figures: money through the ledger's formatCents, ratios to one decimal,
// and "—" where a figure does not exist (no sales, nothing available), never a made-up 0.
import { formatCents } from '../ledger/money'

export const REPORT_EMPTY = '—'

export function reportMoney(cents: number | null | undefined): string {
  return cents === null || cents === undefined ? REPORT_EMPTY : formatCents(cents, 'USD')
}

/** Whole dollars for chart axes and tight cells. */
export function reportMoneyShort(cents: number | null | undefined): string {
  if (cents === null || cents === undefined) return REPORT_EMPTY
  const dollars = Math.round(cents / 100)
  return `${dollars < 0 ? '−' : ''}$${Math.abs(dollars).toLocaleString('en-US')}`
}

export function reportPercent(value: number | null | undefined): string {
  return value === null || value === undefined ? REPORT_EMPTY : `${(Math.round(value * 10) / 10).toLocaleString('en-US')} %`
}

export function reportDays(value: number | null | undefined): string {
  return value === null || value === undefined ? REPORT_EMPTY : `${value.toLocaleString('en-US')} d`
}

export function reportCount(value: number): string {
  return value.toLocaleString('en-US')
}

/** "Q1 $8.00 – Q3 $14.50", the middle half of the prices. */
export function reportSpread(q1: number | null, q3: number | null): string {
  return q1 === null || q3 === null ? '' : `${reportMoney(q1)}–${reportMoney(q3)}`
}

/** "12 of 30" behind a sell-through, so the reader sees what the percentage rests on. */
export function reportBase(sold: number, available: number): string {
  return `${reportCount(sold)} of ${reportCount(available)}`
}
