// Makers: who made a piece, under which names, where and when.
import { and, asc, count, eq, inArray, isNull, like, or, sql } from 'drizzle-orm'
import { makers, marks } from '../../database/schema'
import {
  EMPTY_MAKER, makerContentSchema, makerCreateSchema, makerListQuery, makerPatchSchema,
  type MakerContent, type MakerListQuery,
} from '../../../shared/schemas/wiki'
import { wikiCheckYears } from './refs'
import { wikiJsonRows, wikiRows, wikiYearRange, type WikiFieldErrors, type WikiTypeConfig } from './types'

type MakerRow = typeof makers.$inferSelect

const MAKER_PAGE_MARKS = 500

function makerExtras(ids: number[], rows: { id: number, title: string, makerId: number | null }[]): Map<number, Record<string, unknown>> {
  return new Map(ids.map(id => [id, { marks: rows.filter(r => r.makerId === id).map(r => ({ id: r.id, title: r.title })) }]))
}

export const wikiMakerConfig: WikiTypeConfig<MakerContent, MakerListQuery> = {
  type: 'maker',
  label: 'maker',
  table: makers,
  titleColumn: makers.name,
  contentSchema: makerContentSchema,
  createSchema: makerCreateSchema,
  patchSchema: makerPatchSchema,
  listQuery: makerListQuery,
  empty: EMPTY_MAKER,
  markdownFields: ['notes'],
  titleOf: c => c.name,
  toRow: c => ({
    name: c.name, otherNames: c.otherNames, country: c.country, yearFrom: c.yearFrom, yearFromApprox: c.yearFromApprox,
    yearTo: c.yearTo, yearToApprox: c.yearToApprox, notes: c.notes, tags: c.tags,
  }),
  rowToContent: (r: MakerRow) => ({
    name: r.name, otherNames: r.otherNames, country: r.country, yearFrom: r.yearFrom, yearFromApprox: r.yearFromApprox,
    yearTo: r.yearTo, yearToApprox: r.yearToApprox, notes: r.notes, tags: r.tags,
  }),
  async check(_db, _teamId, _id, next) {
    const fieldErrors: WikiFieldErrors = {}
    wikiCheckYears(next.yearFrom, next.yearTo, fieldErrors)
    return { content: next, fieldErrors }
  },
  async extras(db, teamId, contents, detail) {
    if (!detail) return new Map<number, Record<string, unknown>>()
    // The maker page lists its marks, so a reader can go from the name to every known base.
    const ids = [...contents.keys()]
    const rows = ids.length
      ? await db.select({ id: marks.id, title: marks.title, makerId: marks.makerId }).from(marks)
          .where(and(eq(marks.teamId, teamId), inArray(marks.makerId, ids), isNull(marks.deletedAt)))
          .orderBy(asc(marks.title)).limit(MAKER_PAGE_MARKS)
      : []
    return makerExtras(ids, rows)
  },
  async listConditions(_db, _teamId, query) {
    return query.country ? [eq(makers.country, query.country)] : []
  },
  // JSON columns are binary-collated in MariaDB: compare other names like the name column (case-insensitive).
  searchCondition: (_teamId, pattern) => or(like(makers.name, pattern), sql`${makers.otherNames} collate utf8mb4_unicode_ci like ${pattern}`)!,
  sortColumns: {
    name: makers.name, country: makers.country, yearFrom: makers.yearFrom, yearTo: makers.yearTo,
    createdAt: makers.createdAt, updatedAt: makers.updatedAt,
  },
  defaultSort: 'name',
  async lookupSubtitles(_db, _teamId, contents) {
    const out = new Map<number, string>()
    for (const [id, c] of contents) {
      out.set(id, [c.country, wikiYearRange(c.yearFrom, c.yearTo, c.yearFromApprox, c.yearToApprox)].filter(Boolean).join(' · '))
    }
    return out
  },
  async purgeBlocker(db, teamId, id) {
    const [row] = await db.select({ n: count() }).from(marks).where(and(eq(marks.teamId, teamId), eq(marks.makerId, id)))
    const n = Number(row?.n ?? 0)
    return n ? `${n} mark${n === 1 ? '' : 's'} (counting deleted ones) still name this maker: change or purge them first.` : null
  },
  photoType: 'maker',
  // The same marks as extras reads, as one JSON list beside the maker's row (`makers`).
  detail: {
    columns: teamId => ({
      marks: wikiJsonRows(sql`(select json_arrayagg(json_array(m.id, m.title) order by m.title, m.id limit ${sql.raw(String(MAKER_PAGE_MARKS))})
        from marks m where m.team_id = ${teamId} and m.maker_id = makers.id and m.deleted_at is null)`),
    }),
    extras: (id, _content, v) => makerExtras([id], wikiRows<[number, string]>(v.marks).map(([markId, title]) => ({ id: markId, title, makerId: id }))).get(id)!,
  },
}
