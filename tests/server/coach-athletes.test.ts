import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import type { AthleteRow, Progress } from '../../shared/schemas/athlete.schema'
import type { RunSession } from '../../shared/schemas/run.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

let t: TestApp
const auth: Record<string, { Authorization: string }> = {}
const NOW = new Date('2026-11-30T20:00:00Z')

async function signIn(email: string) {
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  return { Authorization: `Bearer ${res.body.token}` }
}

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, NOW)
  auth.coach = await signIn(DEMO_ACCOUNTS.coach.email)
  auth.ana = await signIn(DEMO_ACCOUNTS.lifterKg.email)
  auth.ben = await signIn(DEMO_ACCOUNTS.lifterLb.email)
})
afterAll(async () => {
  await t.close()
})

describe('GET /api/athletes', () => {
  it('gives adherence, plateaus, the review backlog and the main lifts\' estimated-1RM trend per athlete', async () => {
    const res = await request(t.app).get('/api/athletes').set(auth.coach)
    const rows: AthleteRow[] = res.body.athletes
    expect(rows.map((r) => r.name)).toEqual(['Ana Kovac', 'Ben Okafor', 'Chloe Lindqvist'])
    for (const row of rows) {
      expect(row.plannedLast28Days).toBeGreaterThan(0)
      expect(row.adherencePct).toBe(Math.round((row.sessionsLast28Days / row.plannedLast28Days!) * 100))
      expect(row.waitingReview).toBeGreaterThan(10) // nothing of the demo history is reviewed yet
      expect(row.e1rmTrend.length).toBeGreaterThan(0)
      for (const lift of row.e1rmTrend) {
        const dates = lift.points.map((p) => p.date)
        expect(dates).toEqual([...dates].sort())
        for (const p of lift.points) {
          expect(new Date(p.date).toISOString()).toBe(p.date)
          expect(p.e1rmKg).toBeGreaterThan(0)
        }
      }
    }
    // The advanced lifter's stalled bench press shows as a plateau.
    expect(rows.find((r) => r.name === 'Chloe Lindqvist')!.plateauLifts).toContain('Barbell bench press')
    // The kg lifter with 0.8 attendance is below the plan; the advanced one (0.9) is closer to it.
    expect(rows.find((r) => r.name === 'Ana Kovac')!.adherencePct!).toBeLessThan(100)
  })
})

describe('GET /api/progress', () => {
  it("gives a coach an athlete's estimated 1RM over time, weekly hard sets against the plan, and body weight", async () => {
    await request(t.app).post('/api/body-weights').set(auth.ana).send({ date: '2026-11-29', weightKg: 64.2 })
    await request(t.app).post('/api/body-weights').set(auth.ana).send({ date: '2026-11-29', weightKg: 64.4 }) // same day: replaced
    const athletes: AthleteRow[] = (await request(t.app).get('/api/athletes').set(auth.coach)).body.athletes
    const ana = athletes.find((a) => a.name === 'Ana Kovac')!
    const res = await request(t.app).get('/api/progress').query({ athleteId: ana.id, weeks: 52 }).set(auth.coach)
    expect(res.status).toBe(200)
    const progress: Progress = res.body.progress
    expect(progress.e1rm.map((e) => e.exercise)).toContain('Back squat')
    expect(progress.planWeeklySets.find((m) => m.muscle === 'chest')!.sets).toBeGreaterThan(0)
    expect(progress.weeklySets.length).toBeGreaterThan(6)
    // The demo club logs a weekly body weight; the entry of the day was replaced, not added.
    expect(progress.bodyWeight.filter((b: { date: string }) => b.date === '2026-11-29')).toEqual([{ date: '2026-11-29', weightKg: 64.4 }])
  })

  it("refuses another lifter's progress and a coach without the athlete", async () => {
    const athletes: AthleteRow[] = (await request(t.app).get('/api/athletes').set(auth.coach)).body.athletes
    const ana = athletes.find((a) => a.name === 'Ana Kovac')!
    expect((await request(t.app).get('/api/progress').query({ athleteId: ana.id }).set(auth.ben)).status).toBe(404)
    const stranger = await t.userWithToken('coach')
    expect((await request(t.app).get('/api/progress').query({ athleteId: ana.id }).set(stranger.auth)).status).toBe(404)
    expect((await request(t.app).post('/api/body-weights').set(auth.coach).send({ date: '2026-11-29', weightKg: 80 })).status).toBe(403)
  })
})

describe("the coach's feedback on the next session's set card", () => {
  it("shows the coach's set comment from last time and marks a next step the coach edited", async () => {
    const desk = (await request(t.app).get('/api/review-desk').query({ status: 'all', limit: 200 }).set(auth.coach)).body.sessions
    // Finish today's session first, then look back at the last time she did that day.
    const started = (await request(t.app).post('/api/sessions').query({ date: '2026-12-01', tzOffset: 0 }).set(auth.ana).send({})).body.session as RunSession
    await request(t.app).post(`/api/sessions/${started.id}/complete`).set(auth.ana).send({ completedAt: new Date().toISOString() })
    const previous = desk.find((r: { athlete: { name: string }; session: { dayName: string } }) => r.athlete.name === 'Ana Kovac' && r.session.dayName === started.dayName)
    const detail = (await request(t.app).get(`/api/sessions/${previous.session.id}`).set(auth.coach)).body.session
    const top = detail.sets.find((s: { kind: string }) => s.kind === 'top')
    await request(t.app).post(`/api/sessions/${previous.session.id}/comments`).set(auth.coach).send({ body: 'Pause the first rep.', setLogId: top.id })
    const report = (await request(t.app).get(`/api/sessions/${previous.session.id}/report`).set(auth.coach)).body.report
    const first = report.exercises[0]
    await request(t.app)
      .post(`/api/sessions/${previous.session.id}/next-steps`)
      .set(auth.coach)
      .send({ steps: [{ exerciseId: first.exerciseId, slotId: first.slotId, targetLoadKg: first.nextStep.targetLoadKg, targetReps: first.nextStep.targetReps, edited: true }] })

    const planDay = (await request(t.app).get('/api/train/today').query({ date: '2026-12-01', tzOffset: 0 }).set(auth.ana)).body.planDays.find((d: { name: string }) => d.name === previous.session.dayName)
    const again = await request(t.app).post('/api/sessions').query({ date: '2026-12-01', tzOffset: 0 }).set(auth.ana).send({ dayId: planDay.id, version: previous.session.version })
    const block = (again.body.session as RunSession).exercises.find((e) => e.exerciseId === first.exerciseId)!
    expect(block.coachComments.map((c) => c.body)).toEqual(['Pause the first rep.'])
    expect(block.coachComments[0].author).toBe('Ines Marlowe')
    expect(block.nextStepBy).toBe('coach')
  })
})
