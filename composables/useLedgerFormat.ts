// Display and input helpers of the ledger pages. They format and read what the server or shared/ledger
// computed; they never compute a business figure themselves. Money is integer cents throughout.
import { formatCents, parseMoney } from '~~/shared/ledger/money'
import { statusLabel, type ItemStatus } from '~~/shared/ledger/item-rules'
import type { StoreKind } from '~~/shared/types/ledger'

/** An amount in the team's currency (useTeamCurrency), or `empty` when there is none. */
export function ledgerMoney(cents: number | null | undefined, empty = '—', currency = ledgerCurrency()): string {
  return cents === null || cents === undefined ? empty : formatCents(cents, currency)
}

/** The short sign of a currency as amounts show it ("$", "€", "CHF"). */
export function ledgerCurrencySymbol(currency = ledgerCurrency()): string {
  const parts = new Intl.NumberFormat('en-US', { style: 'currency', currency, currencyDisplay: 'narrowSymbol' }).formatToParts(0)
  return parts.find(p => p.type === 'currency')?.value ?? currency
}

/** Cents as the plain decimal text a money input starts from ("1234" → "12.34"), without floats. */
export function ledgerCentsText(cents: number | null | undefined): string {
  if (cents === null || cents === undefined) return ''
  const magnitude = Math.abs(cents)
  return `${cents < 0 ? '-' : ''}${Math.floor(magnitude / 100)}.${String(magnitude % 100).padStart(2, '0')}`
}

export type LedgerCentsRead = { ok: true, cents: number | null } | { ok: false, error: string }

/** Reads a money input with shared/ledger parseMoney: empty is null, negative amounts are refused. */
export function ledgerReadCents(text: string | null | undefined): LedgerCentsRead {
  if (!text || !text.trim()) return { ok: true, cents: null }
  const result = parseMoney(text)
  if (!result.ok) return { ok: false, error: result.error.charAt(0).toUpperCase() + result.error.slice(1) }
  if (result.cents < 0) return { ok: false, error: 'Enter the amount without a minus sign.' }
  return { ok: true, cents: result.cents }
}

/** Basis points as percent text: 1325 → "13.25". */
export function ledgerBpText(bp: number): string {
  return `${Math.floor(bp / 100)}${bp % 100 ? `.${String(bp % 100).padStart(2, '0').replace(/0$/, '')}` : ''}`
}

/** Percent text to whole basis points, read digit by digit (no float): "12.9" → 1290, "13.25 %" → 1325. */
export function ledgerReadBp(text: string): { ok: true, bp: number } | { ok: false, error: string } {
  const trimmed = text.replace(/\s|%/g, '').replace(',', '.')
  if (trimmed === '') return { ok: true, bp: 0 }
  const match = /^(\d{1,3})(?:\.(\d{0,2}))?$/.exec(trimmed)
  if (!match) return { ok: false, error: 'Enter a percentage like 12.9 (at most two decimals).' }
  const bp = Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0'))
  if (bp > 10_000) return { ok: false, error: 'A percentage is at most 100.' }
  return { ok: true, bp }
}

/** A ratio the server computed (ROI in percent), rounded for display only. */
export function ledgerPercentText(value: number | null | undefined): string {
  if (value === null || value === undefined) return '—'
  return `${new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 }).format(value)} %`
}

/** Today's calendar day (yyyy-mm-dd) in the team's time zone, where the shelf is. */
export function ledgerDayIn(timeZone?: string | null, at = new Date()): string {
  let parts: Intl.DateTimeFormatPart[]
  try {
    parts = new Intl.DateTimeFormat('en-US', { timeZone: timeZone || undefined, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(at)
  }
  catch {
    parts = new Intl.DateTimeFormat('en-US', { year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(at)
  }
  const part = (type: string) => parts.find(p => p.type === type)?.value ?? ''
  return `${part('year')}-${part('month')}-${part('day')}`
}

/** A calendar day for reading: "2026-03-14" → "Mar 14, 2026" (the date is a day, not an instant). */
export function ledgerDateText(day: string | null | undefined, empty = '—'): string {
  if (!day) return empty
  const [y, m, d] = day.slice(0, 10).split('-').map(Number) as [number, number, number]
  if (!y || !m || !d) return day
  return new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', month: 'short', day: 'numeric', year: 'numeric' }).format(new Date(Date.UTC(y, m - 1, d)))
}

export function ledgerStatusText(status: ItemStatus): string {
  return statusLabel(status).replace(/_/g, ' ')
}

/** Colours of the status chips: open (ink), sold (moss), trouble (clay), closed without a sale (glaze). */
export const LEDGER_STATUS_CLASSES: Record<ItemStatus, string> = {
  in_stock: 'bg-paper-sunk text-ink',
  listed: 'bg-kiln-100 text-kiln-800',
  sold: 'bg-moss-100 text-moss-700',
  shipped: 'bg-moss-100 text-moss-700',
  returned: 'bg-clay-100 text-clay-700',
  donated: 'bg-glaze-100 text-glaze-700',
  written_off: 'bg-glaze-100 text-glaze-700',
  kept: 'bg-glaze-100 text-glaze-700',
}

export const LEDGER_STORE_KIND_LABELS: Record<StoreKind, string> = {
  thrift_store: 'Thrift store',
  estate_sale: 'Estate sale',
  auction: 'Auction',
  yard_sale: 'Yard sale',
  online: 'Online',
  other: 'Other',
}

export function ledgerGradeText(grade: string | null | undefined): string {
  if (!grade) return '—'
  const text = grade.replace(/_/g, ' ')
  return text.charAt(0).toUpperCase() + text.slice(1)
}

/** The `sort` parameter of the list APIs ("-soldOn") as TanStack sorting state, and back. */
export function ledgerSortState(sort: string | undefined): { id: string, desc: boolean }[] {
  if (!sort) return []
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }]
}
export function ledgerSortParam(state: { id: string, desc: boolean }[]): string | undefined {
  const first = state[0]
  return first ? `${first.desc ? '-' : ''}${first.id}` : undefined
}

/** One figure of a totals strip; tone colours gains and losses. */
export interface LedgerFigure { key: string, label: string, value: string, tone?: 'gain' | 'loss' }

export function ledgerTone(cents: number | null | undefined): 'gain' | 'loss' | undefined {
  if (cents === null || cents === undefined || cents === 0) return undefined
  return cents > 0 ? 'gain' : 'loss'
}
