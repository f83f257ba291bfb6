// The team export: a zip with team.json (shared/schemas/transfer.ts) and every photo's stored copies, written
// as the download goes. Rows are read 1,000 at a time inside one transaction with a consistent
// snapshot, so the file is one moment of the team even while others keep working; photo files are copied one
// at a time from the storage driver, so memory stays bounded whatever the team's size.
import { Readable } from 'node:stream'
import { ZipArchive, type ZipEntryData } from 'archiver'
import { and, asc, eq, gt, inArray, type SQL } from 'drizzle-orm'
import type { MySqlColumn, MySqlTable } from 'drizzle-orm/mysql-core'
import { TRANSFER_FORMAT, TRANSFER_VERSION } from '../../../shared/schemas/transfer'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import { useStorageDriver, type StoredObject } from '../storage'
import { wikiConfigs } from '../wiki/registry'
import { TRANSFER_JSON_NAME, transferPhotoFiles } from './format'

const PAGE = 1_000
const iso = (d: Date | null) => (d ? d.toISOString() : null)

type Row = Record<string, any>
const ENTRY_COLLECTIONS: Record<WikiEntryType, string> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }
type Files = { display: string, thumb: string }

/** The rows of a team's table with an id column, in id order, a page at a time. */
async function* pages(tx: Transaction, table: MySqlTable & { id: MySqlColumn, teamId: MySqlColumn }, teamId: number, extra?: SQL): AsyncGenerator<Row[]> {
  let last = 0
  for (;;) {
    const rows = await tx.select().from(table as MySqlTable).where(and(eq(table.teamId, teamId), gt(table.id, last), extra))
      .orderBy(asc(table.id)).limit(PAGE) as Row[]
    if (rows.length) yield rows
    if (rows.length < PAGE) return
    last = rows[rows.length - 1]!.id
  }
}

/** Rows of a table without an id column (pairs, links, members), in key order, a page at a time. */
async function* offsetPages(tx: Transaction, table: MySqlTable & { teamId: MySqlColumn }, teamId: number, order: MySqlColumn[]): AsyncGenerator<Row[]> {
  for (let offset = 0; ; offset += PAGE) {
    const rows = await tx.select().from(table as MySqlTable).where(eq(table.teamId, teamId)).orderBy(...order.map(c => asc(c))).limit(PAGE).offset(offset) as Row[]
    if (rows.length) yield rows
    if (rows.length < PAGE) return
  }
}

class ExportWriter {
  readonly people = new Set<number>()
  constructor(readonly tx: Transaction, readonly teamId: number) {}

  user(id: number | null): number | null {
    if (id !== null) this.people.add(id)
    return id
  }

  async* array(name: string, source: AsyncGenerator<Row[]>, map: (rows: Row[]) => Promise<Row[]> | Row[]): AsyncGenerator<string> {
    yield `,${JSON.stringify(name)}:[`
    let first = true
    for await (const rows of source) {
      const mapped = await map(rows)
      if (!mapped.length) continue
      yield (first ? '' : ',') + mapped.map(r => JSON.stringify(r)).join(',')
      first = false
    }
    yield ']'
  }

  entries(type: WikiEntryType): AsyncGenerator<string> {
    const config = wikiConfigs[type]
    return this.array(ENTRY_COLLECTIONS[type], pages(this.tx, config.table as never, this.teamId), async (rows) => {
      const children = config.loadChildren ? await config.loadChildren(this.tx, this.teamId, rows.map(r => r.id)) : new Map()
      return rows.map((row) => {
        const content = { ...config.rowToContent(row), ...children.get(row.id) } as Row
        delete content.lookalikes
        return {
          id: row.id, revision: row.revision, ...content,
          createdBy: this.user(row.createdBy), updatedBy: this.user(row.updatedBy),
          deletedAt: iso(row.deletedAt), deletedBy: this.user(row.deletedBy), createdAt: iso(row.createdAt), updatedAt: iso(row.updatedAt),
        }
      })
    })
  }
}

