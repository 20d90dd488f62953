import { afterEach, describe, expect, it, vi } from 'vitest'
import { z } from 'zod/mini'
import { ApiError, request, setAuthToken } from '@/api/client'
import { signIn } from '@/api/auth'
import { listSessions } from '@/api/sessions'
import { stubFetch, buildUser } from './helpers/fetch-stub'

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

describe('api/client request()', () => {
  it('sends JSON to /api with the bearer token that the session set', async () => {
    const { requests } = stubFetch({ status: 200, body: { user: buildUser({ unit: 'lb' }) } })
    setAuthToken('token-123')

    await request('PATCH', '/me', { body: { unit: 'lb' } })

    expect(requests).toHaveLength(1)
    expect(requests[0]).toMatchObject({
      method: 'PATCH',
      url: '/api/me',
      body: { unit: 'lb' },
      headers: { Authorization: 'Bearer token-123', 'Content-Type': 'application/json' },
    })
  })

  it('sends no Authorization header once the token is cleared', async () => {
    const { requests } = stubFetch({ status: 200, body: {} })
    setAuthToken('old-token')
    setAuthToken(null)

    await request('GET', '/me')

    expect(requests[0].headers).not.toHaveProperty('Authorization')
  })

  it('puts defined query values in the URL and leaves undefined ones out', async () => {
    const { requests } = stubFetch({ status: 200, body: { sessions: [] } })

    await listSessions({ athleteId: 12 })

    expect(requests[0].url).toBe('/api/sessions?athleteId=12')
  })

  it('turns a 400 error body into an ApiError carrying each field issue', async () => {
    stubFetch({
      status: 400,
      body: {
        error: {
          code: 'validation_failed',
          message: 'Check the highlighted fields',
          issues: [{ path: 'email', message: 'Enter a valid e-mail address' }],
        },
      },
    })

    const failure = await request('POST', '/auth/register', { body: {} }).catch((e: unknown) => e)

    expect(failure).toBeInstanceOf(ApiError)
    expect(failure).toMatchObject({
      status: 400,
      code: 'validation_failed',
      message: 'Check the highlighted fields',
      issues: [{ path: 'email', message: 'Enter a valid e-mail address' }],
    })
  })

  it('reports a refused sign-in as a 401 ApiError with the server code', async () => {
    stubFetch({ status: 401, body: { error: { code: 'invalid_credentials', message: 'Wrong e-mail or password' } } })

    const failure = await signIn({ email: 'robin@example.com', password: 'nope' }).catch((e: unknown) => e)

    expect(failure).toMatchObject({ status: 401, code: 'invalid_credentials', issues: [] })
  })

  it('rejects a 2xx answer that does not match the expected schema', async () => {
    stubFetch({ status: 200, body: { token: 42 } })

    const failure = await request('GET', '/x', { schema: z.object({ token: z.string() }) }).catch((e: unknown) => e)

    expect(failure).toMatchObject({ code: 'bad_response' })
  })

  it('checks the answer with a schema given as a loader, which starts before the answer arrives', async () => {
    let loaderStartedBeforeFetch = false
    let loaderCalled = false
    vi.stubGlobal('fetch', vi.fn(async () => {
      loaderStartedBeforeFetch = loaderCalled
      return new Response(JSON.stringify({ token: 42 }), { status: 200 })
    }))
    const loader = () => {
      loaderCalled = true
      return Promise.resolve(z.object({ token: z.string() }))
    }

    const failure = await request('GET', '/x', { schema: loader }).catch((e: unknown) => e)

    expect(loaderStartedBeforeFetch).toBe(true)
    expect(failure).toMatchObject({ code: 'bad_response' })
    stubFetch({ status: 200, body: { token: 'tok' } })
    await expect(request('GET', '/x', { schema: loader })).resolves.toEqual({ token: 'tok' })
  })

  it('reports a schema loader that fails (its file could not be fetched) as a network error', async () => {
    stubFetch({ status: 200, body: { token: 'tok' } })

    const failure = await request('GET', '/x', { schema: () => Promise.reject(new TypeError('Failed to fetch dynamically imported module')) }).catch((e: unknown) => e)

    expect(failure).toMatchObject({ status: 0, code: 'network_error' })
  })

  it('reports a dropped connection as an ApiError with status 0', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))

    const failure = await request('GET', '/train/today').catch((e: unknown) => e)

    expect(failure).toMatchObject({ status: 0, code: 'network_error' })
  })

  it('resolves a 204 answer with no body', async () => {
    stubFetch({ status: 204 })

    await expect(request('POST', '/auth/sign-out')).resolves.toBeUndefined()
  })
})

describe('request() with a file', () => {
  it('sends a FormData body as multipart, without a JSON content type', async () => {
    const { requests, fetchMock } = stubFetch({ status: 201, body: { ok: true } })
    const form = new FormData()
    form.append('video', new Blob(['x'], { type: 'video/mp4' }), 'clip.mp4')
    await request('POST', '/sets/abc/video', { body: form })
    const init = fetchMock.mock.calls[0][1] as RequestInit
    expect(init.body).toBe(form)
    expect((init.headers as Record<string, string>)['Content-Type']).toBeUndefined()
    expect(requests[0].method).toBe('POST')
  })
})
