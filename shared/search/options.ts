// The MiniSearch options and the query builder: one definition for the server's index and the phone's
// offline index later, so both find the same entries for the same typing.
import type MiniSearch from 'minisearch'
import type { Options, Query, SearchOptions, SearchResult } from 'minisearch'
import { prefixVariants, reversedVariants, termVariants, tokenize } from './normalise'
import { SEARCH_FIELDS, type SearchField } from './types'

/** One document as the index takes it: a unique key ("mark:12") and the text of each field. */
export interface SearchDocumentInput {
  key: string
  fields: Partial<Record<SearchField, string>>
}

/** Inscriptions indexed a second time, each word backwards, so a worn start ("…ERY CO") still matches. */
export const TAILS_FIELD = 'tails'
export const INDEX_FIELDS = [...SEARCH_FIELDS, TAILS_FIELD] as const

/** What is read off the base counts most, then the title, the maker; long text least. */
export const FIELD_BOOST: Record<SearchField, number> = {
  inscriptions: 5, title: 3.5, maker: 2.5, otherNames: 2.5, country: 1.5, tags: 1.5, body: 1,
}
// The end of a word read off the base is nearly as telling as the whole word.
const TAILS_BOOST = 4

/** Queries shorter than this answer with recent and popular entries instead. */
export const SEARCH_MIN_QUERY = 2
/** Words of a query beyond this are ignored: each costs a fuzzy lookup. */
export const SEARCH_MAX_QUERY_WORDS = 12

/**
 * About one error in five letters (rounded, as MiniSearch's fraction 0.2 does), at most two; words under five
 * letters must be typed right. Rounded, not floored: a ten-letter word typed with two letters missing is
 * eight letters long and still gets its two errors.
 */
export function fuzzyDistance(term: string): number {
  return term.length < 5 ? 0 : Math.min(2, Math.round(term.length / 5))
}

/**
 * A half-typed word of one to three letters matches the start of words only where a base's words are (not
 * in long notes, where "pri" would be every "price" and "printed"): short prefixes stay fast and precise.
 */
export const SHORT_PREFIX_LENGTH = 4
export const SHORT_PREFIX_FIELDS: SearchField[] = ['inscriptions', 'title', 'maker', 'otherNames', 'tags']

const PREFIX_WEIGHT = 0.6

const searchOptions: SearchOptions = {
  fields: [...SEARCH_FIELDS],
  boost: { ...FIELD_BOOST, [TAILS_FIELD]: TAILS_BOOST },
  combineWith: 'OR',
  // Query strings built by searchQuery() are already terms.
  tokenize: text => [text],
  processTerm: term => term,
  weights: { fuzzy: 0.45, prefix: PREFIX_WEIGHT },
}

/** Backwards words carry this mark, so they never meet forward words in prefix and fuzzy lookups. */
export const TAIL_MARK = '~'
export const tailTerms = (word: string) => reversedVariants(word).map(t => TAIL_MARK + t)

/** A half-typed word is completed to at most this many indexed words (the shortest ones) ... */
export const PREFIX_EXPANSIONS = 48
/** ... and to no more than about this many document matches in all, so every keystroke costs about the same. */
export const PREFIX_POSTINGS = 600
/** When there were more completions than that, the best hits so far are checked for the prefix directly. */
export const PREFIX_RECHECK = 100

export function searchIndexOptions(): Options<SearchDocumentInput> {
  return {
    idField: 'key',
    fields: [...INDEX_FIELDS],
    storeFields: [],
    extractField: (doc, field) => {
      if (field === 'key') return doc.key
      if (field === TAILS_FIELD) return doc.fields.inscriptions ?? ''
      return doc.fields[field as SearchField] ?? ''
    },
    tokenize: text => tokenize(text),
    processTerm: (term, field) => field === TAILS_FIELD ? tailTerms(term) : termVariants(term),
    searchOptions,
  }
}

type TermNode = Map<string, unknown>
interface TermTree { _tree: TermNode, _prefix: string }
type Postings = Map<number, Map<number, number>>

/**
 * Up to `limit` indexed words starting with one of the prefixes, shortest first, within about
 * PREFIX_POSTINGS document matches; null when the index cannot list them. MiniSearch's own prefix search has
 * no bound: "co" would score every entry with a word starting "co" on every keystroke. This walks its term
 * tree (a radix tree: `_index`, a SearchableMap, in MiniSearch 7) breadth-first by length, so it stops early.
 */
export function expandPrefixes(index: MiniSearch<SearchDocumentInput>, prefixes: string[], limit = PREFIX_EXPANSIONS): { terms: string[], capped: boolean } | null {
  const map = (index as unknown as { _index?: { atPrefix?: (p: string) => Partial<TermTree> } })._index
  if (typeof map?.atPrefix !== 'function') return null
  // Nodes waiting to be visited, by the length of the word they spell.
  const buckets: [string, TermNode][][] = []
  const push = (path: string, node: TermNode) => (buckets[path.length] ??= []).push([path, node])
  for (const p of new Set(prefixes)) {
    const sub = map.atPrefix(p)
    if (!(sub._tree instanceof Map) || typeof sub._prefix !== 'string') return null
    for (const [label, child] of sub._tree) {
      if (label === '') continue
      push(sub._prefix + label, child as TermNode)
    }
  }
  const terms: string[] = []
  let postings = 0
  for (let length = 0; length < buckets.length; length++) {
    for (const [path, node] of buckets[length] ?? []) {
      const value = node.get('') as Postings | undefined
      if (value) {
        let n = 0
        for (const docs of value.values()) n += docs.size
        if (terms.length >= limit || (terms.length && postings + n > PREFIX_POSTINGS)) return { terms, capped: true }
        terms.push(path)
        postings += n
      }
      for (const [label, child] of node) if (label !== '') push(path + label, child as TermNode)
    }
  }
  return { terms, capped: false }
}

