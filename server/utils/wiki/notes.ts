// The dated timeline under every entry. Contributors add notes; only the author edits a note (it is in
// their words); the author or an editor/owner removes it.
import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import { renderMarkdown } from '../../../shared/markdown'
import { roleAtLeast } from '../../../shared/roles'
import type { NoteCreateInput, NotePatchInput, WikiEntryType } from '../../../shared/schemas/wiki'
import { wikiConfigs } from './registry'
import { searchTrackChange } from '../search/changes'

type NoteRow = typeof tables.entryNotes.$inferSelect

async function assertLiveEntry(access: TeamAccess, type: WikiEntryType, id: number) {
  const config = wikiConfigs[type]
  const t = config.table
  const rows = await useDb().select({ id: t.id }).from(t).where(and(eq(t.id, id), eq(t.teamId, access.team.id), isNull(t.deletedAt))).limit(1)
  if (!rows.length) throw notFound(`No such ${config.label} in this team.`)
}

function presentNote(access: TeamAccess, row: NoteRow, authorName: string) {
  const own = row.authorId === access.user.id
  return {
    id: row.id,
    body: row.body,
    bodyHtml: renderMarkdown(row.body),
    happenedOn: row.happenedOn,
    author: { id: row.authorId, name: authorName },
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    // Hints for the page; the server checks again on every change.
    canEdit: own && roleAtLeast(access.role, 'contributor'),
    canRemove: (own && roleAtLeast(access.role, 'contributor')) || roleAtLeast(access.role, 'editor'),
  }
}

async function findNote(access: TeamAccess, type: WikiEntryType, id: number, noteId: number) {
  const n = tables.entryNotes
  const [found] = await useDb().select({ note: n, authorName: tables.users.name }).from(n)
    .leftJoin(tables.users, eq(tables.users.id, n.authorId))
    .where(and(eq(n.id, noteId), eq(n.teamId, access.team.id), eq(n.entryType, type), eq(n.entryId, id))).limit(1)
  if (!found) throw notFound('No such note on this entry.')
  return { row: found.note, authorName: found.authorName ?? '' }
}

export async function wikiListNotes(access: TeamAccess, type: WikiEntryType, id: number) {
  await assertLiveEntry(access, type, id)
  const n = tables.entryNotes
  const rows = await useDb().select({ note: n, authorName: tables.users.name }).from(n)
    .leftJoin(tables.users, eq(tables.users.id, n.authorId))
    .where(and(eq(n.teamId, access.team.id), eq(n.entryType, type), eq(n.entryId, id)))
    // Newest first by the day it happened (or was written), then by when it was written.
    .orderBy(desc(sql`coalesce(${n.happenedOn}, date(${n.createdAt}))`), desc(n.createdAt), desc(n.id))
  return { items: rows.map(r => presentNote(access, r.note, r.authorName ?? '')) }
}

export async function wikiAddNote(access: TeamAccess, type: WikiEntryType, id: number, input: NoteCreateInput) {
  await assertLiveEntry(access, type, id)
  // Each note change writes its search change-log row in the same transaction.
  const inserted = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(tables.entryNotes).values({
      teamId: access.team.id, entryType: type, entryId: id, authorId: access.user.id, body: input.body, happenedOn: input.happenedOn ?? null,
    }).$returningId()
    await searchTrackChange(tx, access.team.id, 'note', row!.id)
    return row
  })
  return await findAndPresent(access, type, id, inserted!.id)
}

async function findAndPresent(access: TeamAccess, type: WikiEntryType, id: number, noteId: number) {
  const { row, authorName } = await findNote(access, type, id, noteId)
  return presentNote(access, row, authorName)
}

export async function wikiEditNote(access: TeamAccess, type: WikiEntryType, id: number, noteId: number, input: NotePatchInput) {
  await assertLiveEntry(access, type, id)
  const { row } = await findNote(access, type, id, noteId)
  if (row.authorId !== access.user.id) throw forbidden('Only the author of a note can edit it.')
  const patch: Partial<typeof tables.entryNotes.$inferInsert> = {}
  if (input.body !== undefined) patch.body = input.body
  if (input.happenedOn !== undefined) patch.happenedOn = input.happenedOn
  if (Object.keys(patch).length) {
    const n = tables.entryNotes
    // Scoped to the author in the statement too, so the check above cannot be raced.
    await useDb().transaction(async (tx) => {
      await tx.update(n).set(patch).where(and(eq(n.id, noteId), eq(n.teamId, access.team.id), eq(n.authorId, access.user.id)))
      await searchTrackChange(tx, access.team.id, 'note', noteId)
    })
  }
  return await findAndPresent(access, type, id, noteId)
}

export async function wikiRemoveNote(access: TeamAccess, type: WikiEntryType, id: number, noteId: number) {
  await assertLiveEntry(access, type, id)
  const { row } = await findNote(access, type, id, noteId)
  if (row.authorId !== access.user.id && !roleAtLeast(access.role, 'editor')) {
    throw forbidden('Only the author of a note, or an editor or owner, can remove it.')
  }
  const n = tables.entryNotes
  await useDb().transaction(async (tx) => {
    await tx.delete(n).where(and(eq(n.id, noteId), eq(n.teamId, access.team.id)))
    await searchTrackChange(tx, access.team.id, 'note', noteId)
  })
  return { id: noteId, removed: true }
}
