// The per-type document builders: how each kind of entry becomes a search document. A new searchable type
// (sale items) is one more entry in `searchSources`, with the entity type its writes log in search_changes.
import { and, asc, eq, gt, inArray, isNull, type SQL } from 'drizzle-orm'
import { categories, entryNotes, makers, markCategories, markInscriptions, markMaterials, marks, materials } from '../../database/schema'
import { foldDiacritics, plainMarkdown } from '../../../shared/search/normalise'
import type { SearchDocumentInput } from '../../../shared/search/options'
import type { SearchType } from '../../../shared/search/types'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'
import { wikiYearRange } from '../wiki/types'

/** A document plus what filters, ranking and hits need, kept in memory beside the index. */
export interface SearchRecord extends SearchDocumentInput {
  type: SearchType
  id: number
  title: string
  subtitle: string
  updatedAt: number
  /** Folded, for the country filter. */
  country: string
  makerId: number | null
  materialIds: number[]
  categoryIds: number[]
  yearFrom: number | null
  yearTo: number | null
  /** A category's parent (the category filter takes subcategories too). */
  parentId: number | null
  /** The entry a note is on. */
  entry: { type: WikiEntryType, id: number } | null
}

export interface SearchSource {
  type: SearchType
  /** Live entries of the team with ids above `afterId`, in id order: the index build reads a team in pages. */
  page: (db: DbOrTx, teamId: number, afterId: number, limit: number) => Promise<SearchRecord[]>
  /** These entries as they are now; an id missing from the answer was deleted or purged. */
  byIds: (db: DbOrTx, teamId: number, ids: number[]) => Promise<SearchRecord[]>
  /** Other documents that carry this entry's text (a maker's name is in its marks), refreshed with it. */
  dependents?: (db: DbOrTx, teamId: number, ids: number[]) => Promise<{ type: SearchType, ids: number[] }>
}

const lines = (values: (string | null | undefined)[]) => values.filter(Boolean).join('\n')

function base(type: SearchType, id: number, updatedAt: Date, fields: SearchRecord['fields']): SearchRecord {
  return {
    key: `${type}:${id}`, type, id, title: '', subtitle: '', updatedAt: updatedAt.getTime(), fields,
    country: '', makerId: null, materialIds: [], categoryIds: [], yearFrom: null, yearTo: null, parentId: null, entry: null,
  }
}

/** A source whose rows come from one entry table; `build` turns a batch of rows into records. */
function tableSource<Row extends { id: number }>(
  type: SearchType,
  read: (db: DbOrTx, where: SQL, limit: number | null) => Promise<Row[]>,
  idColumn: Parameters<typeof gt>[0],
  teamColumn: Parameters<typeof eq>[0],
  liveCondition: SQL | undefined,
  build: (db: DbOrTx, teamId: number, rows: Row[]) => Promise<SearchRecord[]>,
): Omit<SearchSource, 'dependents'> {
  const scope = (teamId: number, extra: SQL) => and(eq(teamColumn, teamId), liveCondition, extra)!
  return {
    type,
    async page(db, teamId, afterId, limit) {
      return await build(db, teamId, await read(db, scope(teamId, gt(idColumn, afterId)), limit))
    },
    async byIds(db, teamId, ids) {
      if (!ids.length) return []
      return await build(db, teamId, await read(db, scope(teamId, inArray(idColumn, ids)), null))
    },
  }
}

type MarkRow = typeof marks.$inferSelect
type MakerRow = typeof makers.$inferSelect

const markSource: SearchSource = {
  ...tableSource<MarkRow>('mark', (db, where, limit) => {
    const q = db.select().from(marks).where(where).orderBy(asc(marks.id))
    return limit === null ? q : q.limit(limit)
  }, marks.id, marks.teamId, isNull(marks.deletedAt), async (db, teamId, rows) => {
    if (!rows.length) return []
    const ids = rows.map(r => r.id)
    const makerIds = [...new Set(rows.flatMap(r => r.makerId === null ? [] : [r.makerId]))]
    const [inscriptions, mats, cats, makerRows] = await Promise.all([
      db.select({ markId: markInscriptions.markId, text: markInscriptions.text }).from(markInscriptions)
        .where(and(eq(markInscriptions.teamId, teamId), inArray(markInscriptions.markId, ids)))
        .orderBy(asc(markInscriptions.markId), asc(markInscriptions.position)),
      db.select({ markId: markMaterials.markId, id: markMaterials.materialId }).from(markMaterials)
        .where(and(eq(markMaterials.teamId, teamId), inArray(markMaterials.markId, ids))),
      db.select({ markId: markCategories.markId, id: markCategories.categoryId }).from(markCategories)
        .where(and(eq(markCategories.teamId, teamId), inArray(markCategories.markId, ids))),
      makerIds.length
        ? db.select({ id: makers.id, name: makers.name, otherNames: makers.otherNames }).from(makers)
            .where(and(eq(makers.teamId, teamId), inArray(makers.id, makerIds)))
        : Promise.resolve([]),
    ])
    const group = <T extends { markId: number }>(list: T[]) => {
      const out = new Map<number, T[]>()
      for (const r of list) (out.get(r.markId) ?? out.set(r.markId, []).get(r.markId)!).push(r)
      return out
    }
    const texts = group(inscriptions)
    const matsBy = group(mats)
    const catsBy = group(cats)
    const makerBy = new Map(makerRows.map(m => [m.id, m]))
    return rows.map((r) => {
      const maker = r.makerId === null ? undefined : makerBy.get(r.makerId)
      const record = base('mark', r.id, r.updatedAt, {
        inscriptions: lines((texts.get(r.id) ?? []).map(i => i.text)),
        title: r.title,
        maker: maker ? lines([maker.name, ...maker.otherNames]) : '',
        country: r.country,
        tags: lines(r.tags),
        body: plainMarkdown(r.notes),
      })
      record.title = r.title
      record.subtitle = [maker?.name ?? '', wikiYearRange(r.yearFrom, r.yearTo), r.country].filter(Boolean).join(' · ')
      record.country = foldDiacritics(r.country)
      record.makerId = r.makerId
      record.materialIds = (matsBy.get(r.id) ?? []).map(m => m.id)
      record.categoryIds = (catsBy.get(r.id) ?? []).map(c => c.id)
      record.yearFrom = r.yearFrom
      record.yearTo = r.yearTo
      return record
    })
  }),
}

