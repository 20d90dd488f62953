import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiRouter } from '../../server/routes'
import { fillPath, listRoutes } from '../helpers/route-list'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * The routes anyone may call without signing in. Every other route, read from the router's own
 * list so that a new route cannot slip past, must answer 401 to an anonymous request.
 */
const PUBLIC = new Set([
  'GET /health',
  'POST /auth/register',
  'POST /auth/sign-in',
  'POST /auth/password-reset',
  'POST /auth/password-reset/:token',
  'GET /invites/:token',
  'POST /invites/:token/accept',
  // Protected by its short-lived signature instead of the bearer token (a <video> cannot send one).
  'GET /uploads/:id/stream',
])

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('access without signing in', () => {
  const routes = listRoutes(apiRouter({ rateLimitAuth: 10_000 } as Parameters<typeof apiRouter>[0]))

  it('finds the API routes from the router itself', () => {
    expect(routes.length).toBeGreaterThan(40)
    for (const open of PUBLIC) expect(routes.map((r) => `${r.method} ${r.path}`)).toContain(open)
  })

  it('answers 401 on every route that is not public, whatever the body', async () => {
    const leaks: string[] = []
    for (const route of routes) {
      const key = `${route.method} ${route.path}`
      if (PUBLIC.has(key)) continue
      const url = '/api' + fillPath(route.path)
      const res = await request(t.app)[route.method.toLowerCase() as 'get'](url).send({})
      if (res.status !== 401) leaks.push(`${key} -> ${res.status}`)
    }
    expect(leaks).toEqual([])
  })
})
