// Reads the dating clues in an inscription and intersects their year ranges. Each clue is only a
// "probably"; an empty intersection is worth showing, because it usually means a reproduction, a
// relabelled piece or a misread mark.
import { findSpans, normaliseInscription, originalSlice } from './normalise'
import type { NormalisedText, TextSpan } from './normalise'
import { DATING_RULES } from './rules'
import type { Confidence, DatingRule, YearRange } from './rules'

export interface DatingClue {
  rule: string
  label: string
  /** The words that triggered the rule, as written in the input (several joined by ", "). */
  matched: string
  yearFrom: number | null
  yearTo: number | null
  /** Present only for an either-or clue; yearFrom/yearTo then span all of it. */
  ranges?: YearRange[]
  reason: string
  source: string
  confidence: Confidence
}

export interface DatingResult {
  /** In the order they appear in the inscription. */
  clues: DatingClue[]
  /** From the earliest to the latest year the clues allow together; all null when they conflict. */
  range: YearRange
  /** The allowed years as separate pieces (two when "Russia" leaves an either-or); empty on conflict. */
  ranges: YearRange[]
  conflict: boolean
  explanation: string
}

/** Inclusive years; open ends as infinities so the arithmetic needs no special cases. */
type Interval = readonly [number, number]

const RULES_BY_ID = new Map(DATING_RULES.map(rule => [rule.id, rule]))

function spansOf(rule: DatingRule, text: NormalisedText): TextSpan[] {
  return typeof rule.pattern === 'function' ? rule.pattern(text) : findSpans(rule.pattern, text.text)
}

const overlaps = (a: TextSpan, b: TextSpan) => a.start < b.end && b.start < a.end

/** Drops a superseded rule's match only where the superseding rule matched the same words. */
function applyExcludes(found: Map<string, TextSpan[]>): Map<string, TextSpan[]> {
  const kept = new Map(found)
  for (const [id, own] of found) {
    for (const excluded of RULES_BY_ID.get(id)!.excludes ?? []) {
      const theirs = kept.get(excluded)
      if (!theirs) continue
      const left = theirs.filter(span => !own.some(o => overlaps(o, span)))
      if (left.length) kept.set(excluded, left)
      else kept.delete(excluded)
    }
  }
  return kept
}

function intervalsOf(rule: Pick<DatingRule, 'yearFrom' | 'yearTo' | 'ranges'>): Interval[] | null {
  const ranges = rule.ranges ?? [{ yearFrom: rule.yearFrom, yearTo: rule.yearTo }]
  if (ranges.every(r => r.yearFrom === null && r.yearTo === null)) return null
  return ranges.map(r => [r.yearFrom ?? -Infinity, r.yearTo ?? Infinity] as const)
}

function intersect(a: readonly Interval[], b: readonly Interval[]): Interval[] {
  const pieces: Interval[] = []
  for (const [aFrom, aTo] of a) {
    for (const [bFrom, bTo] of b) {
      const from = Math.max(aFrom, bFrom)
      const to = Math.min(aTo, bTo)
      if (from <= to) pieces.push([from, to])
    }
  }
  return pieces.sort((x, y) => x[0] - y[0])
}

const toYear = (year: number) => (Number.isFinite(year) ? year : null)
const toRange = ([from, to]: Interval): YearRange => ({ yearFrom: toYear(from), yearTo: toYear(to) })

function describeRange({ yearFrom, yearTo }: YearRange): string {
  if (yearFrom !== null && yearTo !== null) return yearFrom === yearTo ? `${yearFrom}` : `${yearFrom}–${yearTo}`
  if (yearFrom !== null) return `${yearFrom} or later`
  if (yearTo !== null) return `${yearTo} or earlier`
  return 'at any date'
}

function describeClue(clue: DatingClue): string {
  const years = clue.ranges ? clue.ranges.map(describeRange).join(', or ') : describeRange(clue)
  return `"${clue.matched}" (${clue.label}: ${years})`
}

/** The input words behind a match; an abbreviation keeps its last dot ("U.S.S.R." rather than "U.S.S.R"). */
function matchedWords(text: NormalisedText, span: TextSpan): string {
  const words = originalSlice(text, span).trim()
  const dotAfter = text.original[text.sourceEnd[span.end - 1]!] === '.'
  return dotAfter && words.includes('.') ? `${words}.` : words
}

function explain(clues: DatingClue[], allowed: Interval[], disagreements: [DatingClue, DatingClue][]): string {
  if (clues.length === 0) {
    return 'No dating clue found in the inscription. A missing country name or mark proves nothing about age.'
  }
  if (disagreements.length || allowed.length === 0) {
    const pairs = disagreements.map(([a, b]) => `${describeClue(a)} and ${describeClue(b)}`)
    const which = pairs.length
      ? `These clues disagree: ${pairs.join('; ')}.`
      : `Together these clues leave no year: ${clues.filter(c => intervalsOf(c)).map(describeClue).join(', ')}.`
    return `${which} No single date fits them all: the piece may be a reproduction or a relabelled piece, or the mark may be misread. Check the base again.`
  }
  const dated = clues.filter(c => intervalsOf(c))
  const undated = clues.filter(c => !intervalsOf(c))
  const parts: string[] = []
  if (dated.length) {
    const estimate = allowed.map(piece => describeRange(toRange(piece))).join(', or ')
    parts.push(`Probably made ${estimate}, from ${dated.map(describeClue).join(', ')}.`)
  }
  if (undated.length) {
    parts.push(`${undated.map(c => `"${c.matched}"`).join(', ')} gives no date by itself.`)
  }
  return parts.join(' ')
}

export function findDatingClues(text: string, country?: string | null): DatingResult {
  // The country field is read like one more line of the inscription.
  const normalised = normaliseInscription(text, country)

  const found = new Map<string, TextSpan[]>()
  for (const rule of DATING_RULES) {
    const spans = spansOf(rule, normalised)
    if (spans.length) found.set(rule.id, spans)
  }
  const kept = applyExcludes(found)

  const clues = [...kept]
    .map(([id, spans]) => ({ rule: RULES_BY_ID.get(id)!, spans: [...spans].sort((a, b) => a.start - b.start) }))
    .sort((a, b) => a.spans[0]!.start - b.spans[0]!.start)
    .map(({ rule, spans }): DatingClue => ({
      rule: rule.id,
      label: rule.label,
      matched: [...new Set(spans.map(span => matchedWords(normalised, span)))].join(', '),
      yearFrom: rule.yearFrom,
      yearTo: rule.yearTo,
      ...(rule.ranges ? { ranges: rule.ranges.map(r => ({ ...r })) } : {}),
      reason: rule.reason,
      source: rule.source,
      confidence: rule.confidence,
    }))

  let allowed: Interval[] = [[-Infinity, Infinity]]
  const disagreements: [DatingClue, DatingClue][] = []
  clues.forEach((clue, i) => {
    const own = intervalsOf(clue)
    if (!own) return
    allowed = intersect(allowed, own)
    for (const earlier of clues.slice(0, i)) {
      const theirs = intervalsOf(earlier)
      if (theirs && intersect(theirs, own).length === 0) disagreements.push([earlier, clue])
    }
  })

  const conflict = allowed.length === 0
  const ranges = allowed.map(toRange)
  const range: YearRange = conflict
    ? { yearFrom: null, yearTo: null }
    : { yearFrom: ranges[0]!.yearFrom, yearTo: ranges[ranges.length - 1]!.yearTo }
  return { clues, range, ranges, conflict, explanation: explain(clues, allowed, disagreements) }
}
