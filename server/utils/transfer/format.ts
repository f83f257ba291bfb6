// The team export's zip layout and the pure steps of an import: new ids into links and old revisions.
// Explicit imports only, so unit tests run these without Nitro. The file's schema is shared/schemas/transfer.ts.
import { WIKI_ENTRY_TYPES, WIKI_PATH_SEGMENTS, type WikiEntryType } from '../../../shared/schemas/wiki'
import { PHOTO_MAX_BYTES } from '../../../shared/photos'

export const TRANSFER_JSON_NAME = 'team.json'

export const TRANSFER_LIMITS = {
  /** The uploaded zip (also the request size allowed on the import route, nuxt.config.ts). */
  zipBytes: 1024 * 1024 * 1024,
  /** team.json unpacked: it is parsed whole, so this bounds the import's memory. */
  jsonBytes: 256 * 1024 * 1024,
  /** One stored photo file: no upload makes a copy larger than an upload may be. */
  photoBytes: PHOTO_MAX_BYTES,
  /** Files in the zip (team.json and two per photo, with room to spare). */
  entries: 2_000_001,
  /** Problems listed in a 400 answer. */
  issues: 50,
} as const

const EXTENSIONS: Record<string, string> = { 'image/webp': 'webp', 'image/jpeg': 'jpg', 'image/png': 'png' }

/** Names of a photo's two stored copies inside the zip. */
export function transferPhotoFiles(photoId: number, contentType: string): { display: string, thumb: string } {
  const ext = EXTENSIONS[contentType] ?? 'webp'
  return { display: `photos/${photoId}/display.${ext}`, thumb: `photos/${photoId}/thumb.${ext}` }
}

export function transferPhotoExtension(contentType: string): string {
  return EXTENSIONS[contentType] ?? 'webp'
}

/** Old id → new id, per entry type. */
export type TransferEntryIds = Record<WikiEntryType, Map<number, number>>

export function transferEmptyEntryIds(): TransferEntryIds {
  return { mark: new Map(), maker: new Map(), material: new Map(), category: new Map() }
}

const TYPE_BY_SEGMENT = new Map(WIKI_ENTRY_TYPES.map(t => [WIKI_PATH_SEGMENTS[t], t]))

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
}

/**
 * Rewrites links between entries (/t/<old team>/<marks|makers|materials|categories>/<old id>) to the new team
 * and the new ids. A link to an entry the file does not hold (purged before the export) keeps the old team's
 * address: it must not point at whichever entry of the new team happens to get that number.
 */
export function transferRewriteLinks(text: string, fromSlug: string, toSlug: string, ids: TransferEntryIds): string {
  if (!text || !text.includes(`/t/${fromSlug}/`)) return text
  const pattern = new RegExp(`/t/${escapeRegExp(fromSlug)}/([a-z]+)/(\\d{1,15})(?![\\w-])`, 'g')
  return text.replace(pattern, (whole, segment: string, id: string) => {
    const type = TYPE_BY_SEGMENT.get(segment)
    const next = type ? ids[type].get(Number(id)) : undefined
    return next === undefined ? whole : `/t/${toSlug}/${segment}/${next}`
  })
}

/** The markdown fields of each entry type (the engine's markdownFields), rewritten on import. */
export const TRANSFER_MARKDOWN_FIELDS: Record<WikiEntryType, string[]> = {
  mark: ['notes'], maker: ['notes'], material: ['recognition', 'damage', 'cautions', 'notes'], category: ['notes'],
}

const asIds = (value: unknown): number[] => Array.isArray(value) ? value.filter((v): v is number => Number.isSafeInteger(v)) : []

/**
 * A revision's snapshot with the new ids: references the file cannot resolve are dropped (as a restore
 * drops references purged since), markdown links are rewritten. Fields the snapshot does not have stay absent.
 */
export function transferRemapSnapshot(type: WikiEntryType, snapshot: Record<string, unknown>, ids: TransferEntryIds, rewrite: (text: string) => string): Record<string, unknown> {
  const out: Record<string, unknown> = { ...snapshot }
  const one = (map: Map<number, number>, value: unknown) => typeof value === 'number' ? map.get(value) ?? null : null
  const many = (map: Map<number, number>, value: unknown) => asIds(value).flatMap(v => map.has(v) ? [map.get(v)!] : []).sort((a, b) => a - b)
  if (type === 'mark') {
    if ('makerId' in out) out.makerId = one(ids.maker, out.makerId)
    if ('materialIds' in out) out.materialIds = many(ids.material, out.materialIds)
    if ('categoryIds' in out) out.categoryIds = many(ids.category, out.categoryIds)
    if (Array.isArray(out.lookalikes)) {
      out.lookalikes = (out.lookalikes as unknown[]).flatMap((l) => {
        const pair = l as { markId?: unknown, howToTell?: unknown }
        const markId = one(ids.mark, pair?.markId)
        if (markId === null) return []
        return [{ ...pair, markId, ...(typeof pair.howToTell === 'string' ? { howToTell: rewrite(pair.howToTell) } : {}) }]
      }).sort((a, b) => a.markId - b.markId)
    }
  }
  if (type === 'category' && 'parentId' in out) out.parentId = one(ids.category, out.parentId)
  for (const field of TRANSFER_MARKDOWN_FIELDS[type]) {
    if (typeof out[field] === 'string') out[field] = rewrite(out[field] as string)
  }
  return out
}
