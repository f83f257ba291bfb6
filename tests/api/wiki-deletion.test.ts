import { describe, expect, it } from 'vitest'
import { createEntry, getEntry, MINIMAL_BODY, newWikiTeam, type WikiPath } from '../support/wiki'

describe('wiki soft delete, restore and purge', async () => {
  const team = await newWikiTeam('Deletion')

  it('hides a deleted mark, lists it as deleted and brings it back on restore', async () => {
    const id = await createEntry(team.editor, team, 'marks', { inscriptions: ['SOON GONE'] })
    expect((await team.contributor.delete(team.api(`/marks/${id}`))).status).toBe(403)
    expect((await team.viewer.delete(team.api(`/marks/${id}`))).status).toBe(403)
    const deleted = await team.editor.delete(team.api(`/marks/${id}`))
    expect(deleted.status).toBe(200)
    expect((await team.editor.delete(team.api(`/marks/${id}`))).status).toBe(404)

    expect((await team.viewer.get(team.api(`/marks/${id}`))).status).toBe(404)
    expect((await team.editor.get(team.api(`/marks/${id}`))).status).toBe(404)
    expect((await team.viewer.get(team.api(`/marks/${id}?includeDeleted=1`))).status).toBe(404)
    const seen = await getEntry(team.editor, team, 'marks', id, '?includeDeleted=1')
    expect(seen.deletedBy).toMatchObject({ name: 'Editor Person' })
    expect(new Date(seen.deletedAt).getTime()).toBeGreaterThan(Date.now() - 60_000)
    const list = await team.viewer.get(team.api('/marks?pageSize=100'))
    expect(list.body.items.map((i: { id: number }) => i.id)).not.toContain(id)
    expect((await team.viewer.get(team.api('/entries/lookup?q=SOON'))).body).toEqual([])

    // A deleted entry cannot be edited or noted on.
    expect((await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'x' })).status).toBe(404)
    expect((await team.contributor.post(team.api(`/marks/${id}/notes`), { body: 'late' })).status).toBe(404)
    expect((await team.viewer.get(team.api(`/marks/${id}/revisions`))).status).toBe(404)
    expect((await team.editor.get(team.api(`/marks/${id}/revisions?includeDeleted=1`))).status).toBe(200)

    const deletedList = await team.editor.get(team.api('/deleted'))
    expect(deletedList.status).toBe(200)
    expect(deletedList.body.items[0]).toMatchObject({ type: 'mark', id, title: 'SOON GONE', deletedBy: { name: 'Editor Person' } })
    expect((await team.viewer.get(team.api('/deleted'))).status).toBe(403)
    expect((await team.contributor.get(team.api('/deleted'))).status).toBe(403)

    expect((await team.contributor.post(team.api(`/marks/${id}/restore`))).status).toBe(403)
    const restored = await team.editor.post(team.api(`/marks/${id}/restore`))
    expect(restored.status).toBe(200)
    expect((await getEntry(team.viewer, team, 'marks', id))).toMatchObject({ id, revision: 1, deletedAt: null, title: 'SOON GONE' })
    expect((await team.editor.get(team.api('/deleted'))).body.items.map((i: { id: number }) => i.id)).not.toContain(id)
    expect((await team.editor.post(team.api(`/marks/${id}/restore`))).status).toBe(404)
  })

  it('lists deleted entries of all four types, newest first', async () => {
    const made: [WikiPath, number][] = []
    for (const path of ['categories', 'materials', 'makers', 'marks'] as WikiPath[]) {
      const id = await createEntry(team.editor, team, path, MINIMAL_BODY[path])
      expect((await team.editor.delete(team.api(`/${path}/${id}`))).status).toBe(200)
      made.push([path, id])
    }
    const items = (await team.owner.get(team.api('/deleted'))).body.items as { type: string, id: number, title: string }[]
    expect(items.slice(0, 4).map(i => [i.type, i.id])).toEqual([
      ['mark', made[3]![1]], ['maker', made[2]![1]], ['material', made[1]![1]], ['category', made[0]![1]],
    ])
    expect(items.slice(0, 4).map(i => i.title)).toEqual(['FERNWOOD POTTERY', 'Fernwood Pottery', 'Pressed glass', 'Kitchenware'])
  })

  it('purges for good: owners only, and only from the deleted list', async () => {
    const partner = await createEntry(team.editor, team, 'marks', { inscriptions: ['PARTNER'] })
    const linker = await createEntry(team.editor, team, 'makers', { name: 'Linker' })
    const id = await createEntry(team.editor, team, 'marks', {
      inscriptions: ['PURGE ME'], lookalikes: [{ markId: partner, howToTell: 'Different crown.' }],
      notes: `Made by [the linker](/t/${team.slug}/makers/${linker}).`,
    })
    await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, colour: 'blue' })
    expect((await team.contributor.post(team.api(`/marks/${id}/notes`), { body: 'Seen at the market.' })).status).toBe(201)
    expect((await getEntry(team.viewer, team, 'makers', linker)).backlinks).toEqual([{ type: 'mark', id, title: 'PURGE ME' }])

    const notYet = await team.owner.delete(team.api(`/marks/${id}?purge=1`))
    expect(notYet.status).toBe(409)
    expect(notYet.body.message).toMatch(/deleted list/)
    expect((await team.editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
    expect((await team.editor.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(403)
    expect((await team.contributor.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(403)
    expect((await team.viewer.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(403)
    expect((await team.owner.delete(team.api(`/marks/${id}?purge=yes`))).status).toBe(400)

    const purged = await team.owner.delete(team.api(`/marks/${id}?purge=1`))
    expect(purged.status).toBe(200)
    expect(purged.body).toEqual({ id, purged: true })
    expect((await team.editor.get(team.api(`/marks/${id}?includeDeleted=1`))).status).toBe(404)
    expect((await team.editor.get(team.api(`/marks/${id}/revisions?includeDeleted=1`))).status).toBe(404)
    expect((await team.editor.get(team.api(`/marks/${id}/revisions/1?includeDeleted=1`))).status).toBe(404)
    expect((await team.editor.post(team.api(`/marks/${id}/restore`))).status).toBe(404)
    expect((await team.editor.get(team.api('/deleted'))).body.items.map((i: { id: number }) => i.id)).not.toContain(id)
    expect((await team.owner.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(404)
    // Its lookalike pair and its outgoing links went with it.
    expect((await getEntry(team.viewer, team, 'marks', partner)).lookalikes).toEqual([])
    expect((await getEntry(team.viewer, team, 'makers', linker)).backlinks).toEqual([])
  })

  it('refuses to purge an entry other entries still point at', async () => {
    const maker = await createEntry(team.editor, team, 'makers', { name: 'Still Used' })
    const material = await createEntry(team.editor, team, 'materials', { name: 'Still Used Material' })
    const parent = await createEntry(team.editor, team, 'categories', { name: 'Still Used Parent' })
    const child = await createEntry(team.editor, team, 'categories', { name: 'Child', parentId: parent })
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['USER'], makerId: maker, materialIds: [material] })
    for (const [path, id] of [['makers', maker], ['materials', material], ['categories', parent]] as const) {
      expect((await team.editor.delete(team.api(`/${path}/${id}`))).status).toBe(200)
      const refused = await team.owner.delete(team.api(`/${path}/${id}?purge=1`))
      expect(refused.status, path).toBe(409)
      expect(refused.body.message).toMatch(/still/)
    }
    // Once nothing points at them, they go.
    expect((await team.editor.delete(team.api(`/marks/${mark}`))).status).toBe(200)
    expect((await team.owner.delete(team.api(`/marks/${mark}?purge=1`))).status).toBe(200)
    expect((await team.owner.delete(team.api(`/makers/${maker}?purge=1`))).status).toBe(200)
    expect((await team.owner.delete(team.api(`/materials/${material}?purge=1`))).status).toBe(200)
    expect((await team.editor.delete(team.api(`/categories/${child}`))).status).toBe(200)
    expect((await team.owner.delete(team.api(`/categories/${child}?purge=1`))).status).toBe(200)
    expect((await team.owner.delete(team.api(`/categories/${parent}?purge=1`))).status).toBe(200)
  })

  it('keeps references to a soft-deleted entry, so restoring it loses nothing', async () => {
    const maker = await createEntry(team.editor, team, 'makers', { name: 'Comes Back' })
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['KEEPS MAKER'], makerId: maker })
    expect((await team.editor.delete(team.api(`/makers/${maker}`))).status).toBe(200)
    // Editing another field of the mark keeps the (deleted) maker.
    expect((await team.editor.patch(team.api(`/marks/${mark}`), { revision: 1, colour: 'grey' })).status).toBe(200)
    expect((await team.editor.post(team.api(`/makers/${maker}/restore`))).status).toBe(200)
    expect(await getEntry(team.viewer, team, 'marks', mark)).toMatchObject({ makerId: maker, maker: { id: maker, name: 'Comes Back' }, colour: 'grey' })
  })
})
