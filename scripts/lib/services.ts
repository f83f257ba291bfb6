// The local services behind npm start, npm run db:seed and npm test: a private MariaDB and a mail catcher.
import { join, resolve } from 'node:path'
import { startPrivateMariaDb, type PrivateMariaDb } from './mariadb'
import { startMailCatcher, type MailCatcher } from './mail-catcher'
import { localSecret } from './local-secrets'

export interface LocalServices {
  databaseUrl: string
  smtpUrl: string
  mailDir: string | null
  stop: () => Promise<void>
}

export async function startLocalServices(options: { dataDir: string, dbPort: number, smtpPort: number, bufferPool?: string, withMail?: boolean }): Promise<LocalServices> {
  const dataDir = resolve(options.dataDir)
  let db: PrivateMariaDb | undefined
  let mail: MailCatcher | undefined
  const stop = async () => {
    await mail?.stop()
    await db?.stop()
  }
  try {
    const databaseUrl = process.env.DATABASE_URL ?? (db = await startPrivateMariaDb({
      dataDir: join(dataDir, 'mariadb'),
      port: options.dbPort,
      database: 'tallymark',
      user: 'tallymark',
      password: localSecret(join(dataDir, 'db-password')),
      bufferPool: options.bufferPool,
    })).url
    let smtpUrl = process.env.SMTP_URL ?? ''
    let mailDir: string | null = null
    if (!smtpUrl && options.withMail !== false) {
      mail = await startMailCatcher(join(dataDir, 'mail'), options.smtpPort)
      smtpUrl = `smtp://127.0.0.1:${options.smtpPort}`
      mailDir = mail.dir
    }
    return { databaseUrl, smtpUrl, mailDir, stop }
  }
  catch (error) {
    await stop()
    throw error
  }
}