async function* teamJson(tx: Transaction, access: TeamAccess, photoFiles: Map<number, Files>): AsyncGenerator<string> {
  const teamId = access.team.id
  const w = new ExportWriter(tx, teamId)
  const t = tables
  const [team] = await tx.select().from(t.teams).where(eq(t.teams.id, teamId))
  const [settings] = await tx.select().from(t.ledgerSettings).where(eq(t.ledgerSettings.teamId, teamId))
  const [targets] = await tx.select().from(t.buyTargets).where(eq(t.buyTargets.teamId, teamId))
  yield `{"format":${JSON.stringify(TRANSFER_FORMAT)},"version":${TRANSFER_VERSION},"exportedAt":${JSON.stringify(new Date().toISOString())}`
  yield `,"team":${JSON.stringify({ name: team!.name, slug: team!.slug, timeZone: team!.timeZone })}`
  yield `,"ledgerSettings":${JSON.stringify(settings
    ? { mileageRateCents: settings.mileageRateCents, conditionScale: settings.conditionScale, currency: settings.currency, createdAt: iso(settings.createdAt), updatedAt: iso(settings.updatedAt) }
    : null)}`
  yield `,"buyTargets":${JSON.stringify(targets
    ? {
        revision: targets.revision, minProfitCents: targets.minProfitCents, minRoiBp: targets.minRoiBp, maxDaysToSell: targets.maxDaysToSell,
        updatedBy: w.user(targets.updatedBy), createdAt: iso(targets.createdAt), updatedAt: iso(targets.updatedAt),
      }
    : null)}`
  yield* w.array('importMappings', pages(tx, t.importMappings, teamId), rows => rows.map(r => ({
    headerKey: r.headerKey, headers: r.headers, mapping: r.mapping, dateOrder: r.dateOrder, updatedBy: w.user(r.updatedBy),
    lastUsedAt: iso(r.lastUsedAt), createdAt: iso(r.createdAt), updatedAt: iso(r.updatedAt),
  })))
  yield* w.array('stores', pages(tx, t.stores, teamId), rows => rows.map(r => ({
    id: r.id, revision: r.revision, name: r.name, kind: r.kind, town: r.town, notes: r.notes, createdBy: w.user(r.createdBy),
    createdAt: iso(r.createdAt), updatedAt: iso(r.updatedAt),
  })))
  yield* w.array('feeProfiles', pages(tx, t.feeProfiles, teamId), rows => rows.map(r => ({
    id: r.id, revision: r.revision, name: r.name, channel: r.channel, percentBp: r.percentBp, fixedCents: r.fixedCents,
    paymentPercentBp: r.paymentPercentBp, paymentFixedCents: r.paymentFixedCents, isDefault: r.defaultFlag === 1,
    createdAt: iso(r.createdAt), updatedAt: iso(r.updatedAt),
  })))
  for (const type of ['maker', 'material', 'category', 'mark'] as const) yield* w.entries(type)
  const ml = t.markLookalikes
  yield* w.array('lookalikes', offsetPages(tx, ml, teamId, [ml.markLowId, ml.markHighId]), rows => rows.map(r => ({
    markLowId: r.markLowId, markHighId: r.markHighId, howToTell: r.howToTell,
  })))
  const el = t.entryLinks
  yield* w.array('links', offsetPages(tx, el, teamId, [el.fromType, el.fromId, el.toType, el.toId]), rows => rows.map(r => ({
    fromType: r.fromType, fromId: r.fromId, toType: r.toType, toId: r.toId,
  })))
  yield* w.array('revisions', pages(tx, t.entryRevisions, teamId), rows => rows.map(r => ({
    id: r.id, entryType: r.entryType, entryId: r.entryId, revision: r.revision, action: r.action, restoredFrom: r.restoredFrom,
    changedFields: r.changedFields, snapshot: r.snapshot, authorId: w.user(r.authorId), createdAt: iso(r.createdAt),
  })))
  yield* w.array('notes', pages(tx, t.entryNotes, teamId), rows => rows.map(r => ({
    id: r.id, entryType: r.entryType, entryId: r.entryId, authorId: w.user(r.authorId), body: r.body, happenedOn: r.happenedOn,
    createdAt: iso(r.createdAt), updatedAt: iso(r.updatedAt),
  })))
  yield* w.array('trips', pages(tx, t.sourcingTrips, teamId), async (rows) => {
    const tm = t.tripMembers
    const members = await tx.select().from(tm).where(and(eq(tm.teamId, teamId), inArray(tm.tripId, rows.map(r => r.id)))).orderBy(asc(tm.tripId), asc(tm.userId))
    return rows.map(({ teamId: _teamId, createdAt, updatedAt, createdBy, ...r }) => ({
      ...r, createdBy: w.user(createdBy), memberIds: members.filter(m => m.tripId === r.id).map(m => w.user(m.userId)),
      createdAt: iso(createdAt), updatedAt: iso(updatedAt),
    }))
  })
  yield* w.array('items', pages(tx, t.items, teamId), async (rows) => {
    const e = t.itemStatusEvents
    const events = await tx.select().from(e).where(and(eq(e.teamId, teamId), inArray(e.itemId, rows.map(r => r.id)))).orderBy(asc(e.id))
    return rows.map(({ teamId: _teamId, createdAt, updatedAt, ...r }) => ({
      ...r, sourcedBy: w.user(r.sourcedBy), listedBy: w.user(r.listedBy), createdBy: w.user(r.createdBy), updatedBy: w.user(r.updatedBy),
      createdAt: iso(createdAt), updatedAt: iso(updatedAt),
      statusHistory: events.filter(ev => ev.itemId === r.id).map(ev => ({
        fromStatus: ev.fromStatus, toStatus: ev.toStatus, happenedOn: ev.happenedOn, changedBy: w.user(ev.changedBy), changedAt: iso(ev.changedAt),
      })),
    }))
  })
  yield* w.array('photos', pages(tx, t.photos, teamId), rows => rows.filter(r => photoFiles.has(r.id)).map(r => ({
    id: r.id, entityType: r.entityType, entityId: r.entityId, position: r.position, contentType: r.contentType,
    width: r.width, height: r.height, thumbWidth: r.thumbWidth, thumbHeight: r.thumbHeight, bytes: r.bytes, originalBytes: r.originalBytes,
    uploadedBy: w.user(r.uploadedBy), createdAt: iso(r.createdAt), files: photoFiles.get(r.id),
  })))
  // Last: everyone the rows above name, and every member, so an import can match them by e-mail.
  const m = t.memberships
  const members = await tx.select({ userId: m.userId, role: m.role }).from(m).where(eq(m.teamId, teamId))
  for (const member of members) w.people.add(member.userId)
  const roles = new Map(members.map(r => [r.userId, r.role]))
  const ids = [...w.people].sort((a, b) => a - b)
  yield ',"people":['
  for (let i = 0; i < ids.length; i += PAGE) {
    const users = await tx.select({ id: t.users.id, email: t.users.email, name: t.users.name }).from(t.users)
      .where(inArray(t.users.id, ids.slice(i, i + PAGE))).orderBy(asc(t.users.id))
    yield (i ? ',' : '') + users.map(u => JSON.stringify({ id: u.id, email: u.email, name: u.name, role: roles.get(u.id) ?? null })).join(',')
  }
  yield ']}'
}

