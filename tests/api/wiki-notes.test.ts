import { describe, expect, it } from 'vitest'
import { createEntry, newWikiTeam } from '../support/wiki'

describe('wiki notes timeline', async () => {
  const team = await newWikiTeam('Notes')
  const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['TIMELINE'] })
  const notes = (path = `/marks/${mark}/notes`) => team.api(path)

  it('lets contributors and above add dated notes, but not viewers', async () => {
    const refused = await team.viewer.post(notes(), { body: 'I saw one.' })
    expect(refused.status).toBe(403)
    const added = await team.contributor.post(notes(), { body: 'Sold one for **$18**.', happenedOn: '2026-03-01' })
    expect(added.status, JSON.stringify(added.body)).toBe(201)
    expect(added.body).toMatchObject({
      body: 'Sold one for **$18**.', bodyHtml: '<p>Sold one for <strong>$18</strong>.</p>\n', happenedOn: '2026-03-01',
      author: { name: 'Contributor Person' }, canEdit: true, canRemove: true,
    })
    for (const person of [team.editor, team.owner]) expect((await person.post(notes(), { body: 'Also seen.' })).status).toBe(201)
    expect((await team.viewer.get(notes())).body.items.length).toBe(3)
  })

  it('lists notes newest first by the day they happened', async () => {
    const maker = await createEntry(team.editor, team, 'makers', { name: 'Timeline Maker' })
    const path = `/makers/${maker}/notes`
    await team.contributor.post(notes(path), { body: 'January', happenedOn: '2026-01-05' })
    await team.contributor.post(notes(path), { body: 'Today' })
    await team.contributor.post(notes(path), { body: 'March', happenedOn: '2026-03-01' })
    await team.contributor.post(notes(path), { body: 'Long ago', happenedOn: '1999-12-31' })
    const list = await team.viewer.get(notes(path))
    expect(list.status).toBe(200)
    expect(list.body.items.map((n: { body: string }) => n.body)).toEqual(['Today', 'March', 'January', 'Long ago'])
    expect(list.body.items[0].happenedOn).toBeNull()
    // The viewer sees the notes but may change none of them.
    expect(list.body.items.every((n: { canEdit: boolean, canRemove: boolean }) => !n.canEdit && !n.canRemove)).toBe(true)
  })

  it('lets only the author edit a note', async () => {
    const own = (await team.contributor.post(notes(), { body: 'Draft' })).body.id
    const owners = (await team.owner.post(notes(), { body: 'Owner wrote this' })).body.id
    const edited = await team.contributor.patch(notes(`/marks/${mark}/notes/${own}`), { body: 'Final wording', happenedOn: '2026-02-02' })
    expect(edited.status).toBe(200)
    expect(edited.body).toMatchObject({ id: own, body: 'Final wording', happenedOn: '2026-02-02' })
    const cleared = await team.contributor.patch(notes(`/marks/${mark}/notes/${own}`), { happenedOn: null })
    expect(cleared.body).toMatchObject({ body: 'Final wording', happenedOn: null })

    expect((await team.contributor.patch(notes(`/marks/${mark}/notes/${owners}`), { body: 'Changed by someone else' })).status).toBe(403)
    expect((await team.editor.patch(notes(`/marks/${mark}/notes/${own}`), { body: 'Editor rewrite' })).status).toBe(403)
    expect((await team.owner.patch(notes(`/marks/${mark}/notes/${own}`), { body: 'Owner rewrite' })).status).toBe(403)
    expect((await team.viewer.patch(notes(`/marks/${mark}/notes/${own}`), { body: 'Viewer rewrite' })).status).toBe(403)
    const after = (await team.viewer.get(notes())).body.items as { id: number, body: string }[]
    expect(after.find(n => n.id === own)!.body).toBe('Final wording')
    expect(after.find(n => n.id === owners)!.body).toBe('Owner wrote this')
  })

  it('lets the author, or an editor or owner, remove a note', async () => {
    const byContributor = (await team.contributor.post(notes(), { body: 'Remove me (editor)' })).body.id
    const second = (await team.contributor.post(notes(), { body: 'Remove me (myself)' })).body.id
    const byOwner = (await team.owner.post(notes(), { body: 'Owner note' })).body.id
    expect((await team.contributor.delete(notes(`/marks/${mark}/notes/${byOwner}`))).status).toBe(403)
    expect((await team.viewer.delete(notes(`/marks/${mark}/notes/${second}`))).status).toBe(403)
    expect((await team.editor.delete(notes(`/marks/${mark}/notes/${byContributor}`))).status).toBe(200)
    expect((await team.contributor.delete(notes(`/marks/${mark}/notes/${second}`))).status).toBe(200)
    expect((await team.contributor.delete(notes(`/marks/${mark}/notes/${second}`))).status).toBe(404)
    const ids = ((await team.viewer.get(notes())).body.items as { id: number }[]).map(n => n.id)
    expect(ids).not.toContain(byContributor)
    expect(ids).not.toContain(second)
    expect(ids).toContain(byOwner)
  })

  it('checks note input and keeps note markdown inert', async () => {
    expect((await team.contributor.post(notes(), { body: '   ' })).status).toBe(400)
    expect((await team.contributor.post(notes(), { body: 'x'.repeat(50_001) })).status).toBe(400)
    const badDate = await team.contributor.post(notes(), { body: 'ok', happenedOn: '2026-13-45' })
    expect(badDate.status).toBe(400)
    expect(badDate.body.fieldErrors.happenedOn).toBeDefined()
    const risky = await team.contributor.post(notes(), { body: '<script>alert(1)</script> [x](javascript:alert(1))' })
    expect(risky.status).toBe(201)
    expect(risky.body.bodyHtml).not.toMatch(/<script|href="javascript/i)
  })

  it('keeps notes on the entry they were written on', async () => {
    const other = await createEntry(team.editor, team, 'marks', { inscriptions: ['OTHER'] })
    const note = (await team.contributor.post(notes(), { body: 'On the first mark' })).body.id
    expect((await team.contributor.patch(team.api(`/marks/${other}/notes/${note}`), { body: 'moved?' })).status).toBe(404)
    expect((await team.editor.delete(team.api(`/marks/${other}/notes/${note}`))).status).toBe(404)
    expect((await team.editor.delete(team.api(`/makers/${mark}/notes/${note}`))).status).toBe(404)
    expect((await team.viewer.get(team.api(`/marks/${other}/notes`))).body.items).toEqual([])
  })
})
