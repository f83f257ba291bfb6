// The team's reference as the phone keeps it (GET /api/teams/<team>/offline/reference): the four wiki entry
// types with the content the editor sees, the notes timeline, and which photo is each entry's thumbnail.
// Nothing from the sales ledger is in it: what a member sold stays on the server.
import type { CategoryContent, MakerContent, MarkContent, MaterialContent, WikiEntryType } from '../schemas/wiki'

/** Bumped when the shape changes: a phone holding an older format downloads everything again. */
export const OFFLINE_FORMAT = 1

interface EntryMeta { id: number, revision: number, updatedAt: number }
export type OfflineMark = EntryMeta & MarkContent
export type OfflineMaker = EntryMeta & MakerContent
export type OfflineMaterial = EntryMeta & MaterialContent
export type OfflineCategory = EntryMeta & CategoryContent
export interface OfflineNote {
  id: number
  entryType: WikiEntryType
  entryId: number
  body: string
  happenedOn: string | null
  authorName: string
  createdAt: number
  updatedAt: number
}

export interface OfflineEntryByType {
  mark: OfflineMark
  maker: OfflineMaker
  material: OfflineMaterial
  category: OfflineCategory
  note: OfflineNote
}
export const OFFLINE_TYPES = ['mark', 'maker', 'material', 'category', 'note'] as const
export type OfflineType = typeof OFFLINE_TYPES[number]

/** The first photo of each mark and maker: [entry id, photo id] pairs, and a hash to skip sending them unchanged. */
export interface OfflineThumbs { hash: string, mark: [number, number][], maker: [number, number][] }

export interface OfflineReferenceResponse {
  format: typeof OFFLINE_FORMAT
  team: { slug: string, name: string }
  /** true: everything below replaces what the phone holds; false: only what changed since `since`. */
  full: boolean
  /** Pass back as ?since= next time. */
  cursor: string
  generatedAt: string
  marks: OfflineMark[]
  makers: OfflineMaker[]
  materials: OfflineMaterial[]
  categories: OfflineCategory[]
  notes: OfflineNote[]
  /** Deleted (or purged) since the cursor: drop them. Empty in a full answer. */
  removed: Record<OfflineType, number[]>
  /** Left out when the phone sent the hash it already has (?thumbs=). */
  thumbs?: OfflineThumbs
}

/** The list key of each type in the response. */
export const OFFLINE_LIST_KEYS = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories', note: 'notes' } as const satisfies Record<OfflineType, keyof OfflineReferenceResponse>
