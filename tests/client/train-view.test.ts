import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Today } from '@shared/schemas/train.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import TrainView from '@/views/TrainView.vue'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  localStorage.clear()
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser()
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/train')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

const pushDay: Today = {
  plan: { id: 1, name: 'Four-day push / pull / legs' },
  day: {
    id: 3,
    name: 'Push',
    isRest: false,
    version: 'I',
    slots: [
      {
        slotId: 10, exerciseName: 'Bench press', role: 'compound_primary', scheme: 'top set 6-9 to failure + 1 back-off 9-12',
        targets: [
          { kind: 'top', targetLoadKg: 80, repsMin: 6, repsMax: 9, targetReps: 8 },
          { kind: 'backoff', targetLoadKg: 70, repsMin: 9, repsMax: 12, targetReps: null },
        ],
      },
      {
        slotId: 11, exerciseName: 'Cable fly', role: 'isolation', scheme: '2 sets 10-15',
        targets: [{ kind: 'straight', targetLoadKg: 20, repsMin: 10, repsMax: 15, targetReps: null }],
      },
    ],
  },
  planDays: [{ id: 3, name: 'Push', isRest: false }, { id: 4, name: 'Pull', isRest: false }],
  nextTraining: null,
  inProgressSessionId: null,
  lastSession: { id: 40, completedAt: '2026-11-28T18:00:00.000Z', dayName: 'Legs', version: 'II' },
}

async function mountTrain() {
  const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
  await flushPromises()
  return wrapper
}

describe('TrainView', () => {
  it("shows today's plan, day with its version, exercises and the last session", async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay })

    const text = (await mountTrain()).text()

    expect(requests[0]).toMatchObject({ method: 'GET', url: '/api/train/today' })
    expect(text).toContain('Four-day push / pull / legs')
    expect(text).toContain('Push · version I')
    expect(text).toContain('Bench press')
    expect(text).toContain('top set 6-9 to failure + 1 back-off 9-12')
    expect(text).toContain('Last session: Legs · version II')
  })

  it('opens the session page from "Start session"', async () => {
    stubFetch({ status: 200, body: pushDay })
    const wrapper = await mountTrain()

    const start = wrapper.findAll('button').find((button) => button.text() === 'Start session')
    await start!.trigger('click')

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('session-run'))
  })

  it('on a rest day says so and offers no start button', async () => {
    stubFetch({ status: 200, body: { ...pushDay, day: { ...pushDay.day!, name: 'Rest', isRest: true, slots: [] } } })

    const wrapper = await mountTrain()

    expect(wrapper.text()).toContain('Rest day')
    expect(wrapper.text()).not.toContain('Start session')
  })

  it('without a plan tells the lifter to ask their coach', async () => {
    stubFetch({ status: 200, body: { plan: null, day: null, planDays: [], nextTraining: null, inProgressSessionId: null, lastSession: null } })

    expect((await mountTrain()).text()).toContain('Ask your coach to assign you a plan')
  })

  it('shows what failed and loads again from Retry', async () => {
    const { requests } = stubFetch({ status: 500, body: { error: { code: 'internal', message: 'Server error' } } }, { status: 200, body: pushDay })
    const wrapper = await mountTrain()

    const retry = wrapper.findAll('button').find((button) => button.text() === 'Retry')
    expect(wrapper.text()).toContain('Could not load this page')
    await retry!.trigger('click')
    await flushPromises()

    expect(requests).toHaveLength(2)
    expect(wrapper.text()).toContain('Push · version I')
  })
})
