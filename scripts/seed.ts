// npm run db:seed — seeds the demo team into DATABASE_URL or the private database under .data/.
import { startLocalServices } from './lib/services'
import { applyMigrations } from './lib/migrate'
import { join, resolve } from 'node:path'
import { demoSignInLines, seedDemoTeam } from '../server/database/seed'

const dataDir = resolve(process.env.TALLYMARK_DATA_DIR || '.data')
process.env.STORAGE_DIR ??= join(dataDir, 'uploads')

const services = await startLocalServices({ dataDir, dbPort: Number(process.env.TALLYMARK_DB_PORT ?? 3307), smtpPort: 0, withMail: false })
try {
  await applyMigrations(services.databaseUrl)
  const { created } = await seedDemoTeam(services.databaseUrl)
  console.log(created ? 'Demo team seeded.' : 'The demo team exists already: nothing changed.')
  for (const line of demoSignInLines()) console.log(line)
}
catch (error) {
  console.error('Seeding failed:', error)
  process.exitCode = 1
}
finally {
  await services.stop()
}
