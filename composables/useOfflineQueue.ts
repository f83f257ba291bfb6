// Changes made with no signal — quick-add items and their photos, notes, "sold" updates, a variant
// inscription — wait in IndexedDB (not in memory: closing the app or restarting the phone loses nothing) and
// are sent in order when the signal is back (the online event, app start, and a retry every half minute
// with growing pauses). Every POST carries an Idempotency-Key chosen when the change was made, so a retry
// after an answer that never arrived gets the first answer back instead of saving the change twice
// (server/utils/idempotency.ts). A photo of an item added offline waits for its item and is then uploaded
// to it. A 409 follows the wiki's rule: nothing is overwritten; the change stays, with the version saved
// meanwhile, until the person picks one (the offline page shows both). Other refusals (400, 403, 404) stay
// too, marked as failed with the server's words, so nothing typed is silently dropped. Sent changes are
// listed as sent for a day.
import { offlineDb, type QueuedChange } from './offline/db'
import { isNoAnswerError } from './useOnlineStatus'
import { apiFetch, toApiProblem } from './useApi'

export type { QueuedChange }
export interface EnqueueInput {
  method: QueuedChange['method']
  url: string
  body?: unknown
  label: string
  pagePath?: string
  /** A photo to upload (multipart, field "file"); `body` then holds the other form fields. */
  file?: Blob
  fileName?: string
  /** The queued change this one needs first (its result's id becomes body.entityId). */
  dependsOn?: number
  /** Reused when a change first tried online is queued after getting no answer. */
  idempotencyKey?: string
  /** The version the change was made on (see QueuedChange.base): any plain record, such as an item. */
  base?: object
}

export const QUEUE_RETRY_MS = 30_000
const MAX_BACKOFF_MS = 5 * 60 * 1000
const SENT_KEPT_MS = 24 * 60 * 60 * 1000

const items = ref<QueuedChange[]>([])
const flushing = ref(false)
const lastSentAt = ref(0)
let channel: BroadcastChannel | null = null
const sentListeners = new Set<(change: QueuedChange, result: unknown) => void>()

/** The signed-in person (set by plugins/offline.client.ts from the session). */
let currentUserId: number | null = null
const currentUser = ref<number | null>(null)
export function offlineSetQueueUser(id: number | null): void {
  currentUserId = id
  currentUser.value = id
}
const sessionUserId = () => currentUserId

function slugOf(url: string): string {
  return /^\/api\/teams\/([^/]+)\//.exec(url)?.[1] ?? ''
}

