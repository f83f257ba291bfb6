// The team export, second half: the zip, written as the download goes, from the snapshot export.ts left in its
// temporary folder (no database transaction is open any more). Photo files first, one at a time, then team.json;
// the folder is removed when team.json is in the zip, and also when the download is closed early or fails.
//
// A photo that was in the snapshot but whose files are gone when their turn comes (deleted for good during the
// download, or lost from storage) is left out of the files AND of team.json, and logged: the zip never names a
// photo it does not hold, and nothing in team.json refers to a photo. Its uploader may stay among the people.
import { createReadStream } from 'node:fs'
import { createInterface } from 'node:readline'
import { Readable } from 'node:stream'
import { buffer } from 'node:stream/consumers'
import { ZipArchive, type ZipEntryData } from 'archiver'
import { useStorageDriver, type StorageDriver } from '../storage'
import type { TransferExportPhotoLine, TransferExportSnapshot } from './export'
import { TRANSFER_JSON_NAME } from './format'

/** Adds one entry and waits until the zip has written it, so only one photo file is in flight at a time. */
function addEntry(zip: ZipArchive, source: Readable | Buffer, data: ZipEntryData, signal: AbortSignal): Promise<void> {
  return new Promise((resolve, reject) => {
    const done = (error?: Error) => {
      zip.off('entry', onEntry)
      zip.off('error', onError)
      zip.off('close', onClose)
      signal.removeEventListener('abort', onClose)
      if (error) {
        // A stream source left half-read would keep its file open.
        if (!Buffer.isBuffer(source)) source.destroy()
        reject(error)
      }
      else resolve()
    }
    const onEntry = (entry: ZipEntryData) => entry.name === data.name && done()
    const onError = (error: Error) => done(error)
    const onClose = () => done(new Error('The download was closed before the export was complete.'))
    if (signal.aborted) return onClose()
    zip.on('entry', onEntry)
    zip.once('error', onError)
    zip.once('close', onClose)
    signal.addEventListener('abort', onClose, { once: true })
    zip.append(source as Readable, data)
  })
}

/**
 * A stored file whole, or null when it is missing. Read into memory (at most what an upload may store) rather
 * than streamed into the zip, so a slow client never keeps a storage read open: an unread S3 response holds one
 * of the SDK's pooled sockets for as long as the client takes.
 */
async function readStored(storage: StorageDriver, key: string): Promise<Buffer | null> {
  const object = await storage.get(key)
  if (!object) return null
  if (Buffer.isBuffer(object.body)) return object.body
  try {
    return await buffer(object.body)
  }
  catch (error) {
    // Deleted between the local driver's stat and its read: missing, as above.
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null
    throw error
  }
}

async function* photoLines(path: string): AsyncGenerator<TransferExportPhotoLine> {
  const input = createReadStream(path)
  try {
    for await (const line of createInterface({ input, crlfDelay: Infinity })) {
      if (line) yield JSON.parse(line) as TransferExportPhotoLine
    }
  }
  finally {
    input.destroy()
  }
}

async function* fileChunks(path: string): AsyncGenerator<Buffer> {
  for await (const chunk of createReadStream(path)) yield chunk as Buffer
}

/** team.json: the head, the photos whose files are in the zip, the tail. */
async function* teamJson(snapshot: TransferExportSnapshot, leftOut: Set<number>): AsyncGenerator<Buffer | string> {
  yield* fileChunks(snapshot.files.head)
  yield ',"photos":['
  let first = true
  for await (const { photo } of photoLines(snapshot.files.photos)) {
    if (leftOut.has(photo.id)) continue
    yield (first ? '' : ',') + JSON.stringify(photo)
    first = false
  }
  yield ']'
  yield* fileChunks(snapshot.files.tail)
}

async function writeZip(snapshot: TransferExportSnapshot, zip: ZipArchive, signal: AbortSignal, storage: StorageDriver) {
  const leftOut = new Set<number>()
  try {
    for await (const { keys, photo } of photoLines(snapshot.files.photos)) {
      if (signal.aborted) break
      const display = await readStored(storage, keys.display)
      const thumb = display && await readStored(storage, keys.thumb)
      if (!display || !thumb) {
        leftOut.add(photo.id)
        console.warn('[transfer] photo files missing from storage (deleted since the export began, or lost), left out of the export', photo.id)
        continue
      }
      const date = new Date(photo.createdAt)
      // Already compressed images: stored as they are.
      await addEntry(zip, display, { name: photo.files.display, store: true, date }, signal)
      await addEntry(zip, thumb, { name: photo.files.thumb, store: true, date }, signal)
    }
    await addEntry(zip, Readable.from(teamJson(snapshot, leftOut), { objectMode: false }), { name: TRANSFER_JSON_NAME, date: new Date() }, signal)
  }
  finally {
    await snapshot.cleanup()
  }
  await zip.finalize()
}

/**
 * The export zip of a snapshot (transferExportSnapshot) as a stream. `signal` ends the work when the download is
 * closed early; a failure half-way breaks the download (a truncated zip does not open) rather than letting it look
 * complete. The snapshot's folder is removed in every case.
 */
export function transferExportStream(snapshot: TransferExportSnapshot, signal: AbortSignal): Readable {
  const zip = new ZipArchive({ zlib: { level: 6 } })
  writeZip(snapshot, zip, signal, useStorageDriver()).catch((error: unknown) => {
    if (!signal.aborted) console.error('[transfer] export failed', error)
    zip.destroy(error instanceof Error ? error : new Error(String(error)))
  })
  return zip
}
