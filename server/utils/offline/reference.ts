// The team's reference for the phone: a full snapshot, or only what changed since the phone's cursor, read
// from the search change log (server/database/schema/search.ts), which every wiki and note write fills in
// its own transaction. The cursor is the highest change id that has surely settled (committed or rolled
// back) before the data was read, so a change is never skipped; one near the cursor may be sent twice, and
// applying an entry twice is harmless.
import { createHash } from 'node:crypto'
import { and, asc, desc, eq, gt, inArray, isNull, lt, sql } from 'drizzle-orm'
import { entryNotes, photos, users } from '../../database/schema'
import { searchChanges } from '../../database/schema/search'
import { WIKI_ENTRY_TYPES, type WikiEntryType } from '../../../shared/schemas/wiki'
import {
  OFFLINE_FORMAT, OFFLINE_LIST_KEYS, OFFLINE_TYPES,
  type OfflineNote, type OfflineReferenceResponse, type OfflineThumbs, type OfflineType,
} from '../../../shared/offline/types'
import type { DbOrTx } from '../db'
import type { TeamAccess } from '../guard'
import { wikiLoadEntries } from '../wiki/engine'
import { wikiConfigs } from '../wiki/registry'

/** A write's transaction is assumed finished this long after its change row (as the search service assumes). */
const SETTLE_MS = 10_000
/** Change rows are pruned after a day (server/utils/search/config.ts); older cursors get a full snapshot. */
const CURSOR_MAX_AGE_MS = 20 * 60 * 60 * 1000
/** More changed entries than this since the cursor: a full snapshot is about as cheap. */
const MAX_DELTA_ENTRIES = 20_000
const PAGE = 1000

interface Cursor { changeId: number, issuedAt: number }

export function offlineParseCursor(raw: string | undefined): Cursor | null {
  const m = /^v(\d+)\.(\d+)\.(\d+)$/.exec(raw ?? '')
  if (!m || Number(m[1]) !== OFFLINE_FORMAT) return null
  return { changeId: Number(m[2]), issuedAt: Number(m[3]) }
}

const formatCursor = (c: Cursor) => `v${OFFLINE_FORMAT}.${c.changeId}.${c.issuedAt}`

/** The highest change id of the team written more than SETTLE_MS ago (0 when none). */
async function settledChangeId(db: DbOrTx, teamId: number): Promise<number> {
  const c = searchChanges
  const [row] = await db.select({ id: c.id }).from(c)
    .where(and(eq(c.teamId, teamId), lt(c.changedAt, sql`now(3) - interval ${Math.ceil(SETTLE_MS / 1000)} second`)))
    .orderBy(desc(c.id)).limit(1)
  return row?.id ?? 0
}

async function liveIds(db: DbOrTx, type: WikiEntryType, teamId: number): Promise<number[]> {
  const t = wikiConfigs[type].table
  const rows = await db.select({ id: t.id }).from(t).where(and(eq(t.teamId, teamId), isNull(t.deletedAt))).orderBy(asc(t.id)) as { id: number }[]
  return rows.map(r => r.id)
}

/** Live entries of one type as { id, revision, updatedAt, ...content }, read with the wiki engine's own loaders. */
async function loadEntries(db: DbOrTx, type: WikiEntryType, teamId: number, ids: number[]) {
  const out: Record<string, unknown>[] = []
  for (let i = 0; i < ids.length; i += PAGE) {
    const page = ids.slice(i, i + PAGE)
    const loaded = await wikiLoadEntries(db, wikiConfigs[type], teamId, page)
    for (const id of page) {
      const entry = loaded.get(id)
      if (entry) out.push({ id, revision: entry.row.revision, updatedAt: entry.row.updatedAt.getTime(), ...entry.content })
    }
  }
  return out
}

/** Notes whose entry is live; `ids` null means all of the team's. */
async function loadNotes(db: DbOrTx, teamId: number, ids: number[] | null, liveEntries: Map<WikiEntryType, Set<number>> | null): Promise<OfflineNote[]> {
  const n = entryNotes
  const out: OfflineNote[] = []
  const read = async (where: ReturnType<typeof and>) => await db.select({
    id: n.id, entryType: n.entryType, entryId: n.entryId, body: n.body, happenedOn: n.happenedOn,
    createdAt: n.createdAt, updatedAt: n.updatedAt, authorName: users.name,
  }).from(n).leftJoin(users, eq(users.id, n.authorId)).where(where).orderBy(asc(n.id))
  const rows = ids === null
    ? await read(eq(n.teamId, teamId))
    : (await Promise.all(chunks(ids, PAGE).map(page => read(and(eq(n.teamId, teamId), inArray(n.id, page)))))).flat()
  for (const r of rows) {
    if (liveEntries && !liveEntries.get(r.entryType)?.has(r.entryId)) continue
    out.push({ ...r, authorName: r.authorName ?? '', createdAt: r.createdAt.getTime(), updatedAt: r.updatedAt.getTime() })
  }
  return out
}

function chunks<T>(list: T[], size: number): T[][] {
  const out: T[][] = []
  for (let i = 0; i < list.length; i += size) out.push(list.slice(i, i + size))
  return out
}

