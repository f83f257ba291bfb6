// Pure helpers on entry content, shared by the engine and the seed (which runs outside Nitro).
import { extractWikiLinks, type WikiLinkTarget } from '../../../shared/markdown'
import type { WikiTypeConfig } from './types'

function stable(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stable).join(',')}]`
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map(k => `${JSON.stringify(k)}:${stable((value as Record<string, unknown>)[k])}`).join(',')}}`
  }
  return JSON.stringify(value ?? null)
}

/** Names of the content fields that differ; `before` null means a new entry (every field that is set). */
export function wikiChangedFields<C extends object>(config: WikiTypeConfig<C>, before: C | null, after: C): string[] {
  const base = (before ?? config.empty) as Record<string, unknown>
  const next = after as Record<string, unknown>
  return Object.keys(config.empty).filter(key => stable(base[key]) !== stable(next[key]))
}

/** Drops keys whose value is undefined, so a partial patch never blanks a field it did not send. */
export function wikiDefinedOnly<T extends object>(input: T): Partial<T> {
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) as Partial<T>
}

/** The full content of a new entry: the type's empty content, the given fields, and derived values. */
export function wikiNewContent<C extends object>(config: WikiTypeConfig<C>, given: Partial<C>): C {
  const merged = { ...config.empty, ...wikiDefinedOnly(given) } as C
  return config.finalize ? config.finalize(merged, null, given) : merged
}

/** Entries linked from the content's markdown fields (not including itself). */
export function wikiLinkTargets<C extends object>(config: WikiTypeConfig<C>, teamSlug: string, id: number, content: C): WikiLinkTarget[] {
  const found = new Map<string, WikiLinkTarget>()
  for (const field of config.markdownFields) {
    for (const target of extractWikiLinks(String(content[field] ?? ''), teamSlug)) {
      if (target.type === config.type && target.id === id) continue
      found.set(`${target.type}:${target.id}`, target)
    }
  }
  return [...found.values()]
}
