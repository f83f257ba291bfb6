// "just now", "12 min ago", "3 h ago", "2 days ago": for when the phone's copy was last synced.
const now = ref(Date.now())
let ticking = false

export function useRelativeTime() {
  if (import.meta.client && !ticking) {
    ticking = true
    setInterval(() => { now.value = Date.now() }, 30_000)
  }
  return (at: number | null | undefined): string => {
    if (!at) return 'never'
    const s = Math.max(0, Math.round((now.value - at) / 1000))
    if (s < 60) return 'just now'
    if (s < 3600) return `${Math.round(s / 60)} min ago`
    if (s < 86_400) return `${Math.round(s / 3600)} h ago`
    const d = Math.round(s / 86_400)
    return `${d} day${d === 1 ? '' : 's'} ago`
  }
}
