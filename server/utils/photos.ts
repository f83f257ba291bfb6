// Photos of reference entries: upload (checked and re-encoded in images.ts), attach, list, serve, delete.
// Imports are explicit (not Nitro's auto-imports) so tests can call listEntryPhotos outside the server.
import { getRequestHeader, type H3Event } from 'h3'
import { and, asc, eq, getTableColumns, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import { MySqlTable, type MySqlColumn } from 'drizzle-orm/mysql-core'
import { randomBytes } from 'node:crypto'
import { roleAtLeast } from '../../shared/roles'
import {
  PHOTO_MAX_BYTES, PHOTO_TOO_LARGE, photoUploadFieldsSchema,
  type EntryPhoto, type PhotoAttachInput, type PhotoEntityType, type PhotoSize,
} from '../../shared/photos'
import { PhotoImageError, processPhotoImage, type EncodedImage } from './images'
import { useStorageDriver, type StorageDriver, type StoredObject } from './storage'
import { tables, useDb, type DbOrTx } from './db'
import { forbidden, httpError, notFound, zodFieldErrors } from './http-errors'
import type { TeamAccess } from './guard'
import { recordTeamAudit } from './audit'
import { wikiPageChanged } from './wiki/versions'

export type PhotoRow = typeof tables.photos.$inferSelect

/** A mark's or maker's photos are part of its page: the wiki's page cache must hear of their changes (wiki/versions.ts). */
const onWikiPage = (type: PhotoEntityType | undefined) => type === 'mark' || type === 'maker'

const ENTITY_LABEL: Record<PhotoEntityType, string> = { mark: 'mark', maker: 'maker', item: 'sale item' }
// Export names in server/database/schema looked up at run time, so photos work for each entry type as soon
// as its table exists (marks and makers come with the wiki, sale items later) without importing it here.
const ENTITY_TABLES: Record<PhotoEntityType, string[]> = { mark: ['marks'], maker: ['makers'], item: ['items', 'saleItems'] }
// Form overhead allowed on top of the file itself (boundaries, part headers, the two small text fields).
const FORM_OVERHEAD_BYTES = 64 * 1024

export function photoUrls(teamSlug: string, photoId: number): { thumbUrl: string, displayUrl: string } {
  const base = `/api/teams/${encodeURIComponent(teamSlug)}/photos/${photoId}`
  return { thumbUrl: `${base}/thumb`, displayUrl: `${base}/display` }
}

export function entryPhoto(teamSlug: string, row: Pick<PhotoRow, 'id' | 'width' | 'height'>): EntryPhoto {
  return { id: row.id, width: row.width, height: row.height, ...photoUrls(teamSlug, row.id) }
}

async function teamRef(team: number | { id: number, slug: string }): Promise<{ id: number, slug: string }> {
  if (typeof team !== 'number') return team
  const [row] = await useDb().select({ id: tables.teams.id, slug: tables.teams.slug }).from(tables.teams).where(eq(tables.teams.id, team)).limit(1)
  if (!row) throw notFound('Team not found.')
  return row
}

/**
 * The photos of several entries of one type, in gallery order: a Map with an array (maybe empty) for
 * every id asked for. Pass `access.team` (id and slug) to save the slug lookup a bare team id costs.
 */
export async function listEntryPhotos(team: number | { id: number, slug: string }, entityType: PhotoEntityType, entityIds: readonly number[]): Promise<Map<number, EntryPhoto[]>> {
  const result = new Map<number, EntryPhoto[]>(entityIds.map(id => [id, []]))
  if (!entityIds.length) return result
  const { id: teamId, slug } = await teamRef(team)
  const rows = await useDb().select({ id: tables.photos.id, entityId: tables.photos.entityId, width: tables.photos.width, height: tables.photos.height })
    .from(tables.photos)
    .where(and(eq(tables.photos.teamId, teamId), eq(tables.photos.entityType, entityType), inArray(tables.photos.entityId, [...new Set(entityIds)])))
    .orderBy(asc(tables.photos.entityId), asc(tables.photos.position), asc(tables.photos.id))
  for (const row of rows) result.get(row.entityId!)?.push(entryPhoto(slug, row))
  return result
}

export async function findTeamPhoto(teamId: number, photoId: number, db: DbOrTx = useDb()): Promise<PhotoRow | undefined> {
  const [row] = await db.select().from(tables.photos).where(and(eq(tables.photos.teamId, teamId), eq(tables.photos.id, photoId))).limit(1)
  return row
}

/** True when an entry of this type with this id exists in the team (and is not soft-deleted). */
export async function photoEntityExists(teamId: number, entityType: PhotoEntityType, entityId: number, db: DbOrTx = useDb()): Promise<boolean> {
  const registry = tables as unknown as Record<string, unknown>
  const table = ENTITY_TABLES[entityType].map(name => registry[name]).find(t => t instanceof MySqlTable) as MySqlTable | undefined
  if (!table) return false
  const columns = getTableColumns(table) as Record<string, MySqlColumn>
  if (!columns.id || !columns.teamId) return false
  const conditions: SQL[] = [eq(columns.id, entityId), eq(columns.teamId, teamId)]
  if (columns.deletedAt) conditions.push(isNull(columns.deletedAt))
  const rows = await db.select({ id: columns.id }).from(table).where(and(...conditions)).limit(1)
  return rows.length > 0
}

/** Role and existence rules for attaching to an entry: marks and makers need editor+, the entry must be in the team. */
async function assertCanAttach(access: TeamAccess, entityType: PhotoEntityType, entityId: number, db: DbOrTx = useDb()) {
  if (entityType !== 'item' && !roleAtLeast(access.role, 'editor')) {
    throw forbidden(`Attaching photos to a ${ENTITY_LABEL[entityType]} needs the editor role or higher; you are ${access.role === 'owner' ? 'an' : 'a'} ${access.role} in ${access.team.name}.`)
  }
  if (!(await photoEntityExists(access.team.id, entityType, entityId, db))) {
    throw notFound(`No such ${ENTITY_LABEL[entityType]} in this team.`)
  }
}

async function nextPosition(db: DbOrTx, teamId: number, entityType: PhotoEntityType, entityId: number): Promise<number> {
  const [row] = await db.select({ max: sql<number | null>`max(${tables.photos.position})` }).from(tables.photos)
    .where(and(eq(tables.photos.teamId, teamId), eq(tables.photos.entityType, entityType), eq(tables.photos.entityId, entityId)))
  return row?.max == null ? 0 : Number(row.max) + 1
}

export interface PhotoUploadForm {
  file: Buffer
  entityType?: PhotoEntityType
  entityId?: number
}

/**
 * Reads a multipart upload without ever holding more than 15 MB plus form overhead in memory:
 * a declared or actual body over that is a 413 before parsing.
 */
export async function readPhotoUploadForm(event: H3Event): Promise<PhotoUploadForm> {
  const contentType = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data\s*;/i.test(contentType)) {
    throw httpError(415, 'Send the photo as multipart/form-data, in a field named "file".')
  }
  const limit = PHOTO_MAX_BYTES + FORM_OVERHEAD_BYTES
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > limit) throw httpError(413, PHOTO_TOO_LARGE)
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of event.node.req as AsyncIterable<Buffer>) {
    total += chunk.length
    if (total > limit) throw httpError(413, PHOTO_TOO_LARGE)
    chunks.push(chunk)
  }
  let form: FormData
  try {
    form = await new Response(Buffer.concat(chunks), { headers: { 'content-type': contentType } }).formData()
  }
  catch {
    throw httpError(400, 'The upload could not be read as multipart form data.')
  }
  const file = form.get('file')
  if (!file || typeof file === 'string') throw httpError(400, 'Choose a photo to upload (form field "file").', { file: ['Choose a photo.'] })
  if (file.size > PHOTO_MAX_BYTES) throw httpError(413, PHOTO_TOO_LARGE, { file: [PHOTO_TOO_LARGE] })
  const fields: Record<string, string> = {}
  for (const name of ['entityType', 'entityId']) {
    const value = form.get(name)
    if (typeof value === 'string' && value !== '') fields[name] = value
  }
  const parsed = photoUploadFieldsSchema.safeParse(fields)
  if (!parsed.success) {
    const fieldErrors = zodFieldErrors(parsed.error)
    throw httpError(400, `Please check the form: ${Object.values(fieldErrors)[0]?.[0] ?? 'invalid fields'}`, fieldErrors)
  }
  return { file: Buffer.from(await file.arrayBuffer()), ...parsed.data }
}

