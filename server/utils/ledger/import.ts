// CSV import of items (papaparse). A file is read whole, every row is checked (row number and column in each
// error), and nothing is written unless every row passes, or the caller asks for the valid rows only. Each row
// has a stable key (its external id, or a hash of its mapped cells and how often the same cells came before
// in the file), unique per team: importing the same file twice adds nothing the second time. The writes go in
// multi-row batches inside one transaction. Column mappings are remembered per team by the file's header row.
import { createHash } from 'node:crypto'
import Papa from 'papaparse'
import { and, asc, desc, eq, inArray, isNull } from 'drizzle-orm'
import { csvCellValue } from '../../../shared/csv-cells'
import { parseMoney } from '../../../shared/ledger/money'
import { searchTrackItemSale } from '../search/popularity'
import { ledgerFiguresChanged } from './versions'
import { parseCsvDate, type DateOrder } from '../../../shared/ledger/import-values'
import {
  checkItemConsistency, DAMAGE_FLAGS, ITEM_STATUSES, itemNetProfitCents, itemSaleFees, SALE_STATUSES, type DamageFlag, type ItemStatus,
} from '../../../shared/ledger/item-rules'
import { IMPORT_FIELDS, type ImportField } from '../../../shared/schemas/ledger'
import type { LedgerImportError, LedgerImportReport } from '../../../shared/types/ledger'

export interface LedgerImportOptions {
  mapping?: Record<string, string>
  dryRun: boolean
  onlyValid: boolean
  dateOrder: DateOrder
  decimalSeparator?: '.' | ','
}

const INSERT_BATCH = 1_000
const KEY_LOOKUP_BATCH = 1_000
const ERRORS_LISTED = 500

/** Which import field each item field's errors belong to (consistency errors name item fields). */
const ITEM_FIELD_TO_IMPORT: Record<string, ImportField> = {
  title: 'title', status: 'status', quantity: 'quantity', condition: 'condition', acquiredOn: 'acquiredOn', costCents: 'cost',
  listedOn: 'listedOn', askingCents: 'asking', soldOn: 'soldOn', shippedOn: 'shippedOn', salePriceCents: 'salePrice',
  shippingChargedCents: 'shippingCharged', postageCents: 'postage', suppliesCents: 'supplies', feesCents: 'fees', refundCents: 'refund',
}

const normaliseHeader = (text: string) => text.toLowerCase().replace(/[^a-z0-9]/g, '')
const NORMALISED_FIELDS = new Map(IMPORT_FIELDS.map(f => [normaliseHeader(f), f]))

function sha256(text: string): string {
  return createHash('sha256').update(text).digest('hex')
}

export function ledgerHeaderKey(headers: string[]): string {
  return sha256(JSON.stringify(headers.map(h => h.trim())))
}

type ItemInsert = typeof tables.items.$inferInsert
interface PlannedRow { row: number, key: string, values: ItemInsert, newStore: string | null }

/** name (lower-cased) → ids of the team's live rows, for the name columns (category, mark, maker, material, store). */
function nameIndex(rows: { id: number, name: string }[]): Map<string, number[]> {
  const out = new Map<string, number[]>()
  for (const row of rows) {
    const key = row.name.trim().toLowerCase()
    ;(out.get(key) ?? out.set(key, []).get(key)!).push(row.id)
  }
  return out
}

