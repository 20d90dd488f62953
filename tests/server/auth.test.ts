import jwt from 'jsonwebtoken'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { UserModel } from '../../server/db'
import { createTestApp, TEST_PASSWORD, type TestApp } from '../helpers/test-app'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('POST /api/auth/register', () => {
  it('creates a lifter, stores only a bcrypt hash, and returns a token that works', async () => {
    const res = await request(t.app)
      .post('/api/auth/register')
      .send({ name: 'Rita Lane', email: 'Rita@Example.test', password: 'a-long-password', role: 'lifter', unit: 'lb' })
    expect(res.status).toBe(201)
    expect(res.body.user).toMatchObject({ name: 'Rita Lane', email: 'rita@example.test', role: 'lifter', unit: 'lb' })
    expect(res.body.user).not.toHaveProperty('passwordHash')

    const row = await UserModel.findOne({ where: { email: 'rita@example.test' } })
    expect(row?.passwordHash).toMatch(/^\$2[aby]\$1\d\$/) // bcrypt, cost >= 10
    expect(row?.passwordHash).not.toContain('a-long-password')

    const me = await request(t.app).get('/api/me').set('Authorization', `Bearer ${res.body.token}`)
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe('rita@example.test')
  })

  it('refuses a second account with the same e-mail', async () => {
    const body = { name: 'Sam', email: 'sam@example.test', password: 'a-long-password', role: 'coach' }
    expect((await request(t.app).post('/api/auth/register').send(body)).status).toBe(201)
    const again = await request(t.app).post('/api/auth/register').send(body)
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('email_taken')
  })

  it('answers 400 naming each bad field, and never lets anyone register as admin', async () => {
    const res = await request(t.app)
      .post('/api/auth/register')
      .send({ name: '', email: 'not-an-email', password: 'short', role: 'admin' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('validation_failed')
    const paths = res.body.error.issues.map((i: { path: string }) => i.path).sort()
    expect(paths).toEqual(['email', 'name', 'password', 'role'])
  })

  it('answers 400 for a body that is not JSON, without a stack trace', async () => {
    const res = await request(t.app)
      .post('/api/auth/register')
      .set('Content-Type', 'application/json')
      .send('{"name": ')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_json')
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/)
  })
})

describe('POST /api/auth/sign-in', () => {
  it('signs in with the right password', async () => {
    const { user } = await t.userWithToken('lifter')
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.token).toEqual(expect.any(String))
  })

  it('answers 401 for a wrong password and for an unknown e-mail alike', async () => {
    const { user } = await t.userWithToken('lifter')
    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: 'not-the-password' })
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: 'nobody@example.test', password: 'whatever-123' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.error.code).toBe('invalid_credentials')
    expect(unknown.body).toEqual(wrong.body)
  })

  it('refuses a switched-off account', async () => {
    const { user } = await t.userWithToken('lifter')
    await user.update({ active: false })
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('account_disabled')
  })
})

describe('tokens', () => {
  it('refuses a request with no token', async () => {
    const res = await request(t.app).get('/api/me')
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('unauthenticated')
  })

  it('refuses an expired token', async () => {
    const { user } = await t.userWithToken('lifter')
    const expired = jwt.sign({ ver: 0, exp: Math.floor(Date.now() / 1000) - 60 }, t.config.jwtSecret, { subject: String(user.id) })
    const res = await request(t.app).get('/api/me').set('Authorization', `Bearer ${expired}`)
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('token_expired')
  })

  it('refuses a token signed with another secret', async () => {
    const { user } = await t.userWithToken('lifter')
    const forged = jwt.sign({ ver: 0 }, 'x'.repeat(48), { subject: String(user.id), expiresIn: '1h' })
    const res = await request(t.app).get('/api/me').set('Authorization', `Bearer ${forged}`)
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('invalid_token')
  })

  it('expires tokens after the configured time', async () => {
    // A second app over the same database, configured with a one-second token lifetime.
    const shortLived = createApp({ ...t.config, jwtTtl: '1s' }, { mailer: t.mailer })
    const { user } = await t.userWithToken('lifter')
    const signIn = await request(shortLived).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    const auth = { Authorization: `Bearer ${signIn.body.token}` }
    expect((await request(shortLived).get('/api/me').set(auth)).status).toBe(200)
    await new Promise((r) => setTimeout(r, 2100))
    const res = await request(shortLived).get('/api/me').set(auth)
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('token_expired')
  })

  it('stops old tokens when the token version is bumped (password change, switch-off)', async () => {
    const { user, auth } = await t.userWithToken('lifter')
    await user.update({ tokenVersion: user.tokenVersion + 1 })
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(401)
  })
})

