import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { isLoadable } from '../../shared/domain/equipment'
import { KG_GYM, LB_GYM, equipmentFor, type ExerciseEquipmentKind } from '../../shared/domain/gym'
import { ExerciseModel, PlanModel, SessionModel, SetLogModel, UserModel } from '../../server/db'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { DEMO_HISTORY_DAYS, resetAndSeedDemo, seedDemoIfEmpty } from '../../server/db/seed/demo'
import { createTestApp, type TestApp } from '../helpers/test-app'

const NOW = new Date('2026-11-30T12:00:00Z')
let t: TestApp

async function signIn(email: string) {
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  expect(res.status).toBe(200)
  return { Authorization: `Bearer ${res.body.token}` }
}

beforeAll(async () => {
  t = await createTestApp()
  expect(await seedDemoIfEmpty(t.config, NOW)).toBe(true)
})
afterAll(async () => {
  await t.close()
})

describe('the demo club', () => {
  it('has an admin, a coach and three lifters in kg and lb, all signing in with the demo password', async () => {
    const users = await UserModel.findAll({ order: [['id', 'ASC']] })
    expect(users.map((u) => u.role).sort()).toEqual(['admin', 'coach', 'lifter', 'lifter', 'lifter'])
    expect(new Set(users.filter((u) => u.role === 'lifter').map((u) => u.unit))).toEqual(new Set(['kg', 'lb']))
    for (const account of Object.values(DEMO_ACCOUNTS)) await signIn(account.email)
  })

  it('has a push/pull/legs and an upper/lower plan, and a library of about 60 generic exercises', async () => {
    expect((await PlanModel.findAll()).map((p) => p.name).sort()).toEqual(['Legs / Push / Pull', 'Upper / Lower'])
    expect(await ExerciseModel.count()).toBeGreaterThanOrEqual(55)
  })

  it('holds ten weeks of completed sessions for each lifter, with loads the gym can make', async () => {
    const lifters = await UserModel.findAll({ where: { role: 'lifter' } })
    for (const lifter of lifters) {
      const sessions = await SessionModel.findAll({ where: { athleteId: lifter.id }, order: [['completedAt', 'ASC']] })
      expect(sessions.length).toBeGreaterThanOrEqual(15)
      const first = sessions[0].completedAt!.getTime()
      const last = sessions.at(-1)!.completedAt!.getTime()
      expect((last - first) / 86_400_000).toBeGreaterThan(DEMO_HISTORY_DAYS - 10)
      expect(last).toBeLessThanOrEqual(NOW.getTime())

      const gym = lifter.unit === 'lb' ? LB_GYM : KG_GYM
      const sets = await SetLogModel.findAll({
        where: { sessionId: sessions.map((s) => s.id) },
        include: [{ model: ExerciseModel, as: 'exercise' }],
      })
      for (const set of sets) {
        const equipment = equipmentFor(gym, set.exercise!.equipmentKind as ExerciseEquipmentKind)
        expect(isLoadable(set.loadKg!, equipment), `${set.exercise!.name} ${set.loadKg} kg`).toBe(true)
      }
    }
  })

  it("moves a lift on over the ten weeks (the kg lifter's squat top set gets heavier or longer)", async () => {
    const ana = await UserModel.findOne({ where: { email: DEMO_ACCOUNTS.lifterKg.email } })
    const squat = await ExerciseModel.findOne({ where: { name: 'Back squat' } })
    const tops = await SetLogModel.findAll({
      where: { exerciseId: squat!.id, kind: 'top' },
      include: [{ model: SessionModel, as: 'session', where: { athleteId: ana!.id } }],
      order: [['loggedAt', 'ASC']],
    })
    expect(tops.length).toBeGreaterThanOrEqual(3)
    const work = (s: SetLogModel) => s.loadKg! * (1 + s.reps! / 30) // Epley (1985) estimated 1RM
    expect(work(tops.at(-1)!)).toBeGreaterThan(work(tops[0]))
  })

  it('stores the records each session set, shown in the logbook list', async () => {
    const res = await request(t.app).get('/api/sessions').query({ limit: 200 }).set(await signIn(DEMO_ACCOUNTS.lifterKg.email))
    const records = res.body.sessions.map((s: { records: number }) => s.records)
    // The lifter progresses over ten weeks, so later sessions beat earlier numbers; the first cannot.
    expect(records.some((n: number) => n > 0)).toBe(true)
    expect(records.at(-1)).toBe(0)
  })

  it("shows the kg lifter today's session from the rotation, and the coach the three athletes", async () => {
    const today = await request(t.app).get('/api/train/today').set(await signIn(DEMO_ACCOUNTS.lifterKg.email))
    expect(today.status).toBe(200)
    expect(today.body.plan.name).toBe('Legs / Push / Pull')
    expect(['Push', 'Pull', 'Legs', 'Rest']).toContain(today.body.day.name)
    expect(['I', 'II']).toContain(today.body.day.version)
    if (!today.body.day.isRest) expect(today.body.day.slots[0].scheme).toMatch(/top set 6-9 to failure · 1 back-off 9-12/)

    const athletes = await request(t.app).get('/api/athletes').set(await signIn(DEMO_ACCOUNTS.coach.email))
    expect(athletes.body.athletes).toHaveLength(3)
    for (const row of athletes.body.athletes) expect(row.sessionsLast28Days).toBeGreaterThan(5)
  })

  it('is not loaded twice, and `npm run seed` resets it to the same shape', async () => {
    expect(await seedDemoIfEmpty(t.config, NOW)).toBe(false)
    const before = await SetLogModel.count()
    await resetAndSeedDemo(t.config, NOW)
    expect(await UserModel.count()).toBe(5)
    expect(await SetLogModel.count()).toBe(before) // deterministic history
  })
})
