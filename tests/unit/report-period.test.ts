// The reports page's default period: the 365 calendar days (UTC) up to and including today.
import { describe, expect, it } from 'vitest'
import { reportDayBefore, reportDefaultPeriod } from '../../shared/reports/period'

describe('report default period', () => {
  it('covers the 365 UTC days up to today, across a leap day', () => {
    // 1 March 2028, late in the day UTC: 2028 has 29 February, so 364 days back is 3 March 2027.
    const now = Date.parse('2028-03-01T23:30:00Z')
    expect(reportDefaultPeriod(now)).toEqual({ from: '2027-03-03', to: '2028-03-01' })
    const days = (Date.parse('2028-03-01T00:00:00Z') - Date.parse('2027-03-03T00:00:00Z')) / 86_400_000 + 1
    expect(days).toBe(365)
  })

  it('counts back whole UTC days', () => {
    const now = Date.parse('2026-01-01T00:05:00Z')
    expect(reportDayBefore(0, now)).toBe('2026-01-01')
    expect(reportDayBefore(1, now)).toBe('2025-12-31')
    expect(reportDayBefore(29, now)).toBe('2025-12-03')
  })
})
