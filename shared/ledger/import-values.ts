// Reading and writing the cells of an item spreadsheet: calendar dates in the common written forms, and
// money through parseMoney. Pure: the import route, the export and the tests share it.

export type DateOrder = 'mdy' | 'dmy'

export type ParseDateResult = { ok: true, date: string } | { ok: false, error: string }

const MONTHS: Record<string, number> = {
  jan: 1, feb: 2, mar: 3, apr: 4, may: 5, jun: 6, jul: 7, aug: 8, sep: 9, sept: 9, oct: 10, nov: 11, dec: 12,
}

function monthOf(word: string): number | undefined {
  const w = word.toLowerCase().replace(/\.$/, '')
  return MONTHS[w] ?? MONTHS[w.slice(0, 3)] ?? undefined
}

function isoOf(year: number, month: number, day: number, text: string): ParseDateResult {
  if (year < 1900 || year > 2100) return { ok: false, error: `"${text}": the year ${year} is outside 1900–2100` }
  if (month < 1 || month > 12) return { ok: false, error: `"${text}" has no month ${month}` }
  const time = Date.UTC(year, month - 1, day)
  const iso = new Date(time).toISOString().slice(0, 10)
  const wanted = `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`
  // Date.UTC rolls 2023-02-30 over into March: a real date survives the round trip.
  if (day < 1 || iso !== wanted) return { ok: false, error: `"${text}" is not a real date` }
  return { ok: true, date: iso }
}

/**
 * A calendar date as yyyy-mm-dd from "2024-03-05", "2024/3/5", "03/05/2024" or "3-5-24" (read in the declared
 * `order`: month first or day first), "5 Mar 2024", "5 March 2024", "Mar 5, 2024" and "March 5 2024".
 * Two-digit years are 2000–2099. A spreadsheet timestamp "2024-03-05T10:00:00Z" gives its UTC date.
 */
export function parseCsvDate(text: string, order: DateOrder = 'mdy'): ParseDateResult {
  const value = text.trim()
  if (!value) return { ok: false, error: 'Enter a date, for example 2024-03-05' }
  let m = /^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})(?:[T ]\d{1,2}:\d{2}(?::\d{2}(?:\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(value)
  if (m) {
    if (m[4] !== undefined) {
      const time = Date.parse(value.replace(' ', 'T'))
      if (Number.isNaN(time)) return { ok: false, error: `"${text}" is not a real date` }
      return { ok: true, date: new Date(time).toISOString().slice(0, 10) }
    }
    return isoOf(Number(m[1]), Number(m[2]), Number(m[3]), text)
  }
  m = /^(\d{1,2})[-/.](\d{1,2})[-/.](\d{2}|\d{4})$/.exec(value)
  if (m) {
    const year = m[3]!.length === 2 ? 2000 + Number(m[3]) : Number(m[3])
    const [month, day] = order === 'mdy' ? [Number(m[1]), Number(m[2])] : [Number(m[2]), Number(m[1])]
    return isoOf(year, month, day, text)
  }
  m = /^(\d{1,2})(?:st|nd|rd|th)?[\s-]+([A-Za-z]{3,9}\.?),?[\s-]+(\d{4})$/.exec(value)
  if (m) {
    const month = monthOf(m[2]!)
    if (!month) return { ok: false, error: `"${text}": "${m[2]}" is not a month` }
    return isoOf(Number(m[3]), month, Number(m[1]), text)
  }
  m = /^([A-Za-z]{3,9}\.?)\s+(\d{1,2})(?:st|nd|rd|th)?,?\s+(\d{4})$/.exec(value)
  if (m) {
    const month = monthOf(m[1]!)
    if (!month) return { ok: false, error: `"${text}": "${m[1]}" is not a month` }
    return isoOf(Number(m[3]), month, Number(m[2]), text)
  }
  return { ok: false, error: `"${text}" is not a date we can read: use 2024-03-05, ${order === 'mdy' ? '03/05/2024 (month first)' : '05/03/2024 (day first)'} or 5 Mar 2024` }
}

/** Cents as a plain decimal for files ("1234.50", "-3.00"): exact digits, no float division, no grouping. */
export function centsToDecimalText(cents: number): string {
  if (!Number.isSafeInteger(cents)) throw new RangeError(`cents must be a whole number, got ${cents}`)
  const magnitude = Math.abs(cents)
  return `${cents < 0 ? '-' : ''}${Math.floor(magnitude / 100)}.${String(magnitude % 100).padStart(2, '0')}`
}
