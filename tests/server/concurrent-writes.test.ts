import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SetLogModel } from '../../server/db'
import { writeAlone, writeWithOthers } from '../../server/db/sqlite-concurrency'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import type { RunSession } from '../../shared/schemas/run.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

// Many lifters at one gym log sets at the same moment: SQLite takes one writer at a time, and
// Sequelize gives each transaction its own connection. None of them may get a 500.
let t: TestApp
const TODAY = { date: '2026-12-01', tzOffset: 0 }
const lifters: { auth: { Authorization: string }; session: RunSession }[] = []

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
  for (const account of [DEMO_ACCOUNTS.lifterKg, DEMO_ACCOUNTS.lifterLb, DEMO_ACCOUNTS.lifterAdvanced]) {
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: account.email, password: DEMO_PASSWORD })
    const auth = { Authorization: `Bearer ${signIn.body.token}` }
    const started = await request(t.app).post('/api/sessions').query(TODAY).set(auth).send({})
    expect(started.status).toBe(201)
    lifters.push({ auth, session: started.body.session })
  }
}, 60_000)
afterAll(async () => {
  await t.close()
}, 60_000)

describe('concurrent writes', () => {
  it('takes 150 set logs from three lifters fired at once, each exactly once, with no 500', async () => {
    const now = new Date().toISOString()
    const posts = Array.from({ length: 150 }, (_, i) => {
      const { auth, session } = lifters[i % lifters.length]!
      const template = session.sets.find((s) => s.kind !== 'warmup')!
      const id = randomUUID()
      const body = {
        exerciseId: template.exerciseId, slotId: template.slotId, position: 20_000 + i, kind: 'backoff', targetLoadKg: 40,
        targetRepsMin: 8, targetRepsMax: 12, targetReps: null, toFailure: false, targetRir: 2, loadKg: 40, reps: 10,
        rir: 2, failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
      }
      return { id, go: () => request(t.app).put(`/api/sessions/${session.id}/sets/${id}`).set(auth).send(body) }
    })
    // The same UUIDs again at the same time, as a phone retrying after a lost answer would.
    const responses = await Promise.all([...posts, ...posts.slice(0, 30)].map((p) => p.go()))

    expect(responses.map((r) => r.status).filter((s) => s !== 200)).toEqual([])
    expect(await SetLogModel.count({ where: { id: posts.map((p) => p.id) } })).toBe(150)
  })

  it('runs one-statement set logs and top-set transactions side by side, with no 500', async () => {
    // A top set takes the transactional path (it re-targets its back-offs); the others are upserts.
    const base = Date.now()
    const isTop = (i: number) => Math.floor(i / lifters.length) % 2 === 0
    const posts = Array.from({ length: 60 }, (_, i) => {
      const { auth, session } = lifters[i % lifters.length]!
      const top = session.sets.find((s) => s.kind === 'top')!
      const id = isTop(i) ? top.id : randomUUID()
      const editedAt = new Date(base + i).toISOString()
      const body = {
        exerciseId: top.exerciseId, slotId: top.slotId, position: isTop(i) ? top.position : 30_000 + i, kind: isTop(i) ? 'top' : 'backoff',
        targetLoadKg: 40, targetRepsMin: top.targetRepsMin, targetRepsMax: top.targetRepsMax, targetReps: null, toFailure: false,
        targetRir: 1, loadKg: 40 + i, reps: 5, rir: 1, failure: false, skipped: false, note: null, loggedAt: editedAt, editedAt,
      }
      return { go: () => request(t.app).put(`/api/sessions/${session.id}/sets/${id}`).set(auth).send(body) }
    })
    const responses = await Promise.all(posts.map((p) => p.go()))
    expect(responses.map((r) => r.status).filter((s) => s !== 200)).toEqual([])
    // Each lifter's top set holds the load of their latest edit (the later edit wins).
    for (const [n, { session }] of lifters.entries()) {
      const top = session.sets.find((s) => s.kind === 'top')!
      const latest = Math.max(...posts.map((_, i) => i).filter((i) => isTop(i) && i % lifters.length === n))
      expect((await SetLogModel.findByPk(top.id))!.loadKg).toBe(40 + latest)
    }
  })
}, 60_000)

describe('writeWithOthers', () => {
  it('batches waiting writes, never alongside a queued transaction, and a failure fails only its caller', async () => {
    const sequelize = SetLogModel.sequelize!
    let active = 0
    let maxTogether = 0
    let overlapWithAlone = false
    let aloneRunning = false
    const write = (fail: boolean) => async () => {
      if (aloneRunning) overlapWithAlone = true
      active++
      maxTogether = Math.max(maxTogether, active)
      await new Promise((r) => setTimeout(r, 5))
      active--
      if (fail) throw new Error('constraint')
      return 'ok'
    }
    const alone = () => writeAlone(sequelize, async () => {
      aloneRunning = true
      await new Promise((r) => setTimeout(r, 10))
      aloneRunning = false
    })
    const results = await Promise.allSettled([
      alone(),
      ...Array.from({ length: 8 }, (_, i) => writeWithOthers(sequelize, write(i === 3))),
      alone(),
      ...Array.from({ length: 4 }, () => writeWithOthers(sequelize, write(false))),
    ])
    expect(results.filter((r) => r.status === 'rejected')).toHaveLength(1)
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(results.length - 1)
    expect(maxTogether).toBeGreaterThan(1)
    expect(overlapWithAlone).toBe(false)
  })
})
