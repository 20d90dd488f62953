import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createTestApp, type TestApp } from '../helpers/test-app'
import { buildCompletedSession } from '../helpers/builders'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let lifter: Actor, otherLifter: Actor, coach: Actor, otherCoach: Actor, admin: Actor
let sessionId: number

beforeAll(async () => {
  t = await createTestApp()
  lifter = await t.userWithToken('lifter', 'lifter-a')
  otherLifter = await t.userWithToken('lifter', 'lifter-b')
  coach = await t.userWithToken('coach', 'coach-a')
  otherCoach = await t.userWithToken('coach', 'coach-b')
  admin = await t.userWithToken('admin', 'admin-a')
  await t.linkCoach(coach.user.id, lifter.user.id)
  await t.linkCoach(otherCoach.user.id, otherLifter.user.id)
  sessionId = (await buildCompletedSession(lifter.user.id)).id
})
afterAll(async () => {
  await t.close()
})

describe('GET /api/sessions/:id (ownership)', () => {
  it('lets the lifter see their own session with its sets', async () => {
    const res = await request(t.app).get(`/api/sessions/${sessionId}`).set(lifter.auth)
    expect(res.status).toBe(200)
    expect(res.body.session.sets).toHaveLength(1)
    expect(res.body.session.sets[0]).toMatchObject({ exerciseName: 'Test squat', loadKg: 100, reps: 8 })
  })

  it("lets the lifter's coach and an admin see it", async () => {
    expect((await request(t.app).get(`/api/sessions/${sessionId}`).set(coach.auth)).status).toBe(200)
    expect((await request(t.app).get(`/api/sessions/${sessionId}`).set(admin.auth)).status).toBe(200)
  })

  it('hides it from another lifter and from another coach (404, as if it did not exist)', async () => {
    for (const outsider of [otherLifter, otherCoach]) {
      const res = await request(t.app).get(`/api/sessions/${sessionId}`).set(outsider.auth)
      expect(res.status).toBe(404)
      expect(res.body).not.toHaveProperty('session')
    }
  })

  it('answers 400 for an id that is not a number, naming the field', async () => {
    const res = await request(t.app).get('/api/sessions/abc').set(lifter.auth)
    expect(res.status).toBe(400)
    expect(res.body.error.issues[0].path).toBe('params.id')
  })
})

describe('GET /api/sessions (ownership)', () => {
  it("lists a lifter's own sessions, and a coach's athlete's when named", async () => {
    const own = await request(t.app).get('/api/sessions').set(lifter.auth)
    expect(own.body.sessions.map((s: { id: number }) => s.id)).toEqual([sessionId])
    const asCoach = await request(t.app).get(`/api/sessions?athleteId=${lifter.user.id}`).set(coach.auth)
    expect(asCoach.body.sessions).toHaveLength(1)
  })

  it("refuses a lifter asking for someone else's sessions and a coach asking for another coach's athlete", async () => {
    expect((await request(t.app).get(`/api/sessions?athleteId=${lifter.user.id}`).set(otherLifter.auth)).status).toBe(404)
    expect((await request(t.app).get(`/api/sessions?athleteId=${lifter.user.id}`).set(otherCoach.auth)).status).toBe(404)
  })

  it('answers 400 when the limit is out of range', async () => {
    const res = await request(t.app).get('/api/sessions?limit=5000').set(lifter.auth)
    expect(res.status).toBe(400)
    expect(res.body.error.issues[0].path).toBe('query.limit')
  })
})

describe('role checks', () => {
  it('keeps the athletes table for coaches', async () => {
    expect((await request(t.app).get('/api/athletes').set(lifter.auth)).status).toBe(403)
    const res = await request(t.app).get('/api/athletes').set(coach.auth)
    expect(res.status).toBe(200)
    expect(res.body.athletes.map((a: { id: number }) => a.id)).toEqual([lifter.user.id])
    expect(res.body.athletes[0].sessionsLast28Days).toBe(1)
  })

  it("keeps Train for lifters", async () => {
    expect((await request(t.app).get('/api/train/today').set(coach.auth)).status).toBe(403)
    const res = await request(t.app).get('/api/train/today').set(lifter.auth)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ plan: null, day: null, lastSession: { id: sessionId } })
  })

  it('keeps account management for admins, who can switch an account off', async () => {
    expect((await request(t.app).get('/api/admin/users').set(coach.auth)).status).toBe(403)
    const list = await request(t.app).get('/api/admin/users').set(admin.auth)
    expect(list.status).toBe(200)
    expect(list.body.users.length).toBeGreaterThanOrEqual(5)

    const off = await request(t.app).patch(`/api/admin/users/${otherLifter.user.id}`).set(admin.auth).send({ active: false })
    expect(off.status).toBe(200)
    expect(off.body.user.active).toBe(false)
    // The switched-off lifter's token stops working at once.
    expect((await request(t.app).get('/api/me').set(otherLifter.auth)).status).toBe(401)
  })

  it('does not let an admin switch off their own account', async () => {
    const res = await request(t.app).patch(`/api/admin/users/${admin.user.id}`).set(admin.auth).send({ active: false })
    expect(res.status).toBe(409)
  })
})
