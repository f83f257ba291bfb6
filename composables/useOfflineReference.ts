// The team's reference on the phone: downloaded on demand (the offline page), then kept fresh in the
// background — on load, when the signal comes back and every few minutes while online — by asking only for
// what changed since the last cursor. Thumbnails fill what is left of the size budget the person chose.
import type { OfflineReferenceResponse, OfflineThumbs, OfflineType } from '~~/shared/offline/types'
import { OFFLINE_FORMAT, OFFLINE_LIST_KEYS, OFFLINE_TYPES } from '~~/shared/offline/types'
import { offlineDb, type OfflineEntryRow, type OfflineTeamMeta } from './offline/db'
import { applyToLoadedIndex, forgetLoadedIndex } from './useOfflineSearch'

export const OFFLINE_BUDGETS_MB = [25, 50, 100, 250] as const
export const OFFLINE_DEFAULT_BUDGET = 50 * 1024 * 1024
/** Background refresh while the app is open and online. */
export const OFFLINE_REFRESH_MS = 5 * 60 * 1000
const THUMB_PARALLEL = 4

export type OfflineSyncState = 'idle' | 'syncing' | 'error'
interface TeamState { meta: OfflineTeamMeta | null, state: OfflineSyncState, error: string, progress: string }

const teams = reactive<Record<string, TeamState>>({})
const running = new Map<string, Promise<void>>()

function teamState(slug: string): TeamState {
  // The server renders every page as "nothing on this phone yet" and keeps no state between requests.
  if (import.meta.server) return { meta: null, state: 'idle', error: '', progress: '' }
  teams[slug] ??= { meta: null, state: 'idle', error: '', progress: '' }
  return teams[slug]!
}

const emptyCounts = (): Record<OfflineType, number> => ({ mark: 0, maker: 0, material: 0, category: 0, note: 0 })
const entryBytes = (data: unknown) => JSON.stringify(data).length

/** Reads what the phone holds for the team (meta only). */
export async function loadOfflineMeta(slug: string): Promise<OfflineTeamMeta | null> {
  const db = await offlineDb()
  const meta = (await db.get('meta', slug)) ?? null
  const state = teamState(slug)
  state.meta = meta
  return meta
}

async function saveMeta(meta: OfflineTeamMeta) {
  const db = await offlineDb()
  await db.put('meta', { ...meta, counts: { ...meta.counts } })
  teamState(meta.slug).meta = meta
}

/** Fetches the reference (or its changes) and stores it; the body size sent over the wire is recorded. */
async function fetchReference(slug: string, meta: OfflineTeamMeta | null, full: boolean): Promise<{ answer: OfflineReferenceResponse, transferBytes: number }> {
  const params = new URLSearchParams()
  if (meta && !full) {
    params.set('since', meta.cursor)
    if (meta.thumbsHash) params.set('thumbs', meta.thumbsHash)
  }
  const url = `/api/teams/${encodeURIComponent(slug)}/offline/reference${params.size ? `?${params}` : ''}`
  const res = await fetch(url, { credentials: 'same-origin', headers: { accept: 'application/json' }, cache: 'no-store' })
  if (!res.ok) {
    const body = await res.json().catch(() => null) as { message?: string } | null
    throw Object.assign(new Error(body?.message ?? `The reference could not be downloaded (${res.status}).`), { statusCode: res.status })
  }
  const answer = await res.json() as OfflineReferenceResponse
  if (answer.format !== OFFLINE_FORMAT) throw new Error('The server sent a reference this version of the app cannot read: reload the app.')
  const timing = performance.getEntriesByName(new URL(url, location.href).href).pop() as PerformanceResourceTiming | undefined
  const transferBytes = timing?.encodedBodySize || Number(res.headers.get('content-length') ?? 0)
  return { answer, transferBytes }
}

