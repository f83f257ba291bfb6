// Money helpers. Every amount is an integer number of cents (minor units of a two-decimal currency);
// JavaScript numbers are exact for integers up to 2^53, so sums of cents never drift the way
// sums of dollars as floats do ((1.005).toFixed(2) gives "1.00").
//
// Rounding rule, used everywhere in the ledger: a rational amount is rounded to the nearest cent,
// ties away from zero (commercial "half-up" on the magnitude: 2.5 → 3, −2.5 → −3, so a refund mirrors
// its sale). The division is done in BigInt so no product ever passes through a float.
// Percentages are integer basis points: 1 bp = 0.01 %, 100 % = 10,000 bp.

export const BASIS_POINTS_PER_WHOLE = 10_000

/** Throws unless `value` is a safe integer number of cents (non-negative unless allowed). */
export function assertCents(name: string, value: number, options: { allowNegative?: boolean } = {}): void {
  if (!Number.isSafeInteger(value)) throw new RangeError(`${name} must be a whole number of cents, got ${value}`)
  if (!options.allowNegative && value < 0) throw new RangeError(`${name} must not be negative, got ${value}`)
}

function toSafeNumber(value: bigint): number {
  if (value > BigInt(Number.MAX_SAFE_INTEGER) || value < BigInt(Number.MIN_SAFE_INTEGER)) {
    throw new RangeError(`amount ${value} is beyond the exact integer range`)
  }
  return Number(value)
}

/** numerator / denominator rounded to the nearest integer, ties away from zero. Arguments must be integers. */
export function roundHalfUp(numerator: number | bigint, denominator: number | bigint): number {
  const n = BigInt(numerator)
  const d = BigInt(denominator)
  if (d === 0n) throw new RangeError('roundHalfUp: denominator is zero')
  const negative = (n < 0n) !== (d < 0n)
  const absN = n < 0n ? -n : n
  const absD = d < 0n ? -d : d
  // floor((2|n| + |d|) / 2|d|) is |n|/|d| rounded with ties going up.
  const magnitude = (2n * absN + absD) / (2n * absD)
  return toSafeNumber(negative ? -magnitude : magnitude)
}

/** `basisPoints` of `cents`, rounded to the cent by the ledger rule. 1290 bp = 12.9 %. */
export function percentOf(cents: number, basisPoints: number): number {
  assertCents('cents', cents, { allowNegative: true })
  if (!Number.isSafeInteger(basisPoints)) throw new RangeError(`basis points must be an integer, got ${basisPoints}`)
  return roundHalfUp(BigInt(cents) * BigInt(basisPoints), BASIS_POINTS_PER_WHOLE)
}

/** Exact sum; throws if any value is not whole cents or the total leaves the exact range. */
export function sumCents(values: Iterable<number>): number {
  let total = 0
  for (const value of values) {
    assertCents('each amount', value, { allowNegative: true })
    total += value
    if (!Number.isSafeInteger(total)) throw new RangeError('sum is beyond the exact integer range')
  }
  return total
}

let displayCurrency: () => string = () => 'USD'

/**
 * Where formatCents takes the currency from when none is passed: the app points it at the team on screen
 * (composables/useLedgerFormat.ts, read per render so server renders of different teams never mix).
 * Server code passes the team's currency explicitly.
 */
export function setDisplayCurrencySource(source: () => string): void {
  displayCurrency = source
}

/** The currency amounts are shown in when the caller names none. */
export function displayCurrencyCode(): string {
  return displayCurrency()
}

/**
 * Display only: Intl formats, it does not compute. The amount is handed over as an exact decimal string,
 * never as cents / 100 in a float. Throws for currencies whose minor unit is not two decimals (e.g. JPY),
 * because the ledger's cents would then be misread.
 */
export function formatCents(cents: number, currency: string = displayCurrency(), locale = 'en-US'): string {
  assertCents('cents', cents, { allowNegative: true })
  const formatter = new Intl.NumberFormat(locale, { style: 'currency', currency })
  if (formatter.resolvedOptions().maximumFractionDigits !== 2) {
    throw new RangeError(`${currency} does not use two decimal places; the ledger stores hundredths`)
  }
  const magnitude = Math.abs(cents)
  const decimalText = `${cents < 0 ? '-' : ''}${Math.floor(magnitude / 100)}.${String(magnitude % 100).padStart(2, '0')}`
  return formatter.format(decimalText as `${number}`)
}

export type ParseMoneyResult = { ok: true, cents: number } | { ok: false, error: string }

export interface ParseMoneyOptions {
  /** Set when the team's locale is known; otherwise the separator is inferred (see parseMoney). */
  decimalSeparator?: '.' | ','
}

