// Helpers for the ledger API tests: a team with one member per role (from the wiki helpers), builders for
// stores, trips, fee profiles and items, and CSV uploads.
import { expect } from 'vitest'
import type { Person } from './api'
import { newWikiTeam, type WikiTeam } from './wiki'

export type LedgerTeam = WikiTeam

export async function newLedgerTeam(name = 'Ledger Team'): Promise<LedgerTeam> {
  return await newWikiTeam(name)
}

/** POSTs and expects a 201; returns the body. */
export async function created(person: Person, path: string, body: Record<string, unknown>) {
  const res = await person.post(path, body)
  expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(201)
  return res.body
}

export async function newStore(person: Person, team: LedgerTeam, body: Record<string, unknown> = {}) {
  return await created(person, team.api('/stores'), { name: `Store ${Math.random().toString(36).slice(2, 8)}`, kind: 'thrift_store', town: 'Hollowbrook', ...body })
}

export async function newTrip(person: Person, team: LedgerTeam, storeId: number, body: Record<string, unknown> = {}) {
  return await created(person, team.api('/trips'), { storeId, tripDate: '2026-03-01', ...body })
}

export async function newItem(person: Person, team: LedgerTeam, body: Record<string, unknown> = {}) {
  return await created(person, team.api('/items'), { title: 'Test piece', acquiredOn: '2026-03-01', costCents: 300, ...body })
}

export async function newFeeProfile(person: Person, team: LedgerTeam, body: Record<string, unknown> = {}) {
  return await created(person, team.api('/fee-profiles'), { name: `Profile ${Math.random().toString(36).slice(2, 8)}`, channel: 'Lanternpost', percentBp: 1325, fixedCents: 30, ...body })
}

/** Uploads CSV text to the import route as a browser form would. */
export async function uploadCsv(person: Person, team: LedgerTeam, csv: string, query = '', mapping?: Record<string, string>) {
  const form = new FormData()
  form.append('file', new Blob([csv], { type: 'text/csv' }), 'items.csv')
  if (mapping) form.append('mapping', JSON.stringify(mapping))
  return await person.request('POST', team.api(`/imports/items${query}`), form)
}

/** Every item of the team (all pages). */
export async function allItems(person: Person, team: LedgerTeam, query = ''): Promise<any[]> {
  const out: any[] = []
  for (let page = 1; ; page++) {
    const res = await person.get(team.api(`/items?pageSize=100&page=${page}&sort=id${query}`))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    out.push(...res.body.items)
    if (out.length >= res.body.total || !res.body.items.length) return out
  }
}
