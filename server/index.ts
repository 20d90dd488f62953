import type { Server } from 'node:http'
import { createApp } from './app'
import { loadConfig } from './config'
import { openDatabase } from './db'
import { migrate } from './db/migrate'
import { DEMO_PASSWORD, seedDemoIfEmpty } from './db/seed/demo'
import { startFakeSmtp } from './mail/fake-smtp'
import { createMailer } from './mail/mailer'
import { sendDailyDigests } from './services/review.service'

/** The only file with side effects: read config, migrate, seed on first start, listen. */
async function main() {
  const config = loadConfig()
  const sequelize = await openDatabase(config.databasePath)
  await migrate(sequelize)
  if (config.seedDemo && (await seedDemoIfEmpty(config))) {
    console.log(`Loaded the demo club (password for every demo account: ${DEMO_PASSWORD}).`)
  }
  // Without a real SMTP server configured, e-mail goes to a local fake one (see /dev/outbox).
  const fakeSmtp = config.mail.smtp ? null : await startFakeSmtp(config.mail.outboxDir)
  const mailer = createMailer(config, fakeSmtp?.port)
  const app = createApp(config, { mailer })
  const server: Server = app.listen(config.port, config.host, () => {
    const address = server.address()
    const port = typeof address === 'object' && address ? address.port : config.port
    console.log(`Chalkline ${config.env} server on http://localhost:${port}`)
    if (fakeSmtp) console.log(`E-mail goes to the local outbox: http://localhost:${port}/dev/outbox`)
  })
  // Coaches on the daily digest get it once a day; the last send time is kept in the database.
  const digestTimer = setInterval(() => {
    sendDailyDigests(config, mailer).catch((err) => console.error('[mail] daily digest failed', err))
  }, 60 * 60 * 1000)
  digestTimer.unref()
  const stop = () => {
    clearInterval(digestTimer)
    server.close(() => void Promise.all([sequelize.close(), fakeSmtp?.close()]).then(() => process.exit(0)))
  }
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
