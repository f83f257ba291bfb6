// Pieces every ledger module shares: the team's ledger settings, reference checks (every id a request names
// must be the same team's row), optimistic-concurrency conflicts and list helpers.
import { and, asc, desc, eq, getTableColumns, getTableName, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import mysql from 'mysql2/promise'
import type { MySqlColumn, MySqlTable } from 'drizzle-orm/mysql-core'
import { DEFAULT_CONDITION_SCALE } from '../../../shared/ledger/item-rules'
import { DEFAULT_LEDGER_CURRENCY, ledgerCurrencyOf } from '../../../shared/ledger/currencies'
import type { LedgerSettings } from '../../../shared/types/ledger'

export type LedgerFieldErrors = Record<string, string[]>

/** Thrown inside a transaction so it rolls back; turned into a 409 with the current record outside it. */
export class LedgerConflict extends Error {}

const DEADLOCK_RETRIES = 3

/** A transaction, run again when InnoDB picked it as a deadlock victim. */
export async function ledgerTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await useDb().transaction(work)
    }
    catch (error) {
      const code = (error as { cause?: { code?: string }, code?: string }).cause?.code ?? (error as { code?: string }).code
      if (code !== 'ER_LOCK_DEADLOCK' || attempt >= DEADLOCK_RETRIES) throw error
    }
  }
}

export function ledgerAddError(errors: LedgerFieldErrors, field: string, message: string) {
  (errors[field] ??= []).push(message)
}

export function ledgerThrowIfInvalid(what: string, errors: LedgerFieldErrors) {
  const first = Object.entries(errors)[0]
  if (first) throw httpError(400, `Please check the ${what}: ${first[0]}: ${first[1][0]}`, errors)
}

export function ledgerConflictError(what: string, current: { revision: number }) {
  return httpError(409, `Someone saved this ${what} while you were editing (it is now at revision ${current.revision}). `
    + 'Your changes were not saved: compare them with the current version and save again.', undefined, { current })
}

/** Today's calendar date in UTC, the ledger's default day for an event recorded now. */
export function ledgerToday(): string {
  return new Date().toISOString().slice(0, 10)
}

/** SQL SUM() comes back as a DECIMAL string (or null over no rows): a whole number of cents. */
export function ledgerSqlNumber(value: unknown): number {
  if (value === null || value === undefined) return 0
  const n = Number(value)
  if (!Number.isSafeInteger(n)) throw new Error(`expected a whole number from SQL, got ${String(value)}`)
  return n
}

export async function ledgerSettingsOf(db: DbOrTx, teamId: number): Promise<LedgerSettings> {
  const [row] = await db.select().from(tables.ledgerSettings).where(eq(tables.ledgerSettings.teamId, teamId)).limit(1)
  return row
    ? { mileageRateCents: row.mileageRateCents, conditionScale: row.conditionScale, currency: ledgerCurrencyOf(row.currency) }
    : { mileageRateCents: 0, conditionScale: [...DEFAULT_CONDITION_SCALE], currency: DEFAULT_LEDGER_CURRENCY }
}

export async function ledgerUpdateSettings(access: TeamAccess, patch: Partial<LedgerSettings>): Promise<LedgerSettings> {
  const current = await ledgerSettingsOf(useDb(), access.team.id)
  const next = { ...current, ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) }
  await useDb().insert(tables.ledgerSettings).values({ teamId: access.team.id, ...next })
    .onDuplicateKeyUpdate({ set: { mileageRateCents: next.mileageRateCents, conditionScale: next.conditionScale, currency: next.currency } })
  return next
}

type TeamTable = { id: MySqlColumn, teamId: MySqlColumn, deletedAt?: MySqlColumn }

/** Which of `ids` are rows of the team's table (live rows only, for tables with soft delete). */
export async function ledgerExistingIds(db: DbOrTx, table: MySqlTable, teamId: number, ids: number[]): Promise<Set<number>> {
  const unique = [...new Set(ids)]
  if (!unique.length) return new Set()
  const t = table as unknown as TeamTable
  const conditions: SQL[] = [eq(t.teamId, teamId), inArray(t.id, unique)]
  if (t.deletedAt) conditions.push(isNull(t.deletedAt))
  const rows = await db.select({ id: t.id }).from(table).where(and(...conditions)) as { id: number }[]
  return new Set(rows.map(r => Number(r.id)))
}

