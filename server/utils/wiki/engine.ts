// The one entry-revision engine behind makers, marks, materials and categories (per-type rules in
// registry.ts). Every save writes the entry row, its child rows, its links and a revision in one
// transaction; concurrent edits are refused by the UPDATE itself (WHERE revision = the one the edit is based on).
import { and, asc, count, desc, eq, inArray, isNotNull, isNull, like, sql, type SQL } from 'drizzle-orm'
import { renderMarkdown } from '../../../shared/markdown'
import { roleAtLeast } from '../../../shared/roles'
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import type { WikiSaved } from '../../../shared/types/wiki'
import { wikiChangedFields, wikiDefinedOnly, wikiLinkTargets, wikiNewContent } from './content'
import { wikiReadDetail } from './detail'
import { wikiPageLookup, wikiPageStore } from './page-cache'
import { wikiExistingIds } from './refs'
import { wikiConfigs } from './registry'
import { wikiPageChanged } from './versions'
import { wikiLikeEscape, type WikiBaseRow, type WikiFieldErrors, type WikiTypeConfig } from './types'
import { searchTrackChange } from '../search/changes'

export interface WikiLoadedEntry<C extends object = any> { row: WikiBaseRow & Record<string, unknown>, content: C }
type WikiSaveResult = Pick<WikiSaved, 'id' | 'revision'>

// Thrown inside a transaction so it rolls back; turned into the 409 answer outside it.
class WikiConflict extends Error {}

const DEADLOCK_RETRIES = 3

/** Runs a transaction again when InnoDB picked it as a deadlock victim (two saves touching the same lookalike pair). */
async function wikiTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await useDb().transaction(work)
    }
    catch (error) {
      const code = (error as { cause?: { code?: string }, code?: string }).cause?.code ?? (error as { code?: string }).code
      if (code !== 'ER_LOCK_DEADLOCK' || attempt >= DEADLOCK_RETRIES) throw error
    }
  }
}

function throwIfInvalid(config: WikiTypeConfig, fieldErrors: WikiFieldErrors) {
  const first = Object.entries(fieldErrors)[0]
  if (first) throw httpError(400, `Please check the ${config.label}: ${first[0]}: ${first[1][0]}`, fieldErrors)
}

const notFoundEntry = (config: WikiTypeConfig) => notFound(`No such ${config.label} in this team.`)

export async function wikiLoadEntries(db: DbOrTx, config: WikiTypeConfig, teamId: number, ids: number[], includeDeleted = false): Promise<Map<number, WikiLoadedEntry>> {
  const out = new Map<number, WikiLoadedEntry>()
  if (!ids.length) return out
  const t = config.table
  const conditions: SQL[] = [eq(t.teamId, teamId), inArray(t.id, ids)]
  if (!includeDeleted) conditions.push(isNull(t.deletedAt))
  const rows = await db.select().from(t).where(and(...conditions)) as (WikiBaseRow & Record<string, unknown>)[]
  const children = config.loadChildren ? await config.loadChildren(db, teamId, rows.map(r => r.id)) : new Map()
  for (const row of rows) out.set(row.id, { row, content: { ...config.rowToContent(row), ...children.get(row.id) } })
  return out
}

async function userNames(db: DbOrTx, ids: number[]): Promise<Map<number, string>> {
  const unique = [...new Set(ids)]
  if (!unique.length) return new Map()
  const rows = await db.select({ id: tables.users.id, name: tables.users.name }).from(tables.users).where(inArray(tables.users.id, unique))
  return new Map(rows.map(r => [r.id, r.name]))
}

const person = (names: Map<number, string>, id: number | null) => id === null ? null : { id, name: names.get(id) ?? '' }

const sortBacklinks = <T extends { title: string }>(list: T[]) => list.sort((a, b) => a.title.localeCompare(b.title))

