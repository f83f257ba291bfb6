// The one search service of this server process, created on first use: in a worker thread of its own (with its
// own database connections) when the build has the worker's file, else on the main thread with the app's pool.
import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { useServerConfig } from '../config'
import { useDb } from '../db'
import { searchConfigFromEnv } from './config'
import { SearchService } from './manager'
import { SearchWorkerClient } from './worker-client'

export type SearchEngine = Pick<SearchService, 'search' | 'searchJson' | 'ready' | 'stop'>

let service: SearchEngine | undefined

/**
 * The worker's file: modules/search-worker.ts puts it beside the server's entry (index.mjs, two folders above
 * the chunk this code is bundled into). nuxt dev has none.
 */
export function searchWorkerFile(): string | null {
  const candidates = [process.argv[1] ? join(dirname(process.argv[1]), 'search-worker.mjs') : '']
  try {
    candidates.push(fileURLToPath(new URL('../../search-worker.mjs', import.meta.url)))
  }
  catch { /* not a file: URL (dev) */ }
  return candidates.find(file => file && existsSync(file)) ?? null
}

export function useSearchService(): SearchEngine {
  if (service) return service
  const config = searchConfigFromEnv()
  const file = config.inWorker ? searchWorkerFile() : null
  service = file
    ? new SearchWorkerClient(file, useServerConfig().databaseUrl).start()
    : new SearchService(useDb(), config).start()
  return service
}
