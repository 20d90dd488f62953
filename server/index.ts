import type { Server } from 'node:http'
import { createApp } from './app'
import { loadConfig } from './config'
import { openDatabase } from './db'
import { migrate } from './db/migrate'
import { DEMO_PASSWORD, seedDemoIfEmpty } from './db/seed/demo'

/** The only file with side effects: read config, migrate, seed on first start, listen. */
async function main() {
  const config = loadConfig()
  const sequelize = await openDatabase(config.databasePath)
  await migrate(sequelize)
  if (config.seedDemo && (await seedDemoIfEmpty(config))) {
    console.log(`Loaded the demo club (password for every demo account: ${DEMO_PASSWORD}).`)
  }
  const app = createApp(config)
  const server: Server = app.listen(config.port, config.host, () => {
    const address = server.address()
    const port = typeof address === 'object' && address ? address.port : config.port
    console.log(`Chalkline ${config.env} server on http://localhost:${port}`)
  })
  const stop = () => {
    server.close(() => void sequelize.close().then(() => process.exit(0)))
  }
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
