import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Role } from '@shared/schemas/common.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { buildUser, stubFetch } from './helpers/fetch-stub'

function signedInAs(role: Role) {
  const session = useSessionStore()
  session.token = 'tok'
  session.user = buildUser({ role })
}

async function navigate(path: string) {
  const router = createAppRouter(createMemoryHistory())
  await router.push(path)
  return router.currentRoute.value
}

beforeEach(() => {
  localStorage.clear()
  setActivePinia(createPinia())
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

describe('router guard', () => {
  it('sends a signed-out visitor to the sign-in page and keeps where they were going', async () => {
    const route = await navigate('/logbook')

    expect(route.name).toBe('sign-in')
    expect(route.query.redirect).toBe('/logbook')
  })

  it('sends a lifter who opens a coach page to Train', async () => {
    signedInAs('lifter')

    expect((await navigate('/athletes')).name).toBe('train')
    expect((await navigate('/review')).name).toBe('train')
  })

  it('sends a coach who opens a lifter page to Athletes, and an admin to Accounts', async () => {
    signedInAs('coach')
    expect((await navigate('/train')).name).toBe('athletes')

    signedInAs('admin')
    expect((await navigate('/plans')).name).toBe('admin-users')
  })

  it('lets every role open Me', async () => {
    for (const role of ['lifter', 'coach', 'admin'] as const) {
      signedInAs(role)
      expect((await navigate('/me')).name).toBe('me')
    }
  })

  it('takes a signed-in user away from the sign-in page to their home', async () => {
    signedInAs('coach')

    expect((await navigate('/sign-in')).name).toBe('athletes')
  })

  it('restores the user from a stored token before deciding', async () => {
    localStorage.setItem(TOKEN_STORAGE_KEY, 'stored-token')
    setActivePinia(createPinia())
    const { requests } = stubFetch({ status: 200, body: { user: buildUser({ role: 'coach' }) } })

    const route = await navigate('/review')

    expect(route.name).toBe('review-desk')
    expect(requests[0]).toMatchObject({ url: '/api/me', headers: { Authorization: 'Bearer stored-token' } })
  })

  it('forgets a stored token the server no longer accepts and asks to sign in', async () => {
    localStorage.setItem(TOKEN_STORAGE_KEY, 'expired-token')
    setActivePinia(createPinia())
    stubFetch({ status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in again' } } })

    const route = await navigate('/train')

    expect(route.name).toBe('sign-in')
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull()
  })
})
