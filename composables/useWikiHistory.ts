// An entry's revisions: the list, any two of them side by side, names for the ids they mention, restoring one.
import type { WikiContentByType, WikiEntryType } from '~~/shared/schemas/wiki'
import type { WikiDeletedItem, WikiEntryByType, WikiRevisionDetail, WikiRevisionSummary, WikiSaved } from '~~/shared/types/wiki'

export function useWikiRevisions(type: WikiEntryType, id: number) {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const result = useAsyncData(`wiki-revisions-${type}-${id}`, () => fetcher<{ items: WikiRevisionSummary[] }>(api(type, `/${id}/revisions`)))
  const revisions = computed(() => result.data.value?.items ?? [])
  const latest = computed(() => revisions.value[0]?.revision ?? 0)

  const details = reactive(new Map<number, WikiRevisionDetail<WikiContentByType[WikiEntryType]>>())
  async function detail(rev: number) {
    const known = details.get(rev)
    if (known) return known
    const loaded = await fetcher<WikiRevisionDetail<WikiContentByType[WikiEntryType]>>(api(type, `/${id}/revisions/${rev}`))
    details.set(rev, loaded)
    return loaded
  }

  /** Restores a revision as a new one, based on the newest revision this page has seen (409 when someone saved since). */
  async function restore(rev: number) {
    const saved = await apiFetch<WikiSaved>(api(type, `/${id}/revisions/${rev}/restore`), { method: 'POST', body: { revision: latest.value } })
    await result.refresh()
    return saved
  }
  return wikiAwaitable(result, { revisions, latest, detail, restore })
}

/**
 * Names of the makers, materials, categories and marks that revisions refer to by id. Names the page
 * already knows are kept; the others are read one by one (a revision mentions a handful at most).
 */
export function useWikiRefNames() {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const names = reactive<Record<string, string>>({})
  async function learn(refs: { type: WikiEntryType, id: number }[]) {
    const missing = refs.filter(r => names[`${r.type}:${r.id}`] === undefined)
    const unique = [...new Map(missing.map(r => [`${r.type}:${r.id}`, r])).values()]
    await Promise.all(unique.map(async (r) => {
      try {
        const entry = await fetcher<WikiEntryByType[WikiEntryType]>(api(r.type, `/${r.id}`))
        names[`${r.type}:${r.id}`] = entry.title
      }
      catch {
        names[`${r.type}:${r.id}`] = `${WIKI_TYPE_META[r.type].noun} #${r.id} (deleted)`
      }
    }))
  }
  const remember = (more: Record<string, string>) => Object.assign(names, more)
  return { names, learn, remember }
}

/** Recently deleted entries of every type (editor+), with restore and, for owners, purge. */
export function useWikiDeleted() {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const result = useAsyncData('wiki-deleted', () => fetcher<{ items: WikiDeletedItem[] }>(api(null, '/deleted')))
  const items = computed(() => result.data.value?.items ?? [])
  async function restore(item: WikiDeletedItem) {
    await apiFetch(api(item.type, `/${item.id}/restore`), { method: 'POST' })
    await result.refresh()
  }
  async function purge(item: WikiDeletedItem) {
    await apiFetch(api(item.type, `/${item.id}`), { method: 'DELETE', query: { purge: 1 } })
    await result.refresh()
  }
  return wikiAwaitable(result, { items, restore, purge })
}
