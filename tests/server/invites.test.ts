import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CoachAthleteModel, InviteModel, SessionModel, UserModel } from '../../server/db'
import { buildCompletedSession } from '../helpers/builders'
import { createTestApp, TEST_PASSWORD, type TestApp } from '../helpers/test-app'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let coach: Actor

beforeAll(async () => {
  t = await createTestApp()
  coach = await t.userWithToken('coach', 'coach-inv')
})
afterAll(async () => {
  await t.close()
})

/** The link in the newest e-mail to this address, read from the fake SMTP server's outbox. */
async function linkSentTo(email: string, path: 'invite' | 'reset-password') {
  for (let i = 0; i < 50; i++) {
    const message = (await t.outbox()).find((m) => m.to.includes(email))
    const match = message?.text.match(new RegExp(`${t.config.appUrl}/${path}/([A-Za-z0-9_-]+)`))
    if (match && message) return { token: match[1], message }
    await new Promise((r) => setTimeout(r, 20))
  }
  throw new Error(`no ${path} e-mail to ${email}`)
}

describe('invitations', () => {
  it('e-mails a single-use link through SMTP; the new lifter sets a password and is linked to the coach', async () => {
    const res = await request(t.app).post('/api/invites').set(coach.auth).send({ name: 'Dana Wells', email: 'dana@example.test' })
    expect(res.status).toBe(201)
    const { token, message } = await linkSentTo('dana@example.test', 'invite')
    expect(message.subject).toContain('coach-inv')
    expect(message.html).toContain(`/invite/${token}`)
    // Only a hash of the token is stored.
    expect((await InviteModel.findByPk(res.body.invite.id))!.tokenHash).not.toContain(token)

    const preview = await request(t.app).get(`/api/invites/${token}`)
    expect(preview.body.invite).toMatchObject({ coachName: 'coach-inv', email: 'dana@example.test', existingAccount: false })

    const accepted = await request(t.app).post(`/api/invites/${token}/accept`).send({ password: 'a-new-long-password' })
    expect(accepted.status).toBe(200)
    expect(accepted.body.user).toMatchObject({ email: 'dana@example.test', role: 'lifter', name: 'Dana Wells' })
    const athletes = await request(t.app).get('/api/athletes').set(coach.auth)
    expect(athletes.body.athletes.map((a: { email: string }) => a.email)).toContain('dana@example.test')
    // The new lifter is signed in by the answer.
    expect((await request(t.app).get('/api/me').set('Authorization', `Bearer ${accepted.body.token}`)).status).toBe(200)

    const reused = await request(t.app).post(`/api/invites/${token}/accept`).send({ password: 'another-long-password' })
    expect(reused.status).toBe(410)
    expect(reused.body.error.code).toBe('invite_used')
  })

  it('stores the unit a new lifter picks (kg when none is sent); their gym then starts from that preset', async () => {
    for (const [name, email, body, unit] of [
      ['Ivo Brandt', 'ivo@example.test', { password: 'a-new-long-password', unit: 'lb' }, 'lb'],
      ['Kit Moreau', 'kit@example.test', { password: 'a-new-long-password' }, 'kg'],
    ] as const) {
      await request(t.app).post('/api/invites').set(coach.auth).send({ name, email })
      const { token } = await linkSentTo(email, 'invite')
      const accepted = await request(t.app).post(`/api/invites/${token}/accept`).send(body)
      expect(accepted.status).toBe(200)
      expect(accepted.body.user.unit).toBe(unit)
      expect((await UserModel.findOne({ where: { email } }))!.unit).toBe(unit)
      const gym = await request(t.app).get('/api/me/gym').set('Authorization', `Bearer ${accepted.body.token}`)
      expect(gym.body.gym.barbell).toMatchObject({ unit, barMass: unit === 'lb' ? 45 : 20 })
    }
  })

  it('refuses a unit other than kg or lb and makes no account', async () => {
    await request(t.app).post('/api/invites').set(coach.auth).send({ name: 'Lou Tan', email: 'lou@example.test' })
    const { token } = await linkSentTo('lou@example.test', 'invite')
    const res = await request(t.app).post(`/api/invites/${token}/accept`).send({ password: 'a-new-long-password', unit: 'stone' })
    expect(res.status).toBe(400)
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual(['unit'])
    expect(await UserModel.count({ where: { email: 'lou@example.test' } })).toBe(0)
  })

  it('leaves an existing lifter\'s unit as it is whatever the body says', async () => {
    const lifter = await t.userWithToken('lifter', 'keeps-unit')
    await request(t.app).post('/api/invites').set(coach.auth).send({ name: 'Keeps', email: lifter.user.email })
    const { token } = await linkSentTo(lifter.user.email, 'invite')
    expect((await request(t.app).post(`/api/invites/${token}/accept`).set(lifter.auth).send({ unit: 'lb' })).status).toBe(200)
    expect((await UserModel.findByPk(lifter.user.id))!.unit).toBe('kg')
  })

  it('refuses an expired link', async () => {
    await request(t.app).post('/api/invites').set(coach.auth).send({ name: 'Eli Park', email: 'eli@example.test' })
    const { token } = await linkSentTo('eli@example.test', 'invite')
    await InviteModel.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { email: 'eli@example.test' } })
    const res = await request(t.app).post(`/api/invites/${token}/accept`).send({ password: 'a-new-long-password' })
    expect(res.status).toBe(410)
    expect(res.body.error.code).toBe('invite_expired')
    expect(await UserModel.count({ where: { email: 'eli@example.test' } })).toBe(0)
  })

  it('lets an existing lifter accept only while signed in as the invited e-mail', async () => {
    const lifter = await t.userWithToken('lifter', 'existing-lifter')
    await request(t.app).post('/api/invites').set(coach.auth).send({ name: 'Existing', email: lifter.user.email })
    const { token } = await linkSentTo(lifter.user.email, 'invite')
    expect((await request(t.app).get(`/api/invites/${token}`)).body.invite.existingAccount).toBe(true)
    const anonymous = await request(t.app).post(`/api/invites/${token}/accept`).send({})
    expect(anonymous.status).toBe(401)
    expect(anonymous.body.error.code).toBe('sign_in_to_accept')
    const someoneElse = await t.userWithToken('lifter')
    expect((await request(t.app).post(`/api/invites/${token}/accept`).set(someoneElse.auth).send({})).status).toBe(401)
    const ok = await request(t.app).post(`/api/invites/${token}/accept`).set(lifter.auth).send({})
    expect(ok.status).toBe(200)
    expect(await CoachAthleteModel.count({ where: { coachId: coach.user.id, athleteId: lifter.user.id } })).toBe(1)
  })

  it('answers 404 for a made-up link and 400 for one that is not a token', async () => {
    expect((await request(t.app).get('/api/invites/' + 'x'.repeat(43))).status).toBe(404)
    expect((await request(t.app).get('/api/invites/not a token')).status).toBe(400)
  })

  it('is for coaches only, and validates the name and e-mail', async () => {
    const lifter = await t.userWithToken('lifter')
    expect((await request(t.app).post('/api/invites').set(lifter.auth).send({ name: 'X', email: 'x@example.test' })).status).toBe(403)
    const bad = await request(t.app).post('/api/invites').set(coach.auth).send({ name: '', email: 'nope' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'name'])
  })

  it('removes an athlete from the coach, and the athlete keeps their data', async () => {
    const athlete = await t.userWithToken('lifter', 'leaving')
    await t.linkCoach(coach.user.id, athlete.user.id)
    const session = await buildCompletedSession(athlete.user.id)
    const res = await request(t.app).delete(`/api/athletes/${athlete.user.id}`).set(coach.auth)
    expect(res.status).toBe(204)
    expect(await CoachAthleteModel.count({ where: { coachId: coach.user.id, athleteId: athlete.user.id } })).toBe(0)
    expect(await SessionModel.findByPk(session.id)).not.toBeNull()
    expect((await request(t.app).get(`/api/sessions/${session.id}`).set(coach.auth)).status).toBe(404)
    expect((await request(t.app).delete(`/api/athletes/${athlete.user.id}`).set(coach.auth)).status).toBe(404)
  })
})

