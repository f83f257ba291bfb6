// npm test: a throwaway MariaDB and mail catcher in a temp dir, migrate, build, lint, type-check, then vitest.
// Extra arguments go to vitest: `npm test -- tests/api/auth.test.ts`, `npm test -- --project unit`.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { startLocalServices } from './lib/services'
import { applyMigrations } from './lib/migrate'
import { runCommand, startAppServer } from './lib/app-server'
import { freePort } from './lib/ports'
import { startFakeS3 } from './lib/fake-s3'

const args = process.argv.slice(2)
const onlyUnit = args.includes('--project') && args[args.indexOf('--project') + 1] === 'unit'
const quick = process.env.TALLYMARK_QUICK === '1' || args.length > 0
const tmp = mkdtempSync(join(tmpdir(), 'tallymark-test-'))
const services = await startLocalServices({ dataDir: tmp, dbPort: await freePort(), smtpPort: await freePort(), bufferPool: '128M' })
// A fake S3 beside the mail catcher, for the S3 storage driver's tests; the app itself keeps the local driver.
const fakeS3 = await startFakeS3(join(tmp, 's3'), await freePort()).catch(async (error: unknown) => {
  await services.stop()
  rmSync(tmp, { recursive: true, force: true })
  throw error
})
let app: Awaited<ReturnType<typeof startAppServer>> | undefined
let code = 1

async function cleanUp() {
  await app?.stop()
  await fakeS3.stop()
  await services.stop()
  if (!process.env.TALLYMARK_KEEP_TMP) rmSync(tmp, { recursive: true, force: true })
}
process.on('SIGINT', () => void cleanUp().then(() => process.exit(130)))
process.on('SIGTERM', () => void cleanUp().then(() => process.exit(143)))

try {
  await applyMigrations(services.databaseUrl)
  const env: Record<string, string> = {
    DATABASE_URL: services.databaseUrl,
    SMTP_URL: services.smtpUrl,
    TALLYMARK_MAIL_DIR: services.mailDir ?? '',
    TALLYMARK_TEST_TMP: tmp,
    NUXT_SESSION_PASSWORD: 'test-session-password-that-is-long-enough-0123456789',
    STORAGE_DIR: join(tmp, 'uploads'),
    TALLYMARK_TEST_S3_ENDPOINT: fakeS3.endpoint,
    TALLYMARK_TEST_S3_BUCKET: fakeS3.bucket,
    TALLYMARK_TEST_S3_ACCESS_KEY_ID: fakeS3.accessKeyId,
    TALLYMARK_TEST_S3_SECRET_ACCESS_KEY: fakeS3.secretAccessKey,
  }
  if (!onlyUnit) {
    if (process.env.TALLYMARK_SKIP_BUILD !== '1') await runCommand('npx', ['nuxt', 'build'])
    const port = await freePort()
    env.PUBLIC_URL = `http://127.0.0.1:${port}`
    app = await startAppServer({ port, env })
    env.TALLYMARK_TEST_URL = app.url
  }
  if (!quick) {
    await runCommand('npx', ['eslint', '.'])
    await runCommand('npx', ['vue-tsc', '-b', '--noEmit'])
  }
  if (args.length) await runCommand('npx', ['vitest', 'run', ...args], env)
  else {
    // Browser tests run after the API tests, so their timings do not suffer from the API suite's load.
    const reports = [join(tmp, 'vitest-unit-api.json'), join(tmp, 'vitest-browser.json')]
    const failures: unknown[] = []
    // Both runs go ahead even when the first fails, so one report shows everything that is broken.
    await runCommand('npx', ['vitest', 'run', '--project', 'unit', '--project', 'api', '--reporter=default', '--reporter=json', `--outputFile.json=${reports[0]}`], env).catch(e => failures.push(e))
    await runCommand('npx', ['vitest', 'run', '--project', 'browser', '--reporter=default', '--reporter=json', `--outputFile.json=${reports[1]}`], env).catch(e => failures.push(e))
    printTotals(reports)
    if (failures.length) throw failures[0]
  }
  code = 0
}
catch (error) {
  console.error(error instanceof Error ? error.message : error)
}
finally {
  await cleanUp()
}
process.exit(code)

/** One plain closing line over both vitest runs: "tests: N passed, N failed, N skipped". */
function printTotals(files: string[]) {
  let passed = 0
  let failed = 0
  let skipped = 0
  for (const file of files) {
    if (!existsSync(file)) continue
    const report = JSON.parse(readFileSync(file, 'utf8')) as { numPassedTests: number, numFailedTests: number, numPendingTests: number, numTodoTests: number }
    passed += report.numPassedTests
    failed += report.numFailedTests
    skipped += report.numPendingTests + report.numTodoTests
  }
  console.log(`\ntests: ${passed} passed, ${failed} failed, ${skipped} skipped`)
}
