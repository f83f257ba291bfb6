// Reading spreadsheet cells for the item import: the common written date forms and money as plain decimals.
// Expected dates are calendar facts (hand computation); money goes through parseMoney (shared/ledger/money.ts).
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { centsToDecimalText, parseCsvDate } from '#shared/ledger/import-values'
import { parseMoney } from '#shared/ledger/money'

describe('dates in a spreadsheet', () => {
  it.each([
    ['2024-03-05', 'mdy', '2024-03-05'],
    ['2024/3/5', 'mdy', '2024-03-05'],
    ['03/05/2024', 'mdy', '2024-03-05'],
    ['03/05/2024', 'dmy', '2024-05-03'],
    ['5.3.2024', 'dmy', '2024-03-05'],
    ['3-5-24', 'mdy', '2024-03-05'],
    ['5 Mar 2024', 'mdy', '2024-03-05'],
    ['5 March 2024', 'dmy', '2024-03-05'],
    ['Mar 5, 2024', 'mdy', '2024-03-05'],
    ['March 5th 2024', 'mdy', '2024-03-05'],
    ['29 Feb 2024', 'mdy', '2024-02-29'],
    ['2024-03-05T23:30:00Z', 'mdy', '2024-03-05'],
    ['2024-03-05T23:30:00-02:00', 'mdy', '2024-03-06'],
  ] as const)('reads %j (%s) as %s', (text, order, iso) => {
    expect(parseCsvDate(text, order)).toEqual({ ok: true, date: iso })
  })

  it.each([
    ['2023-02-29', 'not a real date'], ['13/05/2024', 'no month 13'], ['31 Apr 2024', 'not a real date'],
    ['5 Mrz 2024', 'not a month'], ['yesterday', 'not a date we can read'], ['', 'Enter a date'], ['1850-01-01', 'outside'],
  ])('refuses %j with a message (%s)', (text, message) => {
    const result = parseCsvDate(text, 'mdy')
    expect(result.ok).toBe(false)
    if (!result.ok) expect(result.error).toContain(message)
  })

  it('reads month-first and day-first orders as mirror images', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }), (month, day) => {
      const mdy = parseCsvDate(`${month}/${day}/2025`, 'mdy')
      const dmy = parseCsvDate(`${day}/${month}/2025`, 'dmy')
      expect(mdy).toEqual(dmy)
      expect(mdy).toEqual({ ok: true, date: `2025-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}` })
    }))
  })
})

describe('money in a spreadsheet', () => {
  it('writes cents as plain decimals', () => {
    expect(centsToDecimalText(123450)).toBe('1234.50')
    expect(centsToDecimalText(5)).toBe('0.05')
    expect(centsToDecimalText(-300)).toBe('-3.00')
    expect(() => centsToDecimalText(1.5)).toThrow(RangeError)
  })

  it('reads back every amount it writes (parseMoney round trip)', () => {
    fc.assert(fc.property(fc.integer({ min: -1e12, max: 1e12 }), (cents) => {
      expect(parseMoney(centsToDecimalText(cents))).toEqual({ ok: true, cents })
    }))
  })
})
