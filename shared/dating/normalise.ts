// Folds an inscription typed off a base into one predictable form, so the dating rules can be
// written once ("w germany", "u s s r") instead of once per way people type them, while keeping a
// map back to the original characters so a clue can quote the words exactly as entered.

export interface TextSpan {
  /** Start (inclusive) and end (exclusive) in UTF-16 units of the normalised text. */
  start: number
  end: number
}

export interface NormalisedText {
  /**
   * Lower case, Latin diacritics folded ("é" → "e", "ß" → "ss"), dots and other punctuation as
   * spaces, apostrophes dropped ("people's" → "peoples"), runs of spaces as one space and runs
   * containing a line break as one "\n", a comma always followed by one space. Kept as they are:
   * letters of every script (Cyrillic is not transliterated: "СССР" stays Cyrillic), digits, "®",
   * "&", "(", ")", ",", and "-" only between two digits (ZIP+4, barcodes).
   */
  readonly text: string
  readonly original: string
  /** For each UTF-16 unit of `text`: where its source characters start and end in `original`. */
  readonly sourceStart: readonly number[]
  readonly sourceEnd: readonly number[]
  readonly hasCyrillic: boolean
  readonly hasRegisteredSign: boolean
  /** Where the separately entered country field begins in `text` (it is read as a last line), or null. */
  readonly countryFieldStart: number | null
}

interface Unit {
  ch: string
  start: number
  end: number
}

const CYRILLIC = /\p{Script=Cyrillic}/u
const LETTER_OR_DIGIT = /[\p{L}\p{Nd}]/u
const DIGIT = /^\d$/
const KEPT_SYMBOLS = new Set(['®', '&', '(', ')', ','])
const APOSTROPHES = new Set(['\'', '\u2019', '\u2018', '\u02bc', '`'])
const DASHES = new Set(['-', '\u2010', '\u2011', '\u2012', '\u2013', '\u2014', '\u2212'])
const LINE_BREAKS = new Set(['\n', '\r', '\u2028', '\u2029'])
// Letters that NFD does not split into a base letter and a mark.
const LETTER_FOLDS: Record<string, string> = { ß: 'ss', æ: 'ae', œ: 'oe', ø: 'o', ł: 'l', đ: 'd', þ: 'th' }

export function containsCyrillic(text: string): boolean {
  return CYRILLIC.test(text)
}

function foldCharacter(ch: string): string {
  const lower = ch.toLowerCase()
  // Cyrillic "й" would lose its breve and become another letter; Cyrillic is matched as written.
  if (CYRILLIC.test(ch)) return lower
  const withoutMarks = lower.normalize('NFD').replace(/\p{M}/gu, '')
  return [...withoutMarks].map(c => LETTER_FOLDS[c] ?? c).join('')
}

function classify(ch: string): string {
  if (LETTER_OR_DIGIT.test(ch) || KEPT_SYMBOLS.has(ch)) return ch
  if (APOSTROPHES.has(ch)) return ''
  if (DASHES.has(ch)) return '-'
  if (LINE_BREAKS.has(ch)) return '\n'
  return ' '
}

const isSpace = (ch: string | undefined) => ch === ' ' || ch === '\n'

export function normaliseInscription(inscription: string, countryField?: string | null): NormalisedText {
  const hasCountry = Boolean(countryField?.trim())
  const original = hasCountry ? `${inscription}\n${countryField}` : inscription
  const units: Unit[] = []
  let index = 0
  for (const codePoint of original) {
    const start = index
    index += codePoint.length
    for (const ch of foldCharacter(codePoint)) {
      const kept = classify(ch)
      if (kept) units.push({ ch: kept, start, end: index })
    }
  }

  // A dash joins digits ("45401-6789"); anywhere else it only separates words ("oven-proof").
  units.forEach((unit, i) => {
    if (unit.ch === '-' && !(DIGIT.test(units[i - 1]?.ch ?? '') && DIGIT.test(units[i + 1]?.ch ?? ''))) {
      unit.ch = ' '
    }
  })

  const out: Unit[] = []
  for (const unit of units) {
    const last = out[out.length - 1]
    if (isSpace(unit.ch)) {
      if (!last) continue
      if (isSpace(last.ch)) {
        if (unit.ch === '\n') last.ch = '\n'
        continue
      }
      out.push({ ...unit })
    }
    else if (unit.ch === ',') {
      if (last && isSpace(last.ch) && last.ch !== '\n') out.pop()
      out.push({ ...unit }, { ch: ' ', start: unit.start, end: unit.end })
    }
    else {
      out.push({ ...unit })
    }
  }
  while (out.length && isSpace(out[out.length - 1]!.ch)) out.pop()

  const sourceStart: number[] = []
  const sourceEnd: number[] = []
  for (const unit of out) {
    for (let k = 0; k < unit.ch.length; k++) {
      sourceStart.push(unit.start)
      sourceEnd.push(unit.end)
    }
  }
  const countryIndex = hasCountry ? sourceStart.findIndex(start => start > inscription.length) : -1
  return {
    text: out.map(unit => unit.ch).join(''),
    original,
    sourceStart,
    sourceEnd,
    hasCyrillic: containsCyrillic(original),
    hasRegisteredSign: original.includes('®'),
    countryFieldStart: countryIndex >= 0 ? countryIndex : null,
  }
}

/** The characters of the original input behind a span of the normalised text. */
export function originalSlice(normalised: NormalisedText, span: TextSpan): string {
  if (span.end <= span.start) return ''
  return normalised.original.slice(normalised.sourceStart[span.start], normalised.sourceEnd[span.end - 1])
}

/** Every non-empty match of `pattern` in `text`, whatever flags the pattern was written with. */
export function findSpans(pattern: RegExp, text: string): TextSpan[] {
  const global = new RegExp(pattern.source, pattern.flags.includes('g') ? pattern.flags : pattern.flags + 'g')
  const spans: TextSpan[] = []
  for (const match of text.matchAll(global)) {
    if (match[0].length > 0) spans.push({ start: match.index, end: match.index + match[0].length })
  }
  return spans
}
