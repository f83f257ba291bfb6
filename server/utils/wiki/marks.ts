// Marks: what is on a base, exactly as written, and what it tells about the piece.
import { and, asc, eq, exists, gte, inArray, isNotNull, isNull, like, lte, or, sql, type SQL } from 'drizzle-orm'
import { categories, makers, markCategories, markInscriptions, markLookalikes, markMaterials, marks, materials } from '../../database/schema'
import {
  EMPTY_MARK, WIKI_LIMITS, markContentSchema, markCreateSchema, markListQuery, markPatchSchema,
  type MarkContent, type MarkListQuery,
} from '../../../shared/schemas/wiki'
import { renderMarkdown } from '../../../shared/markdown'
import type { DbOrTx } from '../db'
import { wikiCheckRefs, wikiCheckYears } from './refs'
import { wikiJsonRows, wikiRows, wikiYearRange, type WikiFieldErrors, type WikiTypeConfig } from './types'

type MarkRow = typeof marks.$inferSelect

/** The category and all categories below it, so a filter on "Glass" also finds "Glass › Pressed". */
async function categoryWithDescendants(db: DbOrTx, teamId: number, categoryId: number): Promise<number[]> {
  const rows = await db.select({ id: categories.id, parentId: categories.parentId }).from(categories).where(eq(categories.teamId, teamId))
  const children = new Map<number, number[]>()
  for (const r of rows) if (r.parentId !== null) (children.get(r.parentId) ?? children.set(r.parentId, []).get(r.parentId)!).push(r.id)
  const out = new Set<number>([categoryId])
  const queue = [categoryId]
  while (queue.length) {
    for (const child of children.get(queue.pop()!) ?? []) {
      if (out.has(child)) continue
      out.add(child)
      queue.push(child)
    }
  }
  return [...out]
}

async function namesById(db: DbOrTx, table: typeof makers | typeof materials | typeof categories, teamId: number, ids: number[]) {
  if (!ids.length) return new Map<number, string>()
  const rows = await db.select({ id: table.id, name: table.name }).from(table).where(and(eq(table.teamId, teamId), inArray(table.id, ids)))
  return new Map(rows.map(r => [r.id, r.name]))
}

interface MarkChildRows {
  inscriptions: { markId: number, text: string }[]
  materials: { markId: number, materialId: number }[]
  categories: { markId: number, categoryId: number }[]
  pairs: { markLowId: number, markHighId: number, howToTell: string }[]
}

/** The child content of marks from their child rows (inscriptions in base order). */
function markChildren(ids: number[], rows: MarkChildRows): Map<number, Partial<MarkContent>> {
  const out = new Map<number, Partial<MarkContent>>(ids.map(id => [id, { inscriptions: [], materialIds: [], categoryIds: [], lookalikes: [] }]))
  for (const r of rows.inscriptions) out.get(r.markId)!.inscriptions!.push(r.text)
  for (const r of rows.materials) out.get(r.markId)!.materialIds!.push(r.materialId)
  for (const r of rows.categories) out.get(r.markId)!.categoryIds!.push(r.categoryId)
  // One row per pair, shown from both sides.
  for (const r of rows.pairs) {
    out.get(r.markLowId)?.lookalikes!.push({ markId: r.markHighId, howToTell: r.howToTell })
    out.get(r.markHighId)?.lookalikes!.push({ markId: r.markLowId, howToTell: r.howToTell })
  }
  for (const c of out.values()) {
    c.materialIds!.sort((a, b) => a - b)
    c.categoryIds!.sort((a, b) => a - b)
    c.lookalikes!.sort((a, b) => a.markId - b.markId)
  }
  return out
}

interface MarkNames { makerNames: Map<number, string>, materialNames: Map<number, string>, categoryNames: Map<number, string>, markTitles: Map<number, string> }

/** Ids found (a name), from [id, name or null] pairs. */
const named = (pairs: [number, string | null][]) => new Map(pairs.filter((p): p is [number, string] => p[1] !== null))

