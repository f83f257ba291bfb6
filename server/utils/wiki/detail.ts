// One entry's page in ONE statement: the entry's row with, beside it, JSON lists of its child rows and the
// names it shows (per type: config.detail), its photos, the entries linking to it and the people who wrote it.
// A page read used to be about a dozen round trips; these are the same rows, read by one statement.
import { and, eq, getTableColumns, getTableName, isNull, sql, type SQL } from 'drizzle-orm'
import type { EntryPhoto } from '../../../shared/photos'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'
import { entryPhoto } from '../photos'
import { wikiConfigs } from './registry'
import { wikiVersions } from '../../database/schema/wiki'
import { teamVersionColumn } from '../team-versions'
import { wikiJsonRows, wikiRows, type WikiBaseRow, type WikiTypeConfig } from './types'

export interface WikiDetail {
  row: WikiBaseRow & Record<string, unknown>
  content: Record<string, unknown>
  /** Undefined for a type without extras. */
  extras: Record<string, unknown> | undefined
  /** In link order, not sorted yet. */
  backlinks: { type: WikiEntryType, id: number, title: string }[]
  names: Map<number, string>
  photos: EntryPhoto[]
  /** What page-cache.ts keys a page on, read in this same statement: the team's wiki version and the entry row's own. */
  versions: WikiPageVersions
}

export interface WikiPageVersions { team: string | null, entry: string | null }

/** The team's wiki version (versions.ts) as one string. */
export const wikiTeamVersionColumn = (teamId: number) => teamVersionColumn(wikiVersions, teamId)

/** An entry row's own version (revision, last update, deletion) as one string. */
export const wikiEntryVersionColumn = (entry: SQL) => sql<string | null>`concat_ws(' ', ${entry}.revision, ${entry}.updated_at, ${entry}.deleted_at)`

/** Names of the people with these ids, as [id, name] rows. */
export const wikiPeopleColumn = (ids: SQL) => wikiJsonRows(sql`(select json_arrayagg(json_array(u.id, u.name)) from users u where u.id in (${ids}))`)

export const wikiPeopleOf = (value: unknown) => new Map(wikiRows<[number, string]>(value))

/** A table or column name for plain SQL. */
/** A table or column name, quoted, for plain SQL. */
export const wikiQuoted = (name: string) => sql.raw(`\`${name.replace(/`/g, '``')}\``)

const PREFIX = 'detail:'

/** Live entries linking to the entry, with their titles: one left join per entry type. */
function backlinksColumn(config: WikiTypeConfig, teamId: number, entry: SQL): SQL {
  const types = Object.values(wikiConfigs)
  const joins = types.map((c, n) => sql` left join ${wikiQuoted(getTableName(c.table))} ${wikiQuoted(`b${n}`)} on l.from_type = ${c.type}
    and ${wikiQuoted(`b${n}`)}.team_id = l.team_id and ${wikiQuoted(`b${n}`)}.id = l.from_id and ${wikiQuoted(`b${n}`)}.deleted_at is null`)
  const title = sql`coalesce(${sql.join(types.map((c, n) => sql`${wikiQuoted(`b${n}`)}.${wikiQuoted(c.titleColumn.name)}`), sql`, `)})`
  // The order the links' index gives (from type, from id): the sort by title afterwards keeps it for equal titles.
  return sql`(select json_arrayagg(json_array(l.from_type, l.from_id, ${title}) order by l.from_type, l.from_id) from entry_links l${sql.join(joins)}
    where l.team_id = ${teamId} and l.to_type = ${config.type} and l.to_id = ${entry}.id and ${title} is not null)`
}

/** The entry, or undefined when the team has no such (live, unless includeDeleted) entry. */
export async function wikiReadDetail(db: DbOrTx, config: WikiTypeConfig, team: { id: number, slug: string }, id: number, includeDeleted: boolean): Promise<WikiDetail | undefined> {
  const teamId = team.id
  const t = config.table
  const entry = wikiQuoted(getTableName(t))
  const own = config.detail?.columns(teamId) ?? {}
  const columns = getTableColumns(t)
  const conditions: SQL[] = [eq(t.teamId, teamId), eq(t.id, id)]
  if (!includeDeleted) conditions.push(isNull(t.deletedAt))
  const [found] = await db.select({
    ...columns,
    // Prefixed: table columns keep their own names.
    ...Object.fromEntries(Object.entries(own).map(([key, value]) => [`${PREFIX}${key}`, value])),
    [`${PREFIX}people`]: wikiPeopleColumn(sql`${entry}.created_by, ${entry}.updated_by, ${entry}.deleted_by`),
    [`${PREFIX}backlinks`]: wikiJsonRows(backlinksColumn(config, teamId, entry)),
    ...(config.photoType
      ? {
          [`${PREFIX}photos`]: wikiJsonRows(sql`(select json_arrayagg(json_array(p.id, p.width, p.height) order by p.position, p.id) from photos p
            where p.team_id = ${teamId} and p.entity_type = ${config.photoType} and p.entity_id = ${entry}.id)`),
        }
      : {}),
    [`${PREFIX}teamVersion`]: wikiTeamVersionColumn(teamId),
    [`${PREFIX}entryVersion`]: wikiEntryVersionColumn(entry),
  }).from(t).where(and(...conditions)) as Record<string, unknown>[]
  if (!found) return undefined
  const row = Object.fromEntries(Object.keys(columns).map(key => [key, found[key]])) as WikiDetail['row']
  const values = Object.fromEntries(Object.keys(own).map(key => [key, found[`${PREFIX}${key}`]]))
  // A type whose child content or extras have no subqueries reads them as the list does.
  const children = config.loadChildren
    ? config.detail?.children?.(id, values) ?? (await config.loadChildren(db, teamId, [id])).get(id)
    : undefined
  const content = { ...config.rowToContent(row), ...children }
  const extras = config.extras
    ? config.detail?.extras?.(id, content, values) ?? (await config.extras(db, teamId, new Map([[id, content]]), true)).get(id)
    : undefined
  return {
    row,
    content,
    extras,
    backlinks: wikiRows<[WikiEntryType, number, string]>(found[`${PREFIX}backlinks`]).map(([type, fromId, title]) => ({ type, id: fromId, title })),
    names: wikiPeopleOf(found[`${PREFIX}people`]),
    photos: wikiRows<[number, number, number]>(found[`${PREFIX}photos`]).map(([photoId, width, height]) => entryPhoto(team.slug, { id: photoId, width, height })),
    versions: { team: found[`${PREFIX}teamVersion`] as string | null, entry: found[`${PREFIX}entryVersion`] as string | null },
  }
}
