// Team import: a team export (zip) into an EMPTY team. The whole team.json is checked first (shape and every
// reference, shared/schemas/transfer.ts); every record gets a new id (no id in the file is trusted); people
// are matched by e-mail to members of this team, anyone else becomes the importing owner. Photo files are
// checked and stored first, then every row is written in ONE transaction; if that fails, the stored files are
// removed again, so a failed import leaves the team as it was.
import { randomBytes } from 'node:crypto'
import yauzl from 'yauzl'
import sharp from 'sharp'
import { and, count, eq, inArray, sql } from 'drizzle-orm'
import type { MySqlTable } from 'drizzle-orm/mysql-core'
import { itemNetProfitCents } from '../../../shared/ledger/item-rules'
import type { TRANSFER_PHOTO_TYPES, TeamExport, TeamExportPhoto } from '../../../shared/schemas/transfer'
import { teamExportSchema } from '../../../shared/schemas/transfer'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import { useStorageDriver, type StorageDriver } from '../storage'
import { searchTrackChanges, type SearchEntityType } from '../search/changes'
import { wikiConfigs } from '../wiki/registry'
import { wikiPageChanged } from '../wiki/versions'
import { ledgerFiguresChanged } from '../ledger/versions'
import {
  TRANSFER_JSON_NAME, TRANSFER_LIMITS, TRANSFER_MARKDOWN_FIELDS, transferEmptyEntryIds, transferPhotoExtension, transferRemapSnapshot,
  transferRewriteLinks,
} from './format'

const BATCH = 1_000
const at = (iso: string) => new Date(iso)
const atOrNull = (iso: string | null) => (iso === null ? null : new Date(iso))

export interface TransferImportSummary {
  imported: Record<string, number>
  people: { matched: number, toImporter: number }
}

const badFile = (message: string, fieldErrors?: Record<string, string[]>) => httpError(400, message, fieldErrors)

/** What the team holds already, in words ("3 marks", "12 items"); empty when the team is empty. */
async function teamContents(db: DbOrTx, teamId: number): Promise<string[]> {
  const t = tables
  const checks: [string, string, MySqlTable & { teamId: any }][] = [
    ['mark', 'marks', t.marks], ['maker', 'makers', t.makers], ['material', 'materials', t.materials], ['category', 'categories', t.categories],
    ['item', 'items', t.items], ['sourcing trip', 'sourcing trips', t.sourcingTrips], ['store', 'stores', t.stores],
    ['fee profile', 'fee profiles', t.feeProfiles], ['note', 'notes', t.entryNotes], ['photo', 'photos', t.photos],
  ]
  const found: string[] = []
  for (const [one, many, table] of checks) {
    const [row] = await db.select({ n: count() }).from(table).where(eq(table.teamId, teamId))
    const n = Number(row?.n ?? 0)
    if (n) found.push(`${n} ${n === 1 ? one : many}`)
  }
  return found
}

function notEmpty(contents: string[]) {
  return httpError(409, `This team already has ${contents.join(', ')}: a team export goes only into a new, empty team. Create a team for it and import there.`)
}

interface ZipIndex { zip: yauzl.ZipFile, entries: Map<string, yauzl.Entry> }

async function openZip(path: string): Promise<ZipIndex> {
  let zip: yauzl.ZipFile
  try {
    zip = await yauzl.openPromise(path, { lazyEntries: true, autoClose: false, strictFileNames: true, validateEntrySizes: true })
  }
  catch (error) {
    throw badFile(`The file is not a zip archive that can be read (${(error as Error).message}). Choose the .zip a team export downloaded.`)
  }
  const entries = new Map<string, yauzl.Entry>()
  try {
    for await (const entry of zip.eachEntry()) {
      if (entries.size >= TRANSFER_LIMITS.entries) throw badFile('The zip holds more files than any team export does.')
      if (entry.fileName.endsWith('/')) continue
      if (entry.isEncrypted()) throw badFile(`${entry.fileName} is encrypted: team exports are never encrypted.`)
      entries.set(entry.fileName, entry)
    }
  }
  catch (error) {
    zip.close()
    if ((error as { statusCode?: number }).statusCode) throw error
    throw badFile(`The zip archive is damaged: ${(error as Error).message}`)
  }
  return { zip, entries }
}

