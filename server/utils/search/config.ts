// Search settings, read from the environment once when the search service starts (listed in .env.example).
//
// SEARCH_MAX_TEAMS      team indexes kept in memory at most (least recently searched dropped first)  default 20
// SEARCH_MAX_DOCUMENTS  approximate budget of indexed documents over all teams (about 2.5 kB each)    default 400,000
// SEARCH_POLL_MS        how often each instance reads the change log for the teams it holds          default 500
// SEARCH_BUILD_WAIT_MS  how long a first search waits for its team's index before asking MariaDB       default 150
// SEARCH_BUILD_DELAY_MS holds every index build back this long (to see the MariaDB fallback at work)  default 0
// SEARCH_LOG_BUILDS     when set, logs each finished build (team, documents, milliseconds)              default unset
// SEARCH_WORKER         0 keeps the indexes on the main thread (as nuxt dev always does), not in a worker  default 1
export interface SearchConfig {
  maxTeams: number
  maxDocuments: number
  pollMs: number
  buildWaitMs: number
  buildDelayMs: number
  /** Rows read from MariaDB per page while building (turning a page into documents cannot yield: kept short). */
  buildPageSize: number
  /** The build yields to the event loop after this much work, so other requests keep flowing. */
  buildSliceMs: number
  /** A write's transaction is assumed committed or rolled back this long after its change row was written. */
  settleMs: number
  /** Change rows older than this are pruned. */
  keepChangesMs: number
  /** The indexes live in a worker thread of their own (service.ts), when the build has its file. */
  inWorker: boolean
}

function int(value: string | undefined, fallback: number, min = 0): number {
  const n = Number(value)
  return value !== undefined && value !== '' && Number.isFinite(n) && n >= min ? Math.floor(n) : fallback
}

export function searchConfigFromEnv(env: Record<string, string | undefined> = process.env): SearchConfig {
  return {
    maxTeams: int(env.SEARCH_MAX_TEAMS, 20, 1),
    maxDocuments: int(env.SEARCH_MAX_DOCUMENTS, 400_000, 1),
    pollMs: int(env.SEARCH_POLL_MS, 500, 50),
    buildWaitMs: int(env.SEARCH_BUILD_WAIT_MS, 150),
    buildDelayMs: int(env.SEARCH_BUILD_DELAY_MS, 0),
    buildPageSize: 500,
    buildSliceMs: 4,
    settleMs: 10_000,
    keepChangesMs: 24 * 60 * 60 * 1000,
    inWorker: env.SEARCH_WORKER !== '0',
  }
}