/** A fresh key for one change (every attempt of that change sends the same one). */
export function offlineNewKey(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  // Older browsers on plain http: 122 random bits in the UUID layout.
  const b = crypto.getRandomValues(new Uint8Array(16))
  b[6] = (b[6]! & 0x0F) | 0x40
  b[8] = (b[8]! & 0x3F) | 0x80
  const hex = [...b].map(x => x.toString(16).padStart(2, '0')).join('')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`
}

/** Reloads the list from IndexedDB (and tells other tabs to); sent changes older than a day are dropped. */
export async function offlineReloadQueue(broadcast = false): Promise<void> {
  const db = await offlineDb()
  const all = await db.getAll('queue')
  const old = all.filter(c => c.state === 'sent' && (c.sentAt ?? 0) < Date.now() - SENT_KEPT_MS)
  for (const change of old) await db.delete('queue', change.id!)
  items.value = all.filter(c => !old.includes(c)).sort((a, b) => a.createdAt - b.createdAt || (a.id ?? 0) - (b.id ?? 0))
  if (broadcast) channel?.postMessage('changed')
}

function listen() {
  if (channel || typeof BroadcastChannel === 'undefined') return
  channel = new BroadcastChannel('tallymark-offline-queue')
  channel.onmessage = () => void offlineReloadQueue()
}

/** Stores a change to send later (a photo with its bytes, in one transaction); sends it at once when there is a signal. */
export async function offlineEnqueue(input: EnqueueInput): Promise<QueuedChange> {
  listen()
  const change: QueuedChange = {
    slug: slugOf(input.url), userId: sessionUserId(), method: input.method, url: input.url, body: input.body ?? null, label: input.label, pagePath: input.pagePath,
    createdAt: Date.now(), state: 'pending', attempts: 0, nextAttemptAt: 0, lastError: '',
    idempotencyKey: input.method === 'POST' ? input.idempotencyKey ?? offlineNewKey() : undefined,
    upload: input.file ? { fileName: input.fileName || 'photo.jpg' } : undefined,
    dependsOn: input.dependsOn,
    // A plain copy: IndexedDB stores structured clones, and a reactive proxy is not one.
    base: input.base ? JSON.parse(JSON.stringify(input.base)) : undefined,
  }
  const db = await offlineDb()
  const tx = db.transaction(['queue', 'queueFiles'], 'readwrite')
  change.id = await tx.objectStore('queue').add(change)
  if (input.file) await tx.objectStore('queueFiles').put({ changeId: change.id, blob: input.file })
  await tx.done
  await offlineReloadQueue(true)
  if (navigator.onLine) void offlineFlushQueue()
  return change
}

/** The request of a change: JSON, or the photo's form rebuilt from the stored Blob. */
async function requestOf(change: QueuedChange): Promise<{ body: unknown, headers: Record<string, string> }> {
  const headers: Record<string, string> = change.idempotencyKey ? { 'Idempotency-Key': change.idempotencyKey } : {}
  if (!change.upload) return { body: change.body ?? undefined, headers }
  const stored = await (await offlineDb()).get('queueFiles', change.id!)
  if (!stored) throw new Error('The photo is no longer on this phone.')
  const form = new FormData()
  form.append('file', stored.blob, change.upload.fileName)
  for (const [name, value] of Object.entries((change.body ?? {}) as Record<string, unknown>)) {
    if (value !== null && value !== undefined) form.append(name, String(value))
  }
  return { body: form, headers }
}

/**
 * Sends now when possible, else queues: `{ queued: false, result }` when the server answered (its errors are
 * thrown as usual), `{ queued: true }` when there was no signal or no answer. A POST is sent with the key it
 * keeps in the queue, so if its answer was lost, the retry is recognised by the server.
 */
export async function offlineSendOrQueue<T = unknown>(input: EnqueueInput): Promise<{ queued: true, change: QueuedChange } | { queued: false, result: T }> {
  const key = input.method === 'POST' ? input.idempotencyKey ?? offlineNewKey() : undefined
  const queue = async () => ({ queued: true as const, change: await offlineEnqueue({ ...input, idempotencyKey: key }) })
  // With no signal, or waiting for a change still in the queue (its id is not known yet): queued.
  if ((import.meta.client && !navigator.onLine) || input.dependsOn !== undefined) return await queue()
  try {
    let body: unknown = input.body ?? undefined
    if (input.file) {
      const form = new FormData()
      form.append('file', input.file, input.fileName || 'photo.jpg')
      for (const [name, value] of Object.entries((input.body ?? {}) as Record<string, unknown>)) if (value !== null && value !== undefined) form.append(name, String(value))
      body = form
    }
    const result = await apiFetch<T>(input.url, { method: input.method, body, headers: key ? { 'Idempotency-Key': key } : undefined })
    return { queued: false, result }
  }
  catch (error) {
    if (!isNoAnswerError(error)) throw error
    return await queue()
  }
}

async function update(change: QueuedChange) {
  const db = await offlineDb()
  await db.put('queue', JSON.parse(JSON.stringify(change)) as QueuedChange)
}

/** The app page of what a change saved, when the answer names it (an item, a photo's item). */
function resultPathOf(change: QueuedChange, result: unknown): string | undefined {
  const r = result as { id?: unknown, item?: { id?: unknown } } | null
  const slug = change.slug
  if (!slug) return change.pagePath
  if (/\/items$/.test(change.url) && typeof r?.id === 'number') return `/t/${slug}/items/${r.id}`
  if (typeof r?.item?.id === 'number') return `/t/${slug}/items/${r.item.id}`
  const entityId = (change.body as { entityId?: unknown } | null)?.entityId
  if (change.upload && typeof entityId === 'number') return `/t/${slug}/items/${entityId}`
  return change.pagePath
}

async function markSent(change: QueuedChange, result: unknown) {
  const db = await offlineDb()
  const tx = db.transaction(['queue', 'queueFiles'], 'readwrite')
  const queue = tx.objectStore('queue')
  const sent: QueuedChange = JSON.parse(JSON.stringify({ ...change, state: 'sent', sentAt: Date.now(), lastError: '', conflict: undefined, resultPath: resultPathOf(change, result) }))
  await queue.put(sent)
  await tx.objectStore('queueFiles').delete(change.id!)
  // What waited for this change (a photo for its new item) now knows the id the server gave it.
  const newId = (result as { id?: unknown } | null)?.id
  for (const other of await queue.getAll()) {
    if (other.dependsOn !== change.id) continue
    if (typeof newId === 'number') other.body = { ...(other.body as Record<string, unknown>), entityId: newId }
    other.dependsOn = undefined
    await queue.put(other)
  }
  await tx.done
}

async function sendOne(change: QueuedChange): Promise<'sent' | 'stop' | 'next'> {
  change.state = 'sending'
  change.idempotencyKey ??= change.method === 'POST' ? offlineNewKey() : undefined
  await update(change)
  try {
    const request = await requestOf(change)
    const result = await apiFetch(change.url, { method: change.method, ...request })
    await markSent(change, result)
    lastSentAt.value = Date.now()
    for (const listener of sentListeners) listener(change, result)
    return 'sent'
  }
  catch (error) {
    const problem = toApiProblem(error)
    change.attempts++
    // Still no signal, the server busy, or the first attempt still being saved there: try again later, in order.
    if (isNoAnswerError(error) || problem.statusCode >= 500 || problem.statusCode === 429 || (problem.statusCode === 409 && problem.data.inProgress)) {
      change.state = 'pending'
      change.lastError = problem.statusCode ? problem.message : 'Waiting for a signal.'
      change.nextAttemptAt = Date.now() + Math.min(MAX_BACKOFF_MS, QUEUE_RETRY_MS * 2 ** Math.min(change.attempts - 1, 4))
      await update(change)
      return 'stop'
    }
    if (problem.statusCode === 401) {
      change.state = 'pending'
      change.lastError = 'Sign in again to send this.'
      await update(change)
      return 'stop'
    }
    if (problem.statusCode === 409 && problem.data.current && typeof problem.data.current === 'object') {
      change.state = 'conflict'
      change.conflict = { message: problem.message, current: problem.data.current as Record<string, unknown> }
    }
    else change.state = 'failed'
    change.lastError = problem.message
    await update(change)
    return 'next'
  }
}

/** Sends what is due, oldest first; one tab at a time (Web Locks), stopping at the first change with no answer. */
export async function offlineFlushQueue(force = false): Promise<void> {
  if (flushing.value || !navigator.onLine) return
  flushing.value = true
  const work = async () => {
    await offlineReloadQueue()
    const db = await offlineDb()
    for (const listed of [...items.value]) {
      // Read again: a change sent just before may have filled in this one's item.
      const change = await db.get('queue', listed.id!)
      if (!change || change.state === 'conflict' || change.state === 'failed' || change.state === 'sent') continue
      // Sent only by the person who made it, signed in.
      if (currentUserId === null || (change.userId !== null && change.userId !== currentUserId)) continue
      if (!force && change.nextAttemptAt > Date.now()) continue
      if (change.dependsOn !== undefined) {
        const first = await db.get('queue', change.dependsOn)
        if (first) {
          const note = first.state === 'conflict' || first.state === 'failed' ? `Waits for “${first.label}”, which needs your decision.` : ''
          if (note !== change.lastError) await update({ ...change, lastError: note })
          continue
        }
        // What it waited for was dropped: nothing to attach to.
        await update({ ...change, dependsOn: undefined, state: 'failed', lastError: 'What this was for was dropped before it was sent.' })
        continue
      }
      const outcome = await sendOne(change)
      if (outcome === 'stop') break
    }
    await offlineReloadQueue(true)
  }
  try {
    if (navigator.locks?.request) await navigator.locks.request('tallymark-offline-queue', work)
    else await work()
  }
  finally {
    flushing.value = false
  }
}

async function remove(id: number) {
  const db = await offlineDb()
  const tx = db.transaction(['queue', 'queueFiles'], 'readwrite')
  await tx.objectStore('queue').delete(id)
  await tx.objectStore('queueFiles').delete(id)
  await tx.done
}

/** The person's decision on a change the server refused (dropping one drops what waits for it, e.g. its photo). */
export async function resolveQueued(id: number, choice: 'discard' | 'retry' | 'keep-mine'): Promise<void> {
  const db = await offlineDb()
  const change = await db.get('queue', id)
  if (!change) return
  if (choice === 'discard') {
    await remove(id)
    for (const other of await db.getAll('queue')) if (other.dependsOn === id) await remove(other.id!)
  }
  else {
    // "Keep mine": based on the version saved meanwhile, so it replaces it knowingly (and may still meet a newer one).
    if (choice === 'keep-mine' && change.conflict && change.body && typeof change.body === 'object' && 'revision' in change.body) {
      change.body = { ...change.body as Record<string, unknown>, revision: change.conflict.current.revision }
      // Another request now: a new key (the old one belongs to the refused body).
      if (change.method === 'POST') change.idempotencyKey = offlineNewKey()
    }
    change.state = 'pending'
    change.conflict = undefined
    change.nextAttemptAt = 0
    change.lastError = ''
    await update(change)
  }
  await offlineReloadQueue(true)
  if (choice !== 'discard') await offlineFlushQueue(true)
}

/** Forgets the changes already sent (the list of sent ones is only a receipt). */
export async function offlineClearSent(slug?: string): Promise<void> {
  const db = await offlineDb()
  for (const change of await db.getAll('queue')) if (change.state === 'sent' && (!slug || change.slug === slug)) await db.delete('queue', change.id!)
  await offlineReloadQueue(true)
}

/** Calls back after each queued change reached the server (pages refresh what they show). */
export function offlineOnQueuedSent(listener: (change: QueuedChange, result: unknown) => void): () => void {
  sentListeners.add(listener)
  return () => sentListeners.delete(listener)
}

export function useOfflineQueue(slug?: Readonly<Ref<string>>) {
  if (import.meta.client) {
    listen()
    void offlineReloadQueue()
  }
  const all = computed(() => items.value.filter(i => (!slug?.value || i.slug === slug.value) && (i.userId === null || i.userId === currentUser.value)))
  const mine = computed(() => all.value.filter(i => i.state !== 'sent'))
  return {
    items: mine,
    sent: computed(() => all.value.filter(i => i.state === 'sent').sort((a, b) => (b.sentAt ?? 0) - (a.sentAt ?? 0))),
    waiting: computed(() => mine.value.filter(i => i.state === 'pending' || i.state === 'sending')),
    needsDecision: computed(() => mine.value.filter(i => i.state === 'conflict' || i.state === 'failed')),
    flushing: readonly(flushing),
    lastSentAt: readonly(lastSentAt),
    enqueue: offlineEnqueue,
    sendOrQueue: offlineSendOrQueue,
    flush: () => offlineFlushQueue(true),
    resolve: resolveQueued,
    clearSent: () => offlineClearSent(slug?.value),
  }
}
