import { describe, expect, it } from 'vitest'
import { createEntry, getEntry, MINIMAL_BODY, newWikiTeam, type WikiPath } from '../support/wiki'

describe('wiki revisions and concurrency', async () => {
  const team = await newWikiTeam('Revisions')

  it('stores a revision on create and on every edit, with the changed fields and the author', async () => {
    const id = await createEntry(team.editor, team, 'marks', { inscriptions: ['FIRST'], colour: 'blue', notes: 'Original note.' })
    expect((await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'green' })).body).toEqual({ id, revision: 2 })
    expect((await team.owner.patch(team.api(`/marks/${id}`), { revision: 2, notes: 'Second note.', tags: ['gilt'] })).body).toEqual({ id, revision: 3 })

    const list = await team.viewer.get(team.api(`/marks/${id}/revisions`))
    expect(list.status).toBe(200)
    expect(list.body.items.map((r: { revision: number }) => r.revision)).toEqual([3, 2, 1])
    expect(list.body.items[0]).toMatchObject({ revision: 3, action: 'edit', changedFields: ['notes', 'tags'], author: { name: 'Owner Person' } })
    expect(list.body.items[1]).toMatchObject({ revision: 2, action: 'edit', changedFields: ['colour'], author: { name: 'Editor Person' } })
    expect(list.body.items[2]).toMatchObject({ revision: 1, action: 'create', author: { name: 'Editor Person' } })
    expect(list.body.items[2].changedFields).toEqual(expect.arrayContaining(['title', 'inscriptions', 'colour', 'notes']))
    expect(list.body.items[2].changedFields).not.toContain('tags')

    const first = await team.viewer.get(team.api(`/marks/${id}/revisions/1`))
    expect(first.status).toBe(200)
    expect(first.body).toMatchObject({ revision: 1, action: 'create', title: 'FIRST', author: { name: 'Editor Person' } })
    expect(first.body.snapshot).toMatchObject({ inscriptions: ['FIRST'], colour: 'blue', notes: 'Original note.', tags: [] })
    expect(first.body.html.notesHtml).toBe('<p>Original note.</p>\n')
    expect((await team.viewer.get(team.api(`/marks/${id}/revisions/9`))).status).toBe(404)
  })

  it('restores an old revision as a new revision with the old content, losing nothing', async () => {
    const maker = await createEntry(team.editor, team, 'makers', { name: 'Restorable Maker' })
    const material = await createEntry(team.editor, team, 'materials', { name: 'Restorable Material' })
    const id = await createEntry(team.editor, team, 'marks', {
      inscriptions: ['OLD', 'LINES'], makerId: maker, materialIds: [material], colour: 'blue', yearFrom: 1950, notes: 'First words.',
    })
    await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, inscriptions: ['NEW'], makerId: null, materialIds: [], colour: 'red', yearFrom: 1990, notes: 'Other words.' })

    const restored = await team.editor.post(team.api(`/marks/${id}/revisions/1/restore`), { revision: 2 })
    expect(restored.status, JSON.stringify(restored.body)).toBe(200)
    expect(restored.body).toEqual({ id, revision: 3, restoredFrom: 1 })
    const mark = await getEntry(team.viewer, team, 'marks', id)
    expect(mark).toMatchObject({
      revision: 3, title: 'OLD', inscriptions: ['OLD', 'LINES'], makerId: maker, maker: { id: maker, name: 'Restorable Maker' },
      materialIds: [material], colour: 'blue', yearFrom: 1950, notes: 'First words.',
    })
    const revisions = (await team.viewer.get(team.api(`/marks/${id}/revisions`))).body.items
    expect(revisions.map((r: { revision: number }) => r.revision)).toEqual([3, 2, 1])
    expect(revisions[0]).toMatchObject({ action: 'restore', restoredFrom: 1 })
    expect(revisions[0].changedFields).toEqual(expect.arrayContaining(['title', 'makerId', 'inscriptions', 'colour', 'yearFrom', 'materialIds', 'notes']))
    // The edit that was undone is still there to go back to.
    expect((await team.viewer.get(team.api(`/marks/${id}/revisions/2`))).body.snapshot).toMatchObject({ inscriptions: ['NEW'], colour: 'red' })

    // Without a body revision the current one is the base.
    const again = await team.editor.post(team.api(`/marks/${id}/revisions/2/restore`))
    expect(again.body).toEqual({ id, revision: 4, restoredFrom: 2 })
    expect((await getEntry(team.viewer, team, 'marks', id)).colour).toBe('red')
  })

  it('refuses a restore based on a stale revision with 409 and the current entry', async () => {
    const id = await createEntry(team.editor, team, 'makers', { name: 'Stale Restore' })
    await team.editor.patch(team.api(`/makers/${id}`), { revision: 1, name: 'Stale Restore, renamed' })
    const res = await team.editor.post(team.api(`/makers/${id}/revisions/1/restore`), { revision: 1 })
    expect(res.status).toBe(409)
    expect(res.body.current).toMatchObject({ id, revision: 2, name: 'Stale Restore, renamed' })
    expect((await team.editor.post(team.api(`/makers/${id}/revisions/7/restore`), {})).status).toBe(404)
    expect((await getEntry(team.viewer, team, 'makers', id)).revision).toBe(2)
  })

  it('answers 409 with the full current entry when an edit is based on a stale revision', async () => {
    const id = await createEntry(team.editor, team, 'marks', { inscriptions: ['STALE'], colour: 'blue' })
    expect((await team.owner.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'green' })).status).toBe(200)
    const res = await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'red', notes: 'Mine.' })
    expect(res.status).toBe(409)
    expect(res.body.statusCode).toBe(409)
    expect(res.body.message).toMatch(/revision 2/)
    expect(res.body.current).toMatchObject({ id, revision: 2, colour: 'green', inscriptions: ['STALE'], title: 'STALE', notes: '', backlinks: [], photos: [] })
    expect(res.body.current.notesHtml).toBe('')
    const mark = await getEntry(team.viewer, team, 'marks', id)
    expect(mark).toMatchObject({ revision: 2, colour: 'green', notes: '' })
    expect((await team.viewer.get(team.api(`/marks/${id}/revisions`))).body.items).toHaveLength(2)
    // A revision from the future is just as stale.
    expect((await team.editor.patch(team.api(`/marks/${id}`), { revision: 5, colour: 'red' })).status).toBe(409)
  })

  it('lets exactly one of two concurrent edits with the same revision win', async () => {
    for (let round = 0; round < 5; round++) {
      const id = await createEntry(team.editor, team, 'marks', { inscriptions: [`RACE ${round}`], colour: 'start' })
      const [a, b] = await Promise.all([
        team.editor.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'from editor', inscriptions: ['EDITOR WINS'] }),
        team.owner.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'from owner', inscriptions: ['OWNER WINS'] }),
      ])
      expect([a.status, b.status].sort(), JSON.stringify([a.body, b.body]).slice(0, 500)).toEqual([200, 409])
      const [winner, loser] = a.status === 200 ? [a, b] : [b, a]
      expect(winner.body).toEqual({ id, revision: 2 })
      const expectedColour = winner === a ? 'from editor' : 'from owner'
      expect(loser.body.current).toMatchObject({ revision: 2, colour: expectedColour })
      const mark = await getEntry(team.viewer, team, 'marks', id)
      // The stored entry is the winner's whole edit, never a mix of both.
      expect(mark).toMatchObject({ revision: 2, colour: expectedColour, inscriptions: [winner === a ? 'EDITOR WINS' : 'OWNER WINS'] })
      expect((await team.viewer.get(team.api(`/marks/${id}/revisions`))).body.items).toHaveLength(2)
    }
  })

  it('stores no revision for an edit that changes nothing', async () => {
    const id = await createEntry(team.editor, team, 'categories', { name: 'Unchanged', tags: ['a'] })
    const res = await team.editor.patch(team.api(`/categories/${id}`), { revision: 1, name: 'Unchanged', tags: ['A'] })
    expect(res.body).toEqual({ id, revision: 1 })
    expect((await team.viewer.get(team.api(`/categories/${id}/revisions`))).body.items).toHaveLength(1)
    expect((await team.editor.patch(team.api(`/categories/${id}`), { name: 'No revision sent' })).status).toBe(400)
  })

  const edits: Record<WikiPath, Record<string, unknown>> = {
    marks: { colour: 'brown', position: 'under the foot ring' },
    makers: { country: 'Erland', otherNames: ['Fernwood & Daughters'], yearFrom: 1920, yearFromApprox: true },
    materials: { recognition: 'Rings when tapped.', checks: { sound: 'A clear ring.' }, sources: ['team notes'] },
    categories: { notes: 'Edited notes.' },
  }
  for (const path of Object.keys(edits) as WikiPath[]) {
    it(`runs the same revision engine for ${path}`, async () => {
      const id = await createEntry(team.editor, team, path, { ...MINIMAL_BODY[path] })
      const edited = await team.editor.patch(team.api(`/${path}/${id}`), { revision: 1, ...edits[path] })
      expect(edited.status, JSON.stringify(edited.body)).toBe(200)
      const after = await getEntry(team.viewer, team, path, id)
      expect(after.revision).toBe(2)
      const revisions = (await team.viewer.get(team.api(`/${path}/${id}/revisions`))).body.items
      expect(revisions[0].changedFields.sort()).toEqual(Object.keys(edits[path]!).sort())
      expect((await team.editor.patch(team.api(`/${path}/${id}`), { revision: 1, notes: 'late' })).status).toBe(409)
      const restored = await team.editor.post(team.api(`/${path}/${id}/revisions/1/restore`), { revision: 2 })
      expect(restored.body).toEqual({ id, revision: 3, restoredFrom: 1 })
      const back = await getEntry(team.viewer, team, path, id)
      const first = (await team.viewer.get(team.api(`/${path}/${id}/revisions/1`))).body.snapshot
      for (const key of Object.keys(first)) expect(back[key], key).toEqual(first[key])
    })
  }
})
