// npm start: private MariaDB and mail catcher under .data/, migrate, seed once, build, serve on 127.0.0.1:3000.
import { join, resolve } from 'node:path'
import { startLocalServices } from './lib/services'
import { applyMigrations } from './lib/migrate'
import { localSecret } from './lib/local-secrets'
import { runCommand, startAppServer, startDevServer } from './lib/app-server'
import { demoSignInLines, seedDemoTeam } from '../server/database/seed'

const dataDir = resolve(process.env.TALLYMARK_DATA_DIR || '.data')
const port = Number(process.env.PORT ?? 3000)
// The seed stores demo photos where the app will read them.
process.env.STORAGE_DIR ??= join(dataDir, 'uploads')
const services = await startLocalServices({
  dataDir,
  dbPort: Number(process.env.TALLYMARK_DB_PORT ?? 3307),
  smtpPort: Number(process.env.TALLYMARK_SMTP_PORT ?? 2525),
})

let stopping = false
let app: Awaited<ReturnType<typeof startAppServer>> | undefined
async function shutdown(code = 0) {
  if (stopping) return
  stopping = true
  console.log('\nStopping Tallymark...')
  await app?.stop()
  await services.stop()
  console.log('Stopped.')
  process.exit(code)
}
process.on('SIGINT', () => void shutdown(0))
process.on('SIGTERM', () => void shutdown(0))

try {
  await applyMigrations(services.databaseUrl)
  const { created } = await seedDemoTeam(services.databaseUrl)
  if (created) console.log('Demo team seeded.')
  const dev = process.argv.includes('--dev')
  if (!dev && process.env.TALLYMARK_SKIP_BUILD !== '1') await runCommand('npx', ['nuxt', 'build'])
  const env = {
    DATABASE_URL: services.databaseUrl,
    SMTP_URL: services.smtpUrl,
    NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? localSecret(join(dataDir, 'session-password')),
    STORAGE_DIR: process.env.STORAGE_DIR,
    PUBLIC_URL: process.env.PUBLIC_URL ?? `http://127.0.0.1:${port}`,
  }
  app = dev ? await startDevServer({ port, env }) : await startAppServer({ port, env, inheritOutput: true })
  app.process.on('exit', code => void shutdown(code ?? 1))
  console.log(`\nTallymark is running on ${env.PUBLIC_URL}`)
  if (services.mailDir) console.log(`Outgoing e-mail is caught locally: ${services.mailDir}`)
  // Demo sign-ins are printed for local use only, never for a production deployment.
  if (process.env.NODE_ENV !== 'production' || !process.env.DATABASE_URL) for (const line of demoSignInLines()) console.log(line)
  console.log('Press Ctrl-C to stop.')
}
catch (error) {
  console.error(error instanceof Error ? error.message : error)
  await shutdown(1)
}
