// The search writes thumbnail addresses itself (so its worker bundle leaves out the photo module): they must be
// the addresses the photo routes answer.
import { describe, expect, it } from 'vitest'
import { photoUrls } from '../../server/utils/photos'
import { searchThumbUrl } from '../../server/utils/search/manager'

describe('search thumbnails', () => {
  it('uses the photo module\'s thumbnail address', () => {
    for (const [slug, id] of [['hollowbrook-finds', 12], ['tëam with space', 7]] as const) {
      expect(searchThumbUrl(slug, id)).toBe(photoUrls(slug, id).thumbUrl)
    }
  })
})
