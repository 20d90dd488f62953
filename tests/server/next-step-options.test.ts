import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import {
  AssignmentModel, EquipmentProfileModel, ExerciseModel, SessionModel, SetLogModel, SlotAdjustmentModel, type UserModel,
} from '../../server/db'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'
import { KG_GYM_SET } from '../../shared/domain/equipment'
import { KG_GYM } from '../../shared/domain/gym'
import { DEFAULT_SCHEMES } from '../../shared/domain/schemes'
import type { Plan } from '../../shared/schemas/plan.schema'
import type { RunSession, SessionReport } from '../../shared/schemas/run.schema'
import type { StartEstimatesAnswer } from '../../shared/schemas/start-estimate.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * Plateau options are actions: taking one changes what the next session plans. The world: a
 * coach's one-day plan ("Press": bench press and a cable fly in version I) shared by two lifters;
 * lifter A's bench has stalled over five weekly sessions (100 x 8 three times, then 102.5 x 7
 * twice: Epley 126.7 then 126.4) in a gym with 0.5 kg plates, so every option is on offer.
 */
type Auth = { Authorization: string }
let t: TestApp
let coach: { user: UserModel; auth: Auth }
let lifter: { user: UserModel; auth: Auth }
let other: { user: UserModel; auth: Auth }
let plan: Plan
let lastSessionId: number
let exercise: Map<string, number>

const DAY_MS = 86_400_000
const day = (n: number) => new Date(Date.now() - (40 - n) * DAY_MS)

async function ok<T>(who: Auth, method: 'get' | 'post' | 'put', path: string, body?: unknown, status = 200): Promise<T> {
  const res = await request(t.app)[method](path).set(who).send(body as object)
  if (res.status !== status) throw new Error(`${method} ${path}: ${res.status} ${res.text}`)
  return res.body as T
}

beforeEach(async () => {
  t = await createTestApp()
  await ExerciseModel.bulkCreate(exerciseLibrary.map((e) => ({ ...e, ownerId: null })))
  exercise = new Map((await ExerciseModel.findAll()).map((e) => [e.name, e.id]))
  coach = await t.userWithToken('coach')
  lifter = await t.userWithToken('lifter')
  other = await t.userWithToken('lifter')
  await t.linkCoach(coach.user.id, lifter.user.id)
  await t.linkCoach(coach.user.id, other.user.id)
  const slots = (bench: string, fly: string) => [
    { exerciseId: exercise.get(bench)!, role: 'compound_primary', scheme: DEFAULT_SCHEMES.compound_primary, restSec: 180 },
    { exerciseId: exercise.get(fly)!, role: 'isolation', scheme: DEFAULT_SCHEMES.isolation, restSec: 90 },
  ]
  plan = (await ok<{ plan: Plan }>(coach.auth, 'post', '/api/plans', {
    name: 'Press', days: [{ name: 'Press', isRest: false, versions: { I: slots('Barbell bench press', 'Cable chest fly'), II: slots('Incline barbell bench press', 'Machine chest fly') } }],
  }, 201)).plan
  await ok(coach.auth, 'post', `/api/plans/${plan.id}/assignments`, { athleteIds: [lifter.user.id, other.user.id], startDate: day(0).toISOString().slice(0, 10) }, 201)
  // A gym with a pair of 0.5 kg plates besides the usual ones: a 1 kg step on the bar.
  const gym = { ...KG_GYM, barbell: { ...KG_GYM_SET, plates: [...KG_GYM_SET.plates, { mass: 0.5, count: 1 }] } }
  await EquipmentProfileModel.create({ userId: lifter.user.id, name: 'My gym', spec: gym, isDefault: true })

  // Five weekly sessions of version I, written as the runner would have stored them.
  const assignment = (await AssignmentModel.findOne({ where: { athleteId: lifter.user.id } }))!
  const benchSlot = plan.days[0].versions.I[0]
  const history: Array<[number, number]> = [[100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7]]
  for (const [i, [loadKg, reps]] of history.entries()) {
    const at = day(7 * i)
    const session = await SessionModel.create({
      athleteId: lifter.user.id, assignmentId: assignment.id, planDayId: plan.days[0].id, dayName: 'Press', versionLabel: 'I',
      status: 'completed', startedAt: at, completedAt: new Date(at.getTime() + 3_600_000), summary: { workingSets: 1, volumeKg: loadKg * reps }, note: null,
      rotationIndex: 2 * i,
    })
    await SetLogModel.create({
      id: randomUUID(), sessionId: session.id, exerciseId: benchSlot.exerciseId, slotId: benchSlot.id, role: 'compound_primary', position: 0,
      kind: 'top', targetLoadKg: loadKg, targetRepsMin: 6, targetRepsMax: 9, targetReps: reps, toFailure: true, targetRir: null,
      loadKg, reps, rir: 0, failure: true, note: null, loggedAt: at,
    })
    lastSessionId = session.id
  }
  await assignment.update({ rotationIndex: 2 * history.length })
})

