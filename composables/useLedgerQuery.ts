// Filters, sort and page of a ledger list live in the URL query: shareable, kept on reload, and read with
// the same zod schema the server validates with (a bad value in a pasted link is dropped, not sent).
import type { z } from 'zod'

type Query = Record<string, string>

/** The route's query keys the schema accepts, as strings; keys the schema refuses are left out. */
export function ledgerValidQuery(raw: Record<string, unknown>, schema: z.ZodType, keys: readonly string[]): Query {
  let picked: Query = {}
  for (const key of keys) {
    const value = Array.isArray(raw[key]) ? raw[key][0] : raw[key]
    if (typeof value === 'string' && value.trim() !== '') picked[key] = value.trim()
  }
  for (let attempt = 0; attempt < keys.length; attempt++) {
    const result = schema.safeParse(picked)
    if (result.success) return picked
    const bad = new Set(result.error.issues.map(issue => String(issue.path[0] ?? '')))
    const kept = Object.entries(picked).filter(([key]) => !bad.has(key))
    if (kept.length === Object.keys(picked).length) return {}
    picked = Object.fromEntries(kept)
  }
  return picked
}

/** The list's query from the URL, and a setter that writes changes back (any filter change goes to page 1). */
export function useLedgerListQuery(schema: z.ZodType, keys: readonly string[]) {
  const route = useRoute()
  const router = useRouter()
  const query = computed(() => ledgerValidQuery(route.query as Record<string, unknown>, schema, keys))

  function setQuery(patch: Record<string, string | number | null | undefined>, options: { keepPage?: boolean } = {}) {
    const next = new Map(Object.entries(query.value))
    if (!options.keepPage) next.delete('page')
    for (const [key, value] of Object.entries(patch)) {
      if (value === null || value === undefined || value === '') next.delete(key)
      else next.set(key, String(value))
    }
    return router.push({ query: Object.fromEntries(next) })
  }
  return { query, setQuery }
}
