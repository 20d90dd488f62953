import { loadConfig } from '../config'
import { openDatabase } from './index'
import { migrate } from './migrate'
import { DEMO_PASSWORD, resetAndSeedDemo } from './seed/demo'

/** `npm run seed`: wipes the database and loads the demo club again. */
const config = loadConfig()
const sequelize = await openDatabase(config.databasePath)
await migrate(sequelize)
await resetAndSeedDemo(config)
await sequelize.close()
console.log(`Demo club loaded into ${config.databasePath} (password for every demo account: ${DEMO_PASSWORD}).`)