function newPhotoKeys(teamId: number): { display: string, thumb: string } {
  const folder = `teams/${teamId}/photos/${randomBytes(16).toString('hex')}`
  return { display: `${folder}/display.webp`, thumb: `${folder}/thumb.webp` }
}

async function removeObjects(keys: string[], storage: StorageDriver = useStorageDriver()) {
  for (const key of keys) {
    await storage.delete(key).catch((error: unknown) => console.error('[photos] could not delete stored object', key, error))
  }
}

export interface StorePhotoInput {
  teamId: number
  uploadedBy: number
  bytes: Buffer
  entityType?: PhotoEntityType
  entityId?: number
}

/**
 * Checks, re-encodes and stores image bytes as a photo of a team, without any role or entry checks:
 * the building block of uploads, and what the demo seed calls with its own connection and driver.
 * Throws PhotoImageError for bytes that are not an acceptable image.
 */
export async function storePhoto(input: StorePhotoInput, db: DbOrTx = useDb(), storage: StorageDriver = useStorageDriver()): Promise<{ id: number, width: number, height: number }> {
  const processed = await processPhotoImage(input.bytes)
  const keys = newPhotoKeys(input.teamId)
  const copies: [string, EncodedImage][] = [[keys.display, processed.display], [keys.thumb, processed.thumb]]
  const written: string[] = []
  try {
    for (const [key, copy] of copies) {
      await storage.put(key, copy.bytes, copy.contentType)
      written.push(key)
    }
    const id = await db.transaction(async (tx) => {
      const attach = input.entityType && input.entityId
        ? { entityType: input.entityType, entityId: input.entityId, position: await nextPosition(tx, input.teamId, input.entityType, input.entityId) }
        : {}
      const [row] = await tx.insert(tables.photos).values({
        teamId: input.teamId,
        ...attach,
        displayKey: keys.display,
        thumbKey: keys.thumb,
        contentType: processed.display.contentType,
        width: processed.display.width,
        height: processed.display.height,
        thumbWidth: processed.thumb.width,
        thumbHeight: processed.thumb.height,
        bytes: processed.display.bytes.length + processed.thumb.bytes.length,
        originalBytes: input.bytes.length,
        uploadedBy: input.uploadedBy,
      }).$returningId()
      if (input.entityId && onWikiPage(input.entityType)) await wikiPageChanged(tx, input.teamId)
      return row!.id
    })
    return { id, width: processed.display.width, height: processed.display.height }
  }
  catch (error) {
    await removeObjects(written, storage)
    throw error
  }
}