/** The first photo (gallery order) of every mark and maker of the team. */
async function thumbsOf(db: DbOrTx, teamId: number): Promise<OfflineThumbs> {
  const p = photos
  const rows = await db.select({ id: p.id, entityType: p.entityType, entityId: p.entityId }).from(p)
    .where(and(eq(p.teamId, teamId), inArray(p.entityType, ['mark', 'maker'])))
    .orderBy(asc(p.entityType), asc(p.entityId), asc(p.position), asc(p.id))
  const thumbs: OfflineThumbs = { hash: '', mark: [], maker: [] }
  let last = ''
  for (const r of rows) {
    const key = `${r.entityType}:${r.entityId}`
    if (r.entityId === null || key === last) continue
    last = key
    thumbs[r.entityType as 'mark' | 'maker'].push([r.entityId, r.id])
  }
  thumbs.hash = createHash('sha256').update(JSON.stringify([thumbs.mark, thumbs.maker])).digest('base64url').slice(0, 16)
  return thumbs
}

function emptyAnswer(access: TeamAccess, full: boolean, cursor: Cursor): OfflineReferenceResponse {
  return {
    format: OFFLINE_FORMAT, team: { slug: access.team.slug, name: access.team.name }, full, cursor: formatCursor(cursor),
    generatedAt: new Date(cursor.issuedAt).toISOString(), marks: [], makers: [], materials: [], categories: [], notes: [],
    removed: { mark: [], maker: [], material: [], category: [], note: [] },
  }
}

export async function offlineReference(db: DbOrTx, access: TeamAccess, options: { since?: string, thumbsHash?: string }): Promise<OfflineReferenceResponse> {
  const teamId = access.team.id
  const now = Date.now()
  // Read before any data: every change at or below it is in what is read next.
  const cursor: Cursor = { changeId: await settledChangeId(db, teamId), issuedAt: now }
  const since = offlineParseCursor(options.since)
  let changed: Map<OfflineType, Set<number>> | null = null
  const c = searchChanges
  const [latest] = await db.select({ id: c.id }).from(c).where(eq(c.teamId, teamId)).orderBy(desc(c.id)).limit(1)
  // A cursor from the future (a database restored from a backup) is not trusted.
  if (since && now - since.issuedAt <= CURSOR_MAX_AGE_MS && since.changeId <= (latest?.id ?? 0)) {
    const rows = await db.selectDistinct({ type: c.entityType, id: c.entityId }).from(c)
      .where(and(eq(c.teamId, teamId), gt(c.id, since.changeId))).limit(MAX_DELTA_ENTRIES + 1)
    if (rows.length <= MAX_DELTA_ENTRIES) {
      changed = new Map()
      for (const r of rows) {
        if (!(OFFLINE_TYPES as readonly string[]).includes(r.type)) continue
        const set = changed.get(r.type as OfflineType) ?? changed.set(r.type as OfflineType, new Set()).get(r.type as OfflineType)!
        set.add(r.id)
      }
    }
  }
  const answer = emptyAnswer(access, changed === null, cursor)
  if (changed === null) {
    const live = new Map<WikiEntryType, Set<number>>()
    for (const type of WIKI_ENTRY_TYPES) {
      const ids = await liveIds(db, type, teamId)
      live.set(type, new Set(ids))
      ;(answer[OFFLINE_LIST_KEYS[type]] as unknown[]) = await loadEntries(db, type, teamId, ids)
    }
    answer.notes = await loadNotes(db, teamId, null, live)
  }
  else {
    for (const type of WIKI_ENTRY_TYPES) {
      const ids = [...changed.get(type) ?? []]
      const entries = await loadEntries(db, type, teamId, ids)
      ;(answer[OFFLINE_LIST_KEYS[type]] as unknown[]) = entries
      const present = new Set(entries.map(e => e.id as number))
      answer.removed[type] = ids.filter(id => !present.has(id)).sort((a, b) => a - b)
    }
    // The notes of a changed entry come with it: an entry back from the deleted list brings its timeline.
    const noteIds = new Set(changed.get('note') ?? [])
    for (const type of WIKI_ENTRY_TYPES) {
      const ids = [...changed.get(type) ?? []]
      for (const page of chunks(ids, PAGE)) {
        const rows = await db.select({ id: entryNotes.id }).from(entryNotes)
          .where(and(eq(entryNotes.teamId, teamId), eq(entryNotes.entryType, type), inArray(entryNotes.entryId, page)))
        for (const r of rows) noteIds.add(r.id)
      }
    }
    // Notes of a deleted entry stay on the phone, hidden there while the entry is gone (as on the server).
    answer.notes = await loadNotes(db, teamId, [...noteIds], null)
    const presentNotes = new Set(answer.notes.map(n => n.id))
    answer.removed.note = [...changed.get('note') ?? []].filter(id => !presentNotes.has(id)).sort((a, b) => a - b)
  }
  const thumbs = await thumbsOf(db, teamId)
  if (thumbs.hash !== options.thumbsHash) answer.thumbs = thumbs
  return answer
}
