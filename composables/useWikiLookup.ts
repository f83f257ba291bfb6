// Finding entries by title (or a mark's inscription) for the link picker and the editor's reference fields.
import type { WikiEntryType } from '~~/shared/schemas/wiki'
import type { WikiLookupItem } from '~~/shared/types/wiki'

export function useWikiLookup(types: () => WikiEntryType[]) {
  const api = useWikiApiPath()
  const query = ref('')
  const items = ref<WikiLookupItem[]>([])
  const loading = ref(false)
  const problem = ref('')
  let timer: ReturnType<typeof setTimeout> | undefined
  let controller: AbortController | undefined

  async function run() {
    controller?.abort()
    const mine = new AbortController()
    controller = mine
    loading.value = true
    problem.value = ''
    try {
      const found = await apiFetch<WikiLookupItem[]>(api(null, '/entries/lookup'), {
        query: { q: query.value.trim(), types: types().join(',') },
        signal: mine.signal,
      })
      if (controller === mine) items.value = found
    }
    catch (error) {
      // A newer keystroke aborted this request (ofetch reports it as a FetchError, not an AbortError).
      if (mine.signal.aborted || controller !== mine) return
      problem.value = toApiProblem(error).message
    }
    finally {
      if (controller === mine) loading.value = false
    }
  }
  /** Searches a moment after the last keystroke, dropping answers to older keystrokes. */
  function search(text = query.value, delay = 180) {
    query.value = text
    clearTimeout(timer)
    timer = setTimeout(run, delay)
  }
  onBeforeUnmount(() => {
    clearTimeout(timer)
    controller?.abort()
  })
  return { query, items, loading, problem, search }
}
