// Telling "the database is down or restarting" apart from a bug, so requests get a clear 503 and the pool
// reconnects by itself when MariaDB is back (mysql2 opens new connections on demand).
const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR', 'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED', 'ER_CON_COUNT_ERROR',
  'ER_SERVER_GONE_ERROR', 'CR_SERVER_GONE_ERROR', 'CR_SERVER_LOST', 'ER_LOCK_WAIT_TIMEOUT_UNAVAILABLE',
])

export const DATABASE_UNAVAILABLE = 'The database is not reachable right now. Nothing was saved by this request; try again in a moment.'

export function isDatabaseUnavailable(error: unknown): boolean {
  for (let e = error as { code?: string, cause?: unknown, errno?: number } | undefined, depth = 0; e && depth < 6; e = e.cause as typeof e, depth++) {
    if (e.code && UNAVAILABLE_CODES.has(e.code)) return true
    if (e.errno === 1053 || e.errno === 2006 || e.errno === 2013) return true
  }
  return false
}