async function readEntry(zip: yauzl.ZipFile, entry: yauzl.Entry, maxBytes: number): Promise<Buffer> {
  if (entry.uncompressedSize > maxBytes) throw badFile(`${entry.fileName} is larger than a team export's ${entry.fileName === TRANSFER_JSON_NAME ? 'team.json' : 'photo files'} can be.`)
  const chunks: Buffer[] = []
  let total = 0
  try {
    const stream = await zip.openReadStreamPromise(entry)
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      total += chunk.length
      if (total > maxBytes) {
        stream.destroy()
        throw new Error('larger than its header says')
      }
      chunks.push(chunk)
    }
  }
  catch (error) {
    throw badFile(`${entry.fileName} in the zip cannot be read: ${(error as Error).message}.`)
  }
  return Buffer.concat(chunks)
}

async function readDocument({ zip, entries }: ZipIndex): Promise<TeamExport> {
  const entry = entries.get(TRANSFER_JSON_NAME)
  if (!entry) throw badFile(`The zip has no ${TRANSFER_JSON_NAME}: it is not a Tallymark team export.`)
  const bytes = await readEntry(zip, entry, TRANSFER_LIMITS.jsonBytes)
  let raw: unknown
  try {
    raw = JSON.parse(bytes.toString('utf8').replace(/^\uFEFF/, ''))
  }
  catch (error) {
    throw badFile(`${TRANSFER_JSON_NAME} is not valid JSON: ${(error as Error).message}`)
  }
  const parsed = teamExportSchema.safeParse(raw)
  if (!parsed.success) {
    const fieldErrors = Object.fromEntries(Object.entries(zodFieldErrors(parsed.error)).slice(0, TRANSFER_LIMITS.issues))
    const [field, messages] = Object.entries(fieldErrors)[0]!
    const more = parsed.error.issues.length > 1 ? ` (and ${parsed.error.issues.length - 1} more problem${parsed.error.issues.length === 2 ? '' : 's'})` : ''
    throw badFile(`Please check the file: ${TRANSFER_JSON_NAME} ${field === '_' ? '' : `${field}: `}${messages[0]}${more}. Nothing was imported.`, fieldErrors)
  }
  for (const [i, photo] of parsed.data.photos.entries()) {
    for (const file of [photo.files.display, photo.files.thumb]) {
      if (!entries.has(file)) throw badFile(`Please check the file: photos.${i}.files: the zip has no ${file}. Nothing was imported.`, { [`photos.${i}.files`]: [`The zip has no ${file}.`] })
    }
  }
  return parsed.data
}

const SHARP_FORMATS: Record<typeof TRANSFER_PHOTO_TYPES[number], string> = { 'image/webp': 'webp', 'image/jpeg': 'jpeg', 'image/png': 'png' }

/** Photo files are stored as they are (so they stay byte for byte the team's), after the checks an upload's copies pass. */
async function checkPhotoFile(bytes: Buffer, name: string, contentType: typeof TRANSFER_PHOTO_TYPES[number], width: number, height: number) {
  let meta: Awaited<ReturnType<ReturnType<typeof sharp>['metadata']>>
  try {
    meta = await sharp(bytes).metadata()
  }
  catch {
    throw badFile(`${name} in the zip is not an image. Nothing was imported.`)
  }
  if (meta.format !== SHARP_FORMATS[contentType]) throw badFile(`${name} in the zip is not the ${contentType} image team.json says it is. Nothing was imported.`)
  if (meta.width !== width || meta.height !== height) {
    throw badFile(`${name} in the zip is ${meta.width} × ${meta.height} pixels; team.json says ${width} × ${height}. Nothing was imported.`)
  }
  // Stored copies never carry metadata (a phone's GPS position would ride along): refused, not stripped, so bytes stay as exported.
  if (meta.exif || meta.xmp || meta.iptc) throw badFile(`${name} in the zip carries EXIF, XMP or IPTC metadata, which stored photos never do. Nothing was imported.`)
}

interface StoredPhoto { displayKey: string, thumbKey: string, bytes: number }

