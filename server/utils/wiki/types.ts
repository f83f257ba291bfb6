// The per-type configuration the generic entry engine (engine.ts) runs on. Per-type files use explicit
// imports only and take the database as a parameter: the seed runs them outside Nitro.
import type { SQL } from 'drizzle-orm'
import type { MySqlColumn, MySqlTable } from 'drizzle-orm/mysql-core'
import type { z } from 'zod'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'

export type WikiFieldErrors = Record<string, string[]>

/** The columns every entry table has (see entryColumns in schema/wiki.ts). */
export interface WikiEntryColumns {
  id: MySqlColumn
  teamId: MySqlColumn
  revision: MySqlColumn
  tags: MySqlColumn
  notes: MySqlColumn
  createdBy: MySqlColumn
  updatedBy: MySqlColumn
  deletedAt: MySqlColumn
  deletedBy: MySqlColumn
  createdAt: MySqlColumn
  updatedAt: MySqlColumn
}
export type WikiTable = MySqlTable & WikiEntryColumns

/** The columns shared by all entry rows, as read from the database. */
export interface WikiBaseRow {
  id: number
  teamId: number
  revision: number
  createdBy: number
  updatedBy: number
  deletedAt: Date | null
  deletedBy: number | null
  createdAt: Date
  updatedAt: Date
}

/** Rows for child tables, written after the entry row (replace-all on every save). */
export interface WikiChildRows { table: MySqlTable, rows: Record<string, unknown>[] }

/** Restores may meet references that were purged since: they are dropped instead of refusing the restore. */
export type WikiCheckMode = 'write' | 'restore'

export interface WikiTypeConfig<C extends object = any, Q extends object = any> {
  type: WikiEntryType
  /** Singular noun for messages: "mark". */
  label: string
  table: WikiTable
  titleColumn: MySqlColumn
  /** Normalises a whole content object (restores run old snapshots through it). */
  contentSchema: z.ZodType<C>
  createSchema: z.ZodType<Partial<C>>
  patchSchema: z.ZodType<Partial<C> & { revision: number }>
  listQuery: z.ZodType<Q & { page: number, pageSize: number, sort?: string, q?: string, tag?: string }>
  empty: C
  /** Markdown fields: rendered to <field>Html and scanned for links to other entries. */
  markdownFields: (keyof C & string)[]
  titleOf: (content: C) => string
  /** Main-row column values of a content object. */
  toRow: (content: C) => Record<string, unknown>
  /** Content held in the main row. */
  rowToContent: (row: any) => C
  /** Content held in child tables, for many entries at once. */
  loadChildren?: (db: DbOrTx, teamId: number, ids: number[]) => Promise<Map<number, Partial<C>>>
  childRows?: (teamId: number, id: number, content: C) => WikiChildRows[]
  deleteChildren?: (db: DbOrTx, teamId: number, id: number) => Promise<void>
  /** Derived values after a merge (a mark's title from its inscription). `given` is what the request sent. */
  finalize?: (next: C, previous: C | null, given: Partial<C>) => C
  /** Cross-field and reference checks, scoped to the team; returns the (maybe pruned) content and errors. */
  check: (db: DbOrTx, teamId: number, id: number | null, next: C, previous: C | null, mode: WikiCheckMode) => Promise<{ content: C, fieldErrors: WikiFieldErrors }>
  /** Type-specific read-only fields of the JSON (a mark's maker name, lookalike titles ...). */
  extras?: (db: DbOrTx, teamId: number, contents: Map<number, C>, detail: boolean) => Promise<Map<number, Record<string, unknown>>>
  listConditions: (db: DbOrTx, teamId: number, query: Q) => Promise<SQL[]>
  /** A LIKE pattern (already escaped) matched against the title and other searchable text. */
  searchCondition: (teamId: number, pattern: string) => SQL
  sortColumns: Record<string, MySqlColumn>
  defaultSort: string
  /** Short second line for the link picker. */
  lookupSubtitles: (db: DbOrTx, teamId: number, contents: Map<number, C>) => Promise<Map<number, string>>
  /** Why a purge must wait (other entries still point at this one), or null. */
  purgeBlocker?: (db: DbOrTx, teamId: number, id: number) => Promise<string | null>
  photoType: 'mark' | 'maker' | null
  /**
   * An entry's page in one statement (detail.ts): subqueries in plain SQL, correlated with the entry's row by
   * its table name, whose values give what loadChildren and extras would give. Without them those run as queries.
   */
  detail?: {
    columns: (teamId: number) => Record<string, SQL>
    children?: (id: number, values: Record<string, unknown>) => Partial<C>
    extras?: (id: number, content: C, values: Record<string, unknown>) => Record<string, unknown>
  }
}

/** A JSON_ARRAYAGG subquery as a select field: its rows (see wikiRows; no rows: MariaDB answers NULL). */
export function wikiJsonRows<T = unknown[]>(query: SQL): SQL<T[]> {
  return query.mapWith(value => wikiRows<T>(value)) as SQL<T[]>
}

/** The rows of a JSON_ARRAYAGG value as read, through drizzle's mapWith or not (NULL: no rows). */
export function wikiRows<T = unknown[]>(value: unknown): T[] {
  const rows = typeof value === 'string' ? JSON.parse(value) as unknown : value
  return Array.isArray(rows) ? rows as T[] : []
}

export function wikiYearRange(from: number | null, to: number | null, fromApprox = false, toApprox = false): string {
  const f = from === null ? '' : `${fromApprox ? 'c. ' : ''}${from}`
  const t = to === null ? '' : `${toApprox ? 'c. ' : ''}${to}`
  if (!f && !t) return ''
  if (f && t) return f === t ? f : `${f}–${t}`
  return f ? `from ${f}` : `until ${t}`
}

/** Escapes LIKE wildcards, so a search for "50%" finds the text "50%". */
export function wikiLikeEscape(text: string): string {
  return text.replace(/[\\%_]/g, c => `\\${c}`)
}
