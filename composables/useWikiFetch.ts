// Reading wiki data in useAsyncData: on the server the person's cookie must travel with the request
// (plain $fetch would call the API signed out), so reads go through useRequestFetch.
import type { WikiEntryType } from '~~/shared/schemas/wiki'

type Fetcher = <T>(url: string, options?: { query?: Record<string, unknown> }) => Promise<T>

/** A GET fetcher typed by the caller (Nitro's route typing is skipped, as in apiFetch). Call in setup. */
export function useWikiFetch(): Fetcher {
  const requestFetch = useRequestFetch() as unknown as (url: string, options?: object) => Promise<unknown>
  return <T>(url: string, options: { query?: Record<string, unknown> } = {}) => requestFetch(url, options) as Promise<T>
}

/** /api/teams/<team>/<marks|makers|...><rest> for the team in the route. */
export function useWikiApiPath() {
  const { slug } = useTeam()
  return (type: WikiEntryType | null, rest = '') =>
    `/api/teams/${encodeURIComponent(slug.value)}${type ? `/${WIKI_TYPE_META[type].segment}` : ''}${rest}`
}

/** /t/<team>/<marks|makers|...><rest>: app paths of wiki pages. */
export function useWikiPaths() {
  const { slug } = useTeam()
  const list = (type: WikiEntryType, query?: Record<string, unknown>) => ({
    path: `/t/${slug.value}/${WIKI_TYPE_META[type].segment}`,
    query: query ? wikiListQuery(query) : undefined,
  })
  const entry = (type: WikiEntryType, id: number, rest = '') => `/t/${slug.value}/${WIKI_TYPE_META[type].segment}/${id}${rest}`
  return { list, entry, newEntry: (type: WikiEntryType) => `/t/${slug.value}/${WIKI_TYPE_META[type].segment}/new`, deleted: () => `/t/${slug.value}/deleted` }
}

/** Dates in the team's time zone, worded the same on the server and in the browser. */
export function useWikiDates() {
  const { team } = useTeam()
  const zone = computed(() => team.value?.timeZone || 'UTC')
  const format = (iso: string | null | undefined, withTime = false) => {
    if (!iso) return ''
    const date = new Date(iso)
    if (Number.isNaN(date.getTime())) return ''
    try {
      return new Intl.DateTimeFormat('en-GB', withTime
        ? { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone: zone.value }
        : { day: 'numeric', month: 'short', year: 'numeric', timeZone: zone.value }).format(date)
    }
    catch {
      return date.toISOString().slice(0, withTime ? 16 : 10).replace('T', ' ')
    }
  }
  return { date: (iso: string | null | undefined) => format(iso), dateTime: (iso: string | null | undefined) => format(iso, true) }
}

/**
 * Adds fields to what useAsyncData returned while keeping it awaitable (spreading it would drop `then`,
 * and `await` would no longer wait for the data).
 */
export function wikiAwaitable<A extends Promise<unknown> & object, X extends object>(asyncData: A, extras: X): Omit<A, keyof Promise<unknown>> & X & Promise<Omit<A, keyof Promise<unknown>> & X> {
  // Nuxt makes then/catch/finally own properties: copying them would make `value` resolve to the bare result.
  const own = Object.fromEntries(Object.entries(asyncData).filter(([k]) => k !== 'then' && k !== 'catch' && k !== 'finally'))
  const value = Object.assign(own, extras) as Omit<A, keyof Promise<unknown>> & X
  return Object.assign(asyncData.then(() => value), value)
}
