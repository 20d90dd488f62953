import { randomUUID } from 'node:crypto'
import { writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { QueryTypes } from 'sequelize'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { startBaselineProcess, type BaselineProcess } from '../bench/baseline-process'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * The API benchmark's floor (tests/bench/floor-server.ts) is only a fair "best this stack can do"
 * if it does the real set log's database work: the same row, in the same stored forms, for the
 * same request and token, and it refuses what the real server refuses on the token.
 */
let t: TestApp
let floor: BaselineProcess | undefined
let floorUrl: string
let token: string
let session: RunSession
const TODAY = { date: '2026-12-01', tzOffset: 0 }
// Columns whose values differ by design between two writes: the key and the write moments.
const MOMENT_COLUMNS = ['id', 'created_at', 'updated_at']

function body(set: RunSet, position: number) {
  return {
    exerciseId: set.exerciseId, slotId: set.slotId, position, kind: 'backoff', targetLoadKg: 60,
    targetRepsMin: 8, targetRepsMax: 12, targetReps: null, toFailure: false, targetRir: 2, loadKg: 60, reps: 10,
    rir: 2, failure: false, skipped: false, note: 'floor check', loggedAt: '2026-12-01T17:05:09.007Z',
    editedAt: '2026-12-01T17:05:10.250Z',
  }
}

async function row(id: string) {
  const rows = await t.sequelize.query<Record<string, unknown>>('SELECT * FROM set_logs WHERE id = $id', { bind: { id }, type: QueryTypes.SELECT })
  const found = rows[0]
  if (!found) return undefined
  return Object.fromEntries(Object.entries(found).filter(([k]) => !MOMENT_COLUMNS.includes(k)))
}

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
  const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: DEMO_ACCOUNTS.lifterKg.email, password: DEMO_PASSWORD })
  token = signIn.body.token
  session = (await request(t.app).post('/api/sessions').query(TODAY).set({ Authorization: `Bearer ${token}` }).send({})).body.session
  const secretFile = join(t.dir, 'floor-jwt-secret')
  writeFileSync(secretFile, t.config.jwtSecret + '\n')
  floor = await startBaselineProcess(resolve(__dirname, '../..'), ['--import', 'tsx', 'tests/bench/floor-server.ts'], {
    DATABASE_PATH: t.config.databasePath,
    JWT_SECRET_FILE: secretFile,
  })
  floorUrl = floor.url
})

afterAll(async () => {
  await floor?.stop()
  await t?.close()
})

describe('the API benchmark floor', () => {
  it('writes the same set log row as the real server for the same request', async () => {
    const template = session.sets.find((s) => s.kind === 'backoff')!
    const viaApp = randomUUID()
    const viaFloor = randomUUID()
    const auth = { Authorization: `Bearer ${token}` }
    const app = await request(t.app).put(`/api/sessions/${session.id}/sets/${viaApp}`).set(auth).send(body(template, 9001))
    expect(app.status).toBe(200)
    const res = await fetch(`${floorUrl}/api/sessions/${session.id}/sets/${viaFloor}`, {
      method: 'PUT',
      headers: { ...auth, 'Content-Type': 'application/json' },
      body: JSON.stringify(body(template, 9001)),
    })
    expect(res.status).toBe(200)
    const fromApp = await row(viaApp)
    expect(fromApp).toBeDefined()
    expect(await row(viaFloor)).toEqual(fromApp)
  })

  it('refuses a token the real server would refuse', async () => {
    const template = session.sets.find((s) => s.kind === 'backoff')!
    const id = randomUUID()
    const forged = token.slice(0, -2) + (token.endsWith('A') ? 'BB' : 'AA')
    const res = await fetch(`${floorUrl}/api/sessions/${session.id}/sets/${id}`, {
      method: 'PUT',
      headers: { Authorization: `Bearer ${forged}`, 'Content-Type': 'application/json' },
      body: JSON.stringify(body(template, 9002)),
    })
    expect(res.status).toBe(401)
    expect(await row(id)).toBeUndefined()
  })
})
