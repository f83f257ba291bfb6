// How the report screens word their figures: money through the ledger's formatCents (in the team's currency), ratios to one decimal,
// and "—" where a figure does not exist (no sales, nothing available), never a made-up 0.
import { displayCurrencyCode, formatCents } from '../ledger/money'

export const REPORT_EMPTY = '—'

/** In the team's currency (formatCents' display currency) unless one is given. */
export function reportMoney(cents: number | null | undefined, currency?: string): string {
  return cents === null || cents === undefined ? REPORT_EMPTY : formatCents(cents, currency)
}

/** Whole units of the currency (rounded for display only) for chart axes and tight cells. */
export function reportMoneyShort(cents: number | null | undefined, currency?: string): string {
  if (cents === null || cents === undefined) return REPORT_EMPTY
  const whole = Math.round(Math.abs(cents) / 100)
  const text = new Intl.NumberFormat('en-US', { style: 'currency', currency: currency ?? displayCurrencyCode(), maximumFractionDigits: 0, minimumFractionDigits: 0 }).format(whole)
  return `${cents < 0 && whole !== 0 ? '−' : ''}${text}`
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
