// Direct MariaDB access for API tests: what the HTTP answers cannot show (audit rows) and what they cannot
// arrange (an expired token). The database is the throwaway one npm test starts (DATABASE_URL).
import { createHash } from 'node:crypto'
import mysql from 'mysql2/promise'

let pool: mysql.Pool | undefined

function db(): mysql.Pool {
  const uri = process.env.DATABASE_URL
  if (!uri) throw new Error('DATABASE_URL is not set: run API tests through npm test.')
  // timezone 'Z': Date parameters are written as UTC, as the app does.
  pool ??= mysql.createPool({ uri, connectionLimit: 2, timezone: 'Z' })
  return pool
}

export async function query<T = Record<string, unknown>>(text: string, params: unknown[] = []): Promise<T[]> {
  const [rows] = await db().query(text, params)
  return rows as T[]
}

/** Runs an insert, update or delete; returns the number of rows it changed. */
export async function exec(text: string, params: unknown[] = []): Promise<number> {
  const [result] = await db().query<mysql.ResultSetHeader>(text, params)
  return result.affectedRows
}

export async function closeTestDb() {
  await pool?.end()
  pool = undefined
}

/** The stored form of a secret token from a mail link (tokens are kept as SHA-256 hex only). */
export function tokenHash(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export interface AuditRow {
  id: number
  action: string
  teamId: number | null
  userId: number | null
  targetType: string | null
  targetId: string | null
  ip: string | null
  detail: Record<string, unknown> | null
}

/** Audit events with this action, oldest first, optionally only those of one user or team. */
export async function auditEvents(action: string, where: { userId?: number, teamId?: number, targetId?: string | number } = {}): Promise<AuditRow[]> {
  const clauses = ['action = ?']
  const params: unknown[] = [action]
  if (where.userId !== undefined) {
    clauses.push('user_id = ?')
    params.push(where.userId)
  }
  if (where.teamId !== undefined) {
    clauses.push('team_id = ?')
    params.push(where.teamId)
  }
  if (where.targetId !== undefined) {
    clauses.push('target_id = ?')
    params.push(String(where.targetId))
  }
  const rows = await query<Record<string, any>>(
    `select id, action, team_id, user_id, target_type, target_id, ip, detail from audit_events where ${clauses.join(' and ')} order by id`, params)
  return rows.map(r => ({
    id: Number(r.id),
    action: r.action,
    teamId: r.team_id === null ? null : Number(r.team_id),
    userId: r.user_id === null ? null : Number(r.user_id),
    targetType: r.target_type,
    targetId: r.target_id,
    ip: r.ip,
    detail: typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail,
  }))
}

export async function teamIdOf(slug: string): Promise<number> {
  const [row] = await query<{ id: number }>('select id from teams where slug = ?', [slug])
  if (!row) throw new Error(`no team ${slug}`)
  return Number(row.id)
}