describe('the signed-in user', () => {
  it('changes their unit and records the cautions once', async () => {
    const { auth } = await t.userWithToken('lifter')
    const patched = await request(t.app).patch('/api/me').set(auth).send({ unit: 'lb' })
    expect(patched.status).toBe(200)
    expect(patched.body.user.unit).toBe('lb')
    expect(patched.body.user.cautionsAcknowledgedAt).toBeNull()

    const first = await request(t.app).post('/api/me/cautions').set(auth)
    expect(first.body.user.cautionsAcknowledgedAt).toEqual(expect.any(String))
    const second = await request(t.app).post('/api/me/cautions').set(auth)
    expect(second.body.user.cautionsAcknowledgedAt).toBe(first.body.user.cautionsAcknowledgedAt)
  })

  it('cannot change their own role through the profile', async () => {
    const { auth } = await t.userWithToken('lifter')
    const res = await request(t.app).patch('/api/me').set(auth).send({ role: 'admin' })
    expect(res.status).toBe(400)
    const me = await request(t.app).get('/api/me').set(auth)
    expect(me.body.user.role).toBe('lifter')
  })

  it('signs out with 204', async () => {
    const { auth } = await t.userWithToken('coach')
    expect((await request(t.app).post('/api/auth/sign-out').set(auth)).status).toBe(204)
  })
})

describe('POST /api/me/password', () => {
  it('changes the password, signs out every other device, and keeps this one signed in with a new token', async () => {
    const { user, auth } = await t.userWithToken('lifter')
    const otherDevice = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    expect(otherDevice.status).toBe(200)

    const res = await request(t.app)
      .post('/api/me/password')
      .set(auth)
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'a-fresh-long-password' })
    expect(res.status).toBe(200)
    expect(res.body.user.id).toBe(user.id)

    // Both tokens issued before the change are refused; the one handed back works.
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(401)
    expect((await request(t.app).get('/api/me').set('Authorization', `Bearer ${otherDevice.body.token}`)).status).toBe(401)
    expect((await request(t.app).get('/api/me').set('Authorization', `Bearer ${res.body.token}`)).status).toBe(200)

    const oldSignIn = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    expect(oldSignIn.status).toBe(401)
    const newSignIn = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: 'a-fresh-long-password' })
    expect(newSignIn.status).toBe(200)
    const row = await UserModel.findByPk(user.id)
    expect(row?.passwordHash).toMatch(/^\$2[aby]\$1\d\$/)
  })

  it('refuses a wrong current password with a 400 on that field, and keeps the old password and tokens', async () => {
    const { auth } = await t.userWithToken('coach')
    const res = await request(t.app)
      .post('/api/me/password')
      .set(auth)
      .send({ currentPassword: 'not-my-password', newPassword: 'a-fresh-long-password' })
    expect(res.status).toBe(400)
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual(['currentPassword'])
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(200)
  })

  it('applies the same password rules as registration: length, common passwords, and not the same password', async () => {
    const { auth } = await t.userWithToken('lifter')
    const cases = [
      { newPassword: 'short', field: 'newPassword' },
      // On the common-passwords list that ships with zxcvbn-ts, as in the hardening test.
      { newPassword: 'qwertyuiop', field: 'newPassword' },
      { newPassword: TEST_PASSWORD, field: 'newPassword' },
    ]
    for (const { newPassword, field } of cases) {
      const res = await request(t.app).post('/api/me/password').set(auth).send({ currentPassword: TEST_PASSWORD, newPassword })
      expect(res.status, newPassword).toBe(400)
      expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(field)
    }
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(200)
  })

  it('needs a signed-in user', async () => {
    const res = await request(t.app).post('/api/me/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'a-fresh-long-password' })
    expect(res.status).toBe(401)
  })
})

describe('unknown routes', () => {
  it('answers a JSON 404', async () => {
    const res = await request(t.app).get('/api/nothing-here')
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })
})
