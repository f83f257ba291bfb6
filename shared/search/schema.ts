// The search API's query parameters, shared with the results page so it shows the server's words.
import { z } from 'zod'
import { SEARCH_TYPES, type SearchType } from './types'

export const SEARCH_MAX_QUERY_LENGTH = 200
export const SEARCH_MAX_LIMIT = 50
export const SEARCH_DEFAULT_LIMIT = 20

const types = z.string().max(200, 'types is too long.').optional().transform((raw, ctx) => {
  if (!raw) return [...SEARCH_TYPES]
  const out = new Set<SearchType>()
  for (const part of raw.split(',').map(p => p.trim()).filter(Boolean)) {
    // "mark" and "marks" both work.
    const type = SEARCH_TYPES.find(t => t === part || `${t}s` === part || (t === 'category' && part === 'categories'))
    if (!type) {
      ctx.addIssue({ code: 'custom', message: `types must be a comma-separated list of: ${SEARCH_TYPES.join(', ')}.` })
      return z.NEVER
    }
    out.add(type)
  }
  return out.size ? [...out] : [...SEARCH_TYPES]
})

const optionalId = (name: string) => z.preprocess(v => v === '' ? undefined : v, z.coerce.number({ message: `${name} must be an entry id.` })
  .int(`${name} must be an entry id.`).positive(`${name} must be an entry id.`).max(Number.MAX_SAFE_INTEGER, `${name} must be an entry id.`).optional())

export const searchQuerySchema = z.object({
  q: z.string().max(SEARCH_MAX_QUERY_LENGTH, `The search text is at most ${SEARCH_MAX_QUERY_LENGTH} characters.`).default('')
    .transform(s => s.trim()),
  types,
  country: z.string().trim().max(120, 'country is at most 120 characters.').optional().transform(v => v || undefined),
  materialId: optionalId('materialId'),
  categoryId: optionalId('categoryId'),
  makerId: optionalId('makerId'),
  year: z.preprocess(v => v === '' ? undefined : v, z.coerce.number({ message: 'year must be a year, like 1954.' })
    .int('year must be a whole year.').min(1, 'year must be from 1 to 2100.').max(2100, 'year must be from 1 to 2100.').optional()),
  limit: z.coerce.number({ message: 'limit must be a number.' }).int('limit must be a whole number.')
    .min(1, 'limit is at least 1.').max(SEARCH_MAX_LIMIT, `limit is at most ${SEARCH_MAX_LIMIT}.`).default(SEARCH_DEFAULT_LIMIT),
})
export type SearchParams = z.infer<typeof searchQuerySchema>
