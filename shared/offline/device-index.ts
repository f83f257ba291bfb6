// The search index on the phone: MiniSearch with the server's own options and query builder
// (shared/search/options.ts), over documents built from the downloaded reference the way the server builds
// them (server/utils/search/documents.ts), so the same typing finds the same entries with no signal.
// Pure: no Vue, no IndexedDB; the bench runs this very file in Chromium.
import MiniSearch, { type SearchResult } from 'minisearch'
import { foldDiacritics, plainMarkdown } from '../search/normalise'
import { SEARCH_MIN_QUERY, runSearch, searchIndexOptions, type SearchDocumentInput } from '../search/options'
import { predicatesFromMatch, summariseMatches } from '../search/snippet'
import { SEARCH_TYPES, type SearchField, type SearchHit, type SearchResponse, type SearchType } from '../search/types'
import type { OfflineCategory, OfflineEntryByType, OfflineMaker, OfflineMark, OfflineMaterial, OfflineNote, OfflineType } from './types'

/** "1920–1950", "c. 1890", "from 1950" … as the server writes year ranges (server/utils/wiki/types.ts). */
export function offlineYearRange(from: number | null, to: number | null, fromApprox = false, toApprox = false): string {
  const f = from === null ? '' : `${fromApprox ? 'c. ' : ''}${from}`
  const t = to === null ? '' : `${toApprox ? 'c. ' : ''}${to}`
  if (!f && !t) return ''
  if (f && t) return f === t ? f : `${f}–${t}`
  return f ? `from ${f}` : `until ${t}`
}

const lines = (values: (string | null | undefined)[]) => values.filter(Boolean).join('\n')
const KEPT_TEXT = 4000

interface DeviceRecord extends SearchDocumentInput { type: SearchType, id: number, updatedAt: number, entry: { type: OfflineType, id: number } | null }

export interface DeviceSearchOptions {
  types?: SearchType[]
  limit?: number
  /** The app path of a hit; by default the entry's own page. */
  pathOf?: (type: OfflineType, id: number, noteId?: number) => string
  /** Thumbnail URL of a mark or maker, if the phone has one. */
  thumbOf?: (type: 'mark' | 'maker', id: number) => string | undefined
}

const PATH_SEGMENT: Record<Exclude<OfflineType, 'note'>, string> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }

/** Every entry of the reference on the phone, by type and id, plus its search index. */
export class OfflineDeviceIndex {
  readonly entries = {
    mark: new Map<number, OfflineMark>(),
    maker: new Map<number, OfflineMaker>(),
    material: new Map<number, OfflineMaterial>(),
    category: new Map<number, OfflineCategory>(),
    note: new Map<number, OfflineNote>(),
  }

  private readonly index = new MiniSearch<SearchDocumentInput>(searchIndexOptions())
  private readonly records = new Map<string, DeviceRecord>()

  constructor(readonly slug: string) {}

  get size(): number {
    return this.records.size
  }

  /** Adds or replaces entries; a changed maker re-indexes its marks (they carry its names). */
  put<T extends OfflineType>(type: T, list: OfflineEntryByType[T][]): void {
    const map = this.entries[type] as Map<number, OfflineEntryByType[T]>
    for (const entry of list) map.set(entry.id, entry)
    for (const entry of list) this.reindex(type, entry.id)
    if (type === 'maker') {
      const ids = new Set(list.map(m => m.id))
      for (const mark of this.entries.mark.values()) if (mark.makerId !== null && ids.has(mark.makerId)) this.reindex('mark', mark.id)
    }
  }

  remove(type: OfflineType, ids: number[]): void {
    for (const id of ids) {
      this.entries[type].delete(id)
      this.reindex(type, id)
    }
    if (type === 'maker') {
      const gone = new Set(ids)
      for (const mark of this.entries.mark.values()) if (mark.makerId !== null && gone.has(mark.makerId)) this.reindex('mark', mark.id)
    }
  }

  /** Marks that list this one as a lookalike (pairs are kept on both marks by the server). */
  lookalikesOf(markId: number): { markId: number, howToTell: string }[] {
    return this.entries.mark.get(markId)?.lookalikes ?? []
  }

  private reindex(type: OfflineType, id: number): void {
    const key = `${type}:${id}`
    const record = this.build(type, id)
    if (this.index.has(key)) {
      if (record) this.index.replace(record)
      else this.index.discard(key)
    }
    else if (record) this.index.add(record)
    if (record) {
      const kept: DeviceRecord['fields'] = {}
      for (const [field, text] of Object.entries(record.fields)) kept[field as SearchField] = text.length > KEPT_TEXT ? text.slice(0, KEPT_TEXT) : text
      this.records.set(key, { ...record, fields: kept })
    }
    else this.records.delete(key)
  }