afterEach(async () => {
  await t.close()
})

const report = (who: Auth = lifter.auth) => ok<{ report: SessionReport }>(who, 'get', `/api/sessions/${lastSessionId}/report`).then((r) => r.report)
const bench = (r: SessionReport) => r.exercises.find((e) => e.name === 'Barbell bench press')!
const take = (who: Auth, steps: unknown[], status = 200) =>
  request(t.app).post(`/api/sessions/${lastSessionId}/next-steps`).set(who).send({ steps }).then((res) => {
    expect(res.status, res.text).toBe(status)
    return res.body as { report: SessionReport }
  })
/** Starts version I of the Press day, as the lifter would from Train. */
async function nextPressI(who: Auth = lifter.auth): Promise<RunSession> {
  return (await ok<{ session: RunSession }>(who, 'post', '/api/sessions', { dayId: plan.days[0].id, version: 'I' }, 201)).session
}
const working = (s: RunSession, exerciseId: number) => s.sets.filter((x) => x.exerciseId === exerciseId && x.kind !== 'warmup')

describe('POST /api/sessions/:id/next-steps with a plateau option', () => {
  it('offers every option on a stalled lift and none on a lift that was not done', async () => {
    const r = await report()
    expect(bench(r).plateau!.options.map((o) => o.kind)).toEqual(['microload', 'rotate_version', 'add_set', 'deload'])
    expect(bench(r).plateau!.options[0]).toMatchObject({ targetLoadKg: 103.5, targetReps: 7 })
  })

  it('takes the smaller load step: the next session aims at 103.5 kg x 7', async () => {
    const taken = await take(lifter.auth, [{ exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'microload' }])
    expect(bench(taken.report).taken).toMatchObject({ option: 'microload', targetLoadKg: 103.5, targetReps: 7, by: 'lifter' })
    const top = working(await nextPressI(), exercise.get('Barbell bench press')!)[0]
    expect(top).toMatchObject({ kind: 'top', targetLoadKg: 103.5, targetReps: 7 })
  })

  it('adds a set from now on for this lifter only, and the coach\'s plan stays as written', async () => {
    await take(lifter.auth, [{ exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'add_set' }])
    const sets = working(await nextPressI(), exercise.get('Barbell bench press')!)
    expect(sets.map((s) => s.kind)).toEqual(['top', 'backoff', 'backoff'])
    expect(sets[2]).toMatchObject({ toFailure: false, targetRir: 2 })
    expect((await SlotAdjustmentModel.findOne({ where: { athleteId: lifter.user.id } }))!.extraSets).toBe(1)
    const unchanged = (await ok<{ plan: Plan }>(coach.auth, 'get', `/api/plans/${plan.id}`)).plan
    expect(unchanged.days[0].versions.I[0].scheme.sets).toHaveLength(2)
    const theirs = await nextPressI(other.auth)
    expect(working(theirs, exercise.get('Barbell bench press')!)).toHaveLength(2)
  })

  it('makes the next session a deload: about 90 % of the load, half the sets, short of failure', async () => {
    await take(lifter.auth, [{ exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'deload' }])
    const sets = working(await nextPressI(), exercise.get('Barbell bench press')!)
    expect(sets).toHaveLength(1)
    // The next step from 102.5 x 7 is one more rep at 102.5 kg; 90 % of it is 92.25 kg, and this gym makes
    // 91 kg below it (35.5 kg a side: 25 + 10 + 0.5).
    expect(sets[0]).toMatchObject({ deload: true, toFailure: false, targetRir: 3, targetLoadKg: 91, targetReps: 8 })
  })

  it('rotates the day\'s version to fresh exercises of the same patterns for this lifter only, when the coach takes it', async () => {
    const taken = await take(coach.auth, [{ exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'rotate_version' }])
    expect(bench(taken.report).taken).toMatchObject({ option: 'rotate_version', by: 'coach', status: 'edited' })
    const session = await nextPressI()
    const names = session.exercises.map((e) => e.name)
    expect(names).not.toContain('Barbell bench press')
    expect(names).not.toContain('Incline barbell bench press') // the other version's exercise stays the other version's
    expect(names).toContain('Dumbbell chest fly') // the only chest fly neither version uses
    const library = await ExerciseModel.findAll()
    for (const e of session.exercises) {
      const slot = plan.days[0].versions.I.find((s) => s.id === e.slotId)!
      expect(library.find((l) => l.id === e.exerciseId)!.pattern).toBe(slot.pattern)
    }
    // The plan and the other lifter keep the coach's exercises.
    const theirs = await nextPressI(other.auth)
    expect(theirs.exercises.map((e) => e.name)).toEqual(['Barbell bench press', 'Cable chest fly'])
  })

  it('rotates once when two lifts of the session take the fresh exercises', async () => {
    // The fly stalls too: 20 kg x 15 three times, then 22.5 kg x 10 twice (Epley 30.0 kg each time).
    const flySlot = plan.days[0].versions.I[1]
    const sessions = await SessionModel.findAll({ where: { athleteId: lifter.user.id }, order: [['completedAt', 'ASC']] })
    for (const [i, [loadKg, reps]] of ([[20, 15], [20, 15], [20, 15], [22.5, 10], [22.5, 10]] as const).entries()) {
      await SetLogModel.create({
        id: randomUUID(), sessionId: sessions[i].id, exerciseId: flySlot.exerciseId, slotId: flySlot.id, role: 'isolation', position: 100,
        kind: 'straight', targetLoadKg: loadKg, targetRepsMin: 12, targetRepsMax: 20, targetReps: 15, toFailure: true, targetRir: null,
        loadKg, reps, rir: 0, failure: true, note: null, loggedAt: sessions[i].startedAt,
      })
    }
    const fly = (await report()).exercises.find((e) => e.name === 'Cable chest fly')!
    expect(fly.plateau!.options.map((o) => o.kind)).toContain('rotate_version')
    await take(lifter.auth, [
      { exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'rotate_version' },
      { exerciseId: exercise.get('Cable chest fly'), slotId: flySlot.id, option: 'rotate_version' },
    ])
    // A second rotation would have moved the fly on again, off the one fly neither version used.
    const names = (await nextPressI()).exercises.map((e) => e.name)
    expect(names).toContain('Dumbbell chest fly')
    expect(await SlotAdjustmentModel.count({ where: { athleteId: lifter.user.id } })).toBe(2)
  })

  it('refuses an option the engine does not offer, and anyone but the lifter and their coach', async () => {
    const res = await request(t.app).post(`/api/sessions/${lastSessionId}/next-steps`).set(lifter.auth)
      .send({ steps: [{ exerciseId: exercise.get('Cable chest fly'), slotId: plan.days[0].versions.I[1].id, option: 'deload' }] })
    expect(res.status).toBe(400)
    const stranger = await t.userWithToken('coach')
    const refused = await request(t.app).post(`/api/sessions/${lastSessionId}/next-steps`).set(stranger.auth)
      .send({ steps: [{ exerciseId: exercise.get('Barbell bench press'), slotId: plan.days[0].versions.I[0].id, option: 'deload' }] })
    expect(refused.status).toBe(404)
    expect(await SlotAdjustmentModel.count()).toBe(0)
  })
})

