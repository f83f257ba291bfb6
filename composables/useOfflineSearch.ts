// Search on the phone: when there is no signal (or the server cannot be reached), the search box and the
// results page are answered from the team's reference in IndexedDB, through shared/offline/device-index.ts —
// MiniSearch with the server's very options — and the answer says it came from the phone.
import type { SearchResponse, SearchType } from '~~/shared/search/types'
import { SEARCH_TYPES } from '~~/shared/search/types'
import { OfflineDeviceIndex } from '~~/shared/offline/device-index'
import { OFFLINE_LIST_KEYS, OFFLINE_TYPES, type OfflineReferenceResponse, type OfflineType } from '~~/shared/offline/types'
import { offlineDb, type OfflineEntryRow } from './offline/db'
import { isNoAnswerError } from './useOnlineStatus'

interface Loaded { index: OfflineDeviceIndex, thumbs: Map<string, Blob>, urls: Map<string, string> }
const loaded = new Map<string, Promise<Loaded | null>>()

/** The app page of an entry kept on the phone (readable with no signal). */
export const savedEntryPath = (slug: string, type: OfflineType, id: number, noteId?: number) =>
  `/t/${slug}/saved/${type}/${id}${noteId ? `#note-${noteId}` : ''}`

async function build(slug: string): Promise<Loaded | null> {
  const db = await offlineDb()
  if (!(await db.get('meta', slug))) return null
  const rows = await db.getAllFromIndex('entries', 'slug', slug) as OfflineEntryRow[]
  const index = new OfflineDeviceIndex(slug)
  // Makers before marks: a mark's document carries its maker's names.
  for (const type of ['maker', 'material', 'category', 'mark', 'note'] as const) {
    index.put(type, rows.filter(r => r.type === type).map(r => r.data) as never)
  }
  const thumbs = new Map<string, Blob>()
  for (const t of await db.getAllFromIndex('thumbs', 'slug', slug)) thumbs.set(t.key, t.blob)
  return { index, thumbs, urls: new Map() }
}

/** The team's device index, built from IndexedDB on first use and kept in memory. */
export function loadDeviceIndex(slug: string): Promise<Loaded | null> {
  let found = loaded.get(slug)
  if (!found) {
    found = build(slug).catch(() => null)
    loaded.set(slug, found)
    // Nothing on the phone yet: ask again next time.
    void found.then((v) => { if (!v) loaded.delete(slug) })
  }
  return found
}

/** Applies a downloaded answer to an index already in memory (a full answer rebuilds it on next use). */
export function applyToLoadedIndex(slug: string, answer: OfflineReferenceResponse): void {
  const current = loaded.get(slug)
  if (!current) return
  if (answer.full || answer.thumbs) {
    forgetLoadedIndex(slug)
    return
  }
  void current.then((l) => {
    if (!l) return
    for (const type of ['maker', 'material', 'category', 'mark', 'note'] as const) l.index.put(type, answer[OFFLINE_LIST_KEYS[type]] as never)
    for (const type of OFFLINE_TYPES) if (answer.removed[type].length) l.index.remove(type, answer.removed[type])
  })
}

export function forgetLoadedIndex(slug: string): void {
  const current = loaded.get(slug)
  loaded.delete(slug)
  void current?.then(l => l?.urls.forEach(url => URL.revokeObjectURL(url)))
}

/** An object URL for the thumbnail kept on the phone, if any. */
export function deviceThumbUrl(l: Loaded, type: 'mark' | 'maker', id: number): string | undefined {
  const key = `${type}:${id}`
  const blob = l.thumbs.get(key)
  if (!blob) return undefined
  let url = l.urls.get(key)
  if (!url) l.urls.set(key, url = URL.createObjectURL(blob))
  return url
}

/** The search API's answer from the phone's copy, or null when the phone holds no copy of this team. */
export async function offlineSearch(slug: string, params: Record<string, unknown>): Promise<SearchResponse | null> {
  const l = await loadDeviceIndex(slug)
  if (!l) return null
  const raw = typeof params.types === 'string' ? params.types.split(',') : []
  const types = raw.map(t => SEARCH_TYPES.find(s => s === t || `${s}s` === t || (s === 'category' && t === 'categories'))).filter((t): t is SearchType => Boolean(t))
  return l.index.search(String(params.q ?? ''), {
    types,
    limit: Number(params.limit) || 20,
    pathOf: (type, id, noteId) => savedEntryPath(slug, type, id, noteId),
    thumbOf: (type, id) => deviceThumbUrl(l, type, id),
  })
}

/**
 * The hook of the search box and the results page: with no signal, or when the request gets no answer,
 * the phone's copy answers (source "device"); with no copy on the phone the original error stands.
 */
export async function searchWithOfflineFallback(slug: string, params: Record<string, unknown>, request: () => Promise<SearchResponse>): Promise<SearchResponse> {
  if (import.meta.client && !navigator.onLine) {
    const local = await offlineSearch(slug, params)
    if (local) return local
  }
  try {
    return await request()
  }
  catch (error) {
    if (!import.meta.client || !isNoAnswerError(error)) throw error
    const local = await offlineSearch(slug, params)
    if (local) return local
    throw error
  }
}

export function useOfflineSearch(slug: Readonly<Ref<string>>) {
  return {
    search: (q: string, extra: Record<string, unknown> = {}) => offlineSearch(slug.value, { q, ...extra }),
    index: () => loadDeviceIndex(slug.value),
  }
}
