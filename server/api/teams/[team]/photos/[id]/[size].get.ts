import { photoSizeParams } from '../../../../../../shared/photos'

// Streams one stored copy (thumb or display) to members of the team. The bytes were re-encoded by the
// server and keep the Content-Type recorded at upload; nosniff and a sandboxing CSP keep a browser from
// ever treating them as anything but an image.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event)
  const { id, size } = validParams(event, photoSizeParams)
  const { object, contentType } = await readPhotoFile(access.team.id, id, size)
  setResponseHeaders(event, {
    'content-type': contentType,
    'x-content-type-options': 'nosniff',
    'content-disposition': 'inline',
    'content-security-policy': 'default-src \'none\'; sandbox',
    // Photo ids never get new bytes: a new upload is a new id.
    'cache-control': 'private, max-age=31536000, immutable',
  })
  if (object.size !== undefined) setResponseHeader(event, 'content-length', object.size)
  if (Buffer.isBuffer(object.body)) return object.body
  return sendStream(event, object.body)
})
