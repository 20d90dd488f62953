import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { UserModel } from '../../server/db'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import { sendDailyDigests } from '../../server/services/review.service'
import type { ReviewDeskRow } from '../../shared/schemas/review.schema'
import type { RunSession } from '../../shared/schemas/run.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

let t: TestApp
const auth: Record<string, { Authorization: string }> = {}

async function signIn(email: string) {
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  return { Authorization: `Bearer ${res.body.token}` }
}
async function mailTo(email: string, subject: RegExp) {
  for (let i = 0; i < 50; i++) {
    const found = (await t.outbox()).find((m) => m.to.includes(email) && subject.test(m.subject))
    if (found) return found
    await new Promise((r) => setTimeout(r, 20))
  }
  throw new Error(`no e-mail to ${email} matching ${subject}`)
}

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
  auth.coach = await signIn(DEMO_ACCOUNTS.coach.email)
  auth.ana = await signIn(DEMO_ACCOUNTS.lifterKg.email)
  auth.chloe = await signIn(DEMO_ACCOUNTS.lifterAdvanced.email)
})
afterAll(async () => {
  await t.close()
})

describe('GET /api/review-desk', () => {
  it("lists the coach's athletes' completed sessions newest first, with the engine's flags", async () => {
    const res = await request(t.app).get('/api/review-desk').query({ status: 'all' }).set(auth.coach)
    expect(res.status).toBe(200)
    const rows: ReviewDeskRow[] = res.body.sessions
    expect(new Set(rows.map((r) => r.athlete.name))).toEqual(new Set(['Ana Kovac', 'Ben Okafor', 'Chloe Lindqvist']))
    const times = rows.map((r) => Date.parse(r.session.completedAt!))
    expect(times).toEqual([...times].sort((a, b) => b - a))
    // The advanced lifter's bench press was made to stall in the demo history.
    const chloeFlags = rows.filter((r) => r.athlete.name === 'Chloe Lindqvist').flatMap((r) => r.flags)
    expect(chloeFlags.some((f) => f.code === 'plateau' && f.exercise === 'Barbell bench press')).toBe(true)
  })

  it('is for coaches only, and a new coach sees nothing of these athletes', async () => {
    expect((await request(t.app).get('/api/review-desk').set(auth.ana)).status).toBe(403)
    const stranger = await t.userWithToken('coach')
    expect((await request(t.app).get('/api/review-desk').set(stranger.auth)).body.sessions).toEqual([])
  })
})

describe('reviewing a session', () => {
  let row: ReviewDeskRow

  beforeAll(async () => {
    const res = await request(t.app).get('/api/review-desk').set(auth.coach)
    row = res.body.sessions.find((r: ReviewDeskRow) => r.athlete.name === 'Ana Kovac')
  })

  it('lets the coach comment on one set, and the lifter read it', async () => {
    const detail = await request(t.app).get(`/api/sessions/${row.session.id}`).set(auth.coach)
    const set = detail.body.session.sets.find((s: { kind: string }) => s.kind === 'top')
    const res = await request(t.app)
      .post(`/api/sessions/${row.session.id}/comments`)
      .set(auth.coach)
      .send({ body: 'Depth looked good; keep the bar path over mid-foot.', setLogId: set.id })
    expect(res.status).toBe(201)
    expect(res.body.comment).toMatchObject({ setLogId: set.id, author: { name: 'Ines Marlowe', role: 'coach' } })

    const seen = await request(t.app).get(`/api/sessions/${row.session.id}/review`).set(auth.ana)
    expect(seen.body.review.comments.map((c: { body: string }) => c.body)).toContain('Depth looked good; keep the bar path over mid-foot.')
  })

  it('refuses a comment on a set of another session, and comments from strangers', async () => {
    const bad = await request(t.app)
      .post(`/api/sessions/${row.session.id}/comments`)
      .set(auth.coach)
      .send({ body: 'x', setLogId: '00000000-0000-4000-8000-000000000000' })
    expect(bad.status).toBe(400)
    expect((await request(t.app).post(`/api/sessions/${row.session.id}/comments`).set(auth.chloe).send({ body: 'hi' })).status).toBe(404)
  })

  it('marks it reviewed, takes it off the waiting queue, and e-mails the lifter', async () => {
    const res = await request(t.app).post(`/api/sessions/${row.session.id}/reviewed`).set(auth.coach)
    expect(res.status).toBe(200)
    expect(res.body.review.reviewedBy).toBe('Ines Marlowe')
    const waiting = await request(t.app).get('/api/review-desk').set(auth.coach)
    expect(waiting.body.sessions.map((r: ReviewDeskRow) => r.session.id)).not.toContain(row.session.id)
    const mail = await mailTo(DEMO_ACCOUNTS.lifterKg.email, /reviewed your/)
    expect(mail.text).toMatch(/left 1 comment/)
    expect((await request(t.app).post(`/api/sessions/${row.session.id}/reviewed`).set(auth.ana)).status).toBe(403)
  })

  it("lets the coach edit the lifter's next step, recorded as edited", async () => {
    const report = (await request(t.app).get(`/api/sessions/${row.session.id}/report`).set(auth.coach)).body.report
    const first = report.exercises[0]
    const res = await request(t.app)
      .post(`/api/sessions/${row.session.id}/next-steps`)
      .set(auth.coach)
      .send({ steps: [{ exerciseId: first.exerciseId, slotId: first.slotId, targetLoadKg: first.nextStep.targetLoadKg, targetReps: first.nextStep.targetReps, edited: false }] })
    expect(res.status).toBe(200)
    expect(res.body.report.exercises[0].taken.status).toBe('edited')
  })
})

describe('e-mail to the coach when a session is finished', () => {
  it('sends one per session when the coach asked for each, and a digest when daily', async () => {
    const started = await request(t.app).post('/api/sessions').query({ date: '2026-12-01', tzOffset: 0 }).set(auth.ana).send({})
    const session: RunSession = started.body.session
    const done = await request(t.app).post(`/api/sessions/${session.id}/complete`).set(auth.ana).send({ completedAt: new Date().toISOString() })
    expect(done.status).toBe(200)
    const mail = await mailTo(DEMO_ACCOUNTS.coach.email, /Ana Kovac finished/)
    expect(mail.html).toContain('/review')

    await request(t.app).patch('/api/me').set(auth.coach).send({ notifyCompleted: 'daily' })
    const coach = (await UserModel.findOne({ where: { email: DEMO_ACCOUNTS.coach.email } }))!
    expect(coach.notifyCompleted).toBe('daily')
    const sent = await sendDailyDigests(t.config, t.mailer, new Date(Date.now() + 60_000))
    expect(sent).toBe(1)
    await mailTo(DEMO_ACCOUNTS.coach.email, /finished today/)
    // Not twice in the same day.
    expect(await sendDailyDigests(t.config, t.mailer, new Date(Date.now() + 120_000))).toBe(0)
  })
})
