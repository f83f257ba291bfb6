// Categories: a tree of kinds of goods (Glass › Pressed glass), used to file marks.
import { and, asc, count, eq, inArray, isNull, like, sql } from 'drizzle-orm'
import { categories, markCategories } from '../../database/schema'
import {
  EMPTY_CATEGORY, categoryContentSchema, categoryCreateSchema, categoryListQuery, categoryPatchSchema,
  type CategoryContent, type CategoryListQuery,
} from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'
import { wikiCheckRefs } from './refs'
import { wikiJsonRows, wikiRows, type WikiFieldErrors, type WikiTypeConfig } from './types'

type CategoryRow = typeof categories.$inferSelect

/** Parent of every category of the team; `lock` takes row locks so two concurrent moves cannot form a cycle. */
async function parentMap(db: DbOrTx, teamId: number, lock: boolean): Promise<Map<number, { parentId: number | null, name: string }>> {
  const query = db.select({ id: categories.id, parentId: categories.parentId, name: categories.name }).from(categories).where(eq(categories.teamId, teamId))
  const rows = lock ? await query.for('update') : await query
  return new Map(rows.map(r => [r.id, { parentId: r.parentId, name: r.name }]))
}

/** Ancestors from the root down to the category's parent. */
function ancestors(parents: Map<number, { parentId: number | null, name: string }>, id: number): { id: number, name: string }[] {
  const path: { id: number, name: string }[] = []
  const seen = new Set<number>([id])
  for (let at = parents.get(id)?.parentId ?? null; at !== null && !seen.has(at); at = parents.get(at)?.parentId ?? null) {
    seen.add(at)
    path.unshift({ id: at, name: parents.get(at)?.name ?? '' })
  }
  return path
}

function categoryExtras(contents: Map<number, CategoryContent>, parents: Map<number, { parentId: number | null, name: string }>,
  childRows: { id: number, name: string, parentId: number | null }[], detail: boolean): Map<number, Record<string, unknown>> {
  const out = new Map<number, Record<string, unknown>>()
  for (const [id, c] of contents) {
    const parent = c.parentId === null ? undefined : parents.get(c.parentId)
    out.set(id, {
      parent: parent && c.parentId !== null ? { id: c.parentId, name: parent.name } : null,
      ...(detail
        ? { path: ancestors(parents, id), children: childRows.filter(r => r.parentId === id).map(r => ({ id: r.id, name: r.name })) }
        : {}),
    })
  }
  return out
}

export const wikiCategoryConfig: WikiTypeConfig<CategoryContent, CategoryListQuery> = {
  type: 'category',
  label: 'category',
  table: categories,
  titleColumn: categories.name,
  contentSchema: categoryContentSchema,
  createSchema: categoryCreateSchema,
  patchSchema: categoryPatchSchema,
  listQuery: categoryListQuery,
  empty: EMPTY_CATEGORY,
  markdownFields: ['notes'],
  titleOf: c => c.name,
  toRow: c => ({ parentId: c.parentId, name: c.name, notes: c.notes, tags: c.tags }),
  rowToContent: (r: CategoryRow) => ({ parentId: r.parentId, name: r.name, notes: r.notes, tags: r.tags }),
  async check(db, teamId, id, next, previous, mode) {
    const errors: WikiFieldErrors = {}
    const content = { ...next }
    if (content.parentId === null || content.parentId === previous?.parentId) return { content, fieldErrors: errors }
    if (content.parentId === id) {
      errors.parentId = ['A category cannot be its own parent.']
      return { content, fieldErrors: errors }
    }
    const [parentId] = await wikiCheckRefs({
      db, table: categories, teamId, ids: [content.parentId], previous: [], mode, field: 'parentId', label: 'category', errors,
    })
    content.parentId = parentId ?? null
    if (id === null || content.parentId === null || errors.parentId) return { content, fieldErrors: errors }
    // Walk up from the new parent under row locks: reaching this category means the move would close a loop.
    const parents = await parentMap(db, teamId, true)
    if (ancestors(parents, content.parentId).some(a => a.id === id)) {
      errors.parentId = ['This parent is inside this category: a category cannot be placed under itself or its own subcategories.']
    }
    return { content, fieldErrors: errors }
  },
  async extras(db, teamId, contents, detail) {
    if (!contents.size) return new Map<number, Record<string, unknown>>()
    const parents = await parentMap(db, teamId, false)
    const childRows = detail
      ? await db.select({ id: categories.id, name: categories.name, parentId: categories.parentId }).from(categories)
          .where(and(eq(categories.teamId, teamId), inArray(categories.parentId, [...contents.keys()]), isNull(categories.deletedAt)))
          .orderBy(asc(categories.name))
      : []
    return categoryExtras(contents, parents, childRows, detail)
  },
  async listConditions(_db, _teamId, query) {
    if (query.parentId === undefined) return []
    return [query.parentId === 'root' ? isNull(categories.parentId) : eq(categories.parentId, query.parentId)]
  },
  searchCondition: (_teamId, pattern) => like(categories.name, pattern),
  sortColumns: { name: categories.name, createdAt: categories.createdAt, updatedAt: categories.updatedAt },
  defaultSort: 'name',
  async lookupSubtitles(db, teamId, contents) {
    const parents = await parentMap(db, teamId, false)
    return new Map([...contents.keys()].map(id => [id, ancestors(parents, id).map(a => a.name).join(' › ')]))
  },
  async purgeBlocker(db, teamId, id) {
    const [[children], [filed]] = await Promise.all([
      db.select({ n: count() }).from(categories).where(and(eq(categories.teamId, teamId), eq(categories.parentId, id))),
      db.select({ n: count() }).from(markCategories).where(and(eq(markCategories.teamId, teamId), eq(markCategories.categoryId, id))),
    ])
    const reasons = []
    if (Number(children?.n)) reasons.push(`${children!.n} subcategories`)
    if (Number(filed?.n)) reasons.push(`${filed!.n} marks`)
    return reasons.length ? `${reasons.join(' and ')} (counting deleted ones) still sit in this category: move or purge them first.` : null
  },
  photoType: null,
  // The team's tree (as parentMap reads it) and the live subcategories, as JSON lists beside the row (`categories`).
  detail: {
    columns: teamId => ({
      tree: wikiJsonRows(sql`(select json_arrayagg(json_array(c.id, c.parent_id, c.name)) from categories c where c.team_id = ${teamId})`),
      children: wikiJsonRows(sql`(select json_arrayagg(json_array(c.id, c.name) order by c.name, c.id) from categories c
        where c.team_id = ${teamId} and c.parent_id = categories.id and c.deleted_at is null)`),
    }),
    extras: (id, content, v) => categoryExtras(
      new Map([[id, content]]),
      new Map(wikiRows<[number, number | null, string]>(v.tree).map(([treeId, parentId, name]) => [treeId, { parentId, name }])),
      wikiRows<[number, string]>(v.children).map(([childId, name]) => ({ id: childId, name, parentId: id })),
      true,
    ).get(id)!,
  },
}