async function storeAnswer(slug: string, answer: OfflineReferenceResponse, previous: OfflineTeamMeta | null, transferBytes: number): Promise<OfflineTeamMeta> {
  const db = await offlineDb()
  const tx = db.transaction(['entries', 'meta'], 'readwrite')
  const entries = tx.objectStore('entries')
  if (answer.full) {
    for (const key of await entries.index('slug').getAllKeys(slug)) await entries.delete(key)
  }
  for (const type of OFFLINE_TYPES) {
    for (const data of answer[OFFLINE_LIST_KEYS[type]]) {
      const row: OfflineEntryRow = { slug, key: `${type}:${data.id}`, type, id: data.id, data, bytes: entryBytes(data) }
      await entries.put(row)
    }
    for (const id of answer.removed[type]) await entries.delete([slug, `${type}:${id}`])
  }
  // Totals from what is stored now (keys only for the counts; sizes from the rows).
  const counts = emptyCounts()
  let dataBytes = 0
  let cursor = await entries.index('slug').openCursor(slug)
  while (cursor) {
    counts[cursor.value.type]++
    dataBytes += cursor.value.bytes
    cursor = await cursor.continue()
  }
  const now = Date.now()
  const meta: OfflineTeamMeta = {
    slug, teamName: answer.team.name, cursor: answer.cursor, syncedAt: now, fullAt: answer.full ? now : previous?.fullAt ?? now,
    thumbsHash: answer.thumbs?.hash ?? previous?.thumbsHash ?? '', dataBytes, thumbBytes: previous?.thumbBytes ?? 0,
    lastTransferBytes: transferBytes, counts, budgetBytes: previous?.budgetBytes ?? OFFLINE_DEFAULT_BUDGET, thumbsMissing: previous?.thumbsMissing ?? 0,
    thumbList: answer.thumbs ?? previous?.thumbList ?? null,
  }
  await tx.objectStore('meta').put(meta)
  await tx.done
  teamState(slug).meta = meta
  return meta
}

/** Thumbnails: drops the ones no longer first on their entry, then fetches missing ones within the budget. */
async function syncThumbs(slug: string, meta: OfflineTeamMeta, list: OfflineThumbs, signal?: AbortSignal): Promise<OfflineTeamMeta> {
  const db = await offlineDb()
  const wanted = new Map<string, number>()
  for (const [id, photoId] of list.mark) wanted.set(`mark:${id}`, photoId)
  for (const [id, photoId] of list.maker) wanted.set(`maker:${id}`, photoId)
  let thumbBytes = 0
  const have = new Set<string>()
  for (const row of await db.getAllFromIndex('thumbs', 'slug', slug)) {
    if (wanted.get(row.key) === row.photoId) {
      have.add(row.key)
      thumbBytes += row.bytes
    }
    else await db.delete('thumbs', [slug, row.key])
  }
  const missing = [...wanted].filter(([key]) => !have.has(key))
  const state = teamState(slug)
  let done = 0
  let full = meta.dataBytes + thumbBytes >= meta.budgetBytes
  const worker = async () => {
    while (missing.length && !full && !signal?.aborted) {
      const [key, photoId] = missing.shift()!
      try {
        const res = await fetch(`/api/teams/${encodeURIComponent(slug)}/photos/${photoId}/thumb`, { credentials: 'same-origin' })
        if (!res.ok) continue
        const blob = await res.blob()
        if (meta.dataBytes + thumbBytes + blob.size > meta.budgetBytes) {
          full = true
          missing.unshift([key, photoId])
          break
        }
        await db.put('thumbs', { slug, key, photoId, blob, bytes: blob.size })
        thumbBytes += blob.size
        done++
        if (done % 20 === 0) state.progress = `Photos: ${done} of ${done + missing.length} saved`
      }
      catch {
        // No signal any more: the rest waits for the next sync.
        missing.unshift([key, photoId])
        break
      }
    }
  }
  await Promise.all(Array.from({ length: THUMB_PARALLEL }, worker))
  state.progress = ''
  const next = { ...meta, thumbBytes, thumbsMissing: missing.length }
  await saveMeta(next)
  return next
}

/**
 * Downloads the team's reference (everything the first time, then only changes) and its thumbnails. One run
 * per team at a time; a second call waits for the first.
 */
