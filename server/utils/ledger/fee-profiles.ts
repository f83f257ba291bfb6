// Fee profiles: what a channel takes per order (shared/ledger/fees.ts does the arithmetic). A team has
// several; exactly one is its default once it has any: the first one becomes the default, choosing another
// moves the flag in one transaction, and the default cannot be deleted or un-defaulted (pick another first).
// The database holds "at most one" by itself (unique index on team_id + default_flag, see schema/ledger.ts).
import { and, asc, count, desc, eq, like, or, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import { NO_FEES, type FeeProfile } from '../../../shared/ledger/fees'
import type { feeProfileCreateSchema, feeProfileListQuery, feeProfilePatchSchema } from '../../../shared/schemas/ledger'
import type { LedgerFeeProfile } from '../../../shared/types/ledger'

type FeeProfileRow = typeof tables.feeProfiles.$inferSelect

export function ledgerPresentFeeProfile(row: FeeProfileRow): LedgerFeeProfile {
  return {
    id: row.id, revision: row.revision, name: row.name, channel: row.channel,
    percentBp: row.percentBp, fixedCents: row.fixedCents, paymentPercentBp: row.paymentPercentBp, paymentFixedCents: row.paymentFixedCents,
    isDefault: row.defaultFlag === 1,
  }
}

/** The arithmetic part of a profile, for computeFees; a team without profiles sells without fees. */
export function ledgerFeeTerms(row: FeeProfileRow | null): FeeProfile {
  if (!row) return NO_FEES
  return { percentBp: row.percentBp, fixedCents: row.fixedCents, paymentPercentBp: row.paymentPercentBp, paymentFixedCents: row.paymentFixedCents }
}

export async function ledgerFindFeeProfile(db: DbOrTx, teamId: number, id: number): Promise<FeeProfileRow | null> {
  const f = tables.feeProfiles
  const [row] = await db.select().from(f).where(and(eq(f.id, id), eq(f.teamId, teamId))).limit(1)
  return row ?? null
}

export async function ledgerDefaultFeeProfile(db: DbOrTx, teamId: number): Promise<FeeProfileRow | null> {
  const f = tables.feeProfiles
  const [row] = await db.select().from(f).where(and(eq(f.teamId, teamId), eq(f.defaultFlag, 1))).limit(1)
  return row ?? null
}

async function mustFind(db: DbOrTx, teamId: number, id: number): Promise<FeeProfileRow> {
  const row = await ledgerFindFeeProfile(db, teamId, id)
  if (!row) throw notFound('No such fee profile in this team.')
  return row
}

function duplicateName(name: string) {
  return httpError(400, `Please check the fee profile: name: the team already has a fee profile called "${name}".`, { name: [`The team already has a fee profile called "${name}".`] })
}

export async function ledgerListFeeProfiles(access: TeamAccess, query: z.infer<typeof feeProfileListQuery>) {
  const f = tables.feeProfiles
  const where: SQL[] = [eq(f.teamId, access.team.id)]
  if (query.q) where.push(or(like(f.name, ledgerLikePattern(query.q)), like(f.channel, ledgerLikePattern(query.q)))!)
  const db = useDb()
  const [[total], rows] = await Promise.all([
    db.select({ n: count() }).from(f).where(and(...where)),
    // The default first, then by name.
    db.select().from(f).where(and(...where)).orderBy(desc(f.defaultFlag), asc(f.name), asc(f.id))
      .limit(query.pageSize).offset((query.page - 1) * query.pageSize),
  ])
  return { items: rows.map(ledgerPresentFeeProfile), total: Number(total?.n ?? 0), page: query.page, pageSize: query.pageSize }
}

export async function ledgerGetFeeProfile(access: TeamAccess, id: number): Promise<LedgerFeeProfile> {
  return ledgerPresentFeeProfile(await mustFind(useDb(), access.team.id, id))
}

/**
 * Serialises the team's default changes on the team's own row: a row lock on a row that always exists, where
 * locking the (maybe absent) default profile would take gap locks that deadlock concurrent first profiles.
 */
async function lockTeamDefaults(tx: Transaction, teamId: number) {
  await tx.select({ id: tables.teams.id }).from(tables.teams).where(eq(tables.teams.id, teamId)).for('update')
}

async function clearDefault(tx: Transaction, teamId: number) {
  const f = tables.feeProfiles
  await tx.update(f).set({ defaultFlag: null }).where(and(eq(f.teamId, teamId), eq(f.defaultFlag, 1)))
}

export async function ledgerCreateFeeProfile(access: TeamAccess, input: z.infer<typeof feeProfileCreateSchema>): Promise<LedgerFeeProfile> {
  const teamId = access.team.id
  try {
    const id = await ledgerTransaction(async (tx) => {
      await lockTeamDefaults(tx, teamId)
      const f = tables.feeProfiles
      const [current] = await tx.select({ id: f.id }).from(f).where(and(eq(f.teamId, teamId), eq(f.defaultFlag, 1)))
      const makeDefault = input.isDefault === true || !current
      if (makeDefault && current) await clearDefault(tx, teamId)
      const [{ id }] = await tx.insert(f).values({
        teamId, name: input.name, channel: input.channel ?? '',
        percentBp: input.percentBp ?? 0, fixedCents: input.fixedCents ?? 0,
        paymentPercentBp: input.paymentPercentBp ?? 0, paymentFixedCents: input.paymentFixedCents ?? 0,
        defaultFlag: makeDefault ? 1 : null,
      }).$returningId() as [{ id: number }]
      return id
    })
    return await ledgerGetFeeProfile(access, id)
  }
  catch (error) {
    if (isDuplicateKey(error, 'fee_profiles_team_name_unique')) throw duplicateName(input.name)
    if (isDuplicateKey(error, 'fee_profiles_team_default_unique')) throw httpError(409, 'Another fee profile became the default at the same moment: try again.')
    throw error
  }
}

export async function ledgerUpdateFeeProfile(access: TeamAccess, id: number, patch: z.infer<typeof feeProfilePatchSchema>): Promise<LedgerFeeProfile> {
  const teamId = access.team.id
  const { revision, isDefault, ...given } = patch
  const set: Partial<typeof tables.feeProfiles.$inferInsert> = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined))
  try {
    await ledgerTransaction(async (tx) => {
      const current = await mustFind(tx, teamId, id)
      if (isDefault === false && current.defaultFlag === 1) {
        throw httpError(400, 'Please check the fee profile: isDefault: the team needs a default fee profile; make another one the default instead.',
          { isDefault: ['The team needs a default fee profile: make another one the default instead.'] })
      }
      if (isDefault === true && current.defaultFlag !== 1) {
        await lockTeamDefaults(tx, teamId)
        await clearDefault(tx, teamId)
        set.defaultFlag = 1
      }
      const f = tables.feeProfiles
      const [result] = await tx.update(f).set({ ...set, revision: revision + 1 }).where(and(eq(f.id, id), eq(f.teamId, teamId), eq(f.revision, revision)))
      if (result.affectedRows !== 1) throw new LedgerConflict()
    })
  }
  catch (error) {
    if (error instanceof LedgerConflict) throw ledgerConflictError('fee profile', await ledgerGetFeeProfile(access, id))
    if (isDuplicateKey(error, 'fee_profiles_team_name_unique')) throw duplicateName(String(given.name))
    throw error
  }
  return await ledgerGetFeeProfile(access, id)
}

export async function ledgerDeleteFeeProfile(access: TeamAccess, id: number) {
  const db = useDb()
  const current = await mustFind(db, access.team.id, id)
  if (current.defaultFlag === 1) throw httpError(409, `"${current.name}" is the team's default fee profile: make another one the default before deleting it.`)
  const [used] = await db.select({ n: count() }).from(tables.items).where(and(eq(tables.items.teamId, access.team.id), eq(tables.items.feeProfileId, id)))
  if (Number(used?.n ?? 0) > 0) throw httpError(409, `${used!.n} items were sold or listed with "${current.name}": it stays so their records keep their channel.`)
  await db.delete(tables.feeProfiles).where(and(eq(tables.feeProfiles.id, id), eq(tables.feeProfiles.teamId, access.team.id)))
  return { id, deleted: true }
}