async function storePhotos(index: ZipIndex, doc: TeamExport, teamId: number, storage: StorageDriver, written: string[]): Promise<Map<number, StoredPhoto>> {
  const stored = new Map<number, StoredPhoto>()
  for (const photo of doc.photos as TeamExportPhoto[]) {
    const display = await readEntry(index.zip, index.entries.get(photo.files.display)!, TRANSFER_LIMITS.photoBytes)
    await checkPhotoFile(display, photo.files.display, photo.contentType, photo.width, photo.height)
    const thumb = await readEntry(index.zip, index.entries.get(photo.files.thumb)!, TRANSFER_LIMITS.photoBytes)
    await checkPhotoFile(thumb, photo.files.thumb, photo.contentType, photo.thumbWidth, photo.thumbHeight)
    // Keys are chosen here, as for uploads (teams/<team>/photos/<random>/<size>.<ext>).
    const folder = `teams/${teamId}/photos/${randomBytes(16).toString('hex')}`
    const ext = transferPhotoExtension(photo.contentType)
    const keys = { displayKey: `${folder}/display.${ext}`, thumbKey: `${folder}/thumb.${ext}` }
    await storage.put(keys.displayKey, display, photo.contentType)
    written.push(keys.displayKey)
    await storage.put(keys.thumbKey, thumb, photo.contentType)
    written.push(keys.thumbKey)
    stored.set(photo.id, { ...keys, bytes: display.length + thumb.length })
  }
  return stored
}

/** Inserts rows a thousand at a time; returns the new ids in row order (one INSERT hands out consecutive ids). */
async function insertRows(tx: Transaction, table: MySqlTable, rows: Record<string, unknown>[]): Promise<number[]> {
  const ids: number[] = []
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH)
    const first = await ledgerBulkInsert(tx, table, batch)
    for (let j = 0; j < batch.length; j++) ids.push(first + j)
  }
  return ids
}

const idMap = (rows: { id: number }[], ids: number[]) => new Map(rows.map((row, i) => [row.id, ids[i]!]))

/** File person id → user id in this team: a member with the same e-mail, else the owner who imports. */
async function matchPeople(tx: Transaction, access: TeamAccess, doc: TeamExport) {
  const m = tables.memberships
  const members = await tx.select({ id: tables.users.id, email: tables.users.email }).from(m)
    .innerJoin(tables.users, eq(tables.users.id, m.userId)).where(eq(m.teamId, access.team.id))
  const byEmail = new Map(members.map(r => [r.email.trim().toLowerCase(), r.id]))
  const users = new Map<number, number>()
  let matched = 0
  for (const person of doc.people) {
    const id = byEmail.get(person.email.trim().toLowerCase())
    if (id !== undefined) matched++
    users.set(person.id, id ?? access.user.id)
  }
  return { users, matched, toImporter: doc.people.length - matched }
}

