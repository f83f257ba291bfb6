// Starts the phone's background work once the app is up: unsent changes go out (now, when the signal comes
// back, and every half minute), and every team reference kept on the phone asks for its changes (now, when
// the signal comes back, and every few minutes).
import { offlineFlushQueue, QUEUE_RETRY_MS, offlineReloadQueue, offlineOnQueuedSent, offlineSetQueueUser } from '~/composables/useOfflineQueue'
import { OFFLINE_REFRESH_MS, refreshAllOfflineReferences, syncOfflineReference } from '~/composables/useOfflineReference'
import { loadDeviceIndex } from '~/composables/useOfflineSearch'

// Read when this module loads, before the router settles on the page the HTML was rendered for.
const requestedUrl = location.pathname + location.search + location.hash

export default defineNuxtPlugin((nuxtApp) => {
  const router = useRouter()
  // With no signal, a page never opened on this phone is answered with a cached page of the same team
  // (nuxt.config.ts, pwa); the app then shows the page the person asked for.
  const renderedFor = String(nuxtApp.payload.path ?? '').split(/[?#]/)[0]!
  const requestedPath = requestedUrl.split(/[?#]/)[0]!
  if (renderedFor && decodeURI(renderedFor) !== decodeURI(requestedPath)) {
    nuxtApp.hook('app:mounted', () => void router.replace(requestedUrl))
  }
  if (!('indexedDB' in window)) return
  // The queue belongs to the person who made each change; signing out also drops the pages kept for them.
  const { user } = useUserSession()
  watch(() => user.value?.id ?? null, (id, before) => {
    offlineSetQueueUser(id)
    if (id === null && before) void caches.delete('tallymark-pages').catch(() => false)
    if (id !== null) void offlineFlushQueue().catch(() => {})
  }, { immediate: true })
  const refresh = () => void refreshAllOfflineReferences().catch(() => {})
  const flush = () => void offlineFlushQueue().catch(() => {})
  nuxtApp.hook('app:mounted', () => {
    void offlineReloadQueue().then(flush).catch(() => {})
    // After the first paint, so the page the person opened comes first.
    setTimeout(refresh, 1500)
  })
  window.addEventListener('online', () => {
    flush()
    refresh()
  })
  // Building the phone's search index takes a few seconds on a slow phone: do it as the signal goes, not
  // on the first search.
  const warm = () => {
    const slug = router.currentRoute.value.params.team
    if (typeof slug === 'string' && slug) void loadDeviceIndex(slug)
  }
  window.addEventListener('offline', warm)
  nuxtApp.hook('app:mounted', () => { if (!navigator.onLine) warm() })
  setInterval(flush, QUEUE_RETRY_MS)
  setInterval(refresh, OFFLINE_REFRESH_MS)
  // What was just sent is part of the reference now: fetch it, so the phone's copy shows it too.
  let pending: ReturnType<typeof setTimeout> | null = null
  offlineOnQueuedSent((change) => {
    if (pending) clearTimeout(pending)
    pending = setTimeout(() => {
      pending = null
      if (change.slug) void syncOfflineReference(change.slug).catch(() => {})
    }, 500)
  })
})
