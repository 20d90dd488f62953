import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import bcrypt from 'bcryptjs'
import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { createApp } from '../../server/app'
import { loadConfig, type AppConfig } from '../../server/config'
import { CoachAthleteModel, openDatabase, UserModel } from '../../server/db'
import { migrate } from '../../server/db/migrate'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createMailer } from '../../server/mail/mailer'
import { readOutbox } from '../../server/mail/outbox'
import type { Role } from '../../shared/schemas/common.schema'

export const TEST_PASSWORD = 'correct-horse-battery'

/** A real app over a fresh SQLite file in a temporary folder; `close()` removes it. */
export async function createTestApp(env: Record<string, string> = {}) {
  const dir = mkdtempSync(join(tmpdir(), 'chalkline-test-'))
  const config: AppConfig = loadConfig({
    NODE_ENV: 'test',
    DATABASE_PATH: join(dir, 'test.sqlite'),
    BCRYPT_COST: '10',
    SEED_DEMO: 'false',
    ...env,
  })
  const sequelize: Sequelize = await openDatabase(config.databasePath)
  await migrate(sequelize)
  // E-mail goes through nodemailer to a fake SMTP server on loopback, as in development.
  const fakeSmtp = await startFakeSmtp(config.mail.outboxDir)
  const mailer = createMailer(config, fakeSmtp.port)
  const app = createApp(config, { mailer })
  let passwordHash: string | undefined

  /** Makes a user straight in the database and signs them in through the API. */
  async function userWithToken(role: Role, name = `${role}-${Math.random().toString(36).slice(2, 8)}`) {
    passwordHash ??= await bcrypt.hash(TEST_PASSWORD, 10)
    const user = await UserModel.create({
      name, email: `${name}@example.test`, passwordHash, role, unit: 'kg', clubId: null, cautionsAcknowledgedAt: null,
    })
    const res = await request(app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`)
    return { user, token: res.body.token as string, auth: { Authorization: `Bearer ${res.body.token}` } }
  }

  async function linkCoach(coachId: number, athleteId: number) {
    await CoachAthleteModel.create({ coachId, athleteId })
  }

  async function close() {
    await fakeSmtp.close()
    // A test that stopped the database itself (a restore) has closed it already.
    await sequelize.close().catch((err: Error) => {
      if (!/Database is closed/.test(err.message)) throw err
    })
    rmSync(dir, { recursive: true, force: true })
  }

  return { app, config, sequelize, dir, mailer, userWithToken, linkCoach, close, outbox: () => readOutbox(config.mail.outboxDir) }
}
export type TestApp = Awaited<ReturnType<typeof createTestApp>>
