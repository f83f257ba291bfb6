// The pure steps of a team import: links between entries follow the new team and the new ids; old revisions
// keep only references the file can resolve.
import { describe, expect, it } from 'vitest'
import { transferEmptyEntryIds, transferPhotoFiles, transferRemapSnapshot, transferRewriteLinks } from '../../server/utils/transfer/format'

const ids = transferEmptyEntryIds()
ids.mark.set(12, 501).set(13, 502)
ids.maker.set(7, 90)
ids.category.set(3, 40)
ids.material.set(5, 60)
const rewrite = (text: string) => transferRewriteLinks(text, 'old-team', 'new-team', ids)

describe('transferRewriteLinks', () => {
  it('points links at the new team and ids, in inline links, bare paths and absolute addresses', () => {
    expect(rewrite('See [this](/t/old-team/marks/12) and [maker](/t/old-team/makers/7/#notes).'))
      .toBe('See [this](/t/new-team/marks/501) and [maker](/t/new-team/makers/90/#notes).')
    expect(rewrite('https://tally.example/t/old-team/categories/3?tab=marks')).toBe('https://tally.example/t/new-team/categories/40?tab=marks')
  })

  it('leaves links to entries the file lacks, other teams, longer ids and longer team names alone', () => {
    const text = '[gone](/t/old-team/marks/99) [other](/t/other-team/marks/12) [longer](/t/old-team-2/marks/12) [id](/t/old-team/marks/123) [seg](/t/old-team/items/12)'
    expect(rewrite(text)).toBe(text)
  })
})

describe('transferRemapSnapshot', () => {
  it('maps a mark\'s references, drops those the file cannot resolve and rewrites its notes', () => {
    const snapshot = {
      title: 'A', makerId: 7, materialIds: [5, 8], categoryIds: [3], notes: 'Like [that](/t/old-team/marks/13).',
      lookalikes: [{ markId: 13, howToTell: 'Unlike [this](/t/old-team/marks/12).' }, { markId: 77, howToTell: 'purged' }],
    }
    expect(transferRemapSnapshot('mark', snapshot, ids, rewrite)).toEqual({
      title: 'A', makerId: 90, materialIds: [60], categoryIds: [40], notes: 'Like [that](/t/new-team/marks/502).',
      lookalikes: [{ markId: 502, howToTell: 'Unlike [this](/t/new-team/marks/501).' }],
    })
    expect(transferRemapSnapshot('mark', { makerId: 8 }, ids, rewrite)).toEqual({ makerId: null })
  })

  it('maps a category\'s parent and keeps fields a snapshot never had absent', () => {
    expect(transferRemapSnapshot('category', { name: 'Jugs', parentId: 3 }, ids, rewrite)).toEqual({ name: 'Jugs', parentId: 40 })
    expect(transferRemapSnapshot('material', { name: 'Glass', recognition: '[x](/t/old-team/marks/12)' }, ids, rewrite))
      .toEqual({ name: 'Glass', recognition: '[x](/t/new-team/marks/501)' })
  })
})

describe('transferPhotoFiles', () => {
  it('names both copies by the photo and its type', () => {
    expect(transferPhotoFiles(4, 'image/webp')).toEqual({ display: 'photos/4/display.webp', thumb: 'photos/4/thumb.webp' })
    expect(transferPhotoFiles(4, 'image/jpeg').thumb).toBe('photos/4/thumb.jpg')
  })
})