/** A query starting with dots (or an ellipsis) marks a worn-off start. */
const WORN_START = /^\s*(?:\.{2,}|…)/

export interface PlannedQuery {
  query: Query
  /** The last word's prefixes, when it is treated as half typed. */
  prefixes: string[]
  /** Where the prefixes may match (null: every field). */
  prefixFields: SearchField[] | null
  /** True when not every completion of the prefixes is in the query (see PREFIX_RECHECK). */
  capped: boolean
}

/**
 * The query tree for what was typed: every word matches through any of its spellings (OR), words add up
 * (OR, so a misread or missing word still leaves the others; entries with more words rank first), the
 * last word also as the start of a word (it may be half typed), and the first word also as the end of a
 * word (the start of the line may be worn off). Pass the index to bound the completions of the last word.
 */
export function searchQuery(text: string, index?: MiniSearch<SearchDocumentInput>): PlannedQuery | null {
  const words = tokenize(text).slice(0, SEARCH_MAX_QUERY_WORDS)
  if (!words.length) return null
  const queries: Query[] = words.map(word => ({
    combineWith: 'OR', queries: termVariants(word).map(term => ({ queries: [term], fuzzy: fuzzyDistance(term) })),
  }))
  const last = words[words.length - 1]!
  let prefixes: string[] = []
  let prefixFields: SearchField[] | null = null
  let capped = false
  // A single letter after other words is not worth completing.
  if (words.length === 1 || last.length >= 2) {
    prefixes = prefixVariants(last)
    prefixFields = last.length < SHORT_PREFIX_LENGTH ? SHORT_PREFIX_FIELDS : null
    const fields = prefixFields ? { fields: prefixFields } : {}
    const expanded = index ? expandPrefixes(index, prefixes) : null
    if (!expanded) queries.push({ combineWith: 'OR', queries: prefixes, prefix: true, ...fields })
    else if (expanded.terms.length) {
      const shortest = Math.min(...prefixes.map(p => p.length))
      // MiniSearch's own prefix weight: a longer completion counts a little less.
      queries.push({
        combineWith: 'OR',
        ...fields,
        queries: expanded.terms.map(term => ({ queries: [term], boostTerm: () => PREFIX_WEIGHT * term.length / (term.length + 0.3 * (term.length - shortest)) })),
      })
    }
    capped = expanded?.capped ?? false
  }
  const first = words[0]!
  const tail: Query = { queries: tailTerms(first), fields: [TAILS_FIELD], prefix: true, fuzzy: 0 }
  // "...ERY CO": the dots say the first word is the end of a longer one, so it is looked for only as that
  // (as a whole word it would find every entry with a word "ery"). Without dots it may be either.
  if (WORN_START.test(text) && first.length >= 2) queries[0] = tail
  else if (words.length > 1 && first.length >= 3) queries.push(tail)
  return { query: { combineWith: 'OR', queries }, prefixes, prefixFields, capped }
}

/**
 * Runs a query on an index built with searchIndexOptions(), best first. `fieldsOf` gives a document's text
 * (for the prefix check of the best hits when the completions were capped).
 */
export function runSearch(
  index: MiniSearch<SearchDocumentInput>,
  text: string,
  options: { filter?: (key: string) => boolean, fieldsOf?: (key: string) => Partial<Record<SearchField, string>> | undefined } = {},
): SearchResult[] {
  const planned = searchQuery(text, index)
  if (!planned) return []
  const { filter, fieldsOf } = options
  const results = index.search(planned.query, filter ? { filter: r => filter(r.id as string) } : {})
  if (!planned.capped || !fieldsOf) return results
  for (const result of results.slice(0, PREFIX_RECHECK)) {
    if (Object.keys(result.match).some(t => planned.prefixes.some(p => t.startsWith(p)))) continue
    const fields = fieldsOf(result.id as string)
    if (!fields) continue
    found: for (const field of planned.prefixFields ?? SEARCH_FIELDS) {
      for (const word of tokenize(fields[field] ?? '')) {
        const term = termVariants(word).find(v => planned.prefixes.some(p => v.startsWith(p)))
        if (!term) continue
        // Own keys only: a term like "constructor" would otherwise read Object.prototype's member.
        result.match[term] = [...(Object.hasOwn(result.match, term) ? result.match[term]! : []), field]
        // As if MiniSearch had matched it: one more query word, scoring like an average one at the prefix
        // weight, and the quality factor (the number of query words matched) one higher.
        const quality = Math.max(1, result.queryTerms.length)
        result.score = result.score * (1 + PREFIX_WEIGHT / quality) * (quality + 1) / quality
        result.queryTerms.push(term)
        break found
      }
    }
  }
  return results.sort((a, b) => b.score - a.score)
}

/** The terms a query looks for, per word (for matching words without the index, as the database fallback does). */
export function searchQueryWords(text: string): { word: string, terms: string[], prefix: boolean }[] {
  const words = tokenize(text).slice(0, SEARCH_MAX_QUERY_WORDS)
  return words.map((word, i) => {
    const last = i === words.length - 1
    return { word, terms: last ? prefixVariants(word) : termVariants(word), prefix: last }
  })
}
