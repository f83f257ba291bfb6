import { describe, expect, it } from 'vitest'
import { Person } from '../support/api'

describe('health', () => {
  it('answers with the database up', async () => {
    const res = await new Person().get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true, database: 'up' })
  })
})