async function loadLookups(db: DbOrTx, teamId: number, needTrips: boolean) {
  const live = <T extends typeof tables.categories | typeof tables.makers | typeof tables.materials>(t: T) =>
    db.select({ id: t.id, name: t.name }).from(t).where(and(eq(t.teamId, teamId), isNull(t.deletedAt)))
  const m = tables.marks
  const [categories, marks, makers, materials, stores, feeProfiles, settings, trips] = await Promise.all([
    live(tables.categories),
    db.select({ id: m.id, name: m.title }).from(m).where(and(eq(m.teamId, teamId), isNull(m.deletedAt))),
    live(tables.makers),
    live(tables.materials),
    db.select({ id: tables.stores.id, name: tables.stores.name }).from(tables.stores).where(eq(tables.stores.teamId, teamId)),
    db.select().from(tables.feeProfiles).where(eq(tables.feeProfiles.teamId, teamId)),
    ledgerSettingsOf(db, teamId),
    needTrips
      ? db.select({ id: tables.sourcingTrips.id, storeId: tables.sourcingTrips.storeId, tripDate: tables.sourcingTrips.tripDate })
          .from(tables.sourcingTrips).where(eq(tables.sourcingTrips.teamId, teamId))
      : Promise.resolve([]),
  ])
  return {
    category: { ids: new Set(categories.map(r => r.id)), names: nameIndex(categories), label: 'category' },
    mark: { ids: new Set(marks.map(r => r.id)), names: nameIndex(marks), label: 'mark' },
    maker: { ids: new Set(makers.map(r => r.id)), names: nameIndex(makers), label: 'maker' },
    material: { ids: new Set(materials.map(r => r.id)), names: nameIndex(materials), label: 'material' },
    stores: nameIndex(stores),
    trips: new Map(trips.map(t => [t.id, t])),
    feeProfiles,
    feeProfilesByName: new Map(feeProfiles.flatMap(p => [[p.channel.trim().toLowerCase(), p], [p.name.trim().toLowerCase(), p]] as const).filter(([k]) => k)),
    defaultFeeProfile: feeProfiles.find(p => p.defaultFlag === 1) ?? null,
    conditionScale: new Set(settings.conditionScale),
    currency: settings.currency,
  }
}

/** The mapping to use: the one sent, else the one remembered for this header row, else headers named like fields. */
async function resolveMapping(db: DbOrTx, teamId: number, headers: string[], given: Record<string, string> | undefined) {
  if (given) {
    const unknown = Object.keys(given).filter(column => !headers.includes(column))
    if (unknown.length) {
      throw httpError(400, `Please check the mapping: the file has no column ${unknown.map(c => `"${c}"`).join(', ')}.`, { mapping: [`Columns in the file: ${headers.join(', ')}.`] })
    }
    return { mapping: given, remembered: false }
  }
  const [saved] = await db.select().from(tables.importMappings)
    .where(and(eq(tables.importMappings.teamId, teamId), eq(tables.importMappings.headerKey, ledgerHeaderKey(headers)))).limit(1)
  if (saved) return { mapping: saved.mapping, remembered: true }
  const mapping: Record<string, string> = {}
  const used = new Set<string>()
  for (const header of headers) {
    const field = NORMALISED_FIELDS.get(normaliseHeader(header))
    if (field && !used.has(field)) {
      mapping[header] = field
      used.add(field)
    }
  }
  return { mapping, remembered: false }
}