async function writeTeam(access: TeamAccess, doc: TeamExport, photos: Map<number, StoredPhoto>): Promise<TransferImportSummary> {
  const teamId = access.team.id
  const t = tables
  return await useDb().transaction(async (tx) => {
    // The team row's lock makes two imports into one team wait for each other; the second then finds it full.
    await tx.select({ id: t.teams.id }).from(t.teams).where(eq(t.teams.id, teamId)).for('update')
    const contents = await teamContents(tx, teamId)
    if (contents.length) throw notEmpty(contents)
    const people = await matchPeople(tx, access, doc)
    const u = (id: number | null) => (id === null ? null : people.users.get(id)!)
    const ids = transferEmptyEntryIds()
    const rewrite = (text: string) => transferRewriteLinks(text, doc.team.slug, access.team.slug, ids)

    await tx.update(t.teams).set({ timeZone: doc.team.timeZone }).where(eq(t.teams.id, teamId))
    if (doc.ledgerSettings) {
      const s = doc.ledgerSettings
      const values = { mileageRateCents: s.mileageRateCents, conditionScale: s.conditionScale, ...(s.currency ? { currency: s.currency } : {}), updatedAt: at(s.updatedAt) }
      await tx.insert(t.ledgerSettings).values({ teamId, ...values, createdAt: at(s.createdAt) }).onDuplicateKeyUpdate({ set: values })
    }
    if (doc.buyTargets) {
      const b = doc.buyTargets
      const values = { revision: b.revision, minProfitCents: b.minProfitCents, minRoiBp: b.minRoiBp, maxDaysToSell: b.maxDaysToSell, updatedBy: u(b.updatedBy)!, updatedAt: at(b.updatedAt) }
      await tx.insert(t.buyTargets).values({ teamId, ...values, createdAt: at(b.createdAt) }).onDuplicateKeyUpdate({ set: values })
    }
    const im = t.importMappings
    for (let i = 0; i < doc.importMappings.length; i += BATCH) {
      await tx.insert(im).values(doc.importMappings.slice(i, i + BATCH).map(m => ({
        teamId, headerKey: m.headerKey, headers: m.headers, mapping: m.mapping, dateOrder: m.dateOrder, updatedBy: u(m.updatedBy)!,
        lastUsedAt: at(m.lastUsedAt), createdAt: at(m.createdAt), updatedAt: at(m.updatedAt),
      }))).onDuplicateKeyUpdate({ set: { headers: sql`values(${im.headers})`, mapping: sql`values(${im.mapping})`, dateOrder: sql`values(${im.dateOrder})` } })
    }

    const stores = idMap(doc.stores, await insertRows(tx, t.stores, doc.stores.map(s => ({
      teamId, revision: s.revision, name: s.name, kind: s.kind, town: s.town, notes: s.notes, createdBy: u(s.createdBy),
      createdAt: at(s.createdAt), updatedAt: at(s.updatedAt),
    }))))
    const profiles = idMap(doc.feeProfiles, await insertRows(tx, t.feeProfiles, doc.feeProfiles.map(p => ({
      teamId, revision: p.revision, name: p.name, channel: p.channel, percentBp: p.percentBp, fixedCents: p.fixedCents,
      paymentPercentBp: p.paymentPercentBp, paymentFixedCents: p.paymentFixedCents, defaultFlag: p.isDefault ? 1 : null,
      createdAt: at(p.createdAt), updatedAt: at(p.updatedAt),
    }))))

    // Entries: rows first (categories without parents, marks with their maker), then what needs every new id.
    type EntryRow = TeamExport['makers'][number] | TeamExport['materials'][number] | TeamExport['categories'][number] | TeamExport['marks'][number]
    const entryRow = (type: WikiEntryType, e: EntryRow, content: object) => ({
      ...wikiConfigs[type].toRow(content), teamId, revision: e.revision, createdBy: u(e.createdBy), updatedBy: u(e.updatedBy),
      deletedAt: atOrNull(e.deletedAt), deletedBy: u(e.deletedBy), createdAt: at(e.createdAt), updatedAt: at(e.updatedAt),
    })
    const collections: Record<WikiEntryType, EntryRow[]> = { maker: doc.makers, material: doc.materials, category: doc.categories, mark: doc.marks }
    for (const type of ['maker', 'material', 'category', 'mark'] as const) {
      const rows = collections[type].map(e => entryRow(type, e, type === 'category'
        ? { ...e, parentId: null }
        : type === 'mark' ? { ...e, makerId: (e as TeamExport['marks'][number]).makerId === null ? null : ids.maker.get((e as TeamExport['marks'][number]).makerId!)! } : e))
      ids[type] = idMap(collections[type], await insertRows(tx, wikiConfigs[type].table, rows))
    }
    const c = t.categories
    const withParent = doc.categories.filter(cat => cat.parentId !== null)
    for (let i = 0; i < withParent.length; i += BATCH) {
      const batch = withParent.slice(i, i + BATCH)
      const cases = sql.join(batch.map(cat => sql`when ${ids.category.get(cat.id)!} then ${ids.category.get(cat.parentId!)!}`), sql` `)
      // updated_at = itself: the file's time stays, not the moment of the import.
      await tx.update(c).set({ parentId: sql`case ${c.id} ${cases} end`, updatedAt: sql`${c.updatedAt}` })
        .where(and(eq(c.teamId, teamId), inArray(c.id, batch.map(cat => ids.category.get(cat.id)!))))
    }
    await insertRows(tx, t.markInscriptions, doc.marks.flatMap(m => m.inscriptions.map((text, position) => ({ teamId, markId: ids.mark.get(m.id)!, position, text }))))
    await insertRows(tx, t.markMaterials, doc.marks.flatMap(m => m.materialIds.map(id => ({ teamId, markId: ids.mark.get(m.id)!, materialId: ids.material.get(id)! }))))
    await insertRows(tx, t.markCategories, doc.marks.flatMap(m => m.categoryIds.map(id => ({ teamId, markId: ids.mark.get(m.id)!, categoryId: ids.category.get(id)! }))))
    // Links inside markdown point at the new entries only now that every new id is known.
    for (const type of ['maker', 'material', 'category', 'mark'] as const) {
      const table = wikiConfigs[type].table
      for (const e of collections[type] as Record<string, unknown>[]) {
        const changed = Object.fromEntries(TRANSFER_MARKDOWN_FIELDS[type].flatMap((field) => {
          const before = String(e[field] ?? '')
          const after = rewrite(before)
          return after === before ? [] : [[field, after]]
        }))
        if (!Object.keys(changed).length) continue
        await tx.update(table).set({ ...changed, updatedAt: at(e.updatedAt as string) } as never).where(and(eq(table.teamId, teamId), eq(table.id, ids[type].get(e.id as number)!)))
      }
    }
    await insertRows(tx, t.markLookalikes, doc.lookalikes.map((l) => {
      const [a, b] = [ids.mark.get(l.markLowId)!, ids.mark.get(l.markHighId)!]
      return { teamId, markLowId: Math.min(a, b), markHighId: Math.max(a, b), howToTell: rewrite(l.howToTell) }
    }))
    await insertRows(tx, t.entryLinks, doc.links.map(l => ({ teamId, fromType: l.fromType, fromId: ids[l.fromType].get(l.fromId)!, toType: l.toType, toId: ids[l.toType].get(l.toId)! })))
    await insertRows(tx, t.entryRevisions, doc.revisions.map(r => ({
      teamId, entryType: r.entryType, entryId: ids[r.entryType].get(r.entryId)!, revision: r.revision, action: r.action, restoredFrom: r.restoredFrom,
      changedFields: r.changedFields, snapshot: transferRemapSnapshot(r.entryType, r.snapshot, ids, rewrite), authorId: u(r.authorId), createdAt: at(r.createdAt),
    })))
    const noteIds = await insertRows(tx, t.entryNotes, doc.notes.map(n => ({
      teamId, entryType: n.entryType, entryId: ids[n.entryType].get(n.entryId)!, authorId: u(n.authorId), body: rewrite(n.body), happenedOn: n.happenedOn,
      createdAt: at(n.createdAt), updatedAt: at(n.updatedAt),
    })))

    const trips = idMap(doc.trips, await insertRows(tx, t.sourcingTrips, doc.trips.map(trip => ({
      teamId, revision: trip.revision, storeId: stores.get(trip.storeId)!, tripDate: trip.tripDate, bagsCents: trip.bagsCents, parkingCents: trip.parkingCents,
      fuelCents: trip.fuelCents, milesTenths: trip.milesTenths, mileageRateCents: trip.mileageRateCents, mileageCents: trip.mileageCents, notes: trip.notes,
      createdBy: u(trip.createdBy), createdAt: at(trip.createdAt), updatedAt: at(trip.updatedAt),
    }))))
    // Two people who both become the importing owner are one trip member.
    await insertRows(tx, t.tripMembers, doc.trips.flatMap(trip => [...new Set(trip.memberIds.map(id => u(id)!))].map(userId => ({ teamId, tripId: trips.get(trip.id)!, userId }))))
    const ref = <T>(map: Map<number, T>, id: number | null) => (id === null ? null : map.get(id)!)
    const itemIds = await insertRows(tx, t.items, doc.items.map(({ id: _id, statusHistory: _history, netProfitCents: _net, ...it }) => ({
      ...it, teamId,
      categoryId: ref(ids.category, it.categoryId), markId: ref(ids.mark, it.markId), makerId: ref(ids.maker, it.makerId), materialId: ref(ids.material, it.materialId),
      tripId: ref(trips, it.tripId), storeId: ref(stores, it.storeId), feeProfileId: ref(profiles, it.feeProfileId),
      sourcedBy: u(it.sourcedBy), listedBy: u(it.listedBy), createdBy: u(it.createdBy), updatedBy: u(it.updatedBy),
      // Worked out again from the figures, as every write of an item does.
      netProfitCents: itemNetProfitCents(it),
      createdAt: at(it.createdAt), updatedAt: at(it.updatedAt),
    })))
    const items = idMap(doc.items, itemIds)
    await insertRows(tx, t.itemStatusEvents, doc.items.flatMap(it => it.statusHistory.map(e => ({
      teamId, itemId: items.get(it.id)!, fromStatus: e.fromStatus, toStatus: e.toStatus, happenedOn: e.happenedOn, changedBy: u(e.changedBy), changedAt: at(e.changedAt),
    }))))
    const entityIds: Record<string, Map<number, number>> = { mark: ids.mark, maker: ids.maker, item: items }
    await insertRows(tx, t.photos, doc.photos.map(p => ({
      teamId, entityType: p.entityType, entityId: p.entityType && p.entityId !== null ? entityIds[p.entityType]!.get(p.entityId)! : null, position: p.position,
      displayKey: photos.get(p.id)!.displayKey, thumbKey: photos.get(p.id)!.thumbKey, contentType: p.contentType,
      width: p.width, height: p.height, thumbWidth: p.thumbWidth, thumbHeight: p.thumbHeight, bytes: photos.get(p.id)!.bytes, originalBytes: p.originalBytes,
      uploadedBy: u(p.uploadedBy), createdAt: at(p.createdAt),
    })))
    // The search change log, so every instance's index of this team takes in the new entries and notes.
    const changes: { entityType: SearchEntityType, entityId: number }[] = []
    for (const type of ['mark', 'maker', 'material', 'category'] as const) for (const id of ids[type].values()) changes.push({ entityType: type, entityId: id })
    for (const id of noteIds) changes.push({ entityType: 'note', entityId: id })
    // Item 0 stands for all of the team's items: the sales counts search ranks marks by.
    if (itemIds.length) changes.push({ entityType: 'item', entityId: 0 })
    await searchTrackChanges(tx, teamId, changes)
    // Reports and entry pages this team looked at before (empty ones) are out of date.
    await ledgerFiguresChanged(tx, teamId)
    await wikiPageChanged(tx, teamId)

    const summary = {
      imported: {
        marks: doc.marks.length, makers: doc.makers.length, materials: doc.materials.length, categories: doc.categories.length,
        revisions: doc.revisions.length, notes: doc.notes.length, stores: doc.stores.length, feeProfiles: doc.feeProfiles.length,
        trips: doc.trips.length, items: doc.items.length, photos: doc.photos.length,
      },
      people: { matched: people.matched, toImporter: people.toImporter },
    }
    await recordTeamAudit(access, 'team.imported', { targetType: 'team', targetId: teamId, detail: { from: doc.team.slug, exportedAt: doc.exportedAt, ...summary } }, tx)
    return summary
  })
}

