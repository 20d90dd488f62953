import fc from 'fast-check'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiRouter } from '../../server/routes'
import { fillPath, listRoutes } from '../helpers/route-list'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * Malformed bodies on every write route, read from the router itself: wrong types, huge
 * strings, negative and NaN-like numbers, unicode, nested junk. The server must never answer
 * 500, must name the bad field in a 400, and must not change the database.
 */
const RUNS = 1000

const junkValue = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.string({ unit: 'grapheme', maxLength: 20 }),
  fc.constantFrom('', ' ', '\u0000', 'NaN', '-1', '1e309', 'x'.repeat(5000), '<script>', "'; DROP TABLE users; --"),
  fc.integer(),
  fc.constantFrom(-1, -0.5, 0, 1e308, Number.MAX_SAFE_INTEGER + 2, -Number.MAX_SAFE_INTEGER),
  fc.double({ noNaN: true }),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.oneof(fc.integer(), fc.string({ maxLength: 5 }), fc.constant(null)), { maxLength: 5 }),
  fc.dictionary(fc.string({ maxLength: 5 }), fc.oneof(fc.integer(), fc.string({ maxLength: 5 })), { maxKeys: 3 }),
)
/** A body that is an object with some field names the routes really use, given junk values. */
const FIELD_NAMES = ['name', 'email', 'password', 'role', 'unit', 'exerciseId', 'slotId', 'loadKg', 'reps', 'rir', 'kind', 'position', 'days', 'steps', 'body', 'athleteIds', 'startDate', 'csv', 'mapping', 'weightKg', 'date', 'completedAt', 'editedAt', 'targetLoadKg', 'dayId', 'version', 'templateId', 'toExerciseId', 'active', 'notifyCompleted']
const junkBody = fc.oneof(
  fc.dictionary(fc.constantFrom(...FIELD_NAMES), junkValue, { minKeys: 1, maxKeys: 6 }),
  fc.array(junkValue, { maxLength: 4 }),
  fc.dictionary(fc.string({ maxLength: 8 }), junkValue, { maxKeys: 4 }),
)

let t: TestApp
let tokens: Record<'lifter' | 'coach' | 'admin', { Authorization: string }>

async function rowCounts() {
  const [rows] = await t.sequelize.query(
    "SELECT (SELECT COUNT(*) FROM users) u, (SELECT COUNT(*) FROM sessions) s, (SELECT COUNT(*) FROM set_logs) l, (SELECT COUNT(*) FROM plans) p, (SELECT COUNT(*) FROM comments) c, (SELECT COUNT(*) FROM invites) i, (SELECT COUNT(*) FROM exercises) e, (SELECT COUNT(*) FROM body_weights) b",
  )
  return rows[0]
}

beforeAll(async () => {
  t = await createTestApp()
  const lifter = await t.userWithToken('lifter')
  const coach = await t.userWithToken('coach')
  const admin = await t.userWithToken('admin')
  await t.linkCoach(coach.user.id, lifter.user.id)
  tokens = { lifter: lifter.auth, coach: coach.auth, admin: admin.auth }
})
afterAll(async () => {
  await t.close()
})

describe('malformed bodies on every write route', () => {
  const routes = listRoutes(apiRouter({ rateLimitAuth: 10_000 } as Parameters<typeof apiRouter>[0]))
    .filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method))
    // The upload takes multipart, not JSON; it is tested with real files elsewhere.
    .filter((r) => r.path !== '/sets/:setId/video')
  const unique = [...new Map(routes.map((r) => [`${r.method} ${r.path}`, r])).values()]

  it('covers the write routes the router has', () => {
    expect(unique.length).toBeGreaterThan(20)
  })

  for (const route of unique) {
    it(`${route.method} ${route.path}: ${RUNS} junk bodies, never a 500, a 400 names the field, nothing written`, async () => {
      const url = '/api' + fillPath(route.path)
      const send = (auth: { Authorization: string } | null, body: unknown) => {
        const req = request(t.app)[route.method.toLowerCase() as 'post'](url)
        return (auth ? req.set(auth) : req).send(body as object)
      }
      // Find an account whose role the route accepts (anonymous for the public ones).
      let auth: { Authorization: string } | null = null
      for (const candidate of [null, tokens.lifter, tokens.coach, tokens.admin]) {
        const res = await send(candidate, { __probe: true })
        if (res.status !== 401 && res.status !== 403) {
          auth = candidate
          break
        }
      }
      const before = await rowCounts()
      await fc.assert(
        fc.asyncProperty(junkBody, async (body) => {
          const res = await send(auth, body)
          expect(res.status, JSON.stringify(res.body)).not.toBe(500)
          if (res.status === 400 && res.body.error.code === 'validation_failed') {
            expect(res.body.error.issues.length).toBeGreaterThan(0)
            for (const issue of res.body.error.issues) expect(issue.path).toEqual(expect.any(String))
          }
          expect(res.status).toBeLessThan(500)
        }),
        { numRuns: RUNS },
      )
      expect(await rowCounts()).toEqual(before)
    }, 120_000)
  }
})
