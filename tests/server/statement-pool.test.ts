import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ExerciseModel, findUserForToken, UserModel } from '../../server/db'
import { seedDemo } from '../../server/db/seed/demo'
import { prepared, rowToModel } from '../../server/db/statement-pool'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * server/db/statement-pool.ts runs the sign-in check's read and the set-log upsert as prepared
 * node-sqlite3 statements on Sequelize's main connection. Sequelize's own reads are the reference.
 */
let t: TestApp

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
})
afterAll(async () => {
  await t.close()
})

describe('prepared statements', () => {
  it("reads every user exactly as Sequelize's findByPk does, as an unchanged stored instance", async () => {
    const users = await UserModel.findAll()
    expect(users.length).toBeGreaterThan(3)
    for (const expected of users) {
      const user = (await findUserForToken(expected.id))!
      expect(user).toBeInstanceOf(UserModel)
      expect(user.get({ plain: true })).toEqual(expected.get({ plain: true }))
      expect(user.isNewRecord).toBe(false)
      expect(user.changed()).toBe(false)
    }
    expect(await findUserForToken(999_999)).toBeNull()
  })

  it('saves a change made on an instance it read', async () => {
    const [first] = await UserModel.findAll({ order: [['id', 'ASC']], limit: 1 })
    const user = (await findUserForToken(first!.id))!
    await user.update({ unit: user.unit === 'kg' ? 'lb' : 'kg' })
    expect((await UserModel.findByPk(first!.id))!.unit).toBe(user.unit)
  })

  it('answers many concurrent callers correctly, with more than one prepared copy', async () => {
    const users = await UserModel.findAll()
    const statement = prepared(UserModel.sequelize!, 'SELECT * FROM users WHERE id = $id')
    const ids = Array.from({ length: 60 }, (_, i) => users[i % users.length]!.id)
    const rows = await Promise.all(ids.map((id) => statement.all({ id })))
    expect(rows.map((r) => r[0]!.id)).toEqual(ids)
    expect((statement as unknown as { prepared: Set<unknown> }).prepared.size).toBeGreaterThan(1)
  })

  it('holds no read snapshot open: a write committed on another connection is seen at once', async () => {
    const [first] = await UserModel.findAll({ order: [['id', 'ASC']], limit: 1 })
    const before = (await findUserForToken(first!.id))!.tokenVersion
    // A managed transaction runs on a connection of its own (Sequelize's SQLite dialect).
    await UserModel.sequelize!.transaction(async (transaction) => {
      await UserModel.update({ tokenVersion: before + 1 }, { where: { id: first!.id }, transaction })
    })
    expect((await findUserForToken(first!.id))!.tokenVersion).toBe(before + 1)
  })

  it('refuses a type it does not know how to read instead of guessing', async () => {
    const [exercise] = await prepared(ExerciseModel.sequelize!, 'SELECT * FROM exercises LIMIT 1').all({})
    // primary_muscles is a JSON column: rowToModel reads dates, booleans, numbers and text only.
    expect(() => rowToModel(ExerciseModel, exercise!)).toThrow(/primaryMuscles has type JSON/)
  })
})
