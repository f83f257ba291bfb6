// The audit trail of reference entries, photos and imports: who deleted, restored or purged an entry, who
// uploaded or deleted a photo, who imported items and how many, from where. Refused requests write nothing.
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, type Person } from '../support/api'
import { auditEvents, closeTestDb, teamIdOf } from '../support/db'
import { uploadCsv } from '../support/ledger'
import { photoForm } from '../support/photos'
import { smallPng } from '../support/route-fixtures'
import { newWikiTeam } from '../support/wiki'

afterAll(closeTestDb)

async function userId(person: Person): Promise<number> {
  return (await person.get('/api/me')).body.user.id
}

describe('audit events', async () => {
  const team = await newWikiTeam('Audit Yard')
  const teamId = await teamIdOf(team.slug)
  const [ownerId, editorId, contributorId] = await Promise.all([team.owner, team.editor, team.contributor].map(userId))

  it('records deleting, restoring and purging a reference entry; a refused attempt records nothing', async () => {
    const created = await team.editor.post(team.api('/marks'), { inscriptions: ['LANTERN HILL WARE'] })
    expect(created.status).toBe(201)
    const id = created.body.id as number
    const events = async () => ({
      deleted: await auditEvents('entry.deleted', { teamId, targetId: id }),
      restored: await auditEvents('entry.restored', { teamId, targetId: id }),
      purged: await auditEvents('entry.purged', { teamId, targetId: id }),
    })

    expectError(await team.viewer.delete(team.api(`/marks/${id}`)), 403)
    expect(await events()).toEqual({ deleted: [], restored: [], purged: [] })

    expect((await team.editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
    expect((await team.editor.post(team.api(`/marks/${id}/restore`), {})).status).toBe(200)
    expect((await team.editor.delete(team.api(`/marks/${id}`))).status).toBe(200)
    expectError(await team.editor.delete(team.api(`/marks/${id}?purge=1`)), 403)
    expect((await team.owner.delete(team.api(`/marks/${id}?purge=1`))).status).toBe(200)

    const { deleted, restored, purged } = await events()
    expect(deleted.map(e => e.userId)).toEqual([editorId, editorId])
    expect(restored.map(e => e.userId)).toEqual([editorId])
    expect(purged).toHaveLength(1)
    expect(purged[0]).toMatchObject({ userId: ownerId, targetType: 'mark', detail: { title: 'LANTERN HILL WARE' } })
    for (const event of [...deleted, ...restored, ...purged]) {
      expect(event.targetType).toBe('mark')
      expect(event.ip).toBeTruthy()
    }
  })

  it('records photo uploads and deletions; a file that is not an image records nothing', async () => {
    const before = (await auditEvents('photo.uploaded', { teamId })).length
    const notImage = photoForm(new TextEncoder().encode('plain words, not a picture'), { name: 'note.jpg', type: 'image/jpeg' })
    expect((await team.contributor.request('POST', team.api('/uploads'), notImage)).status).toBe(415)
    expect(await auditEvents('photo.uploaded', { teamId })).toHaveLength(before)

    const uploaded = await team.contributor.request('POST', team.api('/uploads'), photoForm(await smallPng(), { name: 'base.png', type: 'image/png' }))
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201)
    const photoId = uploaded.body.id as number
    expect(await auditEvents('photo.uploaded', { teamId, targetId: photoId })).toMatchObject([
      { userId: contributorId, targetType: 'photo', detail: { entityType: null, entityId: null, bytes: (await smallPng()).length } },
    ])

    expectError(await team.viewer.delete(team.api(`/photos/${photoId}`)), 403)
    expect(await auditEvents('photo.deleted', { teamId, targetId: photoId })).toEqual([])
    expect((await team.editor.delete(team.api(`/photos/${photoId}`))).status).toBe(200)
    expect(await auditEvents('photo.deleted', { teamId, targetId: photoId })).toMatchObject([{ userId: editorId, targetType: 'photo' }])
  })

  it('records an item import with its counts, and nothing for a dry run or a refused file', async () => {
    const csv = 'title,acquiredOn,cost\nLantern jug,2026-03-01,2.50\nLantern cup,2026-03-02,1.00\n'
    expect((await uploadCsv(team.contributor, team, csv, '?dryRun=1')).status).toBe(200)
    expect((await uploadCsv(team.contributor, team, 'title,acquiredOn\n,not a date\n')).status).toBe(400)
    expect(await auditEvents('items.imported', { teamId })).toEqual([])

    expect((await uploadCsv(team.contributor, team, csv)).status).toBe(200)
    // The same file again adds nothing, and says so.
    expect((await uploadCsv(team.contributor, team, csv)).status).toBe(200)
    const events = await auditEvents('items.imported', { teamId })
    expect(events.map(e => ({ userId: e.userId, detail: e.detail }))).toEqual([
      { userId: contributorId, detail: { rows: 2, added: 2, alreadyImported: 0, storesCreated: 0, invalidRows: 0 } },
      { userId: contributorId, detail: { rows: 2, added: 0, alreadyImported: 2, storesCreated: 0, invalidRows: 0 } },
    ])
  })
})
