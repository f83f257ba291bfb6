// One team's in-memory index: MiniSearch with the shared options, plus the records that filters, ranking,
// snippets and hits are made from. Pure (no database): the manager fills it and keeps it current.
import MiniSearch, { type SearchResult } from 'minisearch'
import { foldDiacritics } from '../../../shared/search/normalise'
import { SEARCH_MIN_QUERY, runSearch, searchIndexOptions, type SearchDocumentInput } from '../../../shared/search/options'
import { predicatesFromMatch, summariseMatches } from '../../../shared/search/snippet'
import type { SearchHit, SearchType } from '../../../shared/search/types'
import type { SearchParams } from '../../../shared/search/schema'
import { WIKI_PATH_SEGMENTS } from '../../../shared/schemas/wiki'
import type { SearchRecord } from './documents'
import type { SearchPopularity } from './popularity'

// Snippets are cut from the first part of long texts; the index itself holds all of the text.
const KEPT_TEXT = 4000

export interface SearchFound { hits: SearchHit[], total: number }

const MARK_ONLY_FILTERS = ['makerId', 'materialId', 'categoryId', 'year'] as const

export class SearchTeamIndex {
  private readonly index = new MiniSearch<SearchDocumentInput>(searchIndexOptions())
  private readonly records = new Map<string, SearchRecord>()
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
    const kept: SearchRecord['fields'] = {}
    for (const [field, text] of Object.entries(record.fields)) kept[field as keyof SearchRecord['fields']] = text.length > KEPT_TEXT ? text.slice(0, KEPT_TEXT) : text
    this.records.set(record.key, { ...record, fields: kept })
    if (record.entry) {
      const parent = `${record.entry.type}:${record.entry.id}`
      ;(this.notesByEntry.get(parent) ?? this.notesByEntry.set(parent, new Set()).get(parent)!).add(record.key)
    }
  }

  remove(key: string): void {
    if (this.index.has(key)) this.index.discard(key)
    this.unlinkNote(key)
    this.records.delete(key)
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
    // Equal relevance: the entry the team sold more often first.
    results.sort((a, b) => b.score - a.score || this.pop(b, popularity) - this.pop(a, popularity))
    const hits = results.slice(0, params.limit).map(r => this.present(slug, this.records.get(r.id as string)!, r))
    return { hits, total: results.length }
  }

  /** Recent and popular entries, for an empty or one-letter query (one letter: titles starting with it first). */
  recent(slug: string, params: SearchParams, popularity: SearchPopularity): SearchFound {
    const keep = this.filter(params)
    const letter = foldDiacritics(params.q).slice(0, 1)
    const picked: { record: SearchRecord, starts: number, pop: number }[] = []
    for (const record of this.records.values()) {
      if (!keep(record)) continue
      picked.push({ record, starts: letter && foldDiacritics(this.titleOf(record)).startsWith(letter) ? 1 : 0, pop: popularity(record.type, record.id) })
    }
    picked.sort((a, b) => b.starts - a.starts || b.pop - a.pop || b.record.updatedAt - a.record.updatedAt)
    return { hits: picked.slice(0, params.limit).map(p => this.present(slug, p.record, null)), total: picked.length }
  }

  private pop(result: SearchResult, popularity: SearchPopularity): number {
    const r = this.records.get(result.id as string)
    return r ? popularity(r.type, r.id) : 0
  }

  private filter(params: SearchParams): (record: SearchRecord) => boolean {
    const types = new Set<SearchType>(params.types)
    // Maker, material, category and year describe marks: with any of them, only marks can match.
    if (MARK_ONLY_FILTERS.some(f => params[f] !== undefined)) for (const t of [...types]) if (t !== 'mark') types.delete(t)
    // Countries are on marks and makers.
    if (params.country) for (const t of [...types]) if (t !== 'mark' && t !== 'maker') types.delete(t)
    const country = params.country ? foldDiacritics(params.country) : ''
    const categories = params.categoryId === undefined ? null : this.categoryWithDescendants(params.categoryId)
    return (r) => {
      if (!types.has(r.type)) return false
      // A note shows while the entry it is on is live.
      if (r.entry && !this.records.has(`${r.entry.type}:${r.entry.id}`)) return false
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
      score: result ? Math.round(result.score * 1000) / 1000 : 0,
      matched,
      snippet,
      path,
    }
  }
}
