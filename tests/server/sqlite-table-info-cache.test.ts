import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Sequelize } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { openDatabase, UserModel } from '../../server/db'
import { migrate } from '../../server/db/migrate'

/**
 * Sequelize's SQLite dialect runs `PRAGMA table_info` before each SELECT to learn the column
 * types; server/db/sqlite-table-info-cache.ts answers those from memory until the schema changes.
 * Each statement SQLite actually runs is seen through node-sqlite3's 'trace' event.
 */
let dir: string
let sequelize: Sequelize
const traced: string[] = []

async function mainConnection() {
  const manager = (sequelize as unknown as { connectionManager: { getConnection(o: object): Promise<NodeJS.EventEmitter> } }).connectionManager
  return manager.getConnection({})
}

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'table-info-'))
  sequelize = await openDatabase(join(dir, 'db.sqlite'))
  await migrate(sequelize)
  ;(await mainConnection()).on('trace', (sql: string) => traced.push(sql))
  await UserModel.create({ email: 'una@example.test', name: 'Una Example', passwordHash: 'x', role: 'lifter', unit: 'kg', cautionsAcknowledgedAt: null })
})
afterAll(async () => {
  await sequelize.close()
  rmSync(dir, { recursive: true, force: true })
})

// node-sqlite3 reports traces after the statement, asynchronously.
const settle = () => new Promise((resolve) => setTimeout(resolve, 50))
const tableInfoRuns = () => traced.filter((sql) => /^PRAGMA table_info/i.test(sql)).length

describe('the table_info cache', () => {
  it('asks SQLite for a table\'s columns once, and still reads dates and booleans as such', async () => {
    traced.length = 0
    for (let i = 0; i < 5; i++) {
      const user = (await UserModel.findOne({ where: { email: 'una@example.test' } }))!
      expect(user.createdAt).toBeInstanceOf(Date)
      expect(typeof user.active).toBe('boolean')
    }
    await settle()
    expect(traced.filter((sql) => /^SELECT/i.test(sql))).toHaveLength(5)
    expect(tableInfoRuns()).toBeLessThanOrEqual(1)
  })

  it('asks again after the schema changes', async () => {
    await UserModel.findOne({ where: { email: 'una@example.test' } })
    traced.length = 0
    await UserModel.findOne({ where: { email: 'una@example.test' } })
    await settle()
    expect(tableInfoRuns()).toBe(0)
    await sequelize.query('ALTER TABLE `users` ADD COLUMN `scratch` TEXT')
    await UserModel.findOne({ where: { email: 'una@example.test' } })
    await settle()
    expect(tableInfoRuns()).toBe(1)
    const [info] = await sequelize.query('PRAGMA table_info(`users`)')
    expect((info as Array<{ name: string }>).map((c) => c.name)).toContain('scratch')
  })
})
