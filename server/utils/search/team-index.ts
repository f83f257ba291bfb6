// One team's in-memory index: MiniSearch with the shared options, plus the records that filters, ranking,
// snippets and hits are made from. Pure (no database): the manager fills it and keeps it current.
import MiniSearch, { type SearchResult } from 'minisearch'
import { foldDiacritics } from '../../../shared/search/normalise'
import { SEARCH_MIN_QUERY, runSearch, searchIndexOptions, type SearchDocumentInput } from '../../../shared/search/options'
import { predicatesFromMatch, summariseMatches } from '../../../shared/search/snippet'
import { SEARCH_TYPES, type SearchHit, type SearchType } from '../../../shared/search/types'
import type { SearchParams } from '../../../shared/search/schema'
import { WIKI_PATH_SEGMENTS } from '../../../shared/schemas/wiki'
import type { SearchRecord } from './documents'
import type { SearchPopularity } from './popularity'

// Snippets are cut from the first part of long texts; the index itself holds all of the text.
const KEPT_TEXT = 4000

export interface SearchFound { hits: SearchHit[], total: number }

const MARK_ONLY_FILTERS = ['makerId', 'materialId', 'categoryId', 'year'] as const

const shownScore = (score: number) => Math.round(score * 1000) / 1000

/** A record as kept here, with what every empty query and every filter would otherwise work out again per record. */
type KeptRecord = SearchRecord & {
  /** The key of the entry a note is on. */
  parentKey: string | null
  /** A note's entry is in the index (live): the note shows. Kept up to date by upsert() and remove() of the entry. */
  parentLive: boolean
  /** The first letter of the title, folded (a note's title is "Note on …"). */
  initial: string
}

export class SearchTeamIndex {
  private readonly index = new MiniSearch<SearchDocumentInput>(searchIndexOptions())
  private readonly records = new Map<string, KeptRecord>()
  private readonly notesByEntry = new Map<string, Set<string>>()

  get size(): number {
    return this.records.size
  }

  has(key: string): boolean {
    return this.records.has(key)
  }

  keysOfNotesOn(type: string, id: number): string[] {
    return [...this.notesByEntry.get(`${type}:${id}`) ?? []]
  }

  /** Adds or replaces a document (replace = discard + add: never `remove` with a document that may be stale). */
  upsert(record: SearchRecord): void {
    if (this.index.has(record.key)) {
      this.index.replace(record)
      this.unlinkNote(record.key)
    }
    else this.index.add(record)
    const isNew = !this.records.has(record.key)
    const kept: SearchRecord['fields'] = {}
    for (const [field, text] of Object.entries(record.fields)) kept[field as keyof SearchRecord['fields']] = text.length > KEPT_TEXT ? text.slice(0, KEPT_TEXT) : text
    // Every field written out (a spread plus extra fields can leave the object in V8's slow dictionary mode).
    const r = record
    const parentKey = r.entry ? `${r.entry.type}:${r.entry.id}` : null
    this.records.set(record.key, {
      key: r.key, fields: kept, type: r.type, id: r.id, title: r.title, subtitle: r.subtitle, updatedAt: r.updatedAt, country: r.country,
      makerId: r.makerId, materialIds: r.materialIds, categoryIds: r.categoryIds, yearFrom: r.yearFrom, yearTo: r.yearTo, parentId: r.parentId,
      entry: r.entry, parentKey, parentLive: parentKey !== null && this.records.has(parentKey), initial: r.entry ? 'n' : foldDiacritics(r.title).slice(0, 1),
    })
    if (parentKey) (this.notesByEntry.get(parentKey) ?? this.notesByEntry.set(parentKey, new Set()).get(parentKey)!).add(record.key)
    if (isNew) this.markNotes(record.key, true)
  }

  remove(key: string): void {
    if (this.index.has(key)) this.index.discard(key)
    this.unlinkNote(key)
    if (this.records.delete(key)) this.markNotes(key, false)
  }

  /** The notes on this entry show while it is here. */
  private markNotes(entryKey: string, live: boolean) {
    for (const noteKey of this.notesByEntry.get(entryKey) ?? []) {
      const note = this.records.get(noteKey)
      if (note) note.parentLive = live
    }
  }

  private unlinkNote(key: string) {
    const entry = this.records.get(key)?.entry
    if (!entry) return
    const parent = `${entry.type}:${entry.id}`
    const set = this.notesByEntry.get(parent)
    set?.delete(key)
    if (set && !set.size) this.notesByEntry.delete(parent)
  }

  /** Hits for a query of two or more letters; shorter queries list recent entries (see recent()). */
  search(slug: string, params: SearchParams, popularity: SearchPopularity): SearchFound {
    if (params.q.length < SEARCH_MIN_QUERY) return { hits: [], total: 0 }
    const keep = this.filter(params)
    const results = runSearch(this.index, params.q, { filter: key => keep(this.records.get(key)!), fieldsOf: key => this.records.get(key)?.fields })
    this.breakTies(results, params.limit, popularity)
    const hits = results.slice(0, params.limit).map(r => this.present(slug, this.records.get(r.id as string)!, r))
    return { hits, total: results.length }
  }

