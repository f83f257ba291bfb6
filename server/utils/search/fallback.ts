// Answers from MariaDB while a team's in-memory index is being built: InnoDB FULLTEXT (boolean mode, each
// word as a prefix) on inscriptions, mark titles and maker names, plus a prefix LIKE of the whole query.
// No typo tolerance and no notes: good enough for the seconds a large team's first build takes.
import { and, asc, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import { categories, makers, markInscriptions, materials } from '../../database/schema'
import { foldDiacritics, plainMarkdown, tokenize } from '../../../shared/search/normalise'
import { SEARCH_MIN_QUERY, searchQueryWords } from '../../../shared/search/options'
import { predicateFromTerms, summariseMatches } from '../../../shared/search/snippet'
import type { SearchField, SearchHit, SearchType } from '../../../shared/search/types'
import type { SearchParams } from '../../../shared/search/schema'
import { WIKI_PATH_SEGMENTS, type WikiEntryType } from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'
import { wikiLikeEscape, wikiYearRange } from '../wiki/types'
import type { SearchFound } from './team-index'

type Row = Record<string, unknown>

async function rowsOf(db: DbOrTx, query: SQL): Promise<Row[]> {
  const [rows] = await db.execute(query) as unknown as [Row[]]
  return rows
}

/** Boolean-mode FULLTEXT text: each word of 3+ letters (InnoDB's shortest indexed word) as a prefix, any of them. */
export function searchFulltextQuery(q: string): string {
  return [...new Set(tokenize(q).map(w => foldDiacritics(w).replace(/[^\p{L}\p{N}]/gu, '')).filter(w => w.length >= 3))]
    .map(w => `${w}*`).join(' ')
}

async function categoryIds(db: DbOrTx, teamId: number, root: number): Promise<number[]> {
  const rows = await db.select({ id: categories.id, parentId: categories.parentId }).from(categories).where(eq(categories.teamId, teamId))
  const out = new Set([root])
  let grew = true
  while (grew) {
    grew = false
    for (const r of rows) if (r.parentId !== null && out.has(r.parentId) && !out.has(r.id)) grew = out.add(r.id) !== undefined
  }
  return [...out]
}

function pathOf(slug: string, type: WikiEntryType, id: number) {
  return `/t/${slug}/${WIKI_PATH_SEGMENTS[type]}/${id}`
}

export async function searchDatabase(db: DbOrTx, team: { id: number, slug: string }, params: SearchParams): Promise<SearchFound> {
  const teamId = team.id
  const recent = params.q.length < SEARCH_MIN_QUERY
  const ft = recent ? '' : searchFulltextQuery(params.q)
  const prefix = `${wikiLikeEscape(params.q)}%`
  const isMatch = predicateFromTerms(searchQueryWords(params.q).flatMap(w => w.terms))
  const markOnly = params.makerId !== undefined || params.materialId !== undefined || params.categoryId !== undefined || params.year !== undefined
  const wanted = (type: SearchType) => params.types.includes(type) && (!markOnly || type === 'mark') && (!params.country || type === 'mark' || type === 'maker')
  const found: SearchHit[] = []
  const summary = (fields: Partial<Record<SearchField, string>>) => {
    if (recent) return { matched: {}, snippet: null }
    const predicates: Partial<Record<SearchField, (w: string) => boolean>> = {}
    for (const f of Object.keys(fields) as SearchField[]) predicates[f] = isMatch
    return summariseMatches(fields, predicates)
  }

  if (wanted('mark')) {
    const filters: SQL[] = []
    if (params.country) filters.push(sql`m.country = ${params.country}`)
    if (params.makerId !== undefined) filters.push(sql`m.maker_id = ${params.makerId}`)
    if (params.materialId !== undefined) {
      filters.push(sql`exists (select 1 from mark_materials mm where mm.team_id = ${teamId} and mm.mark_id = m.id and mm.material_id = ${params.materialId})`)
    }
    if (params.categoryId !== undefined) {
      const ids = await categoryIds(db, teamId, params.categoryId)
      filters.push(sql`exists (select 1 from mark_categories mc where mc.team_id = ${teamId} and mc.mark_id = m.id and mc.category_id in (${sql.join(ids.map(id => sql`${id}`), sql`, `)}))`)
    }
    if (params.year !== undefined) {
      filters.push(sql`(m.year_from is not null or m.year_to is not null) and (m.year_from is null or m.year_from <= ${params.year}) and (m.year_to is null or m.year_to >= ${params.year})`)
    }
    const where = filters.length ? sql` and ${sql.join(filters, sql` and `)}` : sql``
    const textScore = (column: SQL) => ft
      ? sql`match(${column}) against (${ft} in boolean mode) + (${column} like ${prefix}) * 5`
      : sql`(${column} like ${prefix}) * 5`
    const textHit = (column: SQL) => ft ? sql`(match(${column}) against (${ft} in boolean mode) or ${column} like ${prefix})` : sql`${column} like ${prefix}`
    const rows = recent
      ? await rowsOf(db, sql`select m.id, m.title, m.country, m.maker_id as makerId, m.year_from as yearFrom, m.year_to as yearTo, 0 as score
          from marks m where m.team_id = ${teamId} and m.deleted_at is null${where} order by m.updated_at desc, m.id desc limit ${params.limit}`)
      : await rowsOf(db, sql`select m.id, m.title, m.country, m.maker_id as makerId, m.year_from as yearFrom, m.year_to as yearTo, s.score
          from (
            select c.id, max(c.score) as score from (
              select i.mark_id as id, ${textScore(sql`i.text`)} as score from mark_inscriptions i
                where i.team_id = ${teamId} and ${textHit(sql`i.text`)}
              union all
              select t.id, ${textScore(sql`t.title`)} from marks t where t.team_id = ${teamId} and ${textHit(sql`t.title`)}
            ) c group by c.id
          ) s join marks m on m.id = s.id and m.team_id = ${teamId} and m.deleted_at is null
          where 1 = 1${where} order by s.score desc, m.id limit ${params.limit}`)
    const ids = rows.map(r => Number(r.id))
    const makerIds = [...new Set(rows.flatMap(r => r.makerId === null ? [] : [Number(r.makerId)]))]
    const [texts, makerRows] = await Promise.all([
      ids.length
        ? db.select({ markId: markInscriptions.markId, text: markInscriptions.text }).from(markInscriptions)
            .where(and(eq(markInscriptions.teamId, teamId), inArray(markInscriptions.markId, ids))).orderBy(asc(markInscriptions.position))
        : Promise.resolve([]),
      makerIds.length ? db.select({ id: makers.id, name: makers.name }).from(makers).where(and(eq(makers.teamId, teamId), inArray(makers.id, makerIds))) : Promise.resolve([]),
    ])
    const makerNames = new Map(makerRows.map(m => [m.id, m.name]))
    for (const r of rows) {
      const id = Number(r.id)
      const makerName = r.makerId === null ? '' : makerNames.get(Number(r.makerId)) ?? ''
      const fields = { inscriptions: texts.filter(t => t.markId === id).map(t => t.text).join('\n'), title: String(r.title), maker: makerName }
      found.push({
        type: 'mark', id, title: String(r.title), score: Number(r.score),
        subtitle: [makerName, wikiYearRange(r.yearFrom as number | null, r.yearTo as number | null), String(r.country ?? '')].filter(Boolean).join(' · '),
        ...summary(fields), path: pathOf(team.slug, 'mark', id),
      })
    }
  }

  if (wanted('maker')) {
    const conditions: SQL[] = [eq(makers.teamId, teamId), isNull(makers.deletedAt)]
    if (params.country) conditions.push(eq(makers.country, params.country))
    if (!recent) {
      const anywhere = `%${wikiLikeEscape(params.q)}%`
      conditions.push(sql`(${ft ? sql`match(${makers.name}) against (${ft} in boolean mode) or ` : sql``}${makers.name} like ${prefix} or ${makers.otherNames} collate utf8mb4_unicode_ci like ${anywhere})`)
    }
    const score = ft ? sql<number>`match(${makers.name}) against (${ft} in boolean mode) + (${makers.name} like ${prefix}) * 5` : sql<number>`(${makers.name} like ${prefix}) * 5`
    const rows = await db.select({ row: makers, score }).from(makers).where(and(...conditions))
      .orderBy(recent ? desc(makers.updatedAt) : desc(score), asc(makers.id)).limit(params.limit)
    for (const { row: r, score: s } of rows) {
      found.push({
        type: 'maker', id: r.id, title: r.name, score: Number(s),
        subtitle: [r.country, wikiYearRange(r.yearFrom, r.yearTo, r.yearFromApprox, r.yearToApprox)].filter(Boolean).join(' · '),
        ...summary({ title: r.name, otherNames: r.otherNames.join('\n'), body: plainMarkdown(r.notes) }), path: pathOf(team.slug, 'maker', r.id),
      })
    }
  }

  for (const [type, table] of [['material', materials], ['category', categories]] as const) {
    if (!wanted(type)) continue
    const conditions: SQL[] = [eq(table.teamId, teamId), isNull(table.deletedAt)]
    if (!recent) conditions.push(sql`${table.name} like ${prefix}`)
    const rows = await db.select({ id: table.id, name: table.name }).from(table).where(and(...conditions))
      .orderBy(recent ? desc(table.updatedAt) : asc(table.name)).limit(params.limit)
    for (const r of rows) {
      found.push({ type, id: r.id, title: r.name, subtitle: '', score: recent ? 0 : 5, ...summary({ title: r.name }), path: pathOf(team.slug, type, r.id) })
    }
  }

  found.sort((a, b) => b.score - a.score)
  return { hits: found.slice(0, params.limit), total: found.length }
}
