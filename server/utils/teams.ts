import { randomBytes } from 'node:crypto'
import { and, asc, eq, like } from 'drizzle-orm'
import type { Role } from '../../shared/roles'
import { ledgerCurrencyOf, type LedgerCurrency } from '../../shared/ledger/currencies'

export function slugify(name: string): string {
  const base = name.normalize('NFD').replace(/[\u0300-\u036F]/g, '').toLowerCase()
    .replace(/&/g, ' and ').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 48)
  return base || 'team'
}

async function uniqueSlug(db: DbOrTx, name: string): Promise<string> {
  const base = slugify(name)
  const taken = new Set((await db.select({ slug: tables.teams.slug }).from(tables.teams).where(like(tables.teams.slug, `${base}%`))).map(r => r.slug))
  if (!taken.has(base)) return base
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`
}

export async function createTeam(db: DbOrTx, input: { name: string, ownerId: number, timeZone?: string, isDemo?: boolean }) {
  let slug = await uniqueSlug(db, input.name)
  let id: number
  for (let attempt = 1; ; attempt++) {
    try {
      id = insertedId(await db.insert(tables.teams).values({ slug, name: input.name, timeZone: input.timeZone ?? 'UTC', isDemo: input.isDemo ?? false }).$returningId())
      break
    }
    catch (error) {
      // A team of the same name took this address a moment ago (a transaction's reads may not see it): add a random part.
      if (attempt >= 3 || !isDuplicateKey(error, 'teams_slug_unique')) throw error
      slug = `${slugify(input.name)}-${randomBytes(3).toString('hex')}`
    }
  }
  await db.insert(tables.memberships).values({ teamId: id, userId: input.ownerId, role: 'owner' })
  return { id, slug, name: input.name }
}

/** The person's teams with their role; each with the ledger's currency, so every page formats money with it. */
export async function listUserTeams(userId: number): Promise<{ slug: string, name: string, role: Role, timeZone: string, currency: LedgerCurrency }[]> {
  const rows = await useDb().select({
    slug: tables.teams.slug, name: tables.teams.name, role: tables.memberships.role, timeZone: tables.teams.timeZone, currency: tables.ledgerSettings.currency,
  })
    .from(tables.memberships)
    .innerJoin(tables.teams, eq(tables.teams.id, tables.memberships.teamId))
    .leftJoin(tables.ledgerSettings, eq(tables.ledgerSettings.teamId, tables.teams.id))
    .where(eq(tables.memberships.userId, userId))
    .orderBy(asc(tables.teams.name))
  return rows.map(row => ({ ...row, currency: ledgerCurrencyOf(row.currency) }))
}

export async function updateTeam(teamId: number, patch: { name?: string, timeZone?: string }) {
  if (!patch.name && !patch.timeZone) return
  await useDb().update(tables.teams).set(patch).where(eq(tables.teams.id, teamId))
  authCacheForgetTeam(teamId)
}

export async function findMembership(teamId: number, userId: number, db: DbOrTx = useDb()) {
  const [row] = await db.select().from(tables.memberships)
    .where(and(eq(tables.memberships.teamId, teamId), eq(tables.memberships.userId, userId))).limit(1)
  return row
}