describe('password reset', () => {
  it('e-mails a one-hour link, sets the new password once, and signs out other devices', async () => {
    const { user, auth } = await t.userWithToken('lifter', 'forgetful')
    const res = await request(t.app).post('/api/auth/password-reset').send({ email: user.email })
    expect(res.status).toBe(202)
    const { token, message } = await linkSentTo(user.email, 'reset-password')
    expect(message.text).toMatch(/Choose a new password/)

    const done = await request(t.app).post(`/api/auth/password-reset/${token}`).send({ password: 'brand-new-password' })
    expect(done.status).toBe(200)
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(401) // the old sign-in ends
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(401)
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: 'brand-new-password' })).status).toBe(200)
    expect((await request(t.app).post(`/api/auth/password-reset/${token}`).send({ password: 'yet-another-password' })).status).toBe(410)
  })

  it('answers the same for an unknown e-mail and sends nothing', async () => {
    const before = (await t.outbox()).length
    const res = await request(t.app).post('/api/auth/password-reset').send({ email: 'nobody-here@example.test' })
    expect(res.status).toBe(202)
    expect((await t.outbox()).length).toBe(before)
  })
})

describe('the development outbox', () => {
  it('lists the messages on a page with clickable links', async () => {
    const page = await request(t.app).get('/dev/outbox')
    expect(page.status).toBe(200)
    expect(page.text).toMatch(/<a href="http:\/\/localhost:\d+\/invite\//)
  })
})
