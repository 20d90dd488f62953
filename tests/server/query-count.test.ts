import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SessionModel, SetLogModel, UserModel } from '../../server/db'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import { largeAthleteEmail, seedLarge, seedLargeDemo } from '../../server/db/seed/large'
import { computeSessionFlags } from '../../server/services/review-flags.service'
import { buildReport } from '../../server/services/session-report.service'
import type { AthleteRow } from '../../shared/schemas/athlete.schema'
import {
  attachQueryLog, countQueries, HOT_REQUESTS, measureHotRequest, openHotWorld, openInstrumentedApp, settle,
  type InstrumentedApp, type QueryLog,
} from '../bench/sql'
import { createTestApp, type TestApp } from '../helpers/test-app'

async function signIn(app: TestApp['app'], email: string) {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  expect(res.status).toBe(200)
  return { Authorization: `Bearer ${res.body.token}` }
}

describe('SQL statements per request', () => {
  let t: TestApp
  let log: QueryLog
  let coach: { Authorization: string }

  beforeAll(async () => {
    t = await createTestApp()
    await seedDemo(t.config)
    log = attachQueryLog(t.sequelize)
    coach = await signIn(t.app, DEMO_ACCOUNTS.coach.email)
  }, 60_000)
  afterAll(async () => {
    await t?.close()
  })

  async function coachRequestCount(path: string) {
    const { result, queries } = await countQueries(log, () => request(t.app).get(path).set(coach))
    expect(result.status).toBe(200)
    return { body: result.body, statements: queries.length }
  }

  it('does not grow with the number of athletes on the athlete table and the review desk (3, then 30 athletes)', async () => {
    const athletes3 = await coachRequestCount('/api/athletes')
    const desk3 = await coachRequestCount('/api/review-desk?status=all&limit=200')
    expect(athletes3.body.athletes).toHaveLength(3)

    // 27 more athletes with six weeks of training each, all coached by the demo coach.
    await seedLarge(t.config, { athletes: 27, weeks: 6 })
    const athletes30 = await coachRequestCount('/api/athletes')
    const desk30 = await coachRequestCount('/api/review-desk?status=all&limit=200')
    const rows: AthleteRow[] = athletes30.body.athletes
    expect(rows).toHaveLength(30)
    expect(rows.filter((r) => r.lastSessionAt !== null)).toHaveLength(30)
    expect(desk30.body.sessions.length).toBeGreaterThan(desk3.body.sessions.length)

    expect(athletes30.statements).toBe(athletes3.statements)
    expect(desk30.statements).toBe(desk3.statements)
  }, 60_000)

  it('keeps every hot request within its fixed statement budget', async () => {
    const world = await openHotWorld(t.app, DEMO_ACCOUNTS.lifterKg.email)
    const start = HOT_REQUESTS.find((h) => h.name.startsWith('POST /api/sessions (start'))!
    const finish = HOT_REQUESTS.find((h) => h.name.startsWith('POST /api/sessions/:id/complete'))!
    const ordered = [start, ...HOT_REQUESTS.filter((h) => h !== start && h !== finish), finish]
    const counted: Array<{ name: string; statements: number; budget: number }> = []
    // Twice through the sets, so that the top set (which recomputes its back-offs) is logged too.
    const logSet = HOT_REQUESTS.find((h) => h.name.includes('log a planned set'))!
    for (const hot of ordered) {
      const result = await measureHotRequest(log, world, hot)
      counted.push({ name: hot.name, statements: result.statements, budget: hot.budget })
      if (hot === logSet) {
        for (let i = 1; i < world.session!.sets.length; i++) {
          const again = await measureHotRequest(log, world, hot)
          counted.push({ name: hot.name, statements: again.statements, budget: hot.budget })
        }
      }
    }
    await settle(log)
    expect(counted.length).toBeGreaterThan(HOT_REQUESTS.length)
    for (const c of counted) expect(c.statements, c.name).toBeLessThanOrEqual(c.budget)
    // A set log never reads the history. Any set but a top set is the token's user and one
    // upsert; a top set also re-targets its back-offs in a transaction.
    const setLogs = counted.filter((c) => c.name === logSet.name).map((c) => c.statements)
    expect(Math.min(...setLogs)).toBe(2)
    expect(Math.max(...setLogs)).toBeGreaterThanOrEqual(5)
    const newSets = counted.filter((c) => c.name.includes('(a new set)')).map((c) => c.statements)
    expect(newSets).toEqual(newSets.map(() => 2))
  }, 60_000)
})