/** Entries of the team whose markdown links to these entries (live ones only), for many targets at once. */
async function wikiBacklinks(db: DbOrTx, teamId: number, toType: WikiEntryType, toIds: number[]) {
  const out = new Map<number, { type: WikiEntryType, id: number, title: string }[]>(toIds.map(id => [id, []]))
  if (!toIds.length) return out
  const links = await db.select().from(tables.entryLinks)
    .where(and(eq(tables.entryLinks.teamId, teamId), eq(tables.entryLinks.toType, toType), inArray(tables.entryLinks.toId, toIds)))
  const byType = new Map<WikiEntryType, number[]>()
  for (const l of links) (byType.get(l.fromType) ?? byType.set(l.fromType, []).get(l.fromType)!).push(l.fromId)
  const titles = new Map<string, string>()
  for (const [type, ids] of byType) {
    const t = wikiConfigs[type].table
    const rows = await db.select({ id: t.id, title: wikiConfigs[type].titleColumn }).from(t)
      .where(and(eq(t.teamId, teamId), inArray(t.id, [...new Set(ids)]), isNull(t.deletedAt))) as { id: number, title: string }[]
    for (const r of rows) titles.set(`${type}:${r.id}`, r.title)
  }
  for (const l of links) {
    const title = titles.get(`${l.fromType}:${l.fromId}`)
    if (title !== undefined) out.get(l.toId)!.push({ type: l.fromType, id: l.fromId, title })
  }
  for (const list of out.values()) sortBacklinks(list)
  return out
}

interface WikiPresentParts {
  extras: Map<number, Record<string, unknown>>
  backlinks: Map<number, { type: WikiEntryType, id: number, title: string }[]>
  names: Map<number, string>
  photos: Map<number, unknown[]>
}

/** The JSON of loaded entries, from what was read beside them (the one shape of an entry, list or page). */
function wikiAssemble(config: WikiTypeConfig, entries: WikiLoadedEntry[], { extras, backlinks, names, photos }: WikiPresentParts): Record<string, unknown>[] {
  return entries.map(({ row, content }) => {
    const html: Record<string, string> = {}
    for (const field of config.markdownFields) html[`${field}Html`] = renderMarkdown(String(content[field] ?? ''))
    return {
      id: row.id,
      type: config.type,
      revision: row.revision,
      title: config.titleOf(content),
      ...content,
      ...html,
      ...extras.get(row.id),
      photos: photos.get(row.id) ?? [],
      backlinks: backlinks.get(row.id) ?? [],
      createdAt: row.createdAt,
      createdBy: person(names, row.createdBy),
      updatedAt: row.updatedAt,
      updatedBy: person(names, row.updatedBy),
      deletedAt: row.deletedAt,
      deletedBy: person(names, row.deletedBy),
    }
  })
}

/** The JSON of entries: content, rendered markdown, type extras, photos, backlinks and authorship. */
export async function wikiPresent(access: TeamAccess, config: WikiTypeConfig, entries: WikiLoadedEntry[], detail: boolean): Promise<Record<string, unknown>[]> {
  const db = useDb()
  const ids = entries.map(e => e.row.id)
  const contents = new Map(entries.map(e => [e.row.id, e.content]))
  const [extras, backlinks, names, photos] = await Promise.all([
    config.extras ? config.extras(db, access.team.id, contents, detail) : new Map<number, Record<string, unknown>>(),
    wikiBacklinks(db, access.team.id, config.type, ids),
    userNames(db, entries.flatMap(e => [e.row.createdBy, e.row.updatedBy, ...(e.row.deletedBy ? [e.row.deletedBy] : [])])),
    config.photoType ? listEntryPhotos(access.team, config.photoType, ids) : new Map<number, unknown[]>(),
  ])
  return wikiAssemble(config, entries, { extras, backlinks, names, photos })
}

/**
 * An entry's page: from this instance's page cache while the database still reads the versions it was built at
 * (page-cache.ts, one statement), else one statement (detail.ts) for what wikiLoadEntries and wikiPresent read.
 */
async function presentOne(access: TeamAccess, config: WikiTypeConfig, id: number, includeDeleted: boolean) {
  const db = useDb()
  const hit = await wikiPageLookup(db, config, access.team, id, includeDeleted)
  if (hit) {
    const [createdBy, updatedBy, deletedBy] = hit.people
    return { ...hit.page, createdBy: person(hit.names, createdBy), updatedBy: person(hit.names, updatedBy), deletedBy: person(hit.names, deletedBy) }
  }
  const detail = await wikiReadDetail(db, config, access.team, id, includeDeleted)
  if (!detail) throw notFoundEntry(config)
  const { row, content, extras, backlinks, names, photos } = detail
  const page = wikiAssemble(config, [{ row, content }], {
    extras: new Map(extras ? [[id, extras]] : []),
    backlinks: new Map([[id, sortBacklinks(backlinks)]]),
    names,
    photos: new Map([[id, photos]]),
  })[0]!
  wikiPageStore(config, access.team.id, id, includeDeleted, detail.versions, page, [row.createdBy, row.updatedBy, row.deletedBy])
  return page
}

