// Which words of an entry a query found, and a short snippet around them, as safe text segments (the page
// renders them as text; no HTML is built from entry text anywhere).
import { termVariants, tokenizeWithOffsets } from './normalise'
import { SEARCH_FIELDS, type SearchField, type SearchSegment, type SearchSnippet } from './types'
import { TAILS_FIELD, tailTerms } from './options'

export const SNIPPET_LENGTH = 140
// Words of context kept before the first match, in characters.
const LEAD = 40

/** A field's text as one line: inscriptions and other lists are stored one per line. */
export function displayText(text: string): string {
  return text.replace(/\s*\n\s*/g, ' · ').replace(/\s+/g, ' ').trim()
}

/** The words (as written) of `text` that pass `isMatch`, in order, without repeats. */
export function matchedWords(text: string, isMatch: (word: string) => boolean): string[] {
  const out = new Set<string>()
  for (const t of tokenizeWithOffsets(text)) if (isMatch(t.text)) out.add(t.text)
  return [...out]
}

/** Up to SNIPPET_LENGTH characters around the first matched word, matched words marked; null when none match. */
export function snippetSegments(text: string, isMatch: (word: string) => boolean, length = SNIPPET_LENGTH): SearchSegment[] | null {
  const line = displayText(text)
  const tokens = tokenizeWithOffsets(line)
  const firstMatch = tokens.findIndex(t => isMatch(t.text))
  if (firstMatch < 0) return null
  let start = 0
  let end = line.length
  if (line.length > length) {
    const want = Math.max(0, tokens[firstMatch]!.start - LEAD)
    start = tokens.find(t => t.start >= want)?.start ?? 0
    if (start > tokens[firstMatch]!.start) start = tokens[firstMatch]!.start
    end = Math.min(line.length, start + length)
    // Never cut a word in half at the end.
    const cut = tokens.find(t => t.start < end && t.end > end)
    if (cut) end = cut.start > start ? cut.start : cut.end
  }
  const segments: SearchSegment[] = []
  const push = (text: string, match: boolean) => {
    if (!text) return
    const last = segments[segments.length - 1]
    if (last && last.match === match) last.text += text
    else segments.push({ text, match })
  }
  if (start > 0) push('…', false)
  let at = start
  for (const t of tokens) {
    if (t.start < start || t.end > end) continue
    push(line.slice(at, t.start), false)
    push(t.text, isMatch(t.text))
    at = t.end
  }
  push(line.slice(at, end), false)
  if (end < line.length) push('…', false)
  return segments
}

/** Field order for the snippet: what is read off the base first. */
const SNIPPET_ORDER: SearchField[] = ['inscriptions', 'title', 'maker', 'otherNames', 'body', 'tags', 'country']

export interface MatchSummary {
  matched: Partial<Record<SearchField, string[]>>
  snippet: SearchSnippet | null
}

/** Matched words and snippet from per-field predicates. */
export function summariseMatches(fields: Partial<Record<SearchField, string>>, predicates: Partial<Record<SearchField, (word: string) => boolean>>): MatchSummary {
  const matched: Partial<Record<SearchField, string[]>> = {}
  for (const field of SEARCH_FIELDS) {
    const text = fields[field]
    const isMatch = predicates[field]
    if (!text || !isMatch) continue
    const words = matchedWords(text, isMatch)
    if (words.length) matched[field] = words
  }
  let snippet: SearchSnippet | null = null
  for (const field of SNIPPET_ORDER) {
    // A title that only repeats the first inscription says nothing new.
    if (!matched[field]) continue
    const segments = snippetSegments(fields[field]!, predicates[field]!)
    if (segments) {
      snippet = { field, segments }
      break
    }
  }
  return { matched, snippet }
}

/**
 * Predicates from MiniSearch's match info ({ indexed term: [fields] }): a word matched when one of its
 * terms is among the terms that matched in its field. Backwards matches count for the inscriptions.
 */
export function predicatesFromMatch(match: Record<string, string[]>): Partial<Record<SearchField, (word: string) => boolean>> {
  const byField = new Map<string, Set<string>>()
  for (const [term, fields] of Object.entries(match)) {
    for (const field of fields) (byField.get(field) ?? byField.set(field, new Set()).get(field)!).add(term)
  }
  const out: Partial<Record<SearchField, (word: string) => boolean>> = {}
  for (const field of SEARCH_FIELDS) {
    const terms = byField.get(field)
    const tails = field === 'inscriptions' ? byField.get(TAILS_FIELD) : undefined
    if (!terms && !tails) continue
    out[field] = word => Boolean(terms && termVariants(word).some(t => terms.has(t)))
      || Boolean(tails && tailTerms(word).some(t => tails.has(t)))
  }
  return out
}

/** A predicate for text found without the index: a word matches when one of its terms starts with a query term. */
export function predicateFromTerms(queryTerms: string[]): (word: string) => boolean {
  const terms = queryTerms.filter(Boolean)
  return word => termVariants(word).some(v => terms.some(t => v.startsWith(t)))
}

/** Escaped HTML with <mark> around matched words, for places that need a string. */
export function segmentsToHtml(segments: SearchSegment[]): string {
  const escape = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
  return segments.map(s => s.match ? `<mark>${escape(s.text)}</mark>` : escape(s.text)).join('')
}
