// Whether the phone has a connection, as the browser reports it (navigator.onLine and its events), shared by
// every component. "Online" can still mean a signal too weak to reach the server: callers also treat a
// request that fails without an answer as offline (see sendOrQueue and the search fallback).
const online = ref(true)
let watching = false

export function useOnlineStatus(): Readonly<Ref<boolean>> {
  if (import.meta.client && !watching) {
    watching = true
    online.value = navigator.onLine
    window.addEventListener('online', () => { online.value = true })
    window.addEventListener('offline', () => { online.value = false })
  }
  return readonly(online)
}

/** True for an error that means the request never got an answer (no signal, server unreachable, timeout). */
export function isNoAnswerError(error: unknown): boolean {
  const e = error as { name?: string, statusCode?: number, status?: number, response?: unknown }
  if (e?.name === 'AbortError') return false
  if (import.meta.client && !navigator.onLine) return true
  const status = e?.statusCode ?? e?.status
  // A gateway in between answering for a server it cannot reach counts as no answer too.
  return status === undefined || status === 0 || status === 502 || status === 504
}
