// What the reference wiki API sends and accepts, for pages and composables. Inputs are inferred from the
// zod schemas the server validates with; rows are inferred from the database schema.
import type { z } from 'zod'
import type { EntryPhoto } from '../photos'
import type {
  CategoryContent, MakerContent, MarkContent, MaterialContent, WikiEntryType,
  categoryCreateSchema, categoryPatchSchema, makerCreateSchema, makerPatchSchema, markCreateSchema, markPatchSchema,
  materialCreateSchema, materialPatchSchema, noteCreateSchema, notePatchSchema,
} from '../schemas/wiki'
import type { categories, entryNotes, entryRevisions, makers, marks, materials } from '../../server/database/schema/wiki'

export type { CategoryContent, MakerContent, MarkContent, MaterialContent, WikiEntryType }

export type MarkCreateInput = z.input<typeof markCreateSchema>
export type MarkPatchInput = z.input<typeof markPatchSchema>
export type MakerCreateInput = z.input<typeof makerCreateSchema>
export type MakerPatchInput = z.input<typeof makerPatchSchema>
export type MaterialCreateInput = z.input<typeof materialCreateSchema>
export type MaterialPatchInput = z.input<typeof materialPatchSchema>
export type CategoryCreateInput = z.input<typeof categoryCreateSchema>
export type CategoryPatchInput = z.input<typeof categoryPatchSchema>
export type WikiNoteCreateInput = z.input<typeof noteCreateSchema>
export type WikiNotePatchInput = z.input<typeof notePatchSchema>

export type WikiMarkRow = typeof marks.$inferSelect
export type WikiMakerRow = typeof makers.$inferSelect
export type WikiMaterialRow = typeof materials.$inferSelect
export type WikiCategoryRow = typeof categories.$inferSelect
export type WikiRevisionRow = typeof entryRevisions.$inferSelect
export type WikiNoteRow = typeof entryNotes.$inferSelect

/** Dates arrive as ISO strings in JSON. */
type IsoDate = string

export interface WikiPersonRef { id: number, name: string }
export interface WikiNamedRef { id: number, name: string }
export interface WikiBacklink { type: WikiEntryType, id: number, title: string }

/** Fields every entry's JSON has. */
export interface WikiEntryCommon {
  id: number
  type: WikiEntryType
  /** Send it back with the next PATCH: an edit based on an older revision is refused with 409. */
  revision: number
  title: string
  notesHtml: string
  photos: EntryPhoto[]
  backlinks: WikiBacklink[]
  createdAt: IsoDate
  createdBy: WikiPersonRef | null
  updatedAt: IsoDate
  updatedBy: WikiPersonRef | null
  deletedAt: IsoDate | null
  deletedBy: WikiPersonRef | null
}

export interface MarkLookalikeView { markId: number, title: string, howToTell: string, howToTellHtml: string }

export interface MarkEntry extends WikiEntryCommon, Omit<MarkContent, 'lookalikes'> {
  type: 'mark'
  maker: WikiNamedRef | null
  materials: WikiNamedRef[]
  categories: WikiNamedRef[]
  lookalikes: MarkLookalikeView[]
}

export interface MakerEntry extends WikiEntryCommon, MakerContent {
  type: 'maker'
  /** On GET [id] only: the maker's marks. */
  marks?: { id: number, title: string }[]
}

export interface MaterialEntry extends WikiEntryCommon, MaterialContent {
  type: 'material'
  recognitionHtml: string
  damageHtml: string
  cautionsHtml: string
}

export interface CategoryEntry extends WikiEntryCommon, CategoryContent {
  type: 'category'
  parent: WikiNamedRef | null
  /** On GET [id] only: ancestors from the root, and direct subcategories. */
  path?: WikiNamedRef[]
  children?: WikiNamedRef[]
}

export interface WikiEntryByType {
  mark: MarkEntry
  maker: MakerEntry
  material: MaterialEntry
  category: CategoryEntry
}

export interface WikiListPage<T> { items: T[], total: number, page: number, pageSize: number }

/** Answer of POST (201), PATCH and revision restores. */
export interface WikiSaved { id: number, revision: number, restoredFrom?: number }

/** Body of a 409: the entry as it is now, to compare with the edit that was refused. */
export interface WikiConflictBody<T> { statusCode: 409, message: string, current: T }

export interface WikiRevisionSummary {
  revision: number
  action: 'create' | 'edit' | 'restore'
  restoredFrom: number | null
  changedFields: string[]
  createdAt: IsoDate
  author: WikiPersonRef
}

export interface WikiRevisionDetail<C> extends WikiRevisionSummary {
  title: string
  snapshot: C
  /** Rendered markdown fields of the snapshot: notesHtml, recognitionHtml ... */
  html: Record<string, string>
}

export interface WikiNote {
  id: number
  body: string
  bodyHtml: string
  happenedOn: string | null
  author: WikiPersonRef
  createdAt: IsoDate
  updatedAt: IsoDate
  canEdit: boolean
  canRemove: boolean
}

export interface WikiLookupItem { type: WikiEntryType, id: number, title: string, subtitle: string }

export interface WikiDeletedItem { type: WikiEntryType, id: number, title: string, deletedAt: IsoDate, deletedBy: WikiPersonRef | null }