/** An upload through the API: role and entry checks, then storePhoto; refused files become 400/413/415. */
export async function uploadPhoto(access: TeamAccess, form: PhotoUploadForm): Promise<EntryPhoto> {
  if (form.entityType && form.entityId) await assertCanAttach(access, form.entityType, form.entityId)
  try {
    const photo = await storePhoto({ teamId: access.team.id, uploadedBy: access.user.id, bytes: form.file, entityType: form.entityType, entityId: form.entityId })
    await recordTeamAudit(access, 'photo.uploaded', {
      targetType: 'photo', targetId: photo.id, detail: { entityType: form.entityType ?? null, entityId: form.entityId ?? null, bytes: form.file.length },
    })
    return entryPhoto(access.team.slug, photo)
  }
  catch (error) {
    if (error instanceof PhotoImageError) throw httpError(error.statusCode, error.message, { file: [error.message] })
    throw error
  }
}

/** Editors and owners may change any photo; a contributor only the photos they uploaded. */
function assertCanChangePhoto(access: TeamAccess, photo: PhotoRow) {
  if (roleAtLeast(access.role, 'editor') || photo.uploadedBy === access.user.id) return
  throw forbidden('Only editors, owners and the person who uploaded a photo can change or delete it.')
}

/** Attaches a photo to an entry (placed last in its gallery) or detaches it (both null). */
export async function attachPhoto(access: TeamAccess, photoId: number, input: PhotoAttachInput): Promise<EntryPhoto & { entityType: PhotoEntityType | null, entityId: number | null }> {
  return await useDb().transaction(async (tx) => {
    const photo = await findTeamPhoto(access.team.id, photoId, tx)
    if (!photo) throw notFound('No such photo in this team.')
    assertCanChangePhoto(access, photo)
    // Taking a photo away from a mark or maker changes that entry too: editor+ as for attaching.
    if (photo.entityType && photo.entityType !== 'item' && !roleAtLeast(access.role, 'editor')
      && (photo.entityType !== input.entityType || photo.entityId !== input.entityId)) {
      throw forbidden(`Only editors and owners can take a photo away from a ${ENTITY_LABEL[photo.entityType]}.`)
    }
    if (input.entityType === null) {
      await tx.update(tables.photos).set({ entityType: null, entityId: null, position: 0 }).where(eq(tables.photos.id, photo.id))
    }
    else if (photo.entityType !== input.entityType || photo.entityId !== input.entityId) {
      await assertCanAttach(access, input.entityType, input.entityId, tx)
      const position = await nextPosition(tx, access.team.id, input.entityType, input.entityId)
      await tx.update(tables.photos).set({ entityType: input.entityType, entityId: input.entityId, position }).where(eq(tables.photos.id, photo.id))
    }
    // Whatever the types: the photo was read without a lock, and may have been moved to an entry since.
    await wikiPageChanged(tx, access.team.id)
    return { ...entryPhoto(access.team.slug, photo), entityType: input.entityType, entityId: input.entityId }
  })
}

