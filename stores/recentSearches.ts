// Searches this person ran on this device, per team, newest first: kept in localStorage, never sent to the
// server (what someone looked for in a store is their own business).
import { defineStore } from 'pinia'

const STORAGE_KEY = 'tm-recent-searches'
const PER_TEAM = 8
const MAX_LENGTH = 200

type RecentByTeam = Record<string, string[]>

function sanitise(value: unknown): RecentByTeam {
  const out: RecentByTeam = {}
  if (!value || typeof value !== 'object') return out
  for (const [slug, list] of Object.entries(value as Record<string, unknown>)) {
    if (!Array.isArray(list)) continue
    const texts = list.filter((q): q is string => typeof q === 'string' && q.trim().length > 0).map(q => q.slice(0, MAX_LENGTH))
    if (texts.length) out[slug] = [...new Set(texts)].slice(0, PER_TEAM)
  }
  return out
}

export const useRecentSearchesStore = defineStore('recentSearches', () => {
  const byTeam = ref<RecentByTeam>({})
  // Read on the device only, after hydration, so server and client render the same first page.
  const loaded = ref(false)

  function load() {
    if (loaded.value || !import.meta.client) return
    loaded.value = true
    try {
      byTeam.value = sanitise(JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '{}'))
    }
    catch {
      byTeam.value = {}
    }
  }

  function save() {
    if (!import.meta.client) return
    try {
      localStorage.setItem(STORAGE_KEY, JSON.stringify(byTeam.value))
    }
    catch { /* storage full or blocked (private mode): recent searches are a convenience */ }
  }

  function forTeam(slug: string): string[] {
    return byTeam.value[slug] ?? []
  }

  function remember(slug: string, query: string) {
    const q = query.trim().slice(0, MAX_LENGTH)
    if (!slug || q.length < 2) return
    load()
    const rest = forTeam(slug).filter(x => x.toLowerCase() !== q.toLowerCase())
    byTeam.value = { ...byTeam.value, [slug]: [q, ...rest].slice(0, PER_TEAM) }
    save()
  }

  function forget(slug: string, query: string) {
    byTeam.value = { ...byTeam.value, [slug]: forTeam(slug).filter(x => x !== query) }
    save()
  }

  function clear(slug: string) {
    const { [slug]: _dropped, ...rest } = byTeam.value
    byTeam.value = rest
    save()
  }

  return { byTeam, loaded, load, forTeam, remember, forget, clear }
})
