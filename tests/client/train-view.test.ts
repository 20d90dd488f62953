import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Today } from '@shared/schemas/train.schema'
import { setAuthToken } from '@/api/client'
import { EARLY_TODAY_MAX_AGE_MS, startEarlyToday, takeEarlyToday } from '@/api/train'
import { createAppRouter, opensOnTrain } from '@/router'
import { useToday } from '@/composables/useToday'
import { SAVED_TODAY_KEY, saveToday, savedToday } from '@/offline/saved-today'
import { useRunStore } from '@/stores/run'
import { localDay } from '@/utils/dates'
import { useSessionStore } from '@/stores/session'
import TrainView from '@/views/TrainView.vue'
import { buildUser, stubFetch } from './helpers/fetch-stub'
import { buildRunSession } from './helpers/run-fixtures'

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
  takeEarlyToday() // no early answer carries over to the next test
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
  // The answer's schema loads beside the request (src/api/client.ts): wait for the loading state to end.
  await vi.waitFor(() => expect(wrapper.find('.van-skeleton').exists()).toBe(false))
  return wrapper
}

/** The runner's route is lazy (its view loads on the first visit) and the store first reads the phone's copy. */
const openedRunner = () => vi.waitFor(() => expect(router.currentRoute.value.name).toBe('session-run'), { timeout: 5_000 })

describe('TrainView', () => {
  it("shows today's plan, day with its version, exercises and the last session", async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay })

    const text = (await mountTrain()).text()

    expect(requests[0].method).toBe('GET')
    expect(requests[0].url).toMatch(/^\/api\/train\/today\?date=\d{4}-\d{2}-\d{2}&tzOffset=-?\d+$/)
    expect(text).toContain('Four-day push / pull / legs')
    expect(text).toContain('Push · version I')
    expect(text).toContain('Bench press')
    expect(text).toContain('top set 6-9 to failure + 1 back-off 9-12')
    expect(text).toContain('Last session: Legs · version II')
  })

  it("sends the lifter's own calendar day and clock offset", async () => {
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(new Date(2026, 11, 1, 23, 30))
    const { requests } = stubFetch({ status: 200, body: pushDay })

    await mountTrain()
    vi.useRealTimers()

    expect(requests[0].url).toBe(`/api/train/today?date=2026-12-01&tzOffset=${new Date(2026, 11, 1, 23, 30).getTimezoneOffset()}`)
  })

  it('previews each exercise with its targets in the lifter unit', async () => {
    stubFetch({ status: 200, body: pushDay })
    const wrapper = await mountTrain()

    const lines = wrapper.findAll('[data-testid="slot-target"]').map((l) => l.text())

    expect(lines).toEqual(['Top set 80 kg × 6–9 · aim for 8', 'Back-off set 70 kg × 9–12', 'Set 20 kg × 10–15'])
  })

  it('previews a lift with no starting load by its reps, and says its load is set on the first set', async () => {
    const firstTime: Today = {
      ...pushDay,
      day: {
        ...pushDay.day!,
        slots: [
          {
            ...pushDay.day!.slots[0],
            targets: [
              { kind: 'top', targetLoadKg: null, repsMin: 6, repsMax: 9, targetReps: 7 },
              { kind: 'backoff', targetLoadKg: null, repsMin: 9, repsMax: 12, targetReps: 9 },
            ],
          },
          pushDay.day!.slots[1],
        ],
      },
    }
    stubFetch({ status: 200, body: firstTime })
    const wrapper = await mountTrain()

    expect(wrapper.findAll('[data-testid="slot-target"]').map((l) => l.text())).toEqual([
      'Top set 6–9 reps · aim for 7',
      'Back-off set 9–12 reps · aim for 9',
      'Set 20 kg × 10–15',
    ])
    expect(wrapper.findAll('[data-testid="slot-start-load"]').map((l) => l.text())).toEqual(['Starting load: set on the first set'])
  })

  it('shows the targets in pounds for a lifter who uses pounds', async () => {
    useSessionStore().user = buildUser({ unit: 'lb' })
    stubFetch({ status: 200, body: pushDay })
    const wrapper = await mountTrain()

    expect(wrapper.findAll('[data-testid="slot-target"]')[0].text()).toBe('Top set 176.4 lb × 6–9 · aim for 8')
  })

  it('"Start session" starts today\'s session on the server and opens the runner', async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay }, { status: 201, body: { session: buildRunSession() } })
    const wrapper = await mountTrain()

    const start = wrapper.findAll('button').find((button) => button.text() === 'Start session')
    await start!.trigger('click')

    await openedRunner()
    expect(requests[1]).toMatchObject({ method: 'POST', body: {} })
    expect(requests[1].url).toMatch(/^\/api\/sessions\?date=\d{4}-\d{2}-\d{2}&tzOffset=-?\d+$/)
  })

  it('offers "Resume session" when a session is in progress, and loads it', async () => {
    const { requests } = stubFetch({ status: 200, body: { ...pushDay, inProgressSessionId: 41 } }, { status: 200, body: { session: buildRunSession() } })
    const wrapper = await mountTrain()

    await wrapper.get('[data-testid="start-session"]').trigger('click')

    await openedRunner()
    expect(wrapper.text()).toContain('Resume session')
    expect(requests[1]).toMatchObject({ method: 'GET', url: '/api/sessions/41/run' })
  })

  it('"Empty session" starts a session with no plan day', async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay }, { status: 201, body: { session: { ...buildRunSession(), sets: [], exercises: [] } } })
    const wrapper = await mountTrain()

    await wrapper.get('[data-testid="empty-session"]').trigger('click')

    await openedRunner()
    expect(requests[1]).toMatchObject({ method: 'POST', body: { empty: true } })
  })

  it('on a rest day says so, offers no start button, and "Train anyway" starts the next training day', async () => {
    const restDay = {
      ...pushDay,
      day: { ...pushDay.day!, name: 'Rest', isRest: true, slots: [] },
      nextTraining: { dayId: 4, name: 'Pull', version: 'II' as const },
    }
    const { requests } = stubFetch({ status: 200, body: restDay }, { status: 201, body: { session: buildRunSession() } })

    const wrapper = await mountTrain()
    expect(wrapper.text()).toContain('Rest day')
    expect(wrapper.text()).not.toContain('Start session')
    await wrapper.get('[data-testid="train-anyway"]').trigger('click')

    await openedRunner()
    expect(wrapper.text()).toContain('Train anyway: Pull · version II')
    expect(requests[1]).toMatchObject({ method: 'POST', body: { dayId: 4, version: 'II' } })
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
    await vi.waitFor(() => expect(wrapper.text()).toContain('Push · version I'))
  })
})

