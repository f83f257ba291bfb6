// Changes made with no signal — quick-add items, notes, "sold" updates, a variant inscription — wait in
// IndexedDB (not in memory: closing the app or restarting the phone loses nothing) and are sent in order when
// the signal is back (the online event, app start, and a retry every half minute with growing pauses).
// A 409 follows the wiki's rule: nothing is overwritten; the change stays, with the version saved meanwhile,
// until the person picks one (the offline page shows both). Other refusals (400, 403, 404) stay too, marked
// as failed with the server's words, so nothing typed is silently dropped.
import { offlineDb, type QueuedChange } from './offline/db'
import { isNoAnswerError } from './useOnlineStatus'
import { apiFetch, toApiProblem } from './useApi'

export type { QueuedChange }
export interface EnqueueInput { method: QueuedChange['method'], url: string, body?: unknown, label: string, pagePath?: string }

export const QUEUE_RETRY_MS = 30_000
const MAX_BACKOFF_MS = 5 * 60 * 1000

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

/** Reloads the list from IndexedDB (and tells other tabs to). */
export async function offlineReloadQueue(broadcast = false): Promise<void> {
  const db = await offlineDb()
  items.value = (await db.getAll('queue')).sort((a, b) => a.createdAt - b.createdAt || (a.id ?? 0) - (b.id ?? 0))
  if (broadcast) channel?.postMessage('changed')
}

function listen() {
  if (channel || typeof BroadcastChannel === 'undefined') return
  channel = new BroadcastChannel('tallymark-offline-queue')
  channel.onmessage = () => void offlineReloadQueue()
}

/** Stores a change to send later; sends it at once when there is a signal. */
export async function offlineEnqueue(input: EnqueueInput): Promise<QueuedChange> {
  listen()
  const change: QueuedChange = {
    slug: slugOf(input.url), userId: sessionUserId(), method: input.method, url: input.url, body: input.body ?? null, label: input.label, pagePath: input.pagePath,
    createdAt: Date.now(), state: 'pending', attempts: 0, nextAttemptAt: 0, lastError: '',
  }
  const db = await offlineDb()
  change.id = await db.add('queue', change)
  await offlineReloadQueue(true)
  if (navigator.onLine) void offlineFlushQueue()
  return change
}

/**
 * Sends now when possible, else queues: `{ queued: false, result }` when the server answered (its errors are
 * thrown as usual), `{ queued: true }` when there was no signal or no answer.
 */
export async function offlineSendOrQueue<T = unknown>(input: EnqueueInput): Promise<{ queued: true, change: QueuedChange } | { queued: false, result: T }> {
  if (import.meta.client && !navigator.onLine) return { queued: true, change: await offlineEnqueue(input) }
  try {
    return { queued: false, result: await apiFetch<T>(input.url, { method: input.method, body: input.body ?? undefined }) }
  }
  catch (error) {
    if (!isNoAnswerError(error)) throw error
    return { queued: true, change: await offlineEnqueue(input) }
  }
}

async function update(change: QueuedChange) {
  const db = await offlineDb()
  await db.put('queue', JSON.parse(JSON.stringify(change)) as QueuedChange)
}

async function sendOne(change: QueuedChange): Promise<'sent' | 'stop' | 'next'> {
  change.state = 'sending'
  await update(change)
  try {
    const result = await apiFetch(change.url, { method: change.method, body: change.body ?? undefined })
    const db = await offlineDb()
    await db.delete('queue', change.id!)
    lastSentAt.value = Date.now()
    for (const listener of sentListeners) listener(change, result)
    return 'sent'
  }
  catch (error) {
    const problem = toApiProblem(error)
    change.attempts++
    if (isNoAnswerError(error) || problem.statusCode >= 500 || problem.statusCode === 429) {
      // Still no signal (or the server is busy): try again later, in the same order.
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
    for (const change of [...items.value]) {
      if (change.state === 'conflict' || change.state === 'failed') continue
      // Sent only by the person who made it, signed in.
      if (currentUserId === null || (change.userId !== null && change.userId !== currentUserId)) continue
      if (!force && change.nextAttemptAt > Date.now()) continue
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

/** The person's decision on a change the server refused. */
export async function resolveQueued(id: number, choice: 'discard' | 'retry' | 'keep-mine'): Promise<void> {
  const db = await offlineDb()
  const change = await db.get('queue', id)
  if (!change) return
  if (choice === 'discard') await db.delete('queue', id)
  else {
    // "Keep mine": based on the version saved meanwhile, so it replaces it knowingly (and may still meet a newer one).
    if (choice === 'keep-mine' && change.conflict && change.body && typeof change.body === 'object' && 'revision' in change.body) {
      change.body = { ...change.body as Record<string, unknown>, revision: change.conflict.current.revision }
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
  const mine = computed(() => items.value.filter(i => (!slug?.value || i.slug === slug.value) && (i.userId === null || i.userId === currentUser.value)))
  return {
    items: mine,
    waiting: computed(() => mine.value.filter(i => i.state === 'pending' || i.state === 'sending')),
    needsDecision: computed(() => mine.value.filter(i => i.state === 'conflict' || i.state === 'failed')),
    flushing: readonly(flushing),
    lastSentAt: readonly(lastSentAt),
    enqueue: offlineEnqueue,
    sendOrQueue: offlineSendOrQueue,
    flush: () => offlineFlushQueue(true),
    resolve: resolveQueued,
  }
}
