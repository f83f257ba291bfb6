// npm run restore -- <file>: checks that the file is a complete backup from npm run backup, then replaces the
// app's database with it (every table is dropped first). Stop the app before, start it again after: its search
// indexes and sessions are of the database it had.
import { resolve } from 'node:path'
import { checkDump, restoreDatabase, withDatabase } from './lib/backup'

const [file] = process.argv.slice(2)
if (!file) {
  console.error('Usage: npm run restore -- <backup.sql.gz>   (backups are in .data/backups/; nothing was changed)')
  process.exit(2)
}
try {
  const path = resolve(file)
  await checkDump(path)
  await withDatabase(async (connection, optionFile) => {
    console.log(`Restoring ${connection.database} on ${connection.host}:${connection.port} from ${path} ...`)
    await restoreDatabase(connection, optionFile, path)
  }, { create: true })
  console.log('Restored. Start the app again (npm start) so it reads the restored data.')
}
catch (error) {
  console.error(`Restore refused or failed: ${error instanceof Error ? error.message : String(error)}`)
  process.exit(1)
}
