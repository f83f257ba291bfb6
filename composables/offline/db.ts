// The phone's own database (IndexedDB through idb): the team's reference, its thumbnails and the queue of
// changes made with no signal. Survives closing the app and restarting the phone; "Clear" on the offline
// page empties the reference of one team (never the queue of unsent changes without asking).
import { openDB, type DBSchema, type IDBPDatabase } from 'idb'
import type { OfflineEntryByType, OfflineThumbs, OfflineType } from '~~/shared/offline/types'

export interface OfflineTeamMeta {
  slug: string
  teamName: string
  cursor: string
  /** When the last download (full or changes) finished, ms. */
  syncedAt: number
  /** When the first full download finished, ms. */
  fullAt: number
  thumbsHash: string
  /** Bytes of entries and thumbnails kept on the phone. */
  dataBytes: number
  thumbBytes: number
  /** Bytes sent by the server for the last download (compressed). */
  lastTransferBytes: number
  counts: Record<OfflineType, number>
  /** Thumbnails are kept while the total stays below this. */
  budgetBytes: number
  /** Thumbnails the server lists that are not on the phone (budget reached, or not fetched yet). */
  thumbsMissing: number
  /** The server's last list of thumbnails (sent only when it changes). */
  thumbList: OfflineThumbs | null
}

export interface OfflineEntryRow<T extends OfflineType = OfflineType> {
  slug: string
  key: string
  type: T
  id: number
  data: OfflineEntryByType[T]
  bytes: number
}

export interface OfflineThumbRow { slug: string, key: string, photoId: number, blob: Blob, bytes: number }

export type QueueState = 'pending' | 'sending' | 'conflict' | 'failed' | 'sent'
export interface QueuedChange {
  id?: number
  slug: string
  /** Who made it: only they send it (another person signed in on the same phone does not). */
  userId: number | null
  method: 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  url: string
  body: unknown
  /** What it is, in the person's words: "Note on HALLOWELL POTTERY CO". */
  label: string
  /** The app page the change belongs to, for "open". */
  pagePath?: string
  createdAt: number
  state: QueueState
  attempts: number
  nextAttemptAt: number
  lastError: string
  /** The version the change was made on (an item's fields), so a 409 can show what someone else changed meanwhile. */
  base?: Record<string, unknown>
  /** A 409: the server's message and the version saved meanwhile, kept until the person decides. */
  conflict?: { message: string, current: Record<string, unknown> }
  /**
   * Sent as the Idempotency-Key header with a POST: the same for every attempt of the same change, so a
   * retry after an answer that never arrived gets the first answer instead of adding the change twice.
   */
  idempotencyKey?: string
  /** A photo: its bytes wait in the queueFiles store; `body` holds the form's other fields. */
  upload?: { fileName: string }
  /**
   * Another queued change this one needs first (a photo of an item added with no signal): when that one
   * is saved, the id the server gave it becomes this change's body.entityId.
   */
  dependsOn?: number
  /** When it reached the server (state "sent": kept a day so the person sees it went). */
  sentAt?: number
  /** The page of what the server saved (the item the change created, for example). */
  resultPath?: string
}

/** A queued photo's bytes, kept apart from the queue so listing the queue never loads them. */
export interface QueuedFile { changeId: number, blob: Blob }

interface OfflineSchema extends DBSchema {
  meta: { key: string, value: OfflineTeamMeta }
  entries: { key: [string, string], value: OfflineEntryRow, indexes: { slug: string } }
  thumbs: { key: [string, string], value: OfflineThumbRow, indexes: { slug: string } }
  queue: { key: number, value: QueuedChange, indexes: { slug: string } }
  queueFiles: { key: number, value: QueuedFile }
}

export const OFFLINE_DB_NAME = 'tallymark-offline'
let opening: Promise<IDBPDatabase<OfflineSchema>> | null = null

export function offlineDb(): Promise<IDBPDatabase<OfflineSchema>> {
  opening ??= openDB<OfflineSchema>(OFFLINE_DB_NAME, 2, {
    upgrade(db, oldVersion) {
      if (oldVersion < 1) {
        db.createObjectStore('meta', { keyPath: 'slug' })
        db.createObjectStore('entries', { keyPath: ['slug', 'key'] }).createIndex('slug', 'slug')
        db.createObjectStore('thumbs', { keyPath: ['slug', 'key'] }).createIndex('slug', 'slug')
        db.createObjectStore('queue', { keyPath: 'id', autoIncrement: true }).createIndex('slug', 'slug')
      }
      // Version 2: photos taken with no signal wait here as Blobs until their upload.
      if (oldVersion < 2) db.createObjectStore('queueFiles', { keyPath: 'changeId' })
    },
    // Another tab upgrades: let it, and open again next time.
    blocking() {
      void opening?.then(db => db.close())
      opening = null
    },
  }).catch((error: unknown) => {
    opening = null
    throw error
  })
  return opening
}
