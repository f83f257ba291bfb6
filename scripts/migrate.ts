// npm run db:migrate — applies migrations to DATABASE_URL and fails loudly on any error.
import { applyMigrations } from './lib/migrate'

const url = process.env.DATABASE_URL
if (!url) {
  console.error('Set DATABASE_URL (npm start and npm test migrate their private databases themselves).')
  process.exit(1)
}
try {
  await applyMigrations(url)
  console.log('Migrations applied.')
}
catch (error) {
  console.error('Migration failed:', error)
  process.exit(1)
}
