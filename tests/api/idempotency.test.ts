// Idempotency keys over HTTP: a POST sent again with the same Idempotency-Key (a retry after a lost answer)
// answers the first result and saves nothing twice; the same key with another body is 422; another person's
// key, or another team's, is independent. Covers the routes the phone's offline queue sends: items, sales,
// status changes, notes and photo uploads. Rules: IETF HTTPAPI draft "The Idempotency-Key HTTP Header Field".
import { randomUUID } from 'node:crypto'
import sharp from 'sharp'
import { afterAll, describe, expect, it } from 'vitest'
import { expectError, type Person } from '../support/api'
import { closeTestDb, exec, query, teamIdOf } from '../support/db'
import { photoForm } from '../support/photos'
import { createEntry } from '../support/wiki'
import { newItem, newLedgerTeam } from '../support/ledger'

afterAll(closeTestDb)

const withKey = (person: Person, method: string, path: string, body: unknown, key: string) => person.request(method, path, body, { 'idempotency-key': key })
const count = async (sql: string, params: unknown[]) => Number((await query<{ n: number }>(sql, params))[0]!.n)

describe('Idempotency-Key', async () => {
  const team = await newLedgerTeam('Idempotency')
  const teamId = await teamIdOf(team.slug)
  const other = await newLedgerTeam('Idempotency other')

  it('adds an item once for the same key sent twice, and answers the same item both times', async () => {
    const key = randomUUID()
    const body = { title: 'Retried jug', acquiredOn: '2026-03-01', costCents: 350 }
    const first = await withKey(team.contributor, 'POST', team.api('/items'), body, key)
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    expect(first.headers.get('idempotent-replayed')).toBeNull()
    // The same body with its keys in another order is the same request.
    const again = await withKey(team.contributor, 'POST', team.api('/items'), { costCents: 350, acquiredOn: '2026-03-01', title: 'Retried jug' }, key)
    expect(again.status).toBe(201)
    expect(again.headers.get('idempotent-replayed')).toBe('true')
    expect(again.body).toEqual(first.body)
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Retried jug'])).toBe(1)
    expect(await count('select count(*) n from item_status_events where item_id = ?', [first.body.id])).toBe(1)
    const [row] = await query<{ route: string, status_code: number, expires_at: Date, created_at: Date }>(
      'select route, status_code, expires_at, created_at from idempotency_keys where team_id = ? and idem_key = ?', [teamId, key])
    expect(row).toMatchObject({ route: `POST ${team.api('/items')}`, status_code: 201 })
    // Kept for 24 hours.
    expect(row!.expires_at.getTime() - row!.created_at.getTime()).toBeGreaterThan(24 * 3600_000 - 5_000)
    expect(row!.expires_at.getTime() - row!.created_at.getTime()).toBeLessThan(24 * 3600_000 + 5_000)
  })

  it('refuses the same key with a different body or on another route (422), saving nothing', async () => {
    const key = randomUUID()
    expect((await withKey(team.contributor, 'POST', team.api('/items'), { title: 'Keyed once', acquiredOn: '2026-03-01' }, key)).status).toBe(201)
    const changed = await withKey(team.contributor, 'POST', team.api('/items'), { title: 'Keyed twice', acquiredOn: '2026-03-01' }, key)
    expectError(changed, 422, /different request/)
    const item = await newItem(team.contributor, team, { title: 'Other route' })
    // A valid sale (bodies are checked first), but the key belongs to the item route.
    expectError(await withKey(team.contributor, 'POST', team.api(`/items/${item.id}/sale`), { salePriceCents: 1000 }, key), 422)
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Keyed twice'])).toBe(0)
    expect((await team.viewer.get(team.api(`/items/${item.id}`))).body.status).toBe('in_stock')
  })

  it('keeps each person\'s keys apart, and each team\'s', async () => {
    const key = randomUUID()
    const body = { title: 'Shared key piece', acquiredOn: '2026-03-01' }
    const mine = await withKey(team.contributor, 'POST', team.api('/items'), body, key)
    const theirs = await withKey(team.editor, 'POST', team.api('/items'), body, key)
    expect([mine.status, theirs.status]).toEqual([201, 201])
    expect(theirs.body.id).not.toBe(mine.body.id)
    expect(theirs.headers.get('idempotent-replayed')).toBeNull()
    const elsewhere = await withKey(other.owner, 'POST', other.api('/items'), body, key)
    expect(elsewhere.status).toBe(201)
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Shared key piece'])).toBe(2)
    // Another team's member cannot read this team's stored answer with a key: they are not in the team (404).
    expect((await withKey(other.owner, 'POST', team.api('/items'), body, key)).status).toBe(404)
  })

  it('records a sale once, with its timeline note once', async () => {
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['WRENFIELD'] })
    const item = await newItem(team.contributor, team, { title: 'Sold once', markId: mark })
    const key = randomUUID()
    const sale = { salePriceCents: 2000, revision: item.revision, note: { onMark: true } }
    const first = await withKey(team.contributor, 'POST', team.api(`/items/${item.id}/sale`), sale, key)
    expect(first.status, JSON.stringify(first.body)).toBe(200)
    // Without the key the same sale would now be refused (the item is sold at a new revision): the key replays.
    const again = await withKey(team.contributor, 'POST', team.api(`/items/${item.id}/sale`), sale, key)
    expect(again.status).toBe(200)
    expect(again.body).toEqual(first.body)
    expect(await count('select count(*) n from item_status_events where item_id = ? and to_status = ?', [item.id, 'sold'])).toBe(1)
    expect(await count('select count(*) n from entry_notes where entry_type = ? and entry_id = ?', ['mark', mark])).toBe(1)
  })

  it('adds a note and uploads a photo once each (the upload is known by its bytes, not its multipart framing)', async () => {
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['OSTLER & KEEP'] })
    const noteKey = randomUUID()
    for (let i = 0; i < 2; i++) {
      expect((await withKey(team.contributor, 'POST', team.api(`/marks/${mark}/notes`), { body: 'Seen at the church sale.' }, noteKey)).status).toBe(201)
    }
    expect(await count('select count(*) n from entry_notes where entry_type = ? and entry_id = ?', ['mark', mark])).toBe(1)

    const item = await newItem(team.contributor, team, { title: 'Photographed once' })
    const jpeg = await sharp({ create: { width: 200, height: 150, channels: 3, background: '#7a4b2a' } }).jpeg().toBuffer()
    const photoKey = randomUUID()
    const fields = { entityType: 'item', entityId: item.id }
    // Two FormData objects: two different multipart boundaries, the same photo.
    const first = await team.contributor.request('POST', team.api('/uploads'), photoForm(jpeg, { fields }), { 'idempotency-key': photoKey })
    const again = await team.contributor.request('POST', team.api('/uploads'), photoForm(jpeg, { fields }), { 'idempotency-key': photoKey })
    expect([first.status, again.status]).toEqual([201, 201])
    expect(again.body).toEqual(first.body)
    expect(await count('select count(*) n from photos where entity_type = ? and entity_id = ?', ['item', item.id])).toBe(1)
    const otherPhoto = await sharp({ create: { width: 200, height: 150, channels: 3, background: '#2a4b7a' } }).jpeg().toBuffer()
    expectError(await team.contributor.request('POST', team.api('/uploads'), photoForm(otherPhoto, { fields }), { 'idempotency-key': photoKey }), 422)
  })

  it('runs a refused request again on retry (nothing of it was kept), and refuses a malformed key', async () => {
    const key = randomUUID()
    const bad = await withKey(team.contributor, 'POST', team.api('/items'), { title: 'Needs a day' }, key)
    expect(bad.status).toBe(400)
    expect(await count('select count(*) n from idempotency_keys where team_id = ? and idem_key = ?', [teamId, key])).toBe(0)
    expectError(await withKey(team.contributor, 'POST', team.api('/items'), { title: 'Bad key', acquiredOn: '2026-03-01' }, 'no spaces allowed'), 400, /Idempotency-Key/)
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Bad key'])).toBe(0)
  })

  it('adds one row when the same key races in twice at once', async () => {
    const key = randomUUID()
    const body = { title: 'Raced piece', acquiredOn: '2026-03-01' }
    const answers = await Promise.all([0, 1, 2].map(() => withKey(team.contributor, 'POST', team.api('/items'), body, key)))
    // Each is the first answer, or "still being saved" (409 with inProgress) for one that came while it ran.
    for (const a of answers) {
      expect([201, 409], JSON.stringify(a.body)).toContain(a.status)
      if (a.status === 409) expect(a.body.inProgress).toBe(true)
    }
    expect(answers.some(a => a.status === 201)).toBe(true)
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Raced piece'])).toBe(1)
    const replay = await withKey(team.contributor, 'POST', team.api('/items'), body, key)
    expect(replay.status).toBe(201)
    expect(replay.headers.get('idempotent-replayed')).toBe('true')
  })

  it('forgets a key once it expired: the request then runs as new', async () => {
    const key = randomUUID()
    const body = { title: 'Expired key piece', acquiredOn: '2026-03-01' }
    expect((await withKey(team.contributor, 'POST', team.api('/items'), body, key)).status).toBe(201)
    expect(await exec('update idempotency_keys set expires_at = now(3) - interval 1 second where team_id = ? and idem_key = ?', [teamId, key])).toBe(1)
    const later = await withKey(team.contributor, 'POST', team.api('/items'), body, key)
    expect(later.status).toBe(201)
    expect(later.headers.get('idempotent-replayed')).toBeNull()
    expect(await count('select count(*) n from items where team_id = ? and title = ?', [teamId, 'Expired key piece'])).toBe(2)
  })
})