// A currency marker at either end: symbols ("$", "€", "R$") or a short code or word ("USD", "CHF", "kr").
const LEADING_NOISE = /^(?:\s+|\p{Sc}+|\p{L}{1,3}(?!\p{L})|[-−+])/u
const TRAILING_NOISE = /(?:\s+|\p{Sc}+|(?<!\p{L})\p{L}{1,3}|[-−])$/u
const SIGNS = new Set(['-', '−', '+'])

function inferDecimalSeparator(core: string): '.' | ',' | null {
  const last = Math.max(core.lastIndexOf('.'), core.lastIndexOf(','))
  if (last < 0) return null
  const separator = core[last] as '.' | ','
  const other = separator === '.' ? ',' : '.'
  // Both kinds present ("1,234.56", "1.234,56"): the later one separates the cents.
  if (core.includes(other)) return separator
  // Repeated ("1.234.567") means grouping.
  if (core.indexOf(separator) !== last) return null
  // A lone separator before exactly three digits is read as grouping ("1,234" = 1234.00), because
  // money has at most two decimals. Pass `decimalSeparator` to read "12.500" the other way.
  return core.length - last - 1 === 3 ? null : separator
}

function parseWholeUnits(integerPart: string, text: string): bigint | string {
  if (integerPart === '') return 0n
  if (/^\d+$/.test(integerPart)) return BigInt(integerPart)
  const separators = new Set(integerPart.replace(/\d/g, ''))
  if (separators.size !== 1) return `mixed digit-group separators in "${text}"`
  const g = [...separators][0]!.replace(/[.]/, '\\.')
  const inThrees = new RegExp(`^[1-9]\\d{0,2}(?:${g}\\d{3})+$`)
  const indianStyle = new RegExp(`^[1-9]\\d?(?:${g}\\d{2})*${g}\\d{3}$`) // 12,34,567
  if (!inThrees.test(integerPart) && !indianStyle.test(integerPart)) return `the digit groups in "${text}" are not in threes`
  return BigInt(integerPart.replace(/\D/g, ''))
}

/**
 * Reads an amount typed by a person into cents: "12.50", "$12.50", "12,50", "1,234.56", "1.234,56",
 * "1 234,56 €", "CHF 1'234.50", "-$3", "(3.00)", "12". Also reads everything formatCents produces.
 * Rejects more than two decimals rather than rounding silently.
 */
export function parseMoney(text: string, options: ParseMoneyOptions = {}): ParseMoneyResult {
  const fail = (error: string): ParseMoneyResult => ({ ok: false, error })
  // NFKC folds full-width digits and no-break spaces into their plain forms.
  let rest = text.normalize('NFKC').replace(/[\s\u00a0\u202f]+/g, ' ').trim()
  if (rest === '') return fail('Enter an amount, for example 12.50')
  let negative = false
  const accounting = /^(.*)\((.*)\)(.*)$/.exec(rest)
  if (accounting) {
    negative = true
    rest = `${accounting[1]}${accounting[2]}${accounting[3]}`.trim()
  }
  let signSeen = negative
  for (const pattern of [LEADING_NOISE, TRAILING_NOISE]) {
    for (let match = pattern.exec(rest); match && rest !== ''; match = pattern.exec(rest)) {
      if (SIGNS.has(match[0])) {
        if (signSeen) return fail(`more than one sign in "${text}"`)
        signSeen = true
        negative = match[0] !== '+'
      }
      rest = pattern === LEADING_NOISE ? rest.slice(match[0].length) : rest.slice(0, -match[0].length)
    }
  }
  if (!/^[\d.,'’ ]*\d[\d.,'’ ]*$/.test(rest)) return fail(`"${text}" is not an amount of money`)

  const decimalSeparator = options.decimalSeparator ?? inferDecimalSeparator(rest)
  let integerPart = rest
  let fraction = ''
  if (decimalSeparator && rest.includes(decimalSeparator)) {
    const at = rest.lastIndexOf(decimalSeparator)
    integerPart = rest.slice(0, at)
    fraction = rest.slice(at + 1)
    if (!/^\d*$/.test(fraction)) return fail(`unexpected characters after the decimal separator in "${text}"`)
    if (fraction.length > 2) return fail(`"${text}" has more than two digits after the decimal separator`)
  }
  const whole = parseWholeUnits(integerPart, text)
  if (typeof whole === 'string') return fail(whole)
  const cents = whole * 100n + BigInt(fraction.padEnd(2, '0'))
  if (cents > BigInt(Number.MAX_SAFE_INTEGER)) return fail(`"${text}" is too large`)
  const value = Number(cents)
  return { ok: true, cents: negative && value !== 0 ? -value : value }
}
