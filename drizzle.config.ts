import { defineConfig } from 'drizzle-kit'

// Migrations are generated here and applied by scripts/migrate.ts (drizzle-orm's migrator reports errors;
// never use drizzle-kit push against MariaDB).
export default defineConfig({
  dialect: 'mysql',
  schema: './server/database/schema/index.ts',
  out: './server/database/migrations',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'mysql://tallymark@127.0.0.1:3307/tallymark' },
})
