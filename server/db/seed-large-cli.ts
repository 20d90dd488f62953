import { availableParallelism } from 'node:os'
import { parseArgs } from 'node:util'
import { loadConfig } from '../config'
import { openDatabase } from './index'
import { migrate } from './migrate'
import { DEMO_PASSWORD, resetAndSeedDemo } from './seed/demo'
import { seedLarge } from './seed/large'

/**
 * `npm run seed:large [-- --athletes 150 --weeks 104]`: wipes the database, loads the demo club,
 * then the large benchmark scenario (invented athletes coached by the demo coach).
 */
const { values } = parseArgs({ options: { athletes: { type: 'string' }, weeks: { type: 'string' } } })
const config = loadConfig()
const started = Date.now()
const cpuStart = process.cpuUsage()
const sequelize = await openDatabase(config.databasePath)
await migrate(sequelize)
await resetAndSeedDemo(config)
const demoMs = Date.now() - started
console.log(`Demo club loaded (${(demoMs / 1000).toFixed(1)} s); adding the large scenario...`)
const result = await seedLarge(config, {
  athletes: values.athletes ? Number(values.athletes) : undefined,
  weeks: values.weeks ? Number(values.weeks) : undefined,
  log: (line) => console.log(line),
})
await sequelize.close()
const cpu = process.cpuUsage(cpuStart)
console.log(
  `Large scenario loaded into ${config.databasePath} in ${(result.ms / 1000).toFixed(1)} s ` +
    `(${((Date.now() - started) / 1000).toFixed(1)} s with the demo club): ${result.athletes} athletes, ` +
    `${result.sessions} sessions, ${result.sets} sets, ${result.reviews} reviews, ${result.comments} comments, ` +
    `${result.bodyWeights} body weights. CPU time ${((cpu.user + cpu.system) / 1e6).toFixed(1)} s on ${availableParallelism()} cores ` +
    `(wall time grows when other work shares the cores). Password for every account: ${DEMO_PASSWORD}.`,
)