/** Which of `userIds` are members of the team. */
export async function ledgerMemberIds(db: DbOrTx, teamId: number, userIds: number[]): Promise<Set<number>> {
  const unique = [...new Set(userIds)]
  if (!unique.length) return new Set()
  const m = tables.memberships
  const rows = await db.select({ id: m.userId }).from(m).where(and(eq(m.teamId, teamId), inArray(m.userId, unique)))
  return new Set(rows.map(r => r.id))
}

export interface LedgerRefCheck {
  field: string
  id: number | null | undefined
  table: 'categories' | 'marks' | 'makers' | 'materials' | 'stores' | 'sourcingTrips' | 'feeProfiles' | 'members'
  label: string
}

/**
 * Adds a field error for every id that is not a row of the same team (reference entries must also not be
 * in the deleted list). Another team's id reads exactly like an unknown one.
 */
export async function ledgerCheckRefs(db: DbOrTx, teamId: number, checks: LedgerRefCheck[], errors: LedgerFieldErrors) {
  const byTable = new Map<LedgerRefCheck['table'], LedgerRefCheck[]>()
  for (const check of checks) {
    if (check.id === null || check.id === undefined) continue
    ;(byTable.get(check.table) ?? byTable.set(check.table, []).get(check.table)!).push(check)
  }
  for (const [table, list] of byTable) {
    const ids = list.map(c => c.id!)
    const found = table === 'members' ? await ledgerMemberIds(db, teamId, ids) : await ledgerExistingIds(db, tables[table], teamId, ids)
    for (const check of list) {
      if (!found.has(check.id!)) ledgerAddError(errors, check.field, `No ${check.label} with id ${check.id} in this team${table === 'members' ? '' : ' (or it is in the deleted list)'}.`)
    }
  }
}

/** ORDER BY for a `sort` parameter like "-soldOn", with the id as the tie-breaker so pages never overlap. */
export function ledgerOrderBy(sort: string, columns: Record<string, MySqlColumn>, idColumn: MySqlColumn): SQL[] {
  const descending = sort.startsWith('-')
  const column = columns[sort.replace(/^-/, '')] ?? idColumn
  return [descending ? desc(column) : asc(column), descending ? desc(idColumn) : asc(idColumn)]
}

/** Escapes LIKE wildcards, so a search for "50%" finds the text "50%". */
export function ledgerLikePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, c => `\\${c}`)}%`
}

/**
 * A multi-row INSERT as one statement escaped by mysql2, for imports: about 3× faster than the query builder
 * on large batches (measured here: 100,000 item rows in 13 s against 45 s, on a loaded 2-core machine).
 * Each value goes through its column's own mapToDriverValue (JSON, dates, numbers), so the rows are those
 * drizzle would write. Returns the first new id: InnoDB hands one multi-row INSERT consecutive ids
 * (innodb_autoinc_lock_mode 1, MariaDB's default; drizzle's $returningId assumes the same).
 */
export async function ledgerBulkInsert(db: DbOrTx, table: MySqlTable, rows: Record<string, unknown>[]): Promise<number> {
  if (!rows.length) return 0
  const columns = getTableColumns(table) as Record<string, MySqlColumn>
  const keys = [...new Set(rows.flatMap(row => Object.keys(row)))].filter(key => columns[key])
  const values = rows.map(row => keys.map((key) => {
    const value = row[key]
    return value === null || value === undefined ? null : columns[key]!.mapToDriverValue(value)
  }))
  const params = [getTableName(table), keys.map(key => columns[key]!.name), values] as Parameters<typeof mysql.format>[1]
  const text = mysql.format('INSERT INTO ?? (??) VALUES ?', params, false, 'Z')
  const [result] = await db.execute(sql.raw(text)) as unknown as [{ insertId: number, affectedRows: number }]
  if (result.affectedRows !== rows.length) throw new Error(`bulk insert wrote ${result.affectedRows} of ${rows.length} rows`)
  return Number(result.insertId)
}
