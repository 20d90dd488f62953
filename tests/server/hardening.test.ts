import { spawn } from 'node:child_process'
import { Writable } from 'node:stream'
import express from 'express'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { createApp } from '../../server/app'
import { UserModel } from '../../server/db'
import { PreparedStatement } from '../../server/db/statement-pool'
import { createLogger, LOG_FLUSH_MS } from '../../server/logger'
import { fixedHeaders, helmetForApp } from '../../server/middleware/security'
import { loopbackOnly } from '../../server/routes/dev.routes'
import { createTestApp, TEST_PASSWORD, type TestApp } from '../helpers/test-app'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('security headers', () => {
  it('sends a content security policy that allows only our own origin, and the usual helmet headers', async () => {
    const res = await request(t.app).get('/api/health')
    const csp = res.headers['content-security-policy']
    expect(csp).toContain("default-src 'self'")
    expect(csp).toContain("script-src 'self'")
    expect(csp).toContain("connect-src 'self'")
    expect(csp).toContain("frame-ancestors 'none'")
    expect(csp).not.toMatch(/https?:\/\//) // no other origin anywhere in the policy
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['x-powered-by']).toBeUndefined()
  })

  it('sets exactly the headers helmet itself sets per request with the same options', async () => {
    // Reference: helmet's own middleware run on every request of a bare Express app.
    const reference = express()
    reference.use(helmetForApp())
    reference.get('/api/health', (_req, res) => {
      res.json({ ok: true })
    })
    const pick = (headers: Record<string, unknown>) =>
      Object.fromEntries(Object.entries(headers).filter(([name]) => !['date', 'etag', 'content-length', 'connection', 'content-type', 'vary', 'x-request-id'].includes(name)))
    const ours = pick((await request(t.app).get('/api/health')).headers)
    const helmets = pick((await request(reference).get('/api/health')).headers)
    expect(Object.keys(helmets).length).toBeGreaterThan(8)
    expect(ours).toEqual(helmets)
  })

  it('refuses a helmet set-up that does not finish at once (headers could not be fixed)', () => {
    expect(() => fixedHeaders(() => undefined)).toThrow(/did not finish synchronously/)
  })
})

describe('attempt limits', () => {
  it('answers 429 after the configured number of sign-in attempts from one address', async () => {
    const strict = createApp({ ...t.config, rateLimitAuth: 3 }, { mailer: t.mailer })
    const body = { email: 'nobody@example.test', password: 'wrong-password-1' }
    const codes: number[] = []
    for (let i = 0; i < 5; i++) codes.push((await request(strict).post('/api/auth/sign-in').send(body)).status)
    expect(codes).toEqual([401, 401, 401, 429, 429])
    const limited = await request(strict).post('/api/auth/sign-in').send(body)
    expect(limited.body.error.code).toBe('too_many_attempts')
    // Other endpoints are not counted against it.
    expect((await request(strict).get('/api/health')).status).toBe(200)
  })
})

describe('passwords', () => {
  it('refuses a password from the common-passwords list, naming the field (NIST SP 800-63B 5.1.1.2)', async () => {
    const res = await request(t.app)
      .post('/api/auth/register')
      .send({ name: 'Common', email: 'common@example.test', password: 'qwertyuiop', role: 'lifter' })
    expect(res.status).toBe(400)
    expect(res.body.error.issues).toEqual([expect.objectContaining({ path: 'password' })])
    expect(await UserModel.count({ where: { email: 'common@example.test' } })).toBe(0)
  })

  it('stores bcrypt hashes with a cost of at least 10', async () => {
    const { user } = await t.userWithToken('lifter')
    const cost = Number(/^\$2[aby]\$(\d\d)\$/.exec(user.passwordHash)![1])
    expect(cost).toBeGreaterThanOrEqual(10)
  })
})