export async function wikiGetEntry(access: TeamAccess, type: WikiEntryType, id: number, includeDeleted: boolean) {
  // Deleted entries are for editors only: to everyone else they do not exist.
  return await presentOne(access, wikiConfigs[type], id, includeDeleted && roleAtLeast(access.role, 'editor'))
}

export async function wikiListEntries(access: TeamAccess, type: WikiEntryType, query: { page: number, pageSize: number, sort?: string, q?: string, tag?: string }) {
  const config = wikiConfigs[type]
  const db = useDb()
  const t = config.table
  const where: SQL[] = [eq(t.teamId, access.team.id), isNull(t.deletedAt), ...await config.listConditions(db, access.team.id, query)]
  if (query.q) where.push(config.searchCondition(access.team.id, `%${wikiLikeEscape(query.q)}%`))
  if (query.tag) where.push(sql`json_contains(${t.tags}, ${JSON.stringify(query.tag)})`)
  const sort = query.sort ?? config.defaultSort
  const column = config.sortColumns[sort.replace(/^-/, '')]!
  const [[totalRow], idRows] = await Promise.all([
    db.select({ n: count() }).from(t).where(and(...where)),
    db.select({ id: t.id }).from(t).where(and(...where))
      .orderBy(sort.startsWith('-') ? desc(column) : asc(column), asc(t.id))
      .limit(query.pageSize).offset((query.page - 1) * query.pageSize) as Promise<{ id: number }[]>,
  ])
  const loaded = await wikiLoadEntries(db, config, access.team.id, idRows.map(r => r.id))
  const entries = idRows.map(r => loaded.get(r.id)).filter((e): e is WikiLoadedEntry => Boolean(e))
  return { items: await wikiPresent(access, config, entries, false), total: Number(totalRow?.n ?? 0), page: query.page, pageSize: query.pageSize }
}

async function writeChildren(tx: Transaction, config: WikiTypeConfig, teamId: number, id: number, content: object, replace: boolean) {
  if (replace && config.deleteChildren) await config.deleteChildren(tx, teamId, id)
  for (const { table, rows } of config.childRows?.(teamId, id, content) ?? []) {
    if (rows.length) await tx.insert(table).values(rows as never)
  }
}

/** Rewrites the entry's outgoing links; targets must be entries of the same team (deleted ones count: they may come back). */
async function writeLinks(tx: Transaction, access: TeamAccess, config: WikiTypeConfig, id: number, content: object, replace: boolean) {
  const teamId = access.team.id
  if (replace) {
    await tx.delete(tables.entryLinks).where(and(eq(tables.entryLinks.teamId, teamId), eq(tables.entryLinks.fromType, config.type), eq(tables.entryLinks.fromId, id)))
  }
  const targets = wikiLinkTargets(config, access.team.slug, id, content)
  const rows: (typeof tables.entryLinks.$inferInsert)[] = []
  for (const type of new Set(targets.map(l => l.type))) {
    const existing = await wikiExistingIds(tx, wikiConfigs[type].table, teamId, targets.filter(l => l.type === type).map(l => l.id), false)
    for (const toId of existing) rows.push({ teamId, fromType: config.type, fromId: id, toType: type, toId })
  }
  if (rows.length) await tx.insert(tables.entryLinks).values(rows)
}

interface RevisionFields { action: 'create' | 'edit' | 'restore', changedFields: string[], snapshot: object, restoredFrom?: number }

async function recordRevision(tx: Transaction, access: TeamAccess, config: WikiTypeConfig, id: number, revision: number, fields: RevisionFields) {
  await tx.insert(tables.entryRevisions).values({
    teamId: access.team.id, entryType: config.type, entryId: id, revision, action: fields.action,
    restoredFrom: fields.restoredFrom ?? null, changedFields: fields.changedFields,
    snapshot: fields.snapshot as Record<string, unknown>, authorId: access.user.id,
  })
  // Creates, edits and restores all record a revision: the search change log is written beside it, and the
  // team's wiki version moves on last (its row lock is held only until the commit that follows).
  await searchTrackChange(tx, access.team.id, config.type, id)
  await wikiPageChanged(tx, access.team.id)
}

