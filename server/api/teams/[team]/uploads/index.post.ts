// Upload a photo (multipart, field "file"; optional entityType and entityId to attach at once).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const form = await readPhotoUploadForm(event)
  const photo = await uploadPhoto(access, form)
  setResponseStatus(event, 201)
  return photo
})
