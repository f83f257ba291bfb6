// Materials: how to tell what a piece is made of at the shelf, and what damage and cautions mean for it.
import { and, count, eq, like } from 'drizzle-orm'
import { markMaterials, materials } from '../../database/schema'
import {
  EMPTY_MATERIAL, materialContentSchema, materialCreateSchema, materialListQuery, materialPatchSchema,
  type MaterialContent, type MaterialListQuery,
} from '../../../shared/schemas/wiki'
import type { WikiTypeConfig } from './types'

type MaterialRow = typeof materials.$inferSelect

export const wikiMaterialConfig: WikiTypeConfig<MaterialContent, MaterialListQuery> = {
  type: 'material',
  label: 'material',
  table: materials,
  titleColumn: materials.name,
  contentSchema: materialContentSchema,
  createSchema: materialCreateSchema,
  patchSchema: materialPatchSchema,
  listQuery: materialListQuery,
  empty: EMPTY_MATERIAL,
  markdownFields: ['recognition', 'damage', 'cautions', 'notes'],
  titleOf: c => c.name,
  toRow: c => ({
    name: c.name, recognition: c.recognition, checks: c.checks, damage: c.damage, cautions: c.cautions,
    handbookPath: c.handbookPath, sources: c.sources, notes: c.notes, tags: c.tags,
  }),
  rowToContent: (r: MaterialRow) => ({
    name: r.name, recognition: r.recognition, checks: { ...EMPTY_MATERIAL.checks, ...r.checks }, damage: r.damage, cautions: r.cautions,
    handbookPath: r.handbookPath, sources: r.sources, notes: r.notes, tags: r.tags,
  }),
  async check(_db, _teamId, _id, next) {
    return { content: next, fieldErrors: {} }
  },
  async listConditions() {
    return []
  },
  searchCondition: (_teamId, pattern) => like(materials.name, pattern),
  sortColumns: { name: materials.name, createdAt: materials.createdAt, updatedAt: materials.updatedAt },
  defaultSort: 'name',
  async lookupSubtitles(_db, _teamId, contents) {
    return new Map([...contents].map(([id, c]) => [id, c.tags.slice(0, 3).join(', ')]))
  },
  async purgeBlocker(db, teamId, id) {
    const [row] = await db.select({ n: count() }).from(markMaterials).where(and(eq(markMaterials.teamId, teamId), eq(markMaterials.materialId, id)))
    const n = Number(row?.n ?? 0)
    return n ? `${n} mark${n === 1 ? '' : 's'} (counting deleted ones) still list this material: change or purge them first.` : null
  },
  photoType: null,
}
