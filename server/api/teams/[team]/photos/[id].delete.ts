import { photoParams } from '../../../../../shared/photos'

// Editors and owners delete any photo; contributors the photos they uploaded.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const { id } = validParams(event, photoParams)
  await deletePhoto(access, id)
  return { ok: true }
})
