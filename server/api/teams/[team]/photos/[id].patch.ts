import { photoAttachSchema, photoParams } from '../../../../../shared/photos'

// Attach a photo to an entry ({ entityType, entityId }) or detach it (both null).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, photoParams)
  const input = await validBody(event, photoAttachSchema)
  return await attachPhoto(access, id, input)
})