describe('starting loads', () => {
  it('asks on the set card for a lift with no history, and plans it from the recent set the lifter enters', async () => {
    const session = await nextPressI()
    const fly = exercise.get('Cable chest fly')!
    expect(working(session, fly).every((s) => s.targetLoadKg === null)).toBe(true)
    const { session: planned } = await ok<{ session: RunSession }>(lifter.auth, 'post', `/api/sessions/${session.id}/start-estimate`, {
      exerciseId: fly, slotId: plan.days[0].versions.I[1].id, loadKg: 30, reps: 12,
    })
    // Epley: 30 x 12 -> 42 kg; the middle of 12-20 (16 reps) to failure: 42 / (1 + 16/30) = 27.4 -> 25 kg on the stack.
    const sets = working(planned, fly)
    expect(sets.map((s) => s.targetLoadKg)).toEqual([25, 25])
    expect(sets.every((s) => s.targetReps === 16)).toBe(true)
  })

  it('lets the coach give starting loads: a recent set per exercise of the athlete\'s plan', async () => {
    const before = await ok<StartEstimatesAnswer>(coach.auth, 'get', `/api/athletes/${lifter.user.id}/start-estimates`)
    expect(before.estimates.find((e) => e.exerciseName === 'Barbell bench press')).toMatchObject({ hasHistory: true, e1rmKg: null })
    expect(before.estimates.find((e) => e.exerciseName === 'Cable chest fly')).toMatchObject({ hasHistory: false, e1rmKg: null })
    const after = await ok<StartEstimatesAnswer>(coach.auth, 'put', `/api/athletes/${lifter.user.id}/start-estimates`, {
      estimates: [{ exerciseId: exercise.get('Cable chest fly'), loadKg: 30, reps: 12 }],
    })
    expect(after.estimates.find((e) => e.exerciseName === 'Cable chest fly')).toMatchObject({ e1rmKg: 42, loadKg: 30, reps: 12, setBy: 'coach' })
    const sets = working(await nextPressI(), exercise.get('Cable chest fly')!)
    expect(sets.map((s) => s.targetLoadKg)).toEqual([25, 25])
    // Only that athlete's coach; an exercise outside the plan is refused.
    expect((await request(t.app).get(`/api/athletes/${lifter.user.id}/start-estimates`).set(other.auth)).status).toBe(403)
    const outside = await request(t.app).put(`/api/athletes/${lifter.user.id}/start-estimates`).set(coach.auth)
      .send({ estimates: [{ exerciseId: exercise.get('Back squat'), loadKg: 100, reps: 5 }] })
    expect(outside.status).toBe(400)
  })
})