describe("today's request sent at start-up", () => {
  it('is used by the Train screen instead of a second request', async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay })
    startEarlyToday()
    expect(requests).toHaveLength(1) // sent before any screen mounted

    const wrapper = await mountTrain()

    expect(requests).toHaveLength(1)
    expect(wrapper.text()).toContain('Bench press')
  })

  it('is taken once: a refresh asks the server again', async () => {
    const { requests } = stubFetch({ status: 200, body: pushDay }, { status: 200, body: { ...pushDay, inProgressSessionId: 91 } })
    startEarlyToday()
    let today: ReturnType<typeof useToday> | undefined
    mount(defineComponent({ setup: () => ((today = useToday()), () => null) }), { global: { plugins: [pinia, router] } })
    await vi.waitFor(() => expect(today!.data.value).toBeDefined())
    expect(today!.data.value!.inProgressSessionId).toBeNull()

    await today!.refresh()

    expect(requests).toHaveLength(2)
    expect(today!.data.value!.inProgressSessionId).toBe(91)
  })

  it('is dropped when it is older than the limit, or from another calendar day', () => {
    stubFetch({ status: 200, body: pushDay }, { status: 200, body: pushDay })
    const started = new Date(2026, 11, 1, 23, 59, 55)
    startEarlyToday(started)
    expect(takeEarlyToday(new Date(started.getTime() + EARLY_TODAY_MAX_AGE_MS + 1))).toBeNull()

    startEarlyToday(started)
    expect(takeEarlyToday(new Date(2026, 11, 2, 0, 0, 1))).toBeNull() // past midnight: another day's plan

    startEarlyToday(started)
    expect(takeEarlyToday(new Date(started.getTime() + 1000))).not.toBeNull()
    expect(takeEarlyToday(new Date(started.getTime() + 1000))).toBeNull() // taken once
  })

  it('is sent only for addresses that open on Train', () => {
    expect(opensOnTrain(router, '/')).toBe(true)
    expect(opensOnTrain(router, '/train')).toBe(true)
    expect(opensOnTrain(router, '/logbook')).toBe(false)
    expect(opensOnTrain(router, '/sign-in')).toBe(false)
  })

  it('a failed early request shows the usual load error on Train, with no unhandled rejection', async () => {
    stubFetch({ status: 500, body: { error: { code: 'server_error', message: 'Something went wrong' } } })
    startEarlyToday()
    const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
    await vi.waitFor(() => expect(wrapper.find('.van-skeleton').exists()).toBe(false))
    expect(wrapper.text()).toMatch(/try again|Something went wrong/i)
  })
})

