import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { AssignmentModel, ExerciseModel, SessionModel } from '../../server/db'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'
import { DEFAULT_SCHEMES } from '../../shared/domain/schemes'
import type { Plan } from '../../shared/schemas/plan.schema'
import { buildCompletedSession } from '../helpers/builders'
import { createTestApp, type TestApp } from '../helpers/test-app'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let coach: Actor, otherCoach: Actor, athlete: Actor, othersAthlete: Actor, selfCoached: Actor
const TODAY = { date: '2026-12-01', tzOffset: 0 }

beforeAll(async () => {
  t = await createTestApp()
  await ExerciseModel.bulkCreate(exerciseLibrary.map((e) => ({ ...e, ownerId: null })))
  coach = await t.userWithToken('coach', 'coach-p')
  otherCoach = await t.userWithToken('coach', 'coach-q')
  athlete = await t.userWithToken('lifter', 'athlete-p')
  othersAthlete = await t.userWithToken('lifter', 'athlete-q')
  selfCoached = await t.userWithToken('lifter', 'solo')
  await t.linkCoach(coach.user.id, athlete.user.id)
  await t.linkCoach(otherCoach.user.id, othersAthlete.user.id)
})
afterAll(async () => {
  await t.close()
})

async function fromTemplate(actor: Actor, templateId: string, name?: string): Promise<Plan> {
  const res = await request(t.app).post('/api/plans/from-template').set(actor.auth).send({ templateId, name })
  expect(res.status).toBe(201)
  return res.body.plan
}

