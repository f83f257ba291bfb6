// Reference checks shared by the per-type configs: every id a request names must belong to the same team.
import { and, eq, inArray, isNull } from 'drizzle-orm'
import type { DbOrTx } from '../db'
import type { WikiCheckMode, WikiFieldErrors, WikiTable } from './types'

/** Which of `ids` exist in the team's table (`liveOnly`: and are not in the deleted list). */
export async function wikiExistingIds(db: DbOrTx, table: WikiTable, teamId: number, ids: number[], liveOnly: boolean): Promise<Set<number>> {
  if (!ids.length) return new Set()
  const conditions = [eq(table.teamId, teamId), inArray(table.id, ids)]
  if (liveOnly) conditions.push(isNull(table.deletedAt))
  const rows = await db.select({ id: table.id }).from(table).where(and(...conditions)) as { id: number }[]
  return new Set(rows.map(r => r.id))
}

/**
 * Checks the ids a save adds (ids already stored stay, even if their entry was deleted since). Writes refuse
 * unknown or deleted ids with a field error; restores keep deleted ones and drop those purged for good.
 * Returns the ids to store.
 */
export async function wikiCheckRefs(options: {
  db: DbOrTx
  table: WikiTable
  teamId: number
  ids: number[]
  previous: number[]
  mode: WikiCheckMode
  field: string
  label: string
  errors: WikiFieldErrors
  /** Field-error key per id, when ids sit in a list of objects (lookalikes.0.markId). */
  keyOf?: (id: number) => string
}): Promise<number[]> {
  const added = options.ids.filter(id => !options.previous.includes(id))
  if (!added.length) return options.ids
  const found = await wikiExistingIds(options.db, options.table, options.teamId, added, options.mode === 'write')
  const missing = added.filter(id => !found.has(id))
  if (!missing.length) return options.ids
  if (options.mode === 'restore') return options.ids.filter(id => !missing.includes(id))
  for (const id of missing) {
    const key = options.keyOf?.(id) ?? options.field
    ;(options.errors[key] ??= []).push(`No ${options.label} with id ${id} in this team (or it is in the deleted list).`)
  }
  return options.ids
}

export function wikiCheckYears(from: number | null, to: number | null, errors: WikiFieldErrors) {
  if (from !== null && to !== null && from > to) (errors.yearTo ??= []).push(`yearTo (${to}) is before yearFrom (${from}).`)
}
