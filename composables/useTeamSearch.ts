// Search as you type: debounced requests, the previous one aborted, and any answer that arrives after a
// newer request was sent is dropped (sequence numbers), so the list always matches what is in the box.
import { SEARCH_TYPES, SEARCH_TYPE_LABELS, type SearchHit, type SearchResponse, type SearchType } from '~~/shared/search/types'
import { toApiProblem, apiFetch, type ApiProblem } from './useApi'
import { searchWithOfflineFallback } from './useOfflineSearch'

/** Extra query parameters of a search (types, country, materialId, categoryId, makerId, year, limit). */
export type TeamSearchFilters = Record<string, string | number | null | undefined>

/** The results page's filters as the form holds them: strings, as in the address bar. */
export interface SearchFilterValues {
  types: SearchType[]
  country: string
  year: string
  makerId: string
  materialId: string
  categoryId: string
}

export const SEARCH_DEBOUNCE_MS = 120

export function useTeamSearch(slug: Readonly<Ref<string>>, filters: Readonly<Ref<TeamSearchFilters>> = ref({})) {
  const query = ref('')
  const response = ref<SearchResponse | null>(null)
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)
  /** The query the shown response answers. */
  const answered = ref<string | null>(null)
  let sequence = 0
  let controller: AbortController | null = null
  let timer: ReturnType<typeof setTimeout> | null = null

  async function run() {
    if (timer) clearTimeout(timer)
    timer = null
    if (!slug.value) return
    controller?.abort()
    controller = new AbortController()
    const mine = ++sequence
    const q = query.value.trim()
    const params: Record<string, unknown> = { q }
    for (const [key, value] of Object.entries(filters.value)) if (value !== undefined && value !== null && value !== '') params[key] = value
    pending.value = true
    try {
      // No signal (or no answer): the phone's copy of the reference answers, marked source "device".
      const answer = await searchWithOfflineFallback(slug.value, params, () => apiFetch<SearchResponse>(`/api/teams/${slug.value}/search`, { query: params, signal: controller!.signal }))
      if (mine !== sequence) return
      response.value = answer
      answered.value = q
      problem.value = null
    }
    catch (error) {
      if (mine !== sequence || (error as { name?: string }).name === 'AbortError') return
      const p = toApiProblem(error)
      // An aborted fetch surfaces as a FetchError without a status.
      if (controller.signal.aborted) return
      problem.value = p
    }
    finally {
      if (mine === sequence) pending.value = false
    }
  }

  function schedule() {
    if (timer) clearTimeout(timer)
    timer = setTimeout(run, SEARCH_DEBOUNCE_MS)
  }

  watch([query, filters], schedule, { deep: true })
  onBeforeUnmount(() => {
    if (timer) clearTimeout(timer)
    controller?.abort()
  })

  return { query, response, pending, problem, answered, run, schedule }
}

/** Hits grouped by type in a fixed order (marks first); `flat` is the keyboard order of the groups. */
export function groupSearchHits(hits: SearchHit[]) {
  const groups = SEARCH_TYPES
    .map(type => ({ type, label: SEARCH_TYPE_LABELS[type].many, hits: hits.filter(h => h.type === type) }))
    .filter(g => g.hits.length)
  return { groups, flat: groups.flatMap(g => g.hits) }
}