const makerSource: SearchSource = {
  ...tableSource<MakerRow>('maker', (db, where, limit) => {
    const q = db.select().from(makers).where(where).orderBy(asc(makers.id))
    return limit === null ? q : q.limit(limit)
  }, makers.id, makers.teamId, isNull(makers.deletedAt), async (_db, _teamId, rows) => rows.map((r) => {
    const record = base('maker', r.id, r.updatedAt, {
      title: r.name, otherNames: lines(r.otherNames), country: r.country, tags: lines(r.tags), body: plainMarkdown(r.notes),
    })
    record.title = r.name
    record.subtitle = [r.country, wikiYearRange(r.yearFrom, r.yearTo, r.yearFromApprox, r.yearToApprox)].filter(Boolean).join(' · ')
    record.country = foldDiacritics(r.country)
    record.yearFrom = r.yearFrom
    record.yearTo = r.yearTo
    return record
  })),
  // Marks carry their maker's names: a renamed maker re-indexes its marks.
  async dependents(db, teamId, ids) {
    if (!ids.length) return { type: 'mark', ids: [] }
    const rows = await db.select({ id: marks.id }).from(marks).where(and(eq(marks.teamId, teamId), inArray(marks.makerId, ids), isNull(marks.deletedAt)))
    return { type: 'mark', ids: rows.map(r => r.id) }
  },
}

const materialSource: SearchSource = tableSource<typeof materials.$inferSelect>('material', (db, where, limit) => {
  const q = db.select().from(materials).where(where).orderBy(asc(materials.id))
  return limit === null ? q : q.limit(limit)
}, materials.id, materials.teamId, isNull(materials.deletedAt), async (_db, _teamId, rows) => rows.map((r) => {
  const record = base('material', r.id, r.updatedAt, {
    title: r.name,
    tags: lines(r.tags),
    body: lines([r.recognition, ...Object.values(r.checks ?? {}), r.damage, r.cautions, r.notes].map(t => plainMarkdown(String(t ?? '')))),
  })
  record.title = r.name
  record.subtitle = r.tags.slice(0, 3).join(', ')
  return record
}))

const categorySource: SearchSource = tableSource<typeof categories.$inferSelect>('category', (db, where, limit) => {
  const q = db.select().from(categories).where(where).orderBy(asc(categories.id))
  return limit === null ? q : q.limit(limit)
}, categories.id, categories.teamId, isNull(categories.deletedAt), async (_db, _teamId, rows) => rows.map((r) => {
  const record = base('category', r.id, r.updatedAt, { title: r.name, tags: lines(r.tags), body: plainMarkdown(r.notes) })
  record.title = r.name
  record.parentId = r.parentId
  return record
}))

// Notes are indexed whatever state their entry is in; a note shows only while its entry is live (in the index).
const noteSource: SearchSource = tableSource<typeof entryNotes.$inferSelect>('note', (db, where, limit) => {
  const q = db.select().from(entryNotes).where(where).orderBy(asc(entryNotes.id))
  return limit === null ? q : q.limit(limit)
}, entryNotes.id, entryNotes.teamId, undefined, async (_db, _teamId, rows) => rows.map((r) => {
  const record = base('note', r.id, r.updatedAt, { body: plainMarkdown(r.body) })
  record.entry = { type: r.entryType, id: r.entryId }
  record.subtitle = r.happenedOn ?? r.createdAt.toISOString().slice(0, 10)
  return record
}))

/** Every searchable type, in the order the index build reads them. */
export const searchSources: Record<SearchType, SearchSource> = {
  maker: makerSource,
  mark: markSource,
  material: materialSource,
  category: categorySource,
  note: noteSource,
}

/** The notes on these entries (for refreshing them when their entry is purged or comes back). */
export async function searchNoteIdsOf(db: DbOrTx, teamId: number, type: WikiEntryType, ids: number[]): Promise<number[]> {
  if (!ids.length) return []
  const rows = await db.select({ id: entryNotes.id }).from(entryNotes)
    .where(and(eq(entryNotes.teamId, teamId), eq(entryNotes.entryType, type), inArray(entryNotes.entryId, ids)))
  return rows.map(r => r.id)
}