describe('seedLargeDemo, small', () => {
  const dir = mkdtempSync(join(tmpdir(), 'chalkline-large-'))
  const path = join(dir, 'large.sqlite')
  let seeded: Awaited<ReturnType<typeof seedLargeDemo>>
  let target: InstrumentedApp

  beforeAll(async () => {
    seeded = await seedLargeDemo(path, { athletes: 5, weeks: 8 })
    target = await openInstrumentedApp(path)
  }, 120_000)
  afterAll(async () => {
    await target?.close()
    rmSync(dir, { recursive: true, force: true })
  })

  it('reports what it wrote: 5 athletes with 3-4 sessions a week, warm-ups and working sets', async () => {
    const athletes = await UserModel.findAll({ where: { email: Array.from({ length: 5 }, (_, i) => largeAthleteEmail(i)) } })
    expect(athletes).toHaveLength(5)
    expect(seeded.athletes).toBe(5)
    const sessions = await SessionModel.count({ where: { athleteId: athletes.map((a) => a.id) } })
    expect(seeded.sessions).toBe(sessions)
    // Eight weeks at 3-4 planned days, minus missed days and weeks (at least one week off each).
    expect(sessions).toBeGreaterThan(5 * 8)
    expect(sessions).toBeLessThanOrEqual(5 * 8 * 4)
    const sets = await SetLogModel.count({ include: [{ model: SessionModel, as: 'session', where: { athleteId: athletes.map((a) => a.id) } }] })
    expect(seeded.sets).toBe(sets)
    expect(seeded.ms).toBeGreaterThan(0)
  })

  it("lets every athlete open their sessions, and shows them on the coach's athlete table", async () => {
    const coach = await signIn(target.app, DEMO_ACCOUNTS.coach.email)
    const table = await request(target.app).get('/api/athletes').set(coach)
    expect(table.status).toBe(200)
    const rows: AthleteRow[] = table.body.athletes
    expect(rows).toHaveLength(3 + 5)
    for (let i = 0; i < 5; i++) {
      const email = largeAthleteEmail(i)
      const row = rows.find((r) => r.email === email)!
      expect(row.planName).not.toBeNull()
      expect(row.sessionsLast28Days).toBeGreaterThan(0)
      expect(row.lastSessionAt).not.toBeNull()
      expect(row.e1rmTrend.length).toBeGreaterThan(0)

      const auth = await signIn(target.app, email)
      const list = await request(target.app).get('/api/sessions').query({ limit: 200 }).set(auth)
      expect(list.status).toBe(200)
      expect(list.body.sessions.length).toBeGreaterThan(5)
      expect(list.body.sessions[0].completedAt).toBe(row.lastSessionAt)
      const detail = await request(target.app).get(`/api/sessions/${list.body.sessions[0].id}`).set(auth)
      expect(detail.status).toBe(200)
      const sets: Array<{ kind: string; reps: number | null; loadKg: number | null }> = detail.body.session.sets
      expect(new Set(sets.map((s) => s.kind)).has('warmup')).toBe(true) // every plan day starts with a main lift
      expect(sets.filter((s) => s.kind !== 'warmup' && (s.reps ?? 0) > 0 && (s.loadKg ?? 0) > 0).length).toBeGreaterThan(3)
      expect((await request(target.app).get('/api/train/today').set(auth)).status).toBe(200)

      // The review backlog on the table is the desk's own list of waiting sessions.
      const desk = await request(target.app).get('/api/review-desk').query({ athleteId: row.id, status: 'waiting', limit: 200 }).set(coach)
      expect(desk.body.sessions).toHaveLength(row.waitingReview)
    }
  })

  it('stores the same review flags and record counts the server computes when a session is finished', async () => {
    const athletes = await UserModel.findAll({ where: { email: Array.from({ length: 5 }, (_, i) => largeAthleteEmail(i)) } })
    let flagged = 0
    for (const athlete of athletes) {
      const sessions = await SessionModel.findAll({ where: { athleteId: athlete.id }, order: [['completedAt', 'DESC']], limit: 4 })
      for (const session of sessions) {
        const stored = session.summary as { flags: unknown[]; records: number }
        expect(stored.flags, `session ${session.id}`).toEqual(await computeSessionFlags(session, athlete))
        const report = await buildReport(session, athlete)
        expect(stored.records, `session ${session.id}`).toBe(report.exercises.reduce((n, e) => n + e.records.length, 0))
        flagged += stored.flags.length
      }
    }
    // Missed days at least are flagged somewhere in eight weeks of five athletes.
    expect(flagged).toBeGreaterThan(0)
  }, 60_000)
})
