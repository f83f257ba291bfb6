// npm run backup: a gzip'd mariadb-dump (--single-transaction --routines --triggers) of the app's database
// into <TALLYMARK_DATA_DIR>/backups/<UTC time>.sql.gz. The app may keep running: the dump is one consistent moment.
import { join } from 'node:path'
import { backupStamp, dumpDatabase, ensureBackupDir, withDatabase } from './lib/backup'

try {
  const file = join(ensureBackupDir(), `${backupStamp()}.sql.gz`)
  await withDatabase(async (connection, optionFile) => {
    console.log(`Backing up ${connection.database} on ${connection.host}:${connection.port} ...`)
    await dumpDatabase(connection, optionFile, file)
  })
  console.log(`Backup written: ${file}`)
}
catch (error) {
  console.error(`Backup failed: ${error instanceof Error ? error.message : String(error)}`)
  process.exit(1)
}
