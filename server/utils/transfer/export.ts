// The team export, first half: every row of the team read in ONE short transaction with a consistent snapshot
// (1,000 rows at a time), written to a temporary folder: team.json without its photos, the photos one per line
// with their storage keys, and the people. The transaction ends there, before a single byte goes to the client;
// export-zip.ts then copies the photo files from storage and streams the zip at the client's pace. Photo files
// are immutable objects under keys that are never reused, so reading them after the snapshot reads the snapshot.
import { createWriteStream } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { and, asc, eq, gt, inArray, type SQL } from 'drizzle-orm'
import type { MySqlColumn, MySqlTable } from 'drizzle-orm/mysql-core'
import { TRANSFER_FORMAT, TRANSFER_VERSION } from '../../../shared/schemas/transfer'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import { wikiConfigs } from '../wiki/registry'
import { transferPhotoFiles } from './format'

const PAGE = 1_000
const iso = (d: Date | null) => (d ? d.toISOString() : null)

type Row = Record<string, any>
const ENTRY_COLLECTIONS: Record<WikiEntryType, string> = { mark: 'marks', maker: 'makers', material: 'materials', category: 'categories' }

/** The snapshot on disk, for export-zip.ts; `cleanup` removes the folder (the zip writer calls it in every case). */
export interface TransferExportSnapshot {
  dir: string
  /** team.json up to its photos, the photos (one JSON line each: `{ keys, photo }`), and its people with the end. */
  files: { head: string, photos: string, tail: string }
  cleanup: () => Promise<void>
}

/** One line of the photos file: where the two copies are stored, and the photo as team.json lists it. */
export interface TransferExportPhotoLine {
  keys: { display: string, thumb: string }
  photo: Row & { id: number, createdAt: string, files: { display: string, thumb: string } }
}

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

/** team.json from its start up to (not including) the photos. */
async function* teamJsonHead(w: ExportWriter): AsyncGenerator<string> {
  const { tx, teamId } = w
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
}

/** The photos, one line each; the zip writer keeps those whose files it finds. */
async function* photoLines(w: ExportWriter): AsyncGenerator<string> {
  for await (const rows of pages(w.tx, tables.photos, w.teamId)) {
    yield rows.map((r) => {
      const line: TransferExportPhotoLine = {
        keys: { display: r.displayKey, thumb: r.thumbKey },
        photo: {
          id: r.id, entityType: r.entityType, entityId: r.entityId, position: r.position, contentType: r.contentType,
          width: r.width, height: r.height, thumbWidth: r.thumbWidth, thumbHeight: r.thumbHeight, bytes: r.bytes, originalBytes: r.originalBytes,
          uploadedBy: w.user(r.uploadedBy), createdAt: iso(r.createdAt)!, files: transferPhotoFiles(r.id, r.contentType),
        },
      }
      return `${JSON.stringify(line)}\n`
    }).join('')
  }
}

/** team.json after the photos: the people, and the end. */
async function* teamJsonTail(w: ExportWriter): AsyncGenerator<string> {
  const { tx, teamId } = w
  const t = tables
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

async function writeFile(path: string, parts: AsyncGenerator<string>) {
  await pipeline(Readable.from(parts), createWriteStream(path, { mode: 0o600 }))
}

/**
 * Reads the whole team in one REPEATABLE READ transaction WITH CONSISTENT SNAPSHOT into a temporary folder and
 * ends the transaction; nothing of the download's pace reaches the database. On failure the folder is gone again.
 */
export async function transferExportSnapshot(access: TeamAccess): Promise<TransferExportSnapshot> {
  const teamId = access.team.id
  // Recorded when it starts: the file holds every member's e-mail address, even if the download breaks off.
  await recordTeamAudit(access, 'team.exported', { targetType: 'team', targetId: teamId })
  const dir = await mkdtemp(join(tmpdir(), 'tallymark-export-'))
  const cleanup = () => rm(dir, { recursive: true, force: true })
  const files = { head: join(dir, 'team-head.json'), photos: join(dir, 'photos.ndjson'), tail: join(dir, 'team-tail.json') }
  try {
    await useDb().transaction(async (tx) => {
      const w = new ExportWriter(tx, teamId)
      await writeFile(files.head, teamJsonHead(w))
      await writeFile(files.photos, photoLines(w))
      await writeFile(files.tail, teamJsonTail(w))
    }, { isolationLevel: 'repeatable read', withConsistentSnapshot: true })
  }
  catch (error) {
    await cleanup()
    throw error
  }
  return { dir, files, cleanup }
}
