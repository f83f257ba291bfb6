// CSV export of any filtered view of the items, streamed in pages of 1,000 rows (keyset by id, so a page never
// repeats or skips a row while the file is written). The columns are the import's field names, so an export
// imports again as it is; names stand beside ids so the file also reads well in a spreadsheet. Amounts are plain
// decimals (12.50), in the currency the `currency` column names (the team's ISO 4217 code, on every row).
import { Readable } from 'node:stream'
import Papa from 'papaparse'
import { and, asc, eq, gt } from 'drizzle-orm'
import type { z } from 'zod'
import { csvTextCell } from '../../../shared/csv-cells'
import { centsToDecimalText } from '../../../shared/ledger/import-values'
import { itemComputed } from '../../../shared/ledger/item-rules'
import type { itemFilterQuery } from '../../../shared/schemas/ledger'

const PAGE = 1_000

export const LEDGER_EXPORT_COLUMNS = [
  'id', 'externalId', 'title', 'status', 'quantity', 'condition', 'damageFlags', 'damageNotes', 'weightGrams',
  'boxLengthMm', 'boxWidthMm', 'boxHeightMm', 'categoryId', 'category', 'markId', 'mark', 'makerId', 'maker',
  'materialId', 'material', 'tripId', 'store', 'acquiredOn', 'currency', 'cost', 'listedOn', 'asking', 'channel', 'soldOn',
  'shippedOn', 'salePrice', 'shippingCharged', 'postage', 'supplies', 'fees', 'refund', 'netProfit', 'daysToSell', 'notes',
] as const

async function names(db: DbOrTx, teamId: number) {
  const byId = (rows: { id: number, name: string }[]) => new Map(rows.map(r => [r.id, r.name]))
  const pick = (t: typeof tables.categories | typeof tables.makers | typeof tables.materials | typeof tables.stores) =>
    db.select({ id: t.id, name: t.name }).from(t).where(eq(t.teamId, teamId))
  const [categories, marks, makers, materials, stores, profiles] = await Promise.all([
    pick(tables.categories),
    db.select({ id: tables.marks.id, name: tables.marks.title }).from(tables.marks).where(eq(tables.marks.teamId, teamId)),
    pick(tables.makers), pick(tables.materials), pick(tables.stores),
    db.select({ id: tables.feeProfiles.id, name: tables.feeProfiles.name }).from(tables.feeProfiles).where(eq(tables.feeProfiles.teamId, teamId)),
  ])
  return { categories: byId(categories), marks: byId(marks), makers: byId(makers), materials: byId(materials), stores: byId(stores), profiles: byId(profiles) }
}

const money = (cents: number | null) => cents === null ? '' : centsToDecimalText(cents)
const text = (value: number | string | null) => value === null ? '' : csvTextCell(String(value))

async function* csvChunks(access: TeamAccess, filters: z.infer<typeof itemFilterQuery>): AsyncGenerator<string> {
  const db = useDb()
  const i = tables.items
  const [lookup, { currency }] = await Promise.all([names(db, access.team.id), ledgerSettingsOf(db, access.team.id)])
  const where = itemFilterConditions(access.team.id, filters)
  let lastId = 0
  let first = true
  for (;;) {
    const rows = await db.select().from(i).where(and(...where, gt(i.id, lastId))).orderBy(asc(i.id)).limit(PAGE)
    if (!rows.length && !first) break
    const data = rows.map((row) => {
      const { netProfitCents, daysToSell } = itemComputed(itemFiguresOf(row))
      const name = (map: Map<number, string>, id: number | null) => id === null ? '' : csvTextCell(map.get(id) ?? '')
      return [
        row.id, text(row.externalId), csvTextCell(row.title), row.status, row.quantity, text(row.condition), row.damageFlags.join(';'), csvTextCell(row.damageNotes),
        text(row.weightGrams), text(row.boxLengthMm), text(row.boxWidthMm), text(row.boxHeightMm),
        text(row.categoryId), name(lookup.categories, row.categoryId), text(row.markId), name(lookup.marks, row.markId),
        text(row.makerId), name(lookup.makers, row.makerId), text(row.materialId), name(lookup.materials, row.materialId),
        text(row.tripId), name(lookup.stores, row.storeId), row.acquiredOn, currency, money(row.costCents), text(row.listedOn), money(row.askingCents),
        name(lookup.profiles, row.feeProfileId), text(row.soldOn), text(row.shippedOn), money(row.salePriceCents),
        money(row.shippingChargedCents), money(row.postageCents), money(row.suppliesCents),
        // Fees travel as charged, so the file imports into another team (with other profiles) with the same net.
        money(row.feesCents), money(row.refundCents), money(netProfitCents), text(daysToSell), csvTextCell(row.notes),
      ]
    })
    const csv = Papa.unparse({ fields: [...LEDGER_EXPORT_COLUMNS], data }, { header: first, newline: '\r\n' })
    yield first ? csv : `\r\n${csv}`
    first = false
    if (rows.length < PAGE) break
    lastId = rows[rows.length - 1]!.id
  }
  yield '\r\n'
}

export function ledgerExportItems(access: TeamAccess, filters: z.infer<typeof itemFilterQuery>): Readable {
  return Readable.from(csvChunks(access, filters))
}