export function syncOfflineReference(slug: string, options: { full?: boolean } = {}): Promise<void> {
  const existing = running.get(slug)
  if (existing) return existing
  const state = teamState(slug)
  const run = (async () => {
    state.state = 'syncing'
    state.error = ''
    state.progress = 'Downloading the reference…'
    try {
      const previous = await loadOfflineMeta(slug)
      const { answer, transferBytes } = await fetchReference(slug, previous, options.full || !previous)
      let meta = await storeAnswer(slug, answer, previous, transferBytes)
      applyToLoadedIndex(slug, answer)
      // The thumbnail list is only sent when it changed; the last one is kept in meta for budget top-ups.
      const list = meta.thumbList
      if (list && (answer.thumbs || meta.thumbsMissing > 0)) {
        meta = await syncThumbs(slug, meta, list)
        forgetLoadedIndex(slug)
      }
      state.state = 'idle'
      if (navigator.storage?.persist) void navigator.storage.persist().catch(() => false)
    }
    catch (error) {
      state.state = 'error'
      state.error = error instanceof Error ? error.message : 'The reference could not be downloaded.'
    }
    finally {
      state.progress = ''
      running.delete(slug)
    }
  })()
  running.set(slug, run)
  return run
}

/** Removes the team's reference and thumbnails from the phone (the queue of unsent changes stays). */
export async function clearOfflineReference(slug: string): Promise<void> {
  await running.get(slug)?.catch(() => {})
  const db = await offlineDb()
  const tx = db.transaction(['entries', 'thumbs', 'meta'], 'readwrite')
  for (const key of await tx.objectStore('entries').index('slug').getAllKeys(slug)) await tx.objectStore('entries').delete(key)
  for (const key of await tx.objectStore('thumbs').index('slug').getAllKeys(slug)) await tx.objectStore('thumbs').delete(key)
  await tx.objectStore('meta').delete(slug)
  await tx.done
  forgetLoadedIndex(slug)
  const state = teamState(slug)
  state.meta = null
  state.error = ''
}

/** Changes the size budget; more room fetches more thumbnails, less removes the ones over it. */
export async function setOfflineBudget(slug: string, budgetBytes: number): Promise<void> {
  const meta = await loadOfflineMeta(slug)
  if (!meta) return
  const db = await offlineDb()
  let thumbBytes = meta.thumbBytes
  let removed = 0
  if (meta.dataBytes + thumbBytes > budgetBytes) {
    for (const row of await db.getAllFromIndex('thumbs', 'slug', slug)) {
      if (meta.dataBytes + thumbBytes <= budgetBytes) break
      await db.delete('thumbs', [slug, row.key])
      thumbBytes -= row.bytes
      removed++
    }
  }
  await saveMeta({ ...meta, budgetBytes, thumbBytes, thumbsMissing: meta.thumbsMissing + removed })
  forgetLoadedIndex(slug)
  if (budgetBytes > meta.budgetBytes && navigator.onLine) await syncOfflineReference(slug)
}

/** The reactive state of one team's copy: meta (null when nothing is on the phone), sync state and error. */
export function useOfflineReference(slug: Readonly<Ref<string>>) {
  const state = computed(() => teamState(slug.value))
  if (import.meta.client) {
    watch(slug, (s) => { if (s) void loadOfflineMeta(s) }, { immediate: true })
  }
  return {
    meta: computed(() => state.value.meta),
    syncing: computed(() => state.value.state === 'syncing'),
    error: computed(() => state.value.error),
    progress: computed(() => state.value.progress),
    sync: (full = false) => syncOfflineReference(slug.value, { full }),
    clear: () => clearOfflineReference(slug.value),
    setBudget: (bytes: number) => setOfflineBudget(slug.value, bytes),
  }
}

/** Background refresh of every team whose reference is on the phone (started by plugins/offline.client.ts). */
export async function refreshAllOfflineReferences(): Promise<void> {
  if (!navigator.onLine) return
  const db = await offlineDb()
  for (const slug of await db.getAllKeys('meta')) await syncOfflineReference(slug)
}

/** Sizes for people: "1.4 MB". */
export function offlineFormatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(bytes < 10 * 1024 ? 1 : 0)} kB`
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`
}
