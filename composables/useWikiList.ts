// Wiki lists: filters, sort and page live in the URL query (shareable, kept on reload); the server pages.
import { MARK_TYPES, type WikiEntryType } from '~~/shared/schemas/wiki'
import type { ComputedRef } from 'vue'
import type { WikiEntryByType, WikiListPage } from '~~/shared/types/wiki'

export interface WikiOption { value: string, label: string }

export interface WikiFilterDef {
  key: string
  label: string
  kind: 'text' | 'select' | 'year'
  /** Fixed choices, or choices loaded from the entries of a type. */
  options?: WikiOption[]
  optionsFrom?: WikiEntryType
  hint?: string
}

export const WIKI_LIST_FILTERS: Record<WikiEntryType, WikiFilterDef[]> = {
  mark: [
    { key: 'makerId', label: 'Maker', kind: 'select', optionsFrom: 'maker' },
    { key: 'country', label: 'Country', kind: 'text', hint: 'As written on the entries' },
    { key: 'markType', label: 'Kind of mark', kind: 'select', options: MARK_TYPES.map(t => ({ value: t, label: MARK_TYPE_LABELS[t] })) },
    { key: 'materialId', label: 'Material', kind: 'select', optionsFrom: 'material' },
    { key: 'categoryId', label: 'Category', kind: 'select', optionsFrom: 'category', hint: 'Includes its subcategories' },
    { key: 'year', label: 'In use in (year)', kind: 'year' },
    { key: 'tag', label: 'Tag', kind: 'text' },
  ],
  maker: [
    { key: 'country', label: 'Country', kind: 'text', hint: 'As written on the entries' },
    { key: 'tag', label: 'Tag', kind: 'text' },
  ],
  material: [
    { key: 'tag', label: 'Tag', kind: 'text' },
  ],
  category: [
    { key: 'parentId', label: 'Inside', kind: 'select', optionsFrom: 'category', options: [{ value: 'root', label: 'Top level only' }] },
    { key: 'tag', label: 'Tag', kind: 'text' },
  ],
}

export interface WikiSortDef { key: string, label: string }

export const WIKI_SORTS: Record<WikiEntryType, WikiSortDef[]> = {
  mark: [
    { key: 'title', label: 'Title' }, { key: 'country', label: 'Country' }, { key: 'markType', label: 'Kind' },
    { key: 'yearFrom', label: 'From year' }, { key: 'yearTo', label: 'To year' }, { key: 'createdAt', label: 'Added' }, { key: 'updatedAt', label: 'Changed' },
  ],
  maker: [
    { key: 'name', label: 'Name' }, { key: 'country', label: 'Country' }, { key: 'yearFrom', label: 'From year' },
    { key: 'yearTo', label: 'To year' }, { key: 'createdAt', label: 'Added' }, { key: 'updatedAt', label: 'Changed' },
  ],
  material: [{ key: 'name', label: 'Name' }, { key: 'createdAt', label: 'Added' }, { key: 'updatedAt', label: 'Changed' }],
  category: [{ key: 'name', label: 'Name' }, { key: 'createdAt', label: 'Added' }, { key: 'updatedAt', label: 'Changed' }],
}

export const WIKI_DEFAULT_SORT: Record<WikiEntryType, string> = { mark: 'title', maker: 'name', material: 'name', category: 'name' }
export const WIKI_PAGE_SIZES = [10, 25, 50, 100] as const
const DEFAULT_PAGE_SIZE = 25

function queryString(value: unknown): string {
  const first = Array.isArray(value) ? value[0] : value
  return typeof first === 'string' ? first : ''
}

