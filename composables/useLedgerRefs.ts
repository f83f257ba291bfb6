// What the ledger forms pick from: stores, fee profiles, members, the condition scale, categories; and the
// titles of the reference entries an item links to. All read from the API with shared keys, so every
// component on a page shares one request.
import type { WikiEntryType } from '~~/shared/schemas/wiki'
import type { CategoryEntry, WikiListPage, WikiLookupItem } from '~~/shared/types/wiki'
import type { LedgerFeeProfile, LedgerPage, LedgerSettings, LedgerStore } from '~~/shared/types/ledger'
import type { Role } from '~~/shared/roles'

export interface LedgerMember { userId: number, name: string, email: string, role: Role }

export function useStores() {
  const { slug } = useTeam()
  return useFetch<LedgerPage<LedgerStore>>(() => `/api/teams/${slug.value}/stores`, {
    key: `ledger-stores-${slug.value}`,
    query: { pageSize: 100, sort: 'name' },
    default: () => ({ items: [], total: 0, page: 1, pageSize: 100 }),
  })
}

export function useFeeProfiles() {
  const { slug } = useTeam()
  return useFetch<LedgerPage<LedgerFeeProfile>>(() => `/api/teams/${slug.value}/fee-profiles`, {
    key: `ledger-fee-profiles-${slug.value}`,
    query: { pageSize: 100 },
    default: () => ({ items: [], total: 0, page: 1, pageSize: 100 }),
  })
}

export function useLedgerSettings() {
  const { slug } = useTeam()
  return useFetch<LedgerSettings>(() => `/api/teams/${slug.value}/ledger-settings`, {
    key: `ledger-settings-${slug.value}`,
    default: () => ({ mileageRateCents: 0, conditionScale: [], currency: 'USD' as const }),
  })
}

export function useLedgerMembers() {
  const { slug } = useTeam()
  return useFetch<{ members: LedgerMember[] }>(() => `/api/teams/${slug.value}/members`, {
    key: `ledger-members-${slug.value}`,
    default: () => ({ members: [] }),
  })
}

/** The team's categories by name (the first 100), for filters and the quick-add chips. */
export function useLedgerCategories() {
  const { slug } = useTeam()
  return useFetch<WikiListPage<CategoryEntry>>(() => `/api/teams/${slug.value}/categories`, {
    key: `ledger-categories-${slug.value}`,
    query: { pageSize: 100, sort: 'name' },
    default: () => ({ items: [], total: 0, page: 1, pageSize: 100 }),
  })
}

const ENTRY_PATHS: Record<WikiEntryType, string> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }

/**
 * Titles of reference entries by id. The item API sends ids only, so the titles on screen are looked up
 * once per entry and kept for the visit (a display cache, not a copy of the data to edit).
 */
export function useLedgerEntryNames() {
  const { slug } = useTeam()
  const names = useState<Record<string, string>>(`ledger-entry-names-${slug.value}`, () => ({}))
  const pending = new Set<string>()
  const keyOf = (type: WikiEntryType, id: number) => `${type}:${id}`

  function nameOf(type: WikiEntryType, id: number | null | undefined): string {
    if (id === null || id === undefined) return ''
    return names.value[keyOf(type, id)] ?? ''
  }
  function remember(type: WikiEntryType, id: number, title: string) {
    if (title && names.value[keyOf(type, id)] !== title) names.value = { ...names.value, [keyOf(type, id)]: title }
  }
  async function ensure(type: WikiEntryType, ids: (number | null | undefined)[]) {
    const missing = [...new Set(ids.filter((id): id is number => typeof id === 'number'))]
      .filter(id => names.value[keyOf(type, id)] === undefined && !pending.has(keyOf(type, id)))
    await Promise.all(missing.map(async (id) => {
      pending.add(keyOf(type, id))
      try {
        const entry = await apiFetch<{ title: string }>(`/api/teams/${slug.value}/${ENTRY_PATHS[type]}/${id}`)
        remember(type, id, entry.title)
      }
      catch {
        // A deleted entry still has its id on old items: say so instead of failing the page.
        names.value = { ...names.value, [keyOf(type, id)]: `#${id} (deleted)` }
      }
      finally {
        pending.delete(keyOf(type, id))
      }
    }))
  }
  const entryPath = (type: WikiEntryType, id: number) => `/t/${slug.value}/${ENTRY_PATHS[type]}/${id}`
  return { names, nameOf, remember, ensure, entryPath }
}

/** Reference entries by title as the person types (the wiki's lookup route), for the mark and category pickers. */
export async function ledgerLookup(slug: string, type: WikiEntryType, q: string, signal?: AbortSignal): Promise<WikiLookupItem[]> {
  return await apiFetch<WikiLookupItem[]>(`/api/teams/${slug}/entries/lookup`, { query: { q, types: type }, signal })
}

/** A reference entry chosen in a picker. */
export interface LedgerPicked { id: number, title: string }