export async function deletePhoto(access: TeamAccess, photoId: number): Promise<void> {
  const photo = await findTeamPhoto(access.team.id, photoId)
  if (!photo) throw notFound('No such photo in this team.')
  assertCanChangePhoto(access, photo)
  await useDb().transaction(async (tx) => {
    await tx.delete(tables.photos).where(and(eq(tables.photos.id, photo.id), eq(tables.photos.teamId, access.team.id)))
    await recordTeamAudit(access, 'photo.deleted', { targetType: 'photo', targetId: photo.id, detail: { entityType: photo.entityType, entityId: photo.entityId } }, tx)
    // Whatever its type: it was read before this transaction, and may have been moved to an entry since.
    await wikiPageChanged(tx, access.team.id)
  })
  // The row is gone first: a failed object delete leaves an unreachable file, never a broken photo.
  await removeObjects([photo.displayKey, photo.thumbKey])
}

/** Deletes every photo of some entries (for the wiki, when entries are deleted for good). */
export async function deleteEntryPhotos(teamId: number, entityType: PhotoEntityType, entityIds: readonly number[]): Promise<number> {
  if (!entityIds.length) return 0
  const where = and(eq(tables.photos.teamId, teamId), eq(tables.photos.entityType, entityType), inArray(tables.photos.entityId, [...entityIds]))
  const rows = await useDb().select({ displayKey: tables.photos.displayKey, thumbKey: tables.photos.thumbKey }).from(tables.photos).where(where)
  if (!rows.length) return 0
  await useDb().delete(tables.photos).where(where)
  await removeObjects(rows.flatMap(r => [r.displayKey, r.thumbKey]))
  return rows.length
}

/** The stored bytes of one size of a team's photo, with the Content-Type recorded at upload. */
export async function readPhotoFile(teamId: number, photoId: number, size: PhotoSize): Promise<{ object: StoredObject, contentType: string }> {
  const photo = await findTeamPhoto(teamId, photoId)
  if (!photo) throw notFound('No such photo in this team.')
  const object = await useStorageDriver().get(size === 'thumb' ? photo.thumbKey : photo.displayKey)
  if (!object) {
    console.error('[photos] stored object missing', photo.id, size)
    throw notFound('This photo\'s file is missing from storage.')
  }
  return { object, contentType: photo.contentType }
}
