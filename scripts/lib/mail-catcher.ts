// A local SMTP catcher on loopback: every message is stored as a .eml file (and a .json summary).
import { SMTPServer } from 'smtp-server'
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'

export interface MailCatcher {
  port: number
  dir: string
  stop: () => Promise<void>
}

export async function startMailCatcher(dir: string, port: number): Promise<MailCatcher> {
  mkdirSync(dir, { recursive: true })
  let counter = 0
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', () => {
        const name = `${Date.now()}-${String(++counter).padStart(4, '0')}`
        const raw = Buffer.concat(chunks)
        writeFileSync(join(dir, `${name}.eml`), raw)
        writeFileSync(join(dir, `${name}.json`), JSON.stringify({
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          to: session.envelope.rcptTo.map(r => r.address),
          receivedAt: new Date().toISOString(),
        }))
        callback()
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => resolve())
  })
  return {
    port,
    dir,
    stop: () => new Promise<void>(resolve => server.close(() => resolve())),
  }
}
