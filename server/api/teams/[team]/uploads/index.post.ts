// Upload a photo (multipart, field "file"; optional entityType and entityId to attach at once). With an
// Idempotency-Key, the same file and fields sent again answer the first photo (a multipart body differs at
// each send by its boundary, so the request is identified by the file's bytes and the fields).
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const form = await readPhotoUploadForm(event)
  return await idempotentCall(event, access, form, () => uploadPhoto(access, form), { status: 201 })
})
