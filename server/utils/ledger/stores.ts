// Stores the team sources from. Contributors add stores and edit their own; editors edit all. A store that
// trips or items still name cannot be deleted.
import { and, count, eq, like, or, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import type { storeCreateSchema, storeListQuery, storePatchSchema } from '../../../shared/schemas/ledger'
import type { LedgerStore } from '../../../shared/types/ledger'

type StoreRow = typeof tables.stores.$inferSelect

export function ledgerPresentStore(row: StoreRow): LedgerStore {
  return {
    id: row.id, revision: row.revision, name: row.name, kind: row.kind, town: row.town, notes: row.notes,
    createdBy: row.createdBy, createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString(),
  }
}

async function findStore(db: DbOrTx, teamId: number, id: number): Promise<StoreRow> {
  const [row] = await db.select().from(tables.stores).where(and(eq(tables.stores.id, id), eq(tables.stores.teamId, teamId))).limit(1)
  if (!row) throw notFound('No such store in this team.')
  return row
}

function duplicateName(name: string) {
  return httpError(400, `Please check the store: name: the team already has a store called "${name}".`, { name: [`The team already has a store called "${name}".`] })
}

export async function ledgerListStores(access: TeamAccess, query: z.infer<typeof storeListQuery>) {
  const s = tables.stores
  const where: SQL[] = [eq(s.teamId, access.team.id)]
  if (query.kind) where.push(eq(s.kind, query.kind))
  if (query.q) where.push(or(like(s.name, ledgerLikePattern(query.q)), like(s.town, ledgerLikePattern(query.q)))!)
  const db = useDb()
  const [[total], rows] = await Promise.all([
    db.select({ n: count() }).from(s).where(and(...where)),
    db.select().from(s).where(and(...where))
      .orderBy(...ledgerOrderBy(query.sort ?? 'name', { name: s.name, kind: s.kind, town: s.town, createdAt: s.createdAt }, s.id))
      .limit(query.pageSize).offset((query.page - 1) * query.pageSize),
  ])
  return { items: rows.map(ledgerPresentStore), total: Number(total?.n ?? 0), page: query.page, pageSize: query.pageSize }
}

export async function ledgerGetStore(access: TeamAccess, id: number): Promise<LedgerStore> {
  return ledgerPresentStore(await findStore(useDb(), access.team.id, id))
}

export async function ledgerCreateStore(access: TeamAccess, input: z.infer<typeof storeCreateSchema>): Promise<LedgerStore> {
  try {
    const [{ id }] = await useDb().insert(tables.stores).values({
      teamId: access.team.id, name: input.name, kind: input.kind ?? 'thrift_store', town: input.town ?? '', notes: input.notes ?? '', createdBy: access.user.id,
    }).$returningId() as [{ id: number }]
    return await ledgerGetStore(access, id)
  }
  catch (error) {
    if (isDuplicateKey(error, 'stores_team_name_unique')) throw duplicateName(input.name)
    throw error
  }
}

export async function ledgerUpdateStore(access: TeamAccess, id: number, patch: z.infer<typeof storePatchSchema>): Promise<LedgerStore> {
  const db = useDb()
  const current = await findStore(db, access.team.id, id)
  assertCanEditOwn(access, current.createdBy)
  const { revision, ...given } = patch
  const set = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined))
  const s = tables.stores
  try {
    const [result] = await db.update(s).set({ ...set, revision: revision + 1 })
      .where(and(eq(s.id, id), eq(s.teamId, access.team.id), eq(s.revision, revision)))
    if (result.affectedRows !== 1) throw ledgerConflictError('store', await ledgerGetStore(access, id))
  }
  catch (error) {
    if (isDuplicateKey(error, 'stores_team_name_unique')) throw duplicateName(String(given.name))
    throw error
  }
  return await ledgerGetStore(access, id)
}

export async function ledgerDeleteStore(access: TeamAccess, id: number) {
  const db = useDb()
  const current = await findStore(db, access.team.id, id)
  assertCanEditOwn(access, current.createdBy)
  const [[trips], [items]] = await Promise.all([
    db.select({ n: count() }).from(tables.sourcingTrips).where(and(eq(tables.sourcingTrips.teamId, access.team.id), eq(tables.sourcingTrips.storeId, id))),
    db.select({ n: count() }).from(tables.items).where(and(eq(tables.items.teamId, access.team.id), eq(tables.items.storeId, id))),
  ])
  const used = Number(trips?.n ?? 0) + Number(items?.n ?? 0)
  if (used) throw httpError(409, `"${current.name}" is named by ${Number(trips?.n ?? 0)} trips and ${Number(items?.n ?? 0)} items: move them to another store first.`)
  await db.delete(tables.stores).where(and(eq(tables.stores.id, id), eq(tables.stores.teamId, access.team.id)))
  return { id, deleted: true }
}