function markExtras(contents: Map<number, MarkContent>, names: MarkNames): Map<number, Record<string, unknown>> {
  const { makerNames, materialNames, categoryNames, markTitles } = names
  const out = new Map<number, Record<string, unknown>>()
  for (const [id, c] of contents) {
    out.set(id, {
      maker: c.makerId !== null && makerNames.has(c.makerId) ? { id: c.makerId, name: makerNames.get(c.makerId)! } : null,
      materials: c.materialIds.filter(m => materialNames.has(m)).map(m => ({ id: m, name: materialNames.get(m)! })),
      categories: c.categoryIds.filter(m => categoryNames.has(m)).map(m => ({ id: m, name: categoryNames.get(m)! })),
      lookalikes: c.lookalikes.map(l => ({
        markId: l.markId, title: markTitles.get(l.markId) ?? '', howToTell: l.howToTell, howToTellHtml: renderMarkdown(l.howToTell),
      })),
    })
  }
  return out
}

export const wikiMarkConfig: WikiTypeConfig<MarkContent, MarkListQuery> = {
  type: 'mark',
  label: 'mark',
  table: marks,
  titleColumn: marks.title,
  contentSchema: markContentSchema,
  createSchema: markCreateSchema,
  patchSchema: markPatchSchema,
  listQuery: markListQuery,
  empty: EMPTY_MARK,
  markdownFields: ['notes'],
  titleOf: c => c.title,
  toRow: c => ({
    title: c.title, makerId: c.makerId, markType: c.markType, colour: c.colour, position: c.position, country: c.country,
    yearFrom: c.yearFrom, yearTo: c.yearTo, dateConfidence: c.dateConfidence, notes: c.notes, tags: c.tags,
  }),
  rowToContent: (r: MarkRow) => ({
    ...EMPTY_MARK,
    title: r.title, makerId: r.makerId, markType: r.markType, colour: r.colour, position: r.position, country: r.country,
    yearFrom: r.yearFrom, yearTo: r.yearTo, dateConfidence: r.dateConfidence, notes: r.notes, tags: r.tags,
  }),
  async loadChildren(db, teamId, ids) {
    if (!ids.length) return markChildren(ids, { inscriptions: [], materials: [], categories: [], pairs: [] })
    const [inscriptions, mats, cats, pairs] = await Promise.all([
      db.select().from(markInscriptions).where(and(eq(markInscriptions.teamId, teamId), inArray(markInscriptions.markId, ids)))
        .orderBy(asc(markInscriptions.markId), asc(markInscriptions.position)),
      db.select().from(markMaterials).where(and(eq(markMaterials.teamId, teamId), inArray(markMaterials.markId, ids))),
      db.select().from(markCategories).where(and(eq(markCategories.teamId, teamId), inArray(markCategories.markId, ids))),
      db.select().from(markLookalikes).where(and(eq(markLookalikes.teamId, teamId),
        or(inArray(markLookalikes.markLowId, ids), inArray(markLookalikes.markHighId, ids)))),
    ])
    return markChildren(ids, { inscriptions, materials: mats, categories: cats, pairs })
  },
  childRows: (teamId, id, c) => [
    { table: markInscriptions, rows: c.inscriptions.map((text, position) => ({ teamId, markId: id, position, text })) },
    { table: markMaterials, rows: c.materialIds.map(materialId => ({ teamId, markId: id, materialId })) },
    { table: markCategories, rows: c.categoryIds.map(categoryId => ({ teamId, markId: id, categoryId })) },
    {
      table: markLookalikes,
      rows: c.lookalikes.map(l => ({ teamId, markLowId: Math.min(id, l.markId), markHighId: Math.max(id, l.markId), howToTell: l.howToTell })),
    },
  ],
  async deleteChildren(db, teamId, id) {
    await db.delete(markInscriptions).where(and(eq(markInscriptions.teamId, teamId), eq(markInscriptions.markId, id)))
    await db.delete(markMaterials).where(and(eq(markMaterials.teamId, teamId), eq(markMaterials.markId, id)))
    await db.delete(markCategories).where(and(eq(markCategories.teamId, teamId), eq(markCategories.markId, id)))
    await db.delete(markLookalikes).where(and(eq(markLookalikes.teamId, teamId), or(eq(markLookalikes.markLowId, id), eq(markLookalikes.markHighId, id))))
  },
  finalize(next, previous, given) {
    // A title that was only the first inscription follows the inscriptions when they change.
    const wasDerived = previous !== null && previous.title === (previous.inscriptions[0] ?? '').slice(0, WIKI_LIMITS.title)
    const title = given.title === undefined && wasDerived ? '' : next.title
    return { ...next, title: title || (next.inscriptions[0] ?? '').slice(0, WIKI_LIMITS.title) }
  },
  async check(db, teamId, id, next, previous, mode) {
    const errors: WikiFieldErrors = {}
    const before = previous ?? EMPTY_MARK
    wikiCheckYears(next.yearFrom, next.yearTo, errors)
    const content = { ...next }
    if (content.makerId !== null) {
      const [makerId] = await wikiCheckRefs({
        db, table: makers, teamId, ids: [content.makerId], previous: before.makerId === null ? [] : [before.makerId], mode, field: 'makerId', label: 'maker', errors,
      })
      content.makerId = makerId ?? null
    }
    content.materialIds = await wikiCheckRefs({ db, table: materials, teamId, ids: content.materialIds, previous: before.materialIds, mode, field: 'materialIds', label: 'material', errors })
    content.categoryIds = await wikiCheckRefs({ db, table: categories, teamId, ids: content.categoryIds, previous: before.categoryIds, mode, field: 'categoryIds', label: 'category', errors })
    const selfIndex = content.lookalikes.findIndex(l => l.markId === id)
    if (selfIndex >= 0) (errors[`lookalikes.${selfIndex}.markId`] ??= []).push('A mark cannot be its own lookalike.')
    const keptIds = await wikiCheckRefs({
      db, table: marks, teamId, ids: content.lookalikes.map(l => l.markId), previous: before.lookalikes.map(l => l.markId), mode,
      field: 'lookalikes', label: 'mark', errors, keyOf: markId => `lookalikes.${content.lookalikes.findIndex(l => l.markId === markId)}.markId`,
    })
    content.lookalikes = content.lookalikes.filter(l => keptIds.includes(l.markId)).sort((a, b) => a.markId - b.markId)
    return { content, fieldErrors: errors }
  },
  async extras(db, teamId, contents) {
    const all = [...contents.values()]
    const [makerNames, materialNames, categoryNames, markTitles] = await Promise.all([
      namesById(db, makers, teamId, [...new Set(all.flatMap(c => c.makerId === null ? [] : [c.makerId]))]),
      namesById(db, materials, teamId, [...new Set(all.flatMap(c => c.materialIds))]),
      namesById(db, categories, teamId, [...new Set(all.flatMap(c => c.categoryIds))]),
      (async () => {
        const ids = [...new Set(all.flatMap(c => c.lookalikes.map(l => l.markId)))]
        if (!ids.length) return new Map<number, string>()
        const rows = await db.select({ id: marks.id, title: marks.title }).from(marks).where(and(eq(marks.teamId, teamId), inArray(marks.id, ids)))
        return new Map(rows.map(r => [r.id, r.title]))
      })(),
    ])
    return markExtras(contents, { makerNames, materialNames, categoryNames, markTitles })
  },
  async listConditions(db, teamId, q) {
    const where: SQL[] = []
    if (q.makerId) where.push(eq(marks.makerId, q.makerId))
    if (q.country) where.push(eq(marks.country, q.country))
    if (q.markType) where.push(eq(marks.markType, q.markType))
    if (q.materialId) {
      where.push(exists(db.select({ one: sql`1` }).from(markMaterials).where(and(
        eq(markMaterials.teamId, teamId), eq(markMaterials.markId, marks.id), eq(markMaterials.materialId, q.materialId)))))
    }
    if (q.categoryId) {
      const ids = await categoryWithDescendants(db, teamId, q.categoryId)
      where.push(exists(db.select({ one: sql`1` }).from(markCategories).where(and(
        eq(markCategories.teamId, teamId), eq(markCategories.markId, marks.id), inArray(markCategories.categoryId, ids)))))
    }
    if (q.year !== undefined) {
      // Open-ended ranges count ("from 1950" includes 1970); undated marks never match a year.
      where.push(or(isNotNull(marks.yearFrom), isNotNull(marks.yearTo))!)
      where.push(or(isNull(marks.yearFrom), lte(marks.yearFrom, q.year))!)
      where.push(or(isNull(marks.yearTo), gte(marks.yearTo, q.year))!)
    }
    return where
  },
  searchCondition: (teamId, pattern) => or(
    like(marks.title, pattern),
    sql`exists (select 1 from ${markInscriptions} where ${markInscriptions.teamId} = ${teamId} and ${markInscriptions.markId} = ${marks.id} and ${markInscriptions.text} like ${pattern})`,
  )!,
  sortColumns: {
    title: marks.title, country: marks.country, markType: marks.markType, yearFrom: marks.yearFrom, yearTo: marks.yearTo,
    createdAt: marks.createdAt, updatedAt: marks.updatedAt,
  },
  defaultSort: 'title',
  async lookupSubtitles(db, teamId, contents) {
    const names = await namesById(db, makers, teamId, [...new Set([...contents.values()].flatMap(c => c.makerId === null ? [] : [c.makerId]))])
    const out = new Map<number, string>()
    for (const [id, c] of contents) {
      const parts = [c.makerId === null ? '' : names.get(c.makerId) ?? '', wikiYearRange(c.yearFrom, c.yearTo), c.country]
      out.set(id, parts.filter(Boolean).join(' · '))
    }
    return out
  },
  photoType: 'mark',
  // The same rows as loadChildren and extras read, one JSON list each, beside the mark's row (`marks`).
  detail: {
    columns: teamId => ({
      inscriptions: wikiJsonRows(sql`(select json_arrayagg(i.text order by i.position) from mark_inscriptions i
        where i.team_id = ${teamId} and i.mark_id = marks.id)`),
      materials: wikiJsonRows(sql`(select json_arrayagg(json_array(x.material_id, n.name)) from mark_materials x
        left join materials n on n.team_id = x.team_id and n.id = x.material_id where x.team_id = ${teamId} and x.mark_id = marks.id)`),
      categories: wikiJsonRows(sql`(select json_arrayagg(json_array(x.category_id, n.name)) from mark_categories x
        left join categories n on n.team_id = x.team_id and n.id = x.category_id where x.team_id = ${teamId} and x.mark_id = marks.id)`),
      pairs: wikiJsonRows(sql`(select json_arrayagg(json_array(p.mark_low_id, p.mark_high_id, p.how_to_tell, lo.title, hi.title)) from mark_lookalikes p
        left join marks lo on lo.team_id = p.team_id and lo.id = p.mark_low_id left join marks hi on hi.team_id = p.team_id and hi.id = p.mark_high_id
        where p.team_id = ${teamId} and (p.mark_low_id = marks.id or p.mark_high_id = marks.id))`),
      makerName: sql<string | null>`(select n.name from makers n where n.team_id = ${teamId} and n.id = marks.maker_id)`,
    }),
    children: (id, v) => markChildren([id], {
      inscriptions: wikiRows<string>(v.inscriptions).map(text => ({ markId: id, text })),
      materials: wikiRows<[number, string | null]>(v.materials).map(([materialId]) => ({ markId: id, materialId })),
      categories: wikiRows<[number, string | null]>(v.categories).map(([categoryId]) => ({ markId: id, categoryId })),
      pairs: wikiRows<[number, number, string]>(v.pairs).map(([markLowId, markHighId, howToTell]) => ({ markLowId, markHighId, howToTell })),
    }).get(id)!,
    extras: (id, content, v) => markExtras(new Map([[id, content]]), {
      makerNames: new Map(content.makerId !== null && typeof v.makerName === 'string' ? [[content.makerId, v.makerName]] : []),
      materialNames: named(wikiRows<[number, string | null]>(v.materials)),
      categoryNames: named(wikiRows<[number, string | null]>(v.categories)),
      markTitles: named(wikiRows<[number, number, string, string | null, string | null]>(v.pairs).flatMap(([low, high, , lowTitle, highTitle]) => [[low, lowTitle], [high, highTitle]])),
    }).get(id)!,
  },
}
