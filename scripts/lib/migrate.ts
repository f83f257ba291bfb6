// Applies the committed drizzle-kit migrations; drizzle-orm's migrator reports SQL errors (drizzle-kit migrate may not).
import { drizzle } from 'drizzle-orm/mysql2'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import mysql from 'mysql2/promise'

export async function applyMigrations(url: string) {
  const connection = await mysql.createConnection({ uri: url, multipleStatements: false, timezone: 'Z' })
  try {
    await connection.query('SET time_zone = \'+00:00\'')
    await migrate(drizzle(connection), { migrationsFolder: 'server/database/migrations' })
  }
  finally {
    await connection.end()
  }
}