export async function ledgerImportItems(access: TeamAccess, csvText: string, options: LedgerImportOptions): Promise<LedgerImportReport> {
  const teamId = access.team.id
  const db = useDb()
  const started = performance.now()
  const parsed = Papa.parse<string[]>(csvText.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false })
  const rows = parsed.data
  const headers = (rows[0] ?? []).map(h => String(h ?? '').trim())
  if (!headers.some(Boolean)) throw httpError(400, 'The file is empty: the first row must name the columns.', { file: ['The first row must name the columns.'] })
  const duplicate = headers.find((h, i) => h && headers.indexOf(h) !== i)
  if (duplicate) throw httpError(400, `Two columns are called "${duplicate}": give each column its own name.`, { file: [`Two columns are called "${duplicate}".`] })

  const { mapping } = await resolveMapping(db, teamId, headers, options.mapping)
  const columnOf = new Map<ImportField, number>()
  const headerOf = new Map<ImportField, string>()
  for (const [column, field] of Object.entries(mapping)) {
    if (!field) continue
    columnOf.set(field as ImportField, headers.indexOf(column))
    headerOf.set(field as ImportField, column)
  }
  if (!columnOf.has('title')) {
    throw httpError(400, 'Please check the mapping: no column is mapped to "title" (every item needs one).', { mapping: ['Map one column to title.'] })
  }
  const mappedFields = IMPORT_FIELDS.filter(f => columnOf.has(f))
  const lookups = await loadLookups(db, teamId, columnOf.has('tripId'))
  const money = { decimalSeparator: options.decimalSeparator }

  const errors: LedgerImportError[] = []
  let errorCount = 0
  const parseErrorsByRow = new Map<number, string>()
  for (const e of parsed.errors) if (e.row !== undefined && e.row !== null) parseErrorsByRow.set(e.row, e.message)

  const planned: PlannedRow[] = []
  const occurrences = new Map<string, number>()
  const externalIds = new Map<string, number>()
  let rowCount = 0

  for (let r = 1; r < rows.length; r++) {
    const cells = rows[r]!
    if (cells.every(c => !c || !String(c).trim())) continue
    rowCount++
    // Spreadsheet numbering: the header is row 1, the first item row 2.
    const rowNumber = r + 1
    let rowHasError = false
    const fail = (field: ImportField | null, message: string) => {
      rowHasError = true
      errorCount++
      if (errors.length < ERRORS_LISTED) errors.push({ row: rowNumber, column: field ? headerOf.get(field) ?? null : null, field, message })
    }
    const parseError = parseErrorsByRow.get(r)
    if (parseError) fail(null, `The row could not be read: ${parseError}`)
    const get = (field: ImportField): string => {
      const index = columnOf.get(field)
      return index === undefined ? '' : csvCellValue(String(cells[index] ?? '').trim())
    }
    const date = (field: ImportField): string | null => {
      const text = get(field)
      if (!text) return null
      const result = parseCsvDate(text, options.dateOrder)
      if (!result.ok) {
        fail(field, result.error)
        return null
      }
      return result.date
    }
    const cents = (field: ImportField): number | null => {
      const text = get(field)
      if (!text) return null
      const result = parseMoney(text, money)
      if (!result.ok) {
        fail(field, result.error)
        return null
      }
      if (result.cents < 0) {
        fail(field, `"${text}" is negative: amounts are entered as positive numbers`)
        return null
      }
      return result.cents
    }
    const whole = (field: ImportField, min: number): number | null => {
      const text = get(field)
      if (!text) return null
      const value = Number(text.replace(/,/g, ''))
      if (!Number.isFinite(value) || value < min) {
        fail(field, `"${text}" is not a number of at least ${min}`)
        return null
      }
      return Math.round(value)
    }
    const entryRef = (idField: ImportField, nameField: ImportField, lookup: { ids: Set<number>, names: Map<string, number[]>, label: string }): number | null => {
      const idText = get(idField)
      if (idText) {
        const id = Number(idText)
        if (!Number.isSafeInteger(id) || !lookup.ids.has(id)) {
          fail(idField, `No ${lookup.label} with id ${idText} in this team (or it is in the deleted list)`)
          return null
        }
        return id
      }
      const name = get(nameField)
      if (!name) return null
      const ids = lookup.names.get(name.toLowerCase()) ?? []
      if (ids.length === 1) return ids[0]!
      fail(nameField, ids.length ? `${ids.length} ${lookup.label} entries are called "${name}": map the ${lookup.label}'s id instead` : `No ${lookup.label} called "${name}" in this team`)
      return null
    }

    const title = get('title')
    if (!title) fail('title', 'Every item needs a title')
    else if (title.length > 200) fail('title', 'A title is at most 200 characters')

    const tripText = get('tripId')
    let trip: { storeId: number, tripDate: string } | null = null
    if (tripText) {
      trip = lookups.trips.get(Number(tripText)) ?? null
      if (!trip) fail('tripId', `No sourcing trip with id ${tripText} in this team`)
    }
    let storeId: number | null = trip?.storeId ?? null
    let newStore: string | null = null
    const storeName = get('store')
    if (storeName && !trip) {
      const ids = lookups.stores.get(storeName.toLowerCase())
      if (ids?.length) storeId = ids[0]!
      else if (storeName.length > 120) fail('store', 'A store name is at most 120 characters')
      else newStore = storeName
    }

    let condition: string | null = get('condition').toLowerCase().replace(/[\s-]+/g, '_') || null
    if (condition && !lookups.conditionScale.has(condition)) {
      fail('condition', `"${get('condition')}" is not one of the team's condition grades: ${[...lookups.conditionScale].join(', ')}`)
      condition = null
    }
    const damageFlags: DamageFlag[] = []
    for (const part of get('damageFlags').split(/[;,|]/).map(p => p.trim().toLowerCase().replace(/[\s-]+/g, '_')).filter(Boolean)) {
      if ((DAMAGE_FLAGS as readonly string[]).includes(part)) {
        if (!damageFlags.includes(part as DamageFlag)) damageFlags.push(part as DamageFlag)
      }
      else fail('damageFlags', `"${part}" is not a damage flag; use: ${DAMAGE_FLAGS.join(', ')}`)
    }
    const sides = (['boxLengthMm', 'boxWidthMm', 'boxHeightMm'] as const).map(f => whole(f, 1))
    if (sides.some(s => s !== null) && sides.some(s => s === null)) fail('boxLengthMm', 'Give all three box sides, or none')

    // Amounts are read as the team's currency; a file kept in another one would be read wrongly, not converted.
    const currency = get('currency').toUpperCase()
    if (currency && currency !== lookups.currency) {
      fail('currency', `The amounts on this row are in ${currency}, but this team keeps its ledger in ${lookups.currency}: convert them first, or change the team's currency in the ledger settings`)
    }
    const acquiredOn = date('acquiredOn') ?? trip?.tripDate ?? null
    const listedOn = date('listedOn')
    const soldOn = date('soldOn')
    const shippedOn = date('shippedOn')
    const costCents = cents('cost') ?? 0
    const salePriceCents = cents('salePrice')
    const shippingChargedCents = cents('shippingCharged')
    const postageCents = cents('postage')
    const suppliesCents = cents('supplies')
    const manualFees = cents('fees')
    const refundCents = cents('refund')

    const statusText = get('status').toLowerCase().replace(/[\s-]+/g, '_')
    let status: ItemStatus
    if (statusText) {
      if (!(ITEM_STATUSES as readonly string[]).includes(statusText)) {
        fail('status', `"${get('status')}" is not a status; use: ${ITEM_STATUSES.join(', ')}`)
        status = 'in_stock'
      }
      else status = statusText as ItemStatus
    }
    // Without a status column, the row's own dates tell: a sale date means sold, a listing date listed.
    else status = soldOn || salePriceCents !== null ? (shippedOn ? 'shipped' : 'sold') : listedOn ? 'listed' : 'in_stock'

    const channelText = get('channel')
    const profile = channelText ? lookups.feeProfilesByName.get(channelText.toLowerCase()) ?? null : null
    if (channelText && !profile) fail('channel', `No fee profile or channel called "${channelText}" in this team`)

    const quantity = whole('quantity', 1) ?? 1
    if (get('damageNotes').length > 2000) fail('damageNotes', 'Damage notes are at most 2,000 characters')
    if (get('notes').length > 10_000) fail('notes', 'Notes are at most 10,000 characters')
    const values: ItemInsert = {
      teamId, title, status, quantity, condition, damageFlags, damageNotes: get('damageNotes'),
      weightGrams: whole('weightGrams', 0),
      boxLengthMm: sides[0] ?? null, boxWidthMm: sides[1] ?? null, boxHeightMm: sides[2] ?? null,
      categoryId: entryRef('categoryId', 'category', lookups.category),
      markId: entryRef('markId', 'mark', lookups.mark),
      makerId: entryRef('makerId', 'maker', lookups.maker),
      materialId: entryRef('materialId', 'material', lookups.material),
      tripId: trip ? Number(tripText) : null, storeId,
      acquiredOn: acquiredOn ?? '', costCents, sourcedBy: access.user.id, listedBy: null,
      listedOn, askingCents: cents('asking'), feeProfileId: profile?.id ?? null,
      soldOn, shippedOn, salePriceCents, shippingChargedCents, postageCents, suppliesCents,
      feesCents: manualFees, feesManual: manualFees !== null, refundCents,
      externalId: get('externalId') || null, notes: get('notes'),
      createdBy: access.user.id, updatedBy: access.user.id,
    }
    if (SALE_STATUSES.includes(status) && salePriceCents !== null && manualFees === null) {
      const used = profile ?? lookups.defaultFeeProfile
      values.feeProfileId = used?.id ?? null
      values.feesCents = itemSaleFees(ledgerFeeTerms(used), salePriceCents, shippingChargedCents ?? 0).feesCents
    }
    const figures = {
      status, quantity, costCents, acquiredOn, listedOn, soldOn, shippedOn, askingCents: values.askingCents ?? null,
      salePriceCents, shippingChargedCents, postageCents, suppliesCents, feesCents: values.feesCents ?? null, refundCents,
    }
    for (const [field, messages] of Object.entries(checkItemConsistency(figures))) {
      const importField = ITEM_FIELD_TO_IMPORT[field] ?? null
      for (const message of messages) fail(importField, message)
    }
    if (values.externalId) {
      if (values.externalId.length > 120) fail('externalId', 'An external id is at most 120 characters')
      const earlier = externalIds.get(values.externalId)
      if (earlier) fail('externalId', `The external id "${values.externalId}" is also on row ${earlier}`)
      else externalIds.set(values.externalId, rowNumber)
    }
    if (rowHasError) continue
    values.netProfitCents = itemNetProfitCents(figures)

    let key: string
    if (values.externalId) key = sha256(`external\u0000${values.externalId}`)
    else {
      const content = JSON.stringify(mappedFields.map(f => get(f)))
      const seen = (occurrences.get(content) ?? 0) + 1
      occurrences.set(content, seen)
      // Two identical rows are two pieces: the second one's key says it is the second.
      key = sha256(`${content}\u0000${seen}`)
    }
    values.importKey = key
    planned.push({ row: rowNumber, key, values, newStore })
  }

  const checkedAt = performance.now()
  const existing = new Set<string>()
  for (let i = 0; i < planned.length; i += KEY_LOOKUP_BATCH) {
    const keys = planned.slice(i, i + KEY_LOOKUP_BATCH).map(p => p.key)
    const found = await db.select({ key: tables.items.importKey }).from(tables.items)
      .where(and(eq(tables.items.teamId, teamId), inArray(tables.items.importKey, keys)))
    for (const f of found) if (f.key) existing.add(f.key)
  }
  const toAdd = planned.filter(p => !existing.has(p.key))
  const storesCreated = [...new Map(toAdd.filter(p => p.newStore).map(p => [p.newStore!.toLowerCase(), p.newStore!])).values()]
  let costTotal = 0
  let revenueTotal = 0
  let netTotal = 0
  for (const p of toAdd) {
    costTotal += p.values.costCents ?? 0
    revenueTotal += (p.values.salePriceCents ?? 0) + (p.values.shippingChargedCents ?? 0)
    netTotal += p.values.netProfitCents ?? 0
  }
  const report: LedgerImportReport = {
    dryRun: options.dryRun,
    rows: rowCount,
    validRows: planned.length,
    alreadyImported: planned.length - toAdd.length,
    added: toAdd.length,
    storesCreated,
    errors,
    errorCount,
    totals: { costCents: costTotal, revenueCents: revenueTotal, netProfitCents: netTotal },
    mapping: Object.fromEntries(Object.entries(mapping).filter(([, f]) => f)),
    timings: { readAndCheckMs: Math.round(checkedAt - started), keyLookupMs: Math.round(performance.now() - checkedAt), writeMs: 0 },
  }
  if (options.dryRun) return report
  if (errorCount && !options.onlyValid) {
    throw httpError(400, `${errorCount} problem${errorCount === 1 ? '' : 's'} in ${new Set(errors.map(e => e.row)).size}${errorCount > errors.length ? '+' : ''} rows: nothing was imported. Fix the rows, or import only the valid rows (onlyValid=1).`,
      undefined, { report: { ...report, added: 0 } })
  }

  const writeStarted = performance.now()
  try {
    await useDb().transaction(async (tx) => {
      if (storesCreated.length) {
        const created = await tx.insert(tables.stores).values(storesCreated.map(name => ({ teamId, name, kind: 'other' as const, notes: 'Added by an import.', createdBy: access.user.id })))
          .$returningId() as { id: number }[]
        const idByName = new Map(storesCreated.map((name, i) => [name.toLowerCase(), created[i]!.id]))
        for (const p of toAdd) if (p.newStore) p.values.storeId = idByName.get(p.newStore.toLowerCase())!
      }
      for (let i = 0; i < toAdd.length; i += INSERT_BATCH) {
        const batch = toAdd.slice(i, i + INSERT_BATCH)
        const firstId = await ledgerBulkInsert(tx, tables.items, batch.map(p => p.values as Record<string, unknown>))
        await ledgerBulkInsert(tx, tables.itemStatusEvents, batch.map((p, j) => ({
          teamId, itemId: firstId + j, fromStatus: null, toStatus: p.values.status!,
          happenedOn: itemStatusDay({ ...p.values, status: p.values.status!, listedOn: p.values.listedOn ?? null, soldOn: p.values.soldOn ?? null, shippedOn: p.values.shippedOn ?? null }),
          changedBy: access.user.id,
        })))
      }
      await tx.insert(tables.importMappings).values({
        teamId, headerKey: ledgerHeaderKey(headers), headers, mapping: report.mapping, dateOrder: options.dateOrder, updatedBy: access.user.id, lastUsedAt: new Date(),
      }).onDuplicateKeyUpdate({ set: { mapping: report.mapping, dateOrder: options.dateOrder, updatedBy: access.user.id, lastUsedAt: new Date() } })
      // One change-log row for the whole import: the search's sales counts read the team's items again.
      await searchTrackItemSale(tx, teamId, 0, toAdd.map(p => p.values.status))
      await recordTeamAudit(access, 'items.imported', {
        targetType: 'import', detail: { rows: report.rows, added: report.added, alreadyImported: report.alreadyImported, storesCreated: storesCreated.length, invalidRows: report.rows - report.validRows },
      }, tx)
      await ledgerFiguresChanged(tx, teamId)
    })
  }
  catch (error) {
    if (isDuplicateKey(error, 'items_team_import_key_unique')) {
      throw httpError(409, 'Another import of some of the same rows finished first. Nothing from this one was saved: run it again, and the rows already imported are skipped.')
    }
    if (isDuplicateKey(error, 'stores_team_name_unique')) throw httpError(409, 'A store this file names was added meanwhile: run the import again.')
    const code = (error as { cause?: { code?: string }, code?: string }).cause?.code ?? (error as { code?: string }).code
    if (code === 'ER_LOCK_DEADLOCK') throw httpError(409, 'Another import ran at the same moment. Nothing from this one was saved: run it again, and the rows already imported are skipped.')
    throw error
  }
  report.timings.writeMs = Math.round(performance.now() - writeStarted)
  return report
}

export async function ledgerListImportMappings(access: TeamAccess) {
  const m = tables.importMappings
  const rows = await useDb().select().from(m).where(eq(m.teamId, access.team.id)).orderBy(desc(m.lastUsedAt), asc(m.id)).limit(50)
  return { items: rows.map(r => ({ id: r.id, headers: r.headers, mapping: r.mapping, dateOrder: r.dateOrder, lastUsedAt: r.lastUsedAt.toISOString() })) }
}
