// Photo limits and schemas shared by the upload form and the server, so both show the same words.
import { z } from 'zod'
import { idParam, teamSlug } from './schemas/common'

export const PHOTO_ENTITY_TYPES = ['mark', 'maker', 'item'] as const
export type PhotoEntityType = typeof PHOTO_ENTITY_TYPES[number]

export const PHOTO_SIZES = ['thumb', 'display'] as const
export type PhotoSize = typeof PHOTO_SIZES[number]

export const PHOTO_MAX_BYTES = 15 * 1024 * 1024
export const PHOTO_MAX_MEGAPIXELS = 100
export const PHOTO_DISPLAY_MAX_PX = 1600
export const PHOTO_THUMB_MAX_PX = 320
export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp'

export const PHOTO_NOT_AN_IMAGE = 'This file is not a JPEG, PNG or WebP image.'
export const PHOTO_TOO_LARGE = 'This file is larger than 15 MB. Photos can be up to 15 MB: export a smaller copy and try again.'

export interface EntryPhoto {
  id: number
  width: number
  height: number
  thumbUrl: string
  displayUrl: string
}

const entityType = z.enum(PHOTO_ENTITY_TYPES, { message: `entityType must be one of: ${PHOTO_ENTITY_TYPES.join(', ')}.` })

/** Attach to an entry ({ entityType, entityId }) or detach ({ entityType: null, entityId: null }). */
export const photoAttachSchema = z.union([
  z.object({ entityType, entityId: idParam }),
  z.object({ entityType: z.null(), entityId: z.null() }),
], { message: 'Send { entityType, entityId } to attach, or both null to detach.' })

/** The optional text fields of an upload, as they arrive in multipart form data (strings or missing). */
export const photoUploadFieldsSchema = z.object({
  entityType: entityType.optional(),
  entityId: idParam.optional(),
}).refine(v => (v.entityType === undefined) === (v.entityId === undefined), {
  message: 'Send entityType and entityId together, or neither.',
  path: ['entityId'],
})

export const photoParams = z.object({ team: teamSlug, id: idParam })
export const photoSizeParams = z.object({ team: teamSlug, id: idParam, size: z.enum(PHOTO_SIZES) })

export type PhotoAttachInput = z.infer<typeof photoAttachSchema>