  /**
   * Equal relevance (the same score as the hit shows it, to three decimals): the entry the team sold more often
   * first. Results come best first, so equal scores stand together; only the runs that reach the page are sorted.
   */
  private breakTies(results: SearchResult[], limit: number, popularity: SearchPopularity) {
    const pop = (result: SearchResult) => {
      const r = this.records.get(result.id as string)
      return r ? popularity(r.type, r.id) : 0
    }
    for (let start = 0; start < Math.min(limit, results.length);) {
      const score = shownScore(results[start]!.score)
      let end = start + 1
      while (end < results.length && shownScore(results[end]!.score) === score) end++
      // A stable sort: among equally popular entries the better raw score stays first.
      if (end - start > 1) results.splice(start, end - start, ...results.slice(start, end).sort((a, b) => pop(b) - pop(a)))
      start = end
    }
  }

  /** Recent and popular entries, for an empty or one-letter query (one letter: titles starting with it first). */
  recent(slug: string, params: SearchParams, popularity: SearchPopularity): SearchFound {
    const keep = this.filter(params)
    const letter = foldDiacritics(params.q).slice(0, 1)
    type Picked = { record: SearchRecord, starts: number, pop: number }
    const before = (a: Picked, b: Picked) => a.starts - b.starts || a.pop - b.pop || a.record.updatedAt - b.record.updatedAt
    // The best `limit` of every entry, kept in order as they are met (a whole team's sort costs far more).
    const top: Picked[] = []
    let total = 0
    for (const record of this.records.values()) {
      if (!keep(record)) continue
      total++
      const picked = { record, starts: letter && record.initial === letter ? 1 : 0, pop: popularity(record.type, record.id) }
      if (top.length === params.limit && before(picked, top[top.length - 1]!) <= 0) continue
      let at = top.length
      while (at > 0 && before(picked, top[at - 1]!) > 0) at--
      top.splice(at, 0, picked)
      if (top.length > params.limit) top.pop()
    }
    return { hits: top.map(p => this.present(slug, p.record, null)), total }
  }

  private filter(params: SearchParams): (record: KeptRecord) => boolean {
    const types = new Set<SearchType>(params.types)
    // Maker, material, category and year describe marks: with any of them, only marks can match.
    if (MARK_ONLY_FILTERS.some(f => params[f] !== undefined)) for (const t of [...types]) if (t !== 'mark') types.delete(t)
    // Countries are on marks and makers.
    if (params.country) for (const t of [...types]) if (t !== 'mark' && t !== 'maker') types.delete(t)
    const country = params.country ? foldDiacritics(params.country) : ''
    const categories = params.categoryId === undefined ? null : this.categoryWithDescendants(params.categoryId)
    const everyType = types.size === SEARCH_TYPES.length
    const narrowed = Boolean(country) || categories !== null || MARK_ONLY_FILTERS.some(f => params[f] !== undefined)
    // Called for every entry of the team on an empty query: the common checks first, and cheap.
    return (r) => {
      if (!everyType && !types.has(r.type)) return false
      // A note shows while the entry it is on is live.
      if (r.parentKey !== null && !r.parentLive) return false
      if (!narrowed) return true
      if (country && r.country !== country) return false
      if (params.makerId !== undefined && r.makerId !== params.makerId) return false
      if (params.materialId !== undefined && !r.materialIds.includes(params.materialId)) return false
      if (categories && !r.categoryIds.some(id => categories.has(id))) return false
      if (params.year !== undefined) {
        // Open-ended ranges count ("from 1950" includes 1970); undated marks never match a year.
        if (r.yearFrom === null && r.yearTo === null) return false
        if (r.yearFrom !== null && r.yearFrom > params.year) return false
        if (r.yearTo !== null && r.yearTo < params.year) return false
      }
      return true
    }
  }

  private categoryWithDescendants(id: number): Set<number> {
    const children = new Map<number, number[]>()
    for (const r of this.records.values()) {
      if (r.type === 'category' && r.parentId !== null) (children.get(r.parentId) ?? children.set(r.parentId, []).get(r.parentId)!).push(r.id)
    }
    const out = new Set([id])
    const queue = [id]
    while (queue.length) {
      for (const child of children.get(queue.pop()!) ?? []) {
        if (!out.has(child)) {
          out.add(child)
          queue.push(child)
        }
      }
    }
    return out
  }

  private titleOf(record: SearchRecord): string {
    if (!record.entry) return record.title
    const parent = this.records.get(`${record.entry.type}:${record.entry.id}`)
    return `Note on ${parent?.title ?? record.entry.type}`
  }

  private present(slug: string, record: SearchRecord, result: SearchResult | null): SearchHit {
    const { matched, snippet } = result ? summariseMatches(record.fields, predicatesFromMatch(result.match)) : { matched: {}, snippet: null }
    let subtitle = record.subtitle
    let path = `/t/${slug}/${WIKI_PATH_SEGMENTS[record.type as keyof typeof WIKI_PATH_SEGMENTS]}/${record.id}`
    if (record.type === 'category' && record.parentId !== null) subtitle = `in ${this.records.get(`category:${record.parentId}`)?.title ?? ''}`.trim()
    if (record.entry) path = `/t/${slug}/${WIKI_PATH_SEGMENTS[record.entry.type]}/${record.entry.id}#note-${record.id}`
    return {
      type: record.type,
      id: record.id,
      title: this.titleOf(record),
      subtitle,
      score: result ? shownScore(result.score) : 0,
      matched,
      snippet,
      path,
    }
  }
}