  /** The search document of an entry, field for field as server/utils/search/documents.ts builds it. */
  private build(type: OfflineType, id: number): DeviceRecord | null {
    const base = (fields: DeviceRecord['fields'], updatedAt: number, entry: DeviceRecord['entry'] = null): DeviceRecord => ({ key: `${type}:${id}`, type, id, fields, updatedAt, entry })
    if (type === 'mark') {
      const r = this.entries.mark.get(id)
      if (!r) return null
      const maker = r.makerId === null ? undefined : this.entries.maker.get(r.makerId)
      return base({
        inscriptions: lines(r.inscriptions), title: r.title, maker: maker ? lines([maker.name, ...maker.otherNames]) : '',
        country: r.country, tags: lines(r.tags), body: plainMarkdown(r.notes),
      }, r.updatedAt)
    }
    if (type === 'maker') {
      const r = this.entries.maker.get(id)
      if (!r) return null
      return base({ title: r.name, otherNames: lines(r.otherNames), country: r.country, tags: lines(r.tags), body: plainMarkdown(r.notes) }, r.updatedAt)
    }
    if (type === 'material') {
      const r = this.entries.material.get(id)
      if (!r) return null
      return base({
        title: r.name, tags: lines(r.tags),
        body: lines([r.recognition, ...Object.values(r.checks ?? {}), r.damage, r.cautions, r.notes].map(t => plainMarkdown(String(t ?? '')))),
      }, r.updatedAt)
    }
    if (type === 'category') {
      const r = this.entries.category.get(id)
      if (!r) return null
      return base({ title: r.name, tags: lines(r.tags), body: plainMarkdown(r.notes) }, r.updatedAt)
    }
    const r = this.entries.note.get(id)
    if (!r) return null
    return base({ body: plainMarkdown(r.body) }, r.updatedAt, { type: r.entryType, id: r.entryId })
  }

  titleOf(type: OfflineType, id: number): string {
    if (type === 'mark') return this.entries.mark.get(id)?.title ?? ''
    if (type === 'maker') return this.entries.maker.get(id)?.name ?? ''
    if (type === 'material') return this.entries.material.get(id)?.name ?? ''
    if (type === 'category') return this.entries.category.get(id)?.name ?? ''
    const note = this.entries.note.get(id)
    return note ? `Note on ${this.titleOf(note.entryType, note.entryId) || note.entryType}` : ''
  }

  subtitleOf(type: OfflineType, id: number): string {
    if (type === 'mark') {
      const r = this.entries.mark.get(id)
      if (!r) return ''
      const maker = r.makerId === null ? undefined : this.entries.maker.get(r.makerId)
      return [maker?.name ?? '', offlineYearRange(r.yearFrom, r.yearTo), r.country].filter(Boolean).join(' · ')
    }
    if (type === 'maker') {
      const r = this.entries.maker.get(id)
      return r ? [r.country, offlineYearRange(r.yearFrom, r.yearTo, r.yearFromApprox, r.yearToApprox)].filter(Boolean).join(' · ') : ''
    }
    if (type === 'material') return this.entries.material.get(id)?.tags.slice(0, 3).join(', ') ?? ''
    if (type === 'category') {
      const parent = this.entries.category.get(id)?.parentId
      return parent ? `in ${this.entries.category.get(parent)?.name ?? ''}`.trim() : ''
    }
    const note = this.entries.note.get(id)
    return note ? note.happenedOn ?? new Date(note.createdAt).toISOString().slice(0, 10) : ''
  }

  /** Search like GET /search: two letters or more find entries; fewer list recent ones. */
  search(q: string, options: DeviceSearchOptions = {}): SearchResponse {
    const started = performance.now()
    const text = q.trim()
    const types = new Set(options.types?.length ? options.types : SEARCH_TYPES)
    const limit = options.limit ?? 20
    const keep = (r: DeviceRecord) => types.has(r.type) && (!r.entry || this.records.has(`${r.entry.type}:${r.entry.id}`))
    const query = text.length >= SEARCH_MIN_QUERY
    let hits: SearchHit[]
    let total: number
    if (query) {
      // The server's own query planning and ranking (shared/search/options.ts), on the phone's index.
      const results = runSearch(this.index, text, { filter: key => keep(this.records.get(key)!), fieldsOf: key => this.records.get(key)?.fields })
      hits = results.slice(0, limit).map(r => this.present(this.records.get(r.id as string)!, r, options))
      total = results.length
    }
    else {
      const picked = [...this.records.values()].filter(keep)
      const letter = foldDiacritics(text).slice(0, 1)
      const starts = (r: DeviceRecord) => letter && foldDiacritics(this.titleOf(r.type, r.id)).startsWith(letter) ? 1 : 0
      picked.sort((a, b) => starts(b) - starts(a) || b.updatedAt - a.updatedAt)
      hits = picked.slice(0, limit).map(r => this.present(r, null, options))
      total = picked.length
    }
    return { hits, total, tookMs: Math.round((performance.now() - started) * 100) / 100, source: 'device', mode: query ? 'results' : 'recent' }
  }

  private present(record: DeviceRecord, result: SearchResult | null, options: DeviceSearchOptions): SearchHit {
    const { matched, snippet } = result ? summariseMatches(record.fields, predicatesFromMatch(result.match)) : { matched: {}, snippet: null }
    const pathOf = options.pathOf ?? ((type: OfflineType, id: number, noteId?: number) => type === 'note'
      ? ''
      : `/t/${this.slug}/${PATH_SEGMENT[type]}/${id}${noteId ? `#note-${noteId}` : ''}`)
    const path = record.entry ? pathOf(record.entry.type, record.entry.id, record.id) : pathOf(record.type, record.id)
    const thumbUrl = record.type === 'mark' || record.type === 'maker' ? options.thumbOf?.(record.type, record.id) : undefined
    return {
      type: record.type, id: record.id, title: this.titleOf(record.type, record.id), subtitle: this.subtitleOf(record.type, record.id),
      score: result ? Math.round(result.score * 1000) / 1000 : 0, matched, snippet, path, ...(thumbUrl ? { thumbUrl } : {}),
    }
  }
}