describe("today's plan kept on the phone", () => {
  /** A fetch that answers only when told to: what the screen shows before the server answers. */
  function heldFetch() {
    let answer: (reply: { status: number; body: unknown }) => void = () => {}
    const calls: string[] = []
    vi.stubGlobal('fetch', vi.fn((input: RequestInfo | URL) => {
      calls.push(String(input))
      return new Promise<Response>((resolve) => {
        answer = (reply) => resolve(new Response(JSON.stringify(reply.body), { status: reply.status, headers: { 'Content-Type': 'application/json' } }))
      })
    }))
    return { calls, answer: (reply: { status: number; body: unknown }) => answer(reply) }
  }

  it('shows the saved plan at once, then the server\'s answer, which it keeps for next time', async () => {
    saveToday(buildUser().id, localDay(), pushDay)
    const held = heldFetch()

    const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
    await flushPromises()
    expect(wrapper.find('.van-skeleton').exists()).toBe(false)
    expect(wrapper.text()).toContain('Bench press') // before any answer
    await vi.waitFor(() => expect(held.calls).toHaveLength(1)) // and it still asks the server, after that paint

    const fresh = { ...pushDay, inProgressSessionId: 91 }
    held.answer({ status: 200, body: fresh })
    await vi.waitFor(() => expect(wrapper.text()).toContain('Resume session'))
    expect(savedToday(buildUser().id, localDay())?.inProgressSessionId).toBe(91)
  })

  it("ignores another lifter's copy, another day's, another format and unreadable text", async () => {
    const day = localDay()
    saveToday(buildUser().id + 1, day, pushDay)
    expect(savedToday(buildUser().id, day)).toBeNull()
    saveToday(buildUser().id, { ...day, date: '2020-01-01' }, pushDay)
    expect(savedToday(buildUser().id, day)).toBeNull()
    saveToday(buildUser().id, { ...day, tzOffset: day.tzOffset + 60 }, pushDay)
    expect(savedToday(buildUser().id, day)).toBeNull()
    localStorage.setItem(SAVED_TODAY_KEY, JSON.stringify({ format: 99, userId: buildUser().id, ...day, today: pushDay }))
    expect(savedToday(buildUser().id, day)).toBeNull()
    localStorage.setItem(SAVED_TODAY_KEY, '{not json')
    expect(savedToday(buildUser().id, day)).toBeNull()
    localStorage.setItem(SAVED_TODAY_KEY, JSON.stringify({ format: 1, userId: buildUser().id, ...day, today: { plan: null } }))
    expect(savedToday(buildUser().id, day)).toBeNull()

    heldFetch()
    const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
    await flushPromises()
    expect(wrapper.find('.van-skeleton').exists()).toBe(true)
  })

  it('with no connection, keeps showing the saved plan with a note and a retry', async () => {
    saveToday(buildUser().id, localDay(), pushDay)
    vi.stubGlobal('fetch', vi.fn(() => Promise.reject(new TypeError('Failed to fetch'))))

    const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
    await vi.waitFor(() => expect(wrapper.find('[data-testid="saved-today"]').exists()).toBe(true))

    expect(wrapper.text()).toContain('Bench press')
    expect(wrapper.find('[data-testid="saved-today"]').text()).toContain('saved on this phone')
    expect(wrapper.find('[role="alert"]').exists()).toBe(false) // not the whole-page error

    stubFetch({ status: 200, body: pushDay })
    await wrapper.find('[data-testid="saved-today"] button').trigger('click')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="saved-today"]').exists()).toBe(false))
  })

  it('with no connection and no saved copy, shows the load error as before', async () => {
    vi.stubGlobal('fetch', vi.fn(() => Promise.reject(new TypeError('Failed to fetch'))))
    const wrapper = mount(TrainView, { global: { plugins: [pinia, router] } })
    await vi.waitFor(() => expect(wrapper.find('[role="alert"]').exists()).toBe(true))
    expect(wrapper.text()).toContain('No connection')
  })

  it('is forgotten on sign-out and when a session starts', async () => {
    saveToday(buildUser().id, localDay(), pushDay)
    useSessionStore().clear()
    expect(localStorage.getItem(SAVED_TODAY_KEY)).toBeNull()

    useSessionStore().start('tok', buildUser())
    saveToday(buildUser().id, localDay(), pushDay)
    stubFetch({ status: 201, body: { session: buildRunSession() } })
    await useRunStore().start({})
    expect(localStorage.getItem(SAVED_TODAY_KEY)).toBeNull()
  })
})
