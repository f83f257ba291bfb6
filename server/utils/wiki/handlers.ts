// Route handlers for the four entry types, so each route file is one line naming its type.
// Each one: guard first (401/404/403 before anything is read), then validate, then one domain call.
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import {
  noteCreateSchema, notePatchSchema, wikiDeleteQuery, wikiEntryParams, wikiNoteParams, wikiReadQuery,
  wikiRestoreSchema, wikiRevisionParams,
} from '../../../shared/schemas/wiki'
import { wikiConfigs } from './registry'

export const defineWikiListHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, wikiConfigs[type].listQuery)
  return await wikiListEntries(access, type, query)
})

export const defineWikiCreateHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const input = await validBody(event, wikiConfigs[type].createSchema)
  const saved = await wikiCreateEntry(access, type, input)
  setResponseStatus(event, 201)
  return saved
})

export const defineWikiGetHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, wikiEntryParams)
  const { includeDeleted } = validQuery(event, wikiReadQuery)
  return await wikiGetEntry(access, type, id, includeDeleted)
})

export const defineWikiPatchHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const { id } = validParams(event, wikiEntryParams)
  const patch = await validBody(event, wikiConfigs[type].patchSchema)
  return await wikiUpdateEntry(access, type, id, patch)
})

export const defineWikiDeleteHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  let access = await requireMember(event, 'editor')
  const { purge } = validQuery(event, wikiDeleteQuery)
  // Deleting is for editors; purging for good is for owners only.
  if (purge) access = await requireMember(event, 'owner')
  const { id } = validParams(event, wikiEntryParams)
  return purge ? await wikiPurge(access, type, id) : await wikiSoftDelete(access, type, id)
})

export const defineWikiUndeleteHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const { id } = validParams(event, wikiEntryParams)
  return await wikiUndelete(access, type, id)
})

export const defineWikiRevisionsHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, wikiEntryParams)
  const { includeDeleted } = validQuery(event, wikiReadQuery)
  return await wikiListRevisions(access, type, id, includeDeleted)
})

export const defineWikiRevisionHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id, rev } = validParams(event, wikiRevisionParams)
  const { includeDeleted } = validQuery(event, wikiReadQuery)
  return await wikiGetRevision(access, type, id, rev, includeDeleted)
})

export const defineWikiRestoreRevisionHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'editor')
  const { id, rev } = validParams(event, wikiRevisionParams)
  const { revision } = await validBody(event, wikiRestoreSchema)
  return await wikiRestoreRevision(access, type, id, rev, revision)
})

export const defineWikiNotesListHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { id } = validParams(event, wikiEntryParams)
  return await wikiListNotes(access, type, id)
})

export const defineWikiNoteCreateHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, wikiEntryParams)
  const input = await validBody(event, noteCreateSchema)
  // Sent again from the phone's queue with the same Idempotency-Key, the note is not added twice.
  return await idempotentCall(event, access, input, () => wikiAddNote(access, type, id, input), { status: 201 })
})

export const defineWikiNotePatchHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id, noteId } = validParams(event, wikiNoteParams)
  const input = await validBody(event, notePatchSchema)
  return await wikiEditNote(access, type, id, noteId, input)
})

export const defineWikiNoteDeleteHandler = (type: WikiEntryType) => defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id, noteId } = validParams(event, wikiNoteParams)
  return await wikiRemoveNote(access, type, id, noteId)
})