/** Adds one entry and waits until the zip has written it, so only one photo file is in flight at a time. */
function addEntry(zip: ZipArchive, source: Readable | Buffer, data: ZipEntryData, signal: AbortSignal): Promise<void> {
  return new Promise((resolve, reject) => {
    const done = (error?: Error) => {
      zip.off('entry', onEntry)
      zip.off('error', onError)
      zip.off('close', onClose)
      signal.removeEventListener('abort', onClose)
      if (error) reject(error)
      else resolve()
    }
    const onEntry = (entry: ZipEntryData) => entry.name === data.name && done()
    const onError = (error: Error) => done(error)
    const onClose = () => done(new Error('The download was closed before the export was complete.'))
    if (signal.aborted) return onClose()
    zip.on('entry', onEntry)
    zip.once('error', onError)
    zip.once('close', onClose)
    signal.addEventListener('abort', onClose, { once: true })
    zip.append(source as Readable, data)
  })
}

function discard(object: StoredObject | null) {
  if (object && !Buffer.isBuffer(object.body)) object.body.destroy()
}

async function writeExport(access: TeamAccess, zip: ZipArchive, signal: AbortSignal) {
  const storage = useStorageDriver()
  const teamId = access.team.id
  // Recorded when it starts: the file holds every member's e-mail address, even if the download breaks off.
  await recordTeamAudit(access, 'team.exported', { targetType: 'team', targetId: teamId })
  await useDb().transaction(async (tx) => {
    // Photo files first: a photo whose files are missing from storage is left out of team.json too.
    const written = new Map<number, Files>()
    for await (const rows of pages(tx, tables.photos, teamId)) {
      for (const photo of rows) {
        const [display, thumb] = [await storage.get(photo.displayKey), await storage.get(photo.thumbKey)]
        if (!display || !thumb) {
          discard(display)
          discard(thumb)
          console.error('[transfer] photo files missing from storage, left out of the export', photo.id)
          continue
        }
        const files = transferPhotoFiles(photo.id, photo.contentType)
        // Already compressed images: stored as they are.
        await addEntry(zip, display.body, { name: files.display, store: true, date: photo.createdAt }, signal)
        await addEntry(zip, thumb.body, { name: files.thumb, store: true, date: photo.createdAt }, signal)
        written.set(photo.id, files)
      }
    }
    await addEntry(zip, Readable.from(teamJson(tx, access, written)), { name: TRANSFER_JSON_NAME, date: new Date() }, signal)
  }, { isolationLevel: 'repeatable read', withConsistentSnapshot: true })
  await zip.finalize()
}

/**
 * The export zip as a stream. `signal` ends the work when the download is closed early; a failure half-way
 * breaks the download (a truncated zip does not open) rather than letting it look complete.
 */
export function transferExportStream(access: TeamAccess, signal: AbortSignal): Readable {
  const zip = new ZipArchive({ zlib: { level: 6 } })
  writeExport(access, zip, signal).catch((error: unknown) => {
    if (!signal.aborted) console.error('[transfer] export failed', error)
    zip.destroy(error instanceof Error ? error : new Error(String(error)))
  })
  return zip
}