/** The plan as a PUT body (ids kept, so slots keep their history). */
function asInput(plan: Plan) {
  return {
    name: plan.name,
    splitKind: plan.splitKind,
    days: plan.days.map((d) => ({
      id: d.id, name: d.name, isRest: d.isRest,
      versions: {
        I: d.versions.I.map((s) => ({ id: s.id, exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
        II: d.versions.II.map((s) => ({ id: s.id, exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
      },
    })),
  }
}

describe('POST /api/plans/from-template', () => {
  it('builds the upper/lower split with versions I and II on the same skeleton', async () => {
    const plan = await fromTemplate(coach, 'upper_lower', 'Off-season upper / lower')
    expect(plan.days.map((d) => d.name)).toEqual(['Upper', 'Lower', 'Rest'])
    const upper = plan.days[0]
    expect(upper.versions.I.map((s) => s.role)).toEqual(upper.versions.II.map((s) => s.role))
    expect(upper.versions.I.map((s) => s.pattern)).toEqual(upper.versions.II.map((s) => s.pattern))
    expect(upper.versions.I[0].exerciseName).not.toBe(upper.versions.II[0].exerciseName)
    expect(upper.versions.I[0].scheme).toEqual(DEFAULT_SCHEMES.compound_primary)
    expect(upper.versions.I[0].restSec).toBe(180)
  })

  it('answers 400 for an unknown template', async () => {
    const res = await request(t.app).post('/api/plans/from-template').set(coach.auth).send({ templateId: 'nope' })
    expect(res.status).toBe(400)
    expect(res.body.error.issues[0].path).toBe('templateId')
  })
})

describe('editing plans', () => {
  it('renames days, keeps slot ids (and their history), and refuses versions with different skeletons', async () => {
    const plan = await fromTemplate(coach, 'full_body_3')
    const body = asInput(plan)
    body.days[0].name = 'Whole body'
    const res = await request(t.app).put(`/api/plans/${plan.id}`).set(coach.auth).send(body)
    expect(res.status).toBe(200)
    expect(res.body.plan.days[0].name).toBe('Whole body')
    expect(res.body.plan.days[0].versions.I.map((s: { id: number }) => s.id)).toEqual(plan.days[0].versions.I.map((s) => s.id))

    const broken = asInput(plan)
    broken.days[0].versions.II = broken.days[0].versions.II.slice(1)
    const bad = await request(t.app).put(`/api/plans/${plan.id}`).set(coach.auth).send(broken)
    expect(bad.status).toBe(400)
    expect(bad.body.error.issues.map((i: { path: string }) => i.path)).toContain('days.0.versions.II')
  })

  it('refuses a primary compound with four working sets (cap of 3), naming the field', async () => {
    const plan = await fromTemplate(coach, 'full_body_3')
    const body = asInput(plan)
    const top = body.days[0].versions.I[0].scheme.sets[0]
    body.days[0].versions.I[0].scheme = { ...body.days[0].versions.I[0].scheme, sets: [top, { ...top, kind: 'straight' }, { ...top, kind: 'straight' }, { ...top, kind: 'straight' }] }
    const res = await request(t.app).put(`/api/plans/${plan.id}`).set(coach.auth).send(body)
    expect(res.status).toBe(400)
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('days.0.versions.I.0.scheme.sets')
  })

  it('duplicates, renames and archives, and never rewrites logged sessions', async () => {
    const plan = await fromTemplate(coach, 'ppl_twice')
    const copy = await request(t.app).post(`/api/plans/${plan.id}/duplicate`).set(coach.auth)
    expect(copy.status).toBe(201)
    expect(copy.body.plan.name).toBe('Push / Pull / Legs, twice a week (copy)')
    expect(copy.body.plan.days[0].versions.I[0].id).not.toBe(plan.days[0].versions.I[0].id)

    const session = await buildCompletedSession(athlete.user.id)
    const renamed = await request(t.app).patch(`/api/plans/${plan.id}`).set(coach.auth).send({ name: 'PPL block 2', archived: true })
    expect(renamed.body.plan).toMatchObject({ name: 'PPL block 2', archived: true })
    expect((await SessionModel.findByPk(session.id))!.dayName).toBe('Legs')
    const archivedList = await request(t.app).get('/api/plans?archived=true').set(coach.auth)
    expect(archivedList.body.plans.map((p: { id: number }) => p.id)).toContain(plan.id)
  })
})

describe('ownership', () => {
  it("hides a coach's plan from another coach (404) and refuses edits by the athlete on it (403)", async () => {
    const plan = await fromTemplate(coach, 'upper_lower')
    expect((await request(t.app).get(`/api/plans/${plan.id}`).set(otherCoach.auth)).status).toBe(404)
    expect((await request(t.app).put(`/api/plans/${plan.id}`).set(otherCoach.auth).send(asInput(plan))).status).toBe(404)
    await request(t.app).post(`/api/plans/${plan.id}/assignments`).set(coach.auth).send({ athleteIds: [athlete.user.id], startDate: '2026-12-01' })
    expect((await request(t.app).get(`/api/plans/${plan.id}`).set(athlete.auth)).status).toBe(200)
    expect((await request(t.app).put(`/api/plans/${plan.id}`).set(athlete.auth).send(asInput(plan))).status).toBe(403)
  })

  it("does not let a coach assign to another coach's athlete, nor a lifter to someone else", async () => {
    const plan = await fromTemplate(coach, 'upper_lower')
    const res = await request(t.app).post(`/api/plans/${plan.id}/assignments`).set(coach.auth).send({ athleteIds: [othersAthlete.user.id], startDate: '2026-12-01' })
    expect(res.status).toBe(403)
    expect(await AssignmentModel.count({ where: { athleteId: othersAthlete.user.id } })).toBe(0)

    const own = await fromTemplate(selfCoached, 'full_body_3')
    const other = await request(t.app).post(`/api/plans/${own.id}/assignments`).set(selfCoached.auth).send({ athleteIds: [athlete.user.id], startDate: '2026-12-01' })
    expect(other.status).toBe(403)
  })

  it('lets a self-coached lifter assign their own plan to themself, and Train shows its first day', async () => {
    const own = await fromTemplate(selfCoached, 'ppl_spaced', 'My split')
    const res = await request(t.app).post(`/api/plans/${own.id}/assignments`).set(selfCoached.auth).send({ athleteIds: [selfCoached.user.id], startDate: '2026-12-01' })
    expect(res.status).toBe(201)
    const today = await request(t.app).get('/api/train/today').query(TODAY).set(selfCoached.auth)
    expect(today.body.plan.name).toBe('My split')
    expect(today.body.day).toMatchObject({ name: 'Legs', version: 'I' })
  })
})

describe('assigning and rotating', () => {
  it('assigns to the coach\'s athlete from a start date, ending the previous assignment', async () => {
    const first = await fromTemplate(coach, 'upper_lower')
    const second = await fromTemplate(coach, 'ppl_spaced')
    await request(t.app).post(`/api/plans/${first.id}/assignments`).set(coach.auth).send({ athleteIds: [athlete.user.id], startDate: '2026-11-01' })
    const res = await request(t.app).post(`/api/plans/${second.id}/assignments`).set(coach.auth).send({ athleteIds: [athlete.user.id], startDate: '2026-12-01' })
    expect(res.status).toBe(201)
    const active = await AssignmentModel.findAll({ where: { athleteId: athlete.user.id, active: true } })
    expect(active.map((a) => a.planId)).toEqual([second.id])
    expect(active[0].rotationIndex).toBe(0)
    expect(active[0].startDate).toBe('2026-12-01')
  })

  it("proposes fresh exercises of the same patterns for one day's version only, and applies them when confirmed", async () => {
    const plan = await fromTemplate(coach, 'ppl_twice')
    const push = plan.days[0]
    const proposal = await request(t.app).post(`/api/plans/${plan.id}/rotation-proposal`).set(coach.auth).send({ dayId: push.id, version: 'I' })
    expect(proposal.status).toBe(200)
    const swaps = proposal.body.proposal.swaps
    expect(swaps.length).toBe(push.versions.I.length)
    const library = await ExerciseModel.findAll()
    for (const [i, swap] of swaps.entries()) {
      const to = library.find((e) => e.id === swap.toExerciseId)!
      expect(to.pattern).toBe(push.versions.I[i].pattern)
      expect(swap.toExerciseId).not.toBe(push.versions.I[i].exerciseId)
      expect(swap.toExerciseId).not.toBe(push.versions.II[i].exerciseId)
    }
    // Nothing changes until the user confirms.
    expect((await request(t.app).get(`/api/plans/${plan.id}`).set(coach.auth)).body.plan.days[0].versions.I[0].exerciseId).toBe(push.versions.I[0].exerciseId)

    const applied = await request(t.app)
      .post(`/api/plans/${plan.id}/rotation`)
      .set(coach.auth)
      .send({ dayId: push.id, version: 'I', swaps: swaps.map((s: { slotId: number; toExerciseId: number }) => ({ slotId: s.slotId, toExerciseId: s.toExerciseId })) })
    expect(applied.status).toBe(200)
    const after: Plan = applied.body.plan
    expect(after.days[0].versions.I.map((s) => s.exerciseId)).toEqual(swaps.map((s: { toExerciseId: number }) => s.toExerciseId))
    expect(after.days[0].versions.II).toEqual(push.versions.II) // the other version stays
    expect(after.days[0].versions.I.map((s) => s.id)).toEqual(push.versions.I.map((s) => s.id))
  })
})

describe('POST /api/exercises', () => {
  it('lets a coach add their own exercise, which their athletes then see, and refuses lifters', async () => {
    const body = { name: 'Landmine press', pattern: 'vertical_push', primaryMuscles: ['front_delts'], secondaryMuscles: ['chest', 'triceps'], equipmentKind: 'barbell', loadStepKg: 2.5, defaultRestSec: 120 }
    const res = await request(t.app).post('/api/exercises').set(coach.auth).send(body)
    expect(res.status).toBe(201)
    expect(res.body.exercise.custom).toBe(true)
    const seen = await request(t.app).get('/api/exercises').query({ q: 'Landmine' }).set(athlete.auth)
    expect(seen.body.exercises.map((e: { name: string }) => e.name)).toEqual(['Landmine press'])
    const hidden = await request(t.app).get('/api/exercises').query({ q: 'Landmine' }).set(othersAthlete.auth)
    expect(hidden.body.exercises).toEqual([])
    expect((await request(t.app).post('/api/exercises').set(athlete.auth).send({ ...body, name: 'Other' })).status).toBe(403)
  })

  it('reads a bodyweight exercise as body mass plus added load, and keeps no load step of its own unless given', async () => {
    const res = await request(t.app).post('/api/exercises').set(coach.auth).send({
      name: 'Ring dip', pattern: 'horizontal_push', primaryMuscles: ['chest', 'triceps'], secondaryMuscles: [], equipmentKind: 'bodyweight', defaultRestSec: 120,
    })
    expect(res.status).toBe(201)
    expect(res.body.exercise).toMatchObject({ loadMode: 'bodyweight', loadStepKg: 0 })
    const assisted = await request(t.app).post('/api/exercises').set(coach.auth).send({
      name: 'Band-assisted chin-up', pattern: 'vertical_pull', primaryMuscles: ['lats'], secondaryMuscles: [], equipmentKind: 'machine', loadMode: 'assisted', loadStepKg: 5, defaultRestSec: 120,
    })
    expect(assisted.body.exercise).toMatchObject({ loadMode: 'assisted', loadStepKg: 5 })
  })

  it('filters the library by pattern, muscle and equipment', async () => {
    const res = await request(t.app).get('/api/exercises').query({ pattern: 'horizontal_push', equipment: 'barbell', muscle: 'triceps' }).set(coach.auth)
    const names = res.body.exercises.map((e: { name: string }) => e.name)
    expect(names).toContain('Close-grip bench press')
    expect(names).not.toContain('Dumbbell bench press')
  })
})
