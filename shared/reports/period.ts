// The reports' calendar days: UTC, as the ledger stores them (shared/ledger/item-rules.ts).
const DAY_MS = 86_400_000

/** yyyy-mm-dd of the day `days` before the UTC day of `now`. */
export function reportDayBefore(days: number, now = Date.now()): string {
  return new Date(now - days * DAY_MS).toISOString().slice(0, 10)
}

/**
 * The period the reports page shows when the address names none: the last 12 months, as the 365 days up to
 * and including today. All time stays one click away (and is named in the address as period=all).
 */
export function reportDefaultPeriod(now = Date.now()): { from: string, to: string } {
  return { from: reportDayBefore(364, now), to: reportDayBefore(0, now) }
}
