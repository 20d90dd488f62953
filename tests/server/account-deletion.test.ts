import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ExerciseModel, UserModel } from '../../server/db'
import { createTestApp, TEST_PASSWORD, type TestApp } from '../helpers/test-app'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe("deleting a coach's account", () => {
  it("keeps the exercise they made in their athlete's logbook, as the athlete's own, and deletes the coach", async () => {
    const coach = await t.userWithToken('coach')
    const athlete = await t.userWithToken('lifter')
    const stranger = await t.userWithToken('lifter')
    await t.linkCoach(coach.user.id, athlete.user.id)
    const made = await request(t.app).post('/api/exercises').set(coach.auth).send({
      name: 'Harbour sled push', pattern: 'squat', primaryMuscles: ['quads'], secondaryMuscles: ['glutes'],
      equipmentKind: 'machine', loadStepKg: 5, defaultRestSec: 120,
    })
    expect(made.status).toBe(201)
    const exerciseId: number = made.body.exercise.id

    // The athlete trains with it: an empty session, the exercise added, one set logged.
    const started = await request(t.app).post('/api/sessions').set(athlete.auth).send({ empty: true })
    expect(started.status).toBe(201)
    const sessionId: number = started.body.session.id
    const added = await request(t.app).post(`/api/sessions/${sessionId}/exercises`).set(athlete.auth).send({ exerciseId, role: 'accessory' })
    expect(added.status, JSON.stringify(added.body)).toBe(200)
    const now = new Date().toISOString()
    const logged = await request(t.app).put(`/api/sessions/${sessionId}/sets/${randomUUID()}`).set(athlete.auth).send({
      exerciseId, slotId: null, position: 900, kind: 'straight', targetLoadKg: 80, targetRepsMin: 8, targetRepsMax: 12, targetReps: null,
      toFailure: false, targetRir: 2, loadKg: 80, reps: 10, rir: 2, failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
    })
    expect(logged.status, JSON.stringify(logged.body)).toBe(200)

    const gone = await request(t.app).delete('/api/me').set(coach.auth).send({ password: TEST_PASSWORD })
    expect(gone.status).toBe(204)
    expect(await UserModel.findByPk(coach.user.id)).toBeNull()

    // The athlete's session still shows the sets under the same name, now on the athlete's own copy.
    const detail = await request(t.app).get(`/api/sessions/${sessionId}`).set(athlete.auth)
    expect(detail.status).toBe(200)
    const sets = detail.body.session.sets.filter((s: { exerciseName?: string; exerciseId: number }) => s.exerciseId !== exerciseId)
    expect(sets.length).toBeGreaterThan(0)
    const copies = await ExerciseModel.findAll({ where: { name: 'Harbour sled push' } })
    expect(copies.map((e) => e.ownerId)).toEqual([athlete.user.id])
    expect(detail.body.session.sets.every((s: { exerciseId: number }) => s.exerciseId === copies[0]!.id)).toBe(true)
    // Nobody else sees it in their library.
    const search = await request(t.app).get('/api/exercises').query({ q: 'Harbour sled' }).set(stranger.auth)
    expect(search.body.exercises).toEqual([])
    const own = await request(t.app).get('/api/exercises').query({ q: 'Harbour sled' }).set(athlete.auth)
    expect(own.body.exercises.map((e: { name: string }) => e.name)).toEqual(['Harbour sled push'])
  })
})