export async function wikiCreateEntry(access: TeamAccess, type: WikiEntryType, input: object): Promise<WikiSaveResult> {
  const config = wikiConfigs[type]
  return await wikiTransaction(async (tx) => {
    const { content, fieldErrors } = await config.check(tx, access.team.id, null, wikiNewContent(config, input), null, 'write')
    throwIfInvalid(config, fieldErrors)
    const [{ id }] = await tx.insert(config.table).values({
      ...config.toRow(content), teamId: access.team.id, revision: 1, createdBy: access.user.id, updatedBy: access.user.id,
    } as never).$returningId() as [{ id: number }]
    await writeChildren(tx, config, access.team.id, id, content, false)
    await writeLinks(tx, access, config, id, content, false)
    await recordRevision(tx, access, config, id, 1, { action: 'create', changedFields: wikiChangedFields(config, null, content), snapshot: content })
    return { id, revision: 1 }
  })
}

/**
 * The one write path for edits and restores. `base` is the revision the client saw (restores may leave it
 * out: then the revision read here is the base, and the UPDATE still refuses if anyone saves in between).
 */
async function writeChange(access: TeamAccess, config: WikiTypeConfig, id: number, options: {
  base: number | undefined
  build: (current: object) => object
  given: object
  action: 'edit' | 'restore'
  restoredFrom?: number
}): Promise<WikiSaveResult> {
  const teamId = access.team.id
  try {
    return await wikiTransaction(async (tx) => {
      const current = (await wikiLoadEntries(tx, config, teamId, [id])).get(id)
      if (!current) throw notFoundEntry(config)
      const base = options.base ?? current.row.revision
      let next = options.build(current.content)
      if (config.finalize) next = config.finalize(next, current.content, options.given)
      const { content, fieldErrors } = await config.check(tx, teamId, id, next, current.content, options.action === 'restore' ? 'restore' : 'write')
      throwIfInvalid(config, fieldErrors)
      const changedFields = wikiChangedFields(config, current.content, content)
      if (!changedFields.length && options.action === 'edit') {
        // Nothing to store; a stale base is still a conflict, so the client learns it is behind.
        if (base !== current.row.revision) throw new WikiConflict()
        return { id, revision: current.row.revision }
      }
      const t = config.table
      const [result] = await tx.update(t).set({ ...config.toRow(content), revision: base + 1, updatedBy: access.user.id } as never)
        .where(and(eq(t.id, id), eq(t.teamId, teamId), eq(t.revision, base), isNull(t.deletedAt)))
      if (result.affectedRows !== 1) throw new WikiConflict()
      await writeChildren(tx, config, teamId, id, content, true)
      await writeLinks(tx, access, config, id, content, true)
      await recordRevision(tx, access, config, id, base + 1, { action: options.action, changedFields, snapshot: content, restoredFrom: options.restoredFrom })
      return { id, revision: base + 1 }
    })
  }
  catch (error) {
    if (!(error instanceof WikiConflict)) throw error
    const current = await presentOne(access, config, id, false)
    throw httpError(409, `Someone saved this ${config.label} while you were editing (it is now at revision ${current.revision}). `
      + 'Your changes were not saved: compare them with the current version and save again.', undefined, { current })
  }
}

export async function wikiUpdateEntry(access: TeamAccess, type: WikiEntryType, id: number, patch: { revision: number } & object): Promise<WikiSaveResult> {
  const { revision, ...given } = patch
  const defined = wikiDefinedOnly(given)
  return await writeChange(access, wikiConfigs[type], id, { base: revision, build: current => ({ ...current, ...defined }), given: defined, action: 'edit' })
}

async function findRevision(access: TeamAccess, config: WikiTypeConfig, id: number, rev: number) {
  const [row] = await useDb().select().from(tables.entryRevisions).where(and(
    eq(tables.entryRevisions.teamId, access.team.id), eq(tables.entryRevisions.entryType, config.type),
    eq(tables.entryRevisions.entryId, id), eq(tables.entryRevisions.revision, rev))).limit(1)
  if (!row) throw notFound(`This ${config.label} has no revision ${rev}.`)
  return row
}

async function assertEntryVisible(access: TeamAccess, config: WikiTypeConfig, id: number, includeDeleted: boolean) {
  const t = config.table
  const conditions: SQL[] = [eq(t.id, id), eq(t.teamId, access.team.id)]
  if (!(includeDeleted && roleAtLeast(access.role, 'editor'))) conditions.push(isNull(t.deletedAt))
  const rows = await useDb().select({ id: t.id }).from(t).where(and(...conditions)).limit(1)
  if (!rows.length) throw notFoundEntry(config)
}