/** One list page of a type, driven by the route query. */
export function useWikiList<T extends WikiEntryType>(type: T) {
  const route = useRoute()
  const router = useRouter()
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const filterKeys = WIKI_LIST_FILTERS[type].map(f => f.key)

  const state = computed(() => {
    const page = Number.parseInt(queryString(route.query.page), 10)
    const pageSize = Number.parseInt(queryString(route.query.pageSize), 10)
    return {
      page: page > 0 ? page : 1,
      pageSize: pageSize > 0 ? pageSize : DEFAULT_PAGE_SIZE,
      sort: queryString(route.query.sort) || WIKI_DEFAULT_SORT[type],
      filters: Object.fromEntries(filterKeys.map(k => [k, queryString(route.query[k])])) as Record<string, string>,
    }
  })
  const apiQuery = computed(() => wikiListQuery({ page: state.value.page, pageSize: state.value.pageSize, sort: state.value.sort, ...state.value.filters }))

  const result = useAsyncData(`wiki-list-${type}`, () =>
    fetcher<WikiListPage<WikiEntryByType[T]>>(api(type), { query: apiQuery.value }), { watch: [apiQuery] })

  const items = computed(() => result.data.value?.items ?? [])
  const total = computed(() => result.data.value?.total ?? 0)
  const pageCount = computed(() => Math.max(1, Math.ceil(total.value / state.value.pageSize)))
  const activeFilters = computed(() => Object.values(state.value.filters).filter(Boolean).length)

  const queryWith = (patch: Record<string, unknown>) => {
    const current = Object.fromEntries(Object.entries(route.query).map(([k, v]) => [k, queryString(v)]))
    return wikiListQuery({ ...current, ...patch })
  }
  const go = (patch: Record<string, unknown>) => router.push({ query: queryWith(patch) })
  /** A link to another page of the same list (a real link: it can be opened in a new tab or shared). */
  const pageLink = (page: number) => ({ query: queryWith({ page: page <= 1 ? undefined : page }) })
  /** New filters start again at page 1. */
  const setFilters = (values: Record<string, string>) => go({ ...values, page: undefined })
  /** Choosing the sorted column again reverses it. */
  function toggleSort(key: string) {
    const current = state.value.sort
    const next = current === key ? `-${key}` : key
    return go({ sort: next === WIKI_DEFAULT_SORT[type] ? undefined : next, page: undefined })
  }
  const setSort = (sort: string) => go({ sort: sort === WIKI_DEFAULT_SORT[type] ? undefined : sort, page: undefined })
  const setPage = (page: number) => go({ page: page <= 1 ? undefined : page })
  const setPageSize = (size: number) => go({ pageSize: size === DEFAULT_PAGE_SIZE ? undefined : size, page: undefined })
  const clearFilters = () => go({ ...Object.fromEntries(filterKeys.map(k => [k, undefined])), page: undefined })

  return wikiAwaitable(result, { state, items, total, pageCount, activeFilters, pageLink, setFilters, toggleSort, setSort, setPage, setPageSize, clearFilters })
}

/** Entries of a type as choices for filters (up to the API's page size, by name). */
export function useWikiOptions(type: WikiEntryType) {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const { data } = useAsyncData(`wiki-options-${type}`, () =>
    fetcher<WikiListPage<WikiEntryByType[WikiEntryType]>>(api(type), { query: { pageSize: 100, sort: WIKI_DEFAULT_SORT[type] } }))
  return computed<WikiOption[]>(() => (data.value?.items ?? []).map((e) => {
    const parent = e.type === 'category' && e.parent ? `${e.parent.name} › ` : ''
    return { value: String(e.id), label: `${parent}${e.title}` }
  }))
}

/** Choices for every filter of a type's list that loads them from other entries. */
export function useWikiFilterOptions(type: WikiEntryType): Record<string, ComputedRef<WikiOption[]>> {
  const out: Record<string, ComputedRef<WikiOption[]>> = {}
  for (const f of WIKI_LIST_FILTERS[type]) {
    if (!f.optionsFrom) continue
    const loaded = useWikiOptions(f.optionsFrom)
    out[f.key] = computed(() => [...(f.options ?? []), ...loaded.value])
  }
  return out
}