describe('logs and errors', () => {
  it('logs requests as JSON with no password or token in them', async () => {
    const lines: string[] = []
    const sink = new Writable({ write: (chunk, _enc, done) => (lines.push(String(chunk)), done()) })
    const logged = createApp({ ...t.config, logLevel: 'info' }, { mailer: t.mailer, logger: createLogger({ logLevel: 'info' }, sink) })
    const { user, token } = await t.userWithToken('lifter')
    await request(logged).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    await request(logged).get('/api/me').set('Authorization', `Bearer ${token}`)
    const text = lines.join('')
    expect(lines.length).toBeGreaterThanOrEqual(2)
    for (const line of lines) expect(() => JSON.parse(line)).not.toThrow()
    expect(text).toContain('/api/me')
    expect(text).not.toContain(TEST_PASSWORD)
    expect(text).not.toContain(token)
    // One short line per request: method, path, status and time, no headers.
    const me = lines.map((l) => JSON.parse(l)).find((l) => l.req?.url === '/api/me')
    expect(me.req).toEqual({ method: 'GET', url: '/api/me' })
    expect(me.res).toEqual({ statusCode: 200 })
    expect(typeof me.responseTime).toBe('number')
  })

  it('in production, buffers log lines but writes each within a second, and the rest on exit', async () => {
    const script = [
      "import { createLogger, LOG_FLUSH_MS } from './server/logger'",
      "const log = createLogger({ logLevel: 'info', env: 'production' })",
      "log.info('first line')",
      // Alive well past the flush interval, then a last line just before a normal exit.
      "setTimeout(() => { log.info('last line'); process.exit(0) }, LOG_FLUSH_MS * 3)",
    ].join('\n')
    const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: process.cwd(), stdio: ['ignore', 'pipe', 'inherit'] })
    const started = Date.now()
    const arrivals: Array<{ msg: string; afterMs: number }> = []
    child.stdout.setEncoding('utf8')
    child.stdout.on('data', (chunk: string) => {
      for (const line of chunk.split('\n').filter(Boolean)) arrivals.push({ msg: JSON.parse(line).msg, afterMs: Date.now() - started })
    })
    const code = await new Promise((resolve) => child.on('exit', resolve))
    expect(code).toBe(0)
    expect(arrivals.map((a) => a.msg)).toEqual(['first line', 'last line'])
    // The first line came out while the process was still running, not only at its exit.
    expect(arrivals[0]!.afterMs).toBeLessThan(arrivals[1]!.afterMs - LOG_FLUSH_MS / 2)
  }, 30_000)

  it('answers an unexpected failure with a plain 500: no stack trace, no SQL', async () => {
    const { auth } = await t.userWithToken('lifter')
    // The sign-in check's read (a prepared statement) fails as SQLite would.
    const spy = vi.spyOn(PreparedStatement.prototype, 'all').mockRejectedValueOnce(new Error('SQLITE_ERROR: no such column: users.secret_sauce (SELECT * FROM users)'))
    const res = await request(t.app).get('/api/me').set(auth)
    spy.mockRestore()
    expect(res.status).toBe(500)
    expect(res.body).toEqual({ error: { code: 'internal', message: 'Something went wrong on our side' } })
    expect(JSON.stringify(res.body)).not.toMatch(/SQLITE|SELECT|\.ts:\d+/)
  })

  it('refuses bodies over 100 kB with 413', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'a@b.co', password: 'x'.repeat(150_000) })
    expect(res.status).toBe(413)
  })
})

describe('the local outbox (no SMTP server configured)', () => {
  it('answers on loopback, where the person running the app reads their invitation links', async () => {
    const res = await request(t.app).get('/api/dev/outbox')
    expect(res.status).toBe(200)
  })

  it('answers 404 to any other address, so reset links never reach another machine', () => {
    const outcome = (remoteAddress: string | undefined) => {
      const next = vi.fn()
      loopbackOnly({ socket: { remoteAddress } } as never, {} as never, next)
      const [error] = next.mock.calls[0] as [unknown]
      return error === undefined ? 'through' : (error as { status: number }).status
    }
    expect(outcome('127.0.0.1')).toBe('through')
    expect(outcome('::1')).toBe('through')
    expect(outcome('::ffff:127.0.0.1')).toBe('through')
    expect(outcome('192.168.1.20')).toBe(404)
    expect(outcome('::ffff:10.0.0.7')).toBe(404)
    expect(outcome('127.0.0.1.evil.example')).toBe(404)
    expect(outcome(undefined)).toBe(404)
  })
})

describe('compression', () => {
  it('compresses answers over 1 KB for a client that accepts gzip, and leaves small ones alone', async () => {
    const { auth } = await t.userWithToken('coach')
    // A coach's own exercises: a dozen of them make a few KB of JSON.
    for (let i = 0; i < 12; i++) {
      const made = await request(t.app).post('/api/exercises').set(auth).send({
        name: `Sled variation ${i}`, pattern: 'squat', primaryMuscles: ['quads'], secondaryMuscles: ['glutes'],
        equipmentKind: 'machine', loadStepKg: 5, defaultRestSec: 120,
      })
      expect(made.status).toBe(201)
    }
    const big = await request(t.app).get('/api/exercises').query({ q: 'Sled variation' }).set(auth).set('Accept-Encoding', 'gzip')
    expect(big.status).toBe(200)
    expect(JSON.stringify(big.body).length).toBeGreaterThan(1024)
    expect(big.headers['content-encoding']).toBe('gzip')
    const small = await request(t.app).get('/api/health').set('Accept-Encoding', 'gzip')
    expect(small.headers['content-encoding']).toBeUndefined()
  })
})
