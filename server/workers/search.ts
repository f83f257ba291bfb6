// The search worker thread: the team indexes (server/utils/search/manager.ts) live here, on a core and a heap
// of their own, so building an index of 160,000 documents, and its garbage collection, never hold up the
// requests the main thread serves. The main thread asks through server/utils/search/worker-client.ts.
// Bundled into the build as search-worker.mjs by modules/search-worker.ts.
import { parentPort, workerData } from 'node:worker_threads'
import { drizzle } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import * as schema from '../database/schema'
import { searchConfigFromEnv } from '../utils/search/config'
import { SearchService } from '../utils/search/manager'
import type { SearchWorkerData, SearchWorkerError, SearchWorkerReply, SearchWorkerRequest } from '../utils/search/worker-client'

const port = parentPort!
const { databaseUrl } = workerData as SearchWorkerData
// The same settings as the app's own pool (server/utils/db.ts).
const pool = mysql.createPool({ uri: databaseUrl, connectionLimit: 10, timezone: 'Z', supportBigNumbers: true, charset: 'utf8mb4_unicode_ci', connectTimeout: 5_000 })
pool.on('connection', conn => void conn.query('SET time_zone = \'+00:00\''))
const service = new SearchService(drizzle(pool, { schema, mode: 'default' }), searchConfigFromEnv()).start()

/** The message and the first database error code along the cause chain. */
function errorOf(error: unknown): SearchWorkerError {
  const out: SearchWorkerError = { message: error instanceof Error ? error.message : String(error) }
  for (let e = error as { code?: unknown, errno?: unknown, cause?: unknown } | undefined, depth = 0; e && depth < 6; e = e.cause as typeof e, depth++) {
    if (typeof e.code === 'string' && !out.code) out.code = e.code
    if (typeof e.errno === 'number' && out.errno === undefined) out.errno = e.errno
  }
  return out
}

function answer(request: Exclude<SearchWorkerRequest, { op: 'changed' }>): unknown {
  switch (request.op) {
    case 'search': return service.search(request.team, request.params)
    case 'searchJson': return service.searchJson(request.team, request.params)
    case 'ready': return service.ready(request.teamId)
    case 'poll': return service.poll()
    case 'stats': return service.stats()
  }
}

port.on('message', async (request: SearchWorkerRequest) => {
  if (request.op === 'changed') return service.changed()
  let reply: SearchWorkerReply
  try {
    const value = await answer(request)
    reply = { id: request.id, ok: true, value }
  }
  catch (error) {
    reply = { id: request.id, ok: false, error: errorOf(error) }
  }
  port.postMessage(reply)
})
