import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { setAuthToken } from '@/api/client'
import { getToday } from '@/api/train'
import { createAppRouter } from '@/router'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { useAsync } from '@/composables/useAsync'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  localStorage.clear()
  pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.token = 'tok'
  session.user = buildUser()
  router = createAppRouter(createMemoryHistory())
  await router.push('/logbook')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

function mountWith<T>(load: () => Promise<T>) {
  let result!: ReturnType<typeof useAsync<T>>
  const Probe = defineComponent({
    setup() {
      result = useAsync(load)
      return () => h('div')
    },
  })
  mount(Probe, { global: { plugins: [pinia, router] } })
  return result
}

describe('useAsync', () => {
  it('loads on setup and exposes the data', async () => {
    const today = { plan: null, day: null, planDays: [], nextTraining: null, inProgressSessionId: null, lastSession: null }
    stubFetch({ status: 200, body: today })

    const { data, loading, error } = mountWith(getToday)
    expect(loading.value).toBe(true)
    await flushPromises()
    // The answer's schema loads beside the request (src/api/client.ts).
    await vi.waitFor(() => expect(loading.value).toBe(false))

    expect(data.value).toEqual(today)
    expect(loading.value).toBe(false)
    expect(error.value).toBeUndefined()
  })

  it('keeps the error and loads again on refresh', async () => {
    stubFetch({ status: 500, body: { error: { code: 'internal', message: 'Server error' } } }, { status: 200, body: { plan: null, day: null, planDays: [], nextTraining: null, inProgressSessionId: null, lastSession: null } })

    const { data, error, refresh } = mountWith(getToday)
    await vi.waitFor(() => expect(error.value).toMatchObject({ status: 500 }))

    await refresh()
    expect(error.value).toBeUndefined()
    expect(data.value).toEqual({ plan: null, day: null, planDays: [], nextTraining: null, inProgressSessionId: null, lastSession: null })
  })

  it('on a 401 forgets the session and sends the user to sign in, back to this page afterwards', async () => {
    stubFetch({ status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in again' } } })

    mountWith(getToday)
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'))

    expect(router.currentRoute.value.query.redirect).toBe('/logbook')
    expect(useSessionStore().user).toBeNull()
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull()
  })
})
