// Receives the team zip of an import: the multipart field "file" goes straight to a temporary file (busboy),
// never whole into memory; the zip is then read from disk (yauzl needs random access to its directory).
import { createWriteStream } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pipeline } from 'node:stream/promises'
import busboy from 'busboy'
import type { H3Event } from 'h3'
import { TRANSFER_LIMITS } from './format'

export interface TransferUpload { path: string, cleanup: () => Promise<void> }

const TOO_LARGE = `The file is larger than ${TRANSFER_LIMITS.zipBytes / 1024 / 1024 / 1024} GB, the most one import takes.`

export async function transferReadUpload(event: H3Event): Promise<TransferUpload> {
  const headers = event.node.req.headers
  if (!/^multipart\/form-data\s*;/i.test(headers['content-type'] ?? '')) {
    throw httpError(415, 'Send the team export as multipart/form-data, in a field named "file".')
  }
  const declared = Number(headers['content-length'])
  if (Number.isFinite(declared) && declared > TRANSFER_LIMITS.zipBytes + 64 * 1024) throw httpError(413, TOO_LARGE)
  const dir = await mkdtemp(join(tmpdir(), 'tallymark-import-'))
  const path = join(dir, 'team.zip')
  const cleanup = () => rm(dir, { recursive: true, force: true })
  try {
    await new Promise<void>((resolve, reject) => {
      let parser: busboy.Busboy
      try {
        parser = busboy({ headers, limits: { files: 1, fileSize: TRANSFER_LIMITS.zipBytes, fields: 10, parts: 12 } })
      }
      catch {
        return reject(httpError(400, 'The upload could not be read as multipart form data.'))
      }
      let saving: Promise<void> | null = null
      let truncated = false
      parser.on('file', (name, stream) => {
        if (name !== 'file' || saving) {
          stream.resume()
          return
        }
        stream.on('limit', () => { truncated = true })
        saving = pipeline(stream, createWriteStream(path, { mode: 0o600 }))
      })
      parser.on('error', () => reject(httpError(400, 'The upload could not be read as multipart form data.')))
      parser.on('close', () => {
        if (!saving) return reject(httpError(400, 'Choose the team export (.zip) to import (form field "file").', { file: ['Choose a .zip file.'] }))
        saving.then(() => truncated ? reject(httpError(413, TOO_LARGE)) : resolve(), reject)
      })
      event.node.req.on('error', reject)
      event.node.req.pipe(parser)
    })
    return { path, cleanup }
  }
  catch (error) {
    await cleanup()
    throw error
  }
}