export async function wikiListRevisions(access: TeamAccess, type: WikiEntryType, id: number, includeDeleted: boolean) {
  const config = wikiConfigs[type]
  await assertEntryVisible(access, config, id, includeDeleted)
  const r = tables.entryRevisions
  const rows = await useDb().select({
    revision: r.revision, action: r.action, restoredFrom: r.restoredFrom, changedFields: r.changedFields, createdAt: r.createdAt,
    authorId: r.authorId, authorName: tables.users.name,
  }).from(r).leftJoin(tables.users, eq(tables.users.id, r.authorId))
    .where(and(eq(r.teamId, access.team.id), eq(r.entryType, config.type), eq(r.entryId, id)))
    .orderBy(desc(r.revision))
  return {
    items: rows.map(({ authorId, authorName, ...rest }) => ({ ...rest, author: { id: authorId, name: authorName ?? '' } })),
  }
}

export async function wikiGetRevision(access: TeamAccess, type: WikiEntryType, id: number, rev: number, includeDeleted: boolean) {
  const config = wikiConfigs[type]
  await assertEntryVisible(access, config, id, includeDeleted)
  const row = await findRevision(access, config, id, rev)
  const snapshot = { ...config.empty, ...row.snapshot } as Record<string, unknown>
  const html: Record<string, string> = {}
  for (const field of config.markdownFields) html[`${field}Html`] = renderMarkdown(String(snapshot[field] ?? ''))
  const names = await userNames(useDb(), [row.authorId])
  return {
    revision: row.revision, action: row.action, restoredFrom: row.restoredFrom, changedFields: row.changedFields,
    createdAt: row.createdAt, author: person(names, row.authorId), title: config.titleOf(snapshot), snapshot, html,
  }
}

export async function wikiRestoreRevision(access: TeamAccess, type: WikiEntryType, id: number, rev: number, base: number | undefined): Promise<WikiSaveResult & { restoredFrom: number }> {
  const config = wikiConfigs[type]
  const row = await findRevision(access, config, id, rev)
  // Old snapshots pass today's rules again; fields added since take their empty value.
  const parsed = config.contentSchema.safeParse({ ...config.empty, ...row.snapshot })
  if (!parsed.success) {
    throw httpError(400, `Revision ${rev} no longer passes the ${config.label} rules: ${parsed.error.issues[0]?.message ?? 'invalid'}`)
  }
  const content = parsed.data as object
  const saved = await writeChange(access, config, id, { base, build: () => content, given: content, action: 'restore', restoredFrom: rev })
  return { ...saved, restoredFrom: rev }
}

export async function wikiSoftDelete(access: TeamAccess, type: WikiEntryType, id: number) {
  const config = wikiConfigs[type]
  const t = config.table
  await wikiTransaction(async (tx) => {
    const [result] = await tx.update(t).set({ deletedAt: new Date(), deletedBy: access.user.id } as never)
      .where(and(eq(t.id, id), eq(t.teamId, access.team.id), isNull(t.deletedAt)))
    if (result.affectedRows !== 1) throw notFoundEntry(config)
    await searchTrackChange(tx, access.team.id, config.type, id)
    await recordTeamAudit(access, 'entry.deleted', { targetType: config.type, targetId: id }, tx)
    await wikiPageChanged(tx, access.team.id)
  })
  return { id, deleted: true }
}

export async function wikiUndelete(access: TeamAccess, type: WikiEntryType, id: number) {
  const config = wikiConfigs[type]
  const t = config.table
  await wikiTransaction(async (tx) => {
    const [result] = await tx.update(t).set({ deletedAt: null, deletedBy: null } as never)
      .where(and(eq(t.id, id), eq(t.teamId, access.team.id), isNotNull(t.deletedAt)))
    if (result.affectedRows !== 1) throw notFound(`No ${config.label} with this id in the deleted list.`)
    await searchTrackChange(tx, access.team.id, config.type, id)
    await recordTeamAudit(access, 'entry.restored', { targetType: config.type, targetId: id }, tx)
    await wikiPageChanged(tx, access.team.id)
  })
  return { id, deleted: false }
}

