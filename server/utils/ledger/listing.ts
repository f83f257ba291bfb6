// The listing draft of an item: its reference links read once, then the pure builder in
// shared/ledger/listing-draft.ts assembles the text.
import { and, asc, eq } from 'drizzle-orm'
import { buildListingDraft, type ListingDraft } from '../../../shared/ledger/listing-draft'

async function byId<T extends { id: unknown, teamId: unknown }>(db: DbOrTx, table: any, teamId: number, id: number | null): Promise<T | null> {
  if (id === null) return null
  const [row] = await db.select().from(table).where(and(eq(table.id, id), eq(table.teamId, teamId))).limit(1)
  return (row as T | undefined) ?? null
}

export async function itemListingDraft(access: TeamAccess, id: number): Promise<ListingDraft> {
  const db = useDb()
  const teamId = access.team.id
  const item = await itemFindRow(db, teamId, id)
  const mark = await byId<typeof tables.marks.$inferSelect>(db, tables.marks, teamId, item.markId)
  const inscriptions = mark
    ? (await db.select({ text: tables.markInscriptions.text }).from(tables.markInscriptions)
        .where(and(eq(tables.markInscriptions.teamId, teamId), eq(tables.markInscriptions.markId, mark.id)))
        .orderBy(asc(tables.markInscriptions.position))).map(r => r.text)
    : []
  // The item's own maker, else the maker its mark belongs to.
  const [maker, material, category] = await Promise.all([
    byId<typeof tables.makers.$inferSelect>(db, tables.makers, teamId, item.makerId ?? mark?.makerId ?? null),
    byId<typeof tables.materials.$inferSelect>(db, tables.materials, teamId, item.materialId),
    byId<typeof tables.categories.$inferSelect>(db, tables.categories, teamId, item.categoryId),
  ])
  return buildListingDraft({
    title: item.title,
    quantity: item.quantity,
    category: category ? { name: category.name } : null,
    mark: mark ? { title: mark.title, inscriptions, markType: mark.markType, colour: mark.colour, yearFrom: mark.yearFrom, yearTo: mark.yearTo, country: mark.country } : null,
    maker: maker ? { name: maker.name, country: maker.country, yearFrom: maker.yearFrom, yearTo: maker.yearTo } : null,
    material: material ? { name: material.name } : null,
    condition: item.condition,
    damageFlags: item.damageFlags,
    damageNotes: item.damageNotes,
    weightGrams: item.weightGrams,
    box: item.boxLengthMm !== null && item.boxWidthMm !== null && item.boxHeightMm !== null
      ? { lengthMm: item.boxLengthMm, widthMm: item.boxWidthMm, heightMm: item.boxHeightMm }
      : null,
  })
}
