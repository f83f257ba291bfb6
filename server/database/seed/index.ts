// Seeds the demo team once: a second run finds the team and changes nothing.
import { drizzle } from 'drizzle-orm/mysql2'
import { eq } from 'drizzle-orm'
import mysql from 'mysql2/promise'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import * as schema from '../schema'
import type { Role } from '../../../shared/roles'
import { DEMO_MEMBERS, DEMO_PASSWORD, DEMO_TEAM } from './demo-team'
import { seedDemoReference } from './reference'
import { seedDemoLedger } from './demo-ledger'
import { seedDemoPhotos } from './photos'
import { createStorageDriver } from '../../utils/storage'
import { useServerConfig } from '../../utils/config'

export type SeedDb = ReturnType<typeof drizzle<typeof schema>>

/** `photos`: how many demo marks get a drawn photo (0 skips drawing). */
export async function seedDemoTeam(url: string, options: { photos?: number } = {}): Promise<{ created: boolean }> {
  const connection = await mysql.createConnection({ uri: url, timezone: 'Z' })
  try {
    await connection.query('SET time_zone = \'+00:00\'')
    const db = drizzle(connection, { schema, mode: 'default' })
    const [existing] = await db.select({ id: schema.teams.id }).from(schema.teams).where(eq(schema.teams.slug, DEMO_TEAM.slug)).limit(1)
    if (existing) return { created: false }
    // Same scrypt format as nuxt-auth-utils' hashPassword, so the demo members can sign in.
    const passwordHash = await new Hash(new Scrypt({})).make(DEMO_PASSWORD)
    let teamId = 0
    let ownerId = 0
    await db.transaction(async (tx) => {
      teamId = (await tx.insert(schema.teams).values({ ...DEMO_TEAM, isDemo: true }).$returningId())[0]!.id
      const idsByRole = new Map<Role, number[]>()
      for (const member of DEMO_MEMBERS) {
        const [user] = await tx.select({ id: schema.users.id }).from(schema.users).where(eq(schema.users.email, member.email)).limit(1)
        const userId = user?.id ?? (await tx.insert(schema.users).values({ email: member.email, name: member.name, passwordHash }).$returningId())[0]!.id
        await tx.insert(schema.memberships).values({ teamId, userId, role: member.role })
        idsByRole.set(member.role, [...(idsByRole.get(member.role) ?? []), userId])
      }
      const role = (r: Role) => idsByRole.get(r) ?? []
      ownerId = role('owner')[0]!
      await seedDemoReference(tx, teamId, {
        editors: [...role('owner'), ...role('editor')],
        noteAuthors: [...role('contributor'), ...role('editor'), ...role('owner')],
      })
      await seedDemoLedger(tx, teamId, { sourcers: [...role('owner'), ...role('editor'), ...role('contributor')] })
    })
    // Photos go to storage, outside the transaction: a failure here leaves a complete team without pictures.
    const photos = options.photos ?? 80
    if (photos > 0) await seedDemoPhotos(db, teamId, ownerId, createStorageDriver(useServerConfig()), photos)
    return { created: true }
  }
  finally {
    await connection.end()
  }
}

export function demoSignInLines(): string[] {
  return [
    `Demo team "${DEMO_TEAM.name}" — password for every demo member: ${DEMO_PASSWORD}`,
    ...DEMO_MEMBERS.map(m => `  ${m.role.padEnd(12)} ${m.email}`),
  ]
}