/** Removes an entry for good, with its revisions, notes, links, lookalikes and photos. Owners only (checked by the route). */
export async function wikiPurge(access: TeamAccess, type: WikiEntryType, id: number) {
  const config = wikiConfigs[type]
  const teamId = access.team.id
  const t = config.table
  await wikiTransaction(async (tx) => {
    const [row] = await tx.select({ id: t.id, title: config.titleColumn, deletedAt: t.deletedAt }).from(t).where(and(eq(t.id, id), eq(t.teamId, teamId))).for('update') as { id: number, title: string, deletedAt: Date | null }[]
    if (!row) throw notFoundEntry(config)
    if (!row.deletedAt) throw httpError(409, `Only ${config.label}s in the deleted list can be purged: delete it first.`)
    const blocker = await config.purgeBlocker?.(tx, teamId, id)
    if (blocker) throw httpError(409, blocker)
    const { entryRevisions: r, entryNotes: n, entryLinks: l } = tables
    await tx.delete(r).where(and(eq(r.teamId, teamId), eq(r.entryType, config.type), eq(r.entryId, id)))
    await tx.delete(n).where(and(eq(n.teamId, teamId), eq(n.entryType, config.type), eq(n.entryId, id)))
    await tx.delete(l).where(and(eq(l.teamId, teamId), eq(l.fromType, config.type), eq(l.fromId, id)))
    await tx.delete(l).where(and(eq(l.teamId, teamId), eq(l.toType, config.type), eq(l.toId, id)))
    await config.deleteChildren?.(tx, teamId, id)
    await tx.delete(t).where(and(eq(t.id, id), eq(t.teamId, teamId)))
    await searchTrackChange(tx, teamId, config.type, id)
    // The row is gone for good: the event keeps its title, so the log still says what was removed.
    await recordTeamAudit(access, 'entry.purged', { targetType: config.type, targetId: id, detail: { title: row.title } }, tx)
    await wikiPageChanged(tx, teamId)
  })
  // After the commit: a failed file delete leaves an orphan file, never a photo row without an entry.
  if (config.photoType) await deleteEntryPhotos(teamId, config.photoType, [id])
  return { id, purged: true }
}

/** Recently deleted entries of every type, newest first. */
export async function wikiListDeleted(access: TeamAccess, limit = 100) {
  const db = useDb()
  const perType = await Promise.all(Object.values(wikiConfigs).map(async (config) => {
    const t = config.table
    const rows = await db.select({ id: t.id, title: config.titleColumn, deletedAt: t.deletedAt, deletedBy: t.deletedBy }).from(t)
      .where(and(eq(t.teamId, access.team.id), isNotNull(t.deletedAt))).orderBy(desc(t.deletedAt)).limit(limit) as { id: number, title: string, deletedAt: Date, deletedBy: number | null }[]
    return rows.map(r => ({ type: config.type, ...r }))
  }))
  const rows = perType.flat().sort((a, b) => b.deletedAt.getTime() - a.deletedAt.getTime()).slice(0, limit)
  const names = await userNames(db, rows.flatMap(r => r.deletedBy === null ? [] : [r.deletedBy]))
  return { items: rows.map(r => ({ ...r, deletedBy: person(names, r.deletedBy) })) }
}

/** The editor's link picker: entries whose title (or a mark's inscription, a maker's other name) matches. */
export async function wikiLookup(access: TeamAccess, q: string, types: WikiEntryType[], limit = 20) {
  const db = useDb()
  const prefix = `${wikiLikeEscape(q)}%`
  const found = await Promise.all(types.map(async (type) => {
    const config = wikiConfigs[type]
    const t = config.table
    const where: SQL[] = [eq(t.teamId, access.team.id), isNull(t.deletedAt)]
    if (q) where.push(config.searchCondition(access.team.id, `%${wikiLikeEscape(q)}%`))
    const rows = await db.select().from(t).where(and(...where))
      .orderBy(q ? desc(like(config.titleColumn, prefix)) : desc(t.updatedAt), asc(config.titleColumn)).limit(limit) as (WikiBaseRow & Record<string, unknown>)[]
    const contents = new Map(rows.map(r => [r.id, config.rowToContent(r)]))
    const subtitles = await config.lookupSubtitles(db, access.team.id, contents)
    return rows.map((r) => {
      const title = config.titleOf(contents.get(r.id)!)
      return { type, id: r.id, title, subtitle: subtitles.get(r.id) ?? '', prefix: title.toLowerCase().startsWith(q.toLowerCase()) }
    })
  }))
  return found.flat()
    .sort((a, b) => Number(b.prefix) - Number(a.prefix) || a.title.localeCompare(b.title))
    .slice(0, limit)
    .map(({ prefix: _prefix, ...item }) => item)
}