async function removeObjects(storage: StorageDriver, keys: string[]) {
  for (const key of keys) await storage.delete(key).catch((error: unknown) => console.error('[transfer] could not remove a stored file', key, error))
}

/** Imports the zip at `zipPath` into the (empty) team of `access`. 409 when the team has data, 400 for any problem in the file. */
export async function transferImportTeam(access: TeamAccess, zipPath: string): Promise<TransferImportSummary> {
  const contents = await teamContents(useDb(), access.team.id)
  if (contents.length) throw notEmpty(contents)
  const index = await openZip(zipPath)
  const storage = useStorageDriver()
  const written: string[] = []
  try {
    const doc = await readDocument(index)
    const photos = await storePhotos(index, doc, access.team.id, storage, written)
    return await writeTeam(access, doc, photos)
  }
  catch (error) {
    await removeObjects(storage, written)
    if (isDuplicateKey(error)) {
      const key = /for key '([^']+)'/.exec((error as { cause?: { sqlMessage?: string } }).cause?.sqlMessage ?? '')?.[1] ?? 'a unique key'
      throw badFile(`Two records in the file are the same where the team allows one (${key}; names are compared without regard to case or accents). Nothing was imported.`)
    }
    throw error
  }
  finally {
    index.zip.close()
  }
}
