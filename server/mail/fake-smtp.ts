import { randomUUID } from 'node:crypto'
import { createWriteStream, mkdirSync, renameSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import { join } from 'node:path'
import { SMTPServer } from 'smtp-server'

/**
 * A local SMTP server for development and tests: it accepts every message on 127.0.0.1 and
 * keeps each one as a .eml file in the outbox folder, where the dev outbox page reads it.
 */
export async function startFakeSmtp(outboxDir: string) {
  mkdirSync(outboxDir, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Chalkline local outbox',
    logger: false,
    onData(stream, _session, callback) {
      // Time first in the name, so a folder listing is in the order messages arrived.
      const file = join(outboxDir, `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`)
      // Written under a temporary name and renamed when complete, so a reader never sees half a message.
      const out = createWriteStream(`${file}.part`)
      stream.pipe(out)
      out.on('finish', () => {
        renameSync(`${file}.part`, file)
        callback()
      })
      out.on('error', (err) => callback(err))
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => resolve())
  })
  const { port } = server.server.address() as AddressInfo
  return {
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
