import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import { useRunStore } from '@/stores/run'
import SessionRunView from '@/views/SessionRunView.vue'
import { buildRunSession, buildSessionAtTopSet, buildUnplannedSession, plannedFromStart } from './helpers/run-fixtures'
import { buildUser, stubFetch } from './helpers/fetch-stub'

vi.mock('howler', () => ({ Howl: class { play() { return 1 } } }))

let pinia: Pinia
let router: Router
const NOW = new Date('2026-12-01T18:00:00.000Z')

beforeEach(async () => {
  localStorage.clear()
  vi.useFakeTimers({ toFake: ['Date', 'setTimeout', 'clearTimeout', 'setInterval', 'clearInterval'] })
  vi.setSystemTime(NOW)
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser()
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/train/session')
})

afterEach(async () => {
  // Let the runner's sends settle against this test's fetch, so none leaks into the next test.
  const run = useRunStore(pinia)
  await run.flush()
  await run.whenSaved()
  vi.useRealTimers()
  setAuthToken(null)
  vi.unstubAllGlobals()
  delete window.__chalklineCues
})

async function mountRunner() {
  const wrapper = mount(SessionRunView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await useRunStore(pinia).whenReady() // the copy on the phone (IndexedDB) loads first
  await flushPromises()
  return wrapper
}
const byId = (wrapper: Awaited<ReturnType<typeof mountRunner>>, id: string) => wrapper.get(`[data-testid="${id}"]`)

describe('SessionRunView', () => {
  it('loads the session in progress and shows its first set', async () => {
    const { requests } = stubFetch({ status: 200, body: { session: buildRunSession() } })

    const view = await mountRunner()

    expect(requests[0]).toMatchObject({ method: 'GET', url: '/api/sessions/current' })
    expect(byId(view, 'set-label').text()).toBe('Warm-up 1 of 2')
    expect(byId(view, 'plate-change').text()).toBe('Empty bar')
    view.unmount()
  })

  it('says in one quiet line when this phone cannot keep sets (no IndexedDB), and still runs the session', async () => {
    vi.stubGlobal('indexedDB', undefined)
    stubFetch({ status: 200, body: { session: buildRunSession() } })

    const view = await mountRunner()

    expect(byId(view, 'storage-warning').text()).toMatch(/not keeping sets on the device/)
    expect(byId(view, 'storage-warning').attributes('role')).toBe('status')
    expect(byId(view, 'set-label').text()).toBe('Warm-up 1 of 2')
    view.unmount()
  })

  it('logs the top set As planned with one tap and starts the rest clock', async () => {
    const session = buildSessionAtTopSet()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[2], updated: [] } })
    const view = await mountRunner()
    expect(byId(view, 'set-label').text()).toBe('Top set')

    await byId(view, 'as-planned').trigger('click')
    await useRunStore().flush() // sent once the set is in the phone's outbox (IndexedDB)
    await flushPromises()

    // Planned to technical failure: As planned logs the failure (read as 0 reps in reserve).
    expect(requests[1]).toMatchObject({
      method: 'PUT',
      url: `/api/sessions/41/sets/${session.sets[2].id}`,
      body: { loadKg: 100, reps: 8, failure: true, rir: null, loggedAt: NOW.toISOString() },
    })
    expect(byId(view, 'set-label').text()).toBe('Back-off set 1 of 1')
    expect(byId(view, 'rest-clock-time').text()).toBe('3:00')
    view.unmount()
  })

  it('logs an off-target set in three taps: reps −, reps −, Log', async () => {
    const session = buildRunSession()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[0], updated: [] } })
    const view = await mountRunner()
    useRunStore().jumpTo(session.sets[4].id) // Cable fly, set 1: 20 kg × 10–15
    await flushPromises()
    expect(byId(view, 'reps-value').text()).toBe('10 reps')

    await byId(view, 'reps-minus').trigger('click')
    await byId(view, 'reps-minus').trigger('click')
    await byId(view, 'log-set').trigger('click')
    await useRunStore().flush()
    await flushPromises()

    expect(requests[1]).toMatchObject({ method: 'PUT', url: `/api/sessions/41/sets/${session.sets[4].id}`, body: { loadKg: 20, reps: 8 } })
    view.unmount()
  })

  it('when rest is over it cues once (recorded on window.__chalklineCues) and vibrates', async () => {
    const vibrate = vi.fn(() => true)
    vi.stubGlobal('navigator', { ...navigator, vibrate })
    const session = buildRunSession()
    stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[4], updated: [] } })
    const view = await mountRunner()
    useRunStore().jumpTo(session.sets[4].id)
    await flushPromises()

    await byId(view, 'as-planned').trigger('click') // Cable fly rests 90 s
    await vi.advanceTimersByTimeAsync(80_000)
    await vi.advanceTimersByTimeAsync(10_000)

    expect(window.__chalklineCues!.map((c) => c.kind)).toEqual(['warning', 'done'])
    expect(vibrate).toHaveBeenCalledWith([400, 150, 400, 150, 400])
    expect(byId(view, 'rest-clock-time').text()).toBe('Rest over · 0:00 ago')
    view.unmount()
  })
})

describe('SessionRunView finishing', () => {
  it('after the last set, "Finish session" completes the session with the note and opens the summary', async () => {
    const session = buildRunSession()
    session.sets = session.sets.map((s) => ({ ...s, loadKg: s.targetLoadKg, reps: 8, loggedAt: '2026-12-01T17:59:00.000Z', editedAt: '2026-12-01T17:59:00.000Z' }))
    const report = { session: { ...session, status: 'completed' }, durationSec: 3600, exercises: [] }
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { report } })
    const view = await mountRunner()
    expect(view.find('[data-testid="set-card"]').exists()).toBe(false)

    await byId(view, 'open-note').trigger('click')
    await flushPromises()
    const field = document.querySelector<HTMLTextAreaElement>('[data-testid="set-note"] textarea')!
    field.value = 'Shoulder felt fine'
    field.dispatchEvent(new Event('input'))
    await byId(view, 'finish-session').trigger('click')
    await flushPromises()

    expect(requests[1]).toMatchObject({
      method: 'POST',
      url: '/api/sessions/41/complete',
      body: { completedAt: NOW.toISOString(), note: 'Shoulder felt fine' },
    })
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/train/session/41/summary'))
    expect(useRunStore().session).toBeNull()
    view.unmount()
  })
})

describe('SessionRunView: As planned logs the effort the plan asked for', () => {
  it('on a set planned with 2 reps in reserve logs RIR 2, shown on the chips before the tap', async () => {
    const session = buildRunSession()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[4], updated: [] } })
    const view = await mountRunner()
    useRunStore().jumpTo(session.sets[4].id) // Cable fly: 10–15 reps · RIR 2
    await flushPromises()
    expect(byId(view, 'rir-2').attributes('aria-pressed')).toBe('true')
    expect(byId(view, 'rir-failure').attributes('aria-pressed')).toBe('false')

    await byId(view, 'as-planned').trigger('click')
    await useRunStore().flush()

    expect(requests[1]).toMatchObject({ method: 'PUT', url: `/api/sessions/41/sets/${session.sets[4].id}`, body: { loadKg: 20, reps: 10, rir: 2, failure: false } })
    view.unmount()
  })

  it('lets the chips change the effort before As planned: a set planned to failure logged with 1 in reserve', async () => {
    const session = buildSessionAtTopSet()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[2], updated: [] } })
    const view = await mountRunner()
    expect(byId(view, 'rir-failure').attributes('aria-pressed')).toBe('true')

    await byId(view, 'rir-1').trigger('click')
    await byId(view, 'as-planned').trigger('click')
    await useRunStore().flush()

    expect(requests[1].body).toMatchObject({ loadKg: 100, reps: 8, rir: 1, failure: false })
    view.unmount()
  })

  it('on a deload set preselects and logs the planned reserve', async () => {
    const session = buildRunSession()
    session.sets[4] = { ...session.sets[4], deload: true, targetRir: 3 }
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[4], updated: [] } })
    const view = await mountRunner()
    useRunStore().jumpTo(session.sets[4].id)
    await flushPromises()
    expect(byId(view, 'set-label').text()).toBe('Deload · Set 1 of 2')
    expect(byId(view, 'rir-3').attributes('aria-pressed')).toBe('true')

    await byId(view, 'as-planned').trigger('click')
    await useRunStore().flush()

    expect(requests[1].body).toMatchObject({ rir: 3, failure: false })
    view.unmount()
  })
})

describe('SessionRunView: a lift with no starting load', () => {
  const startButtons = ['start-from-set', 'find-load']
  /** The start the runner sends for bench press (exercise 1 in slot 10) of session 41. */
  const startRequest = (start: { loadKg: number; reps: number; rir: number; source: 'recent_set' | 'ramp' }) => ({
    method: 'POST',
    url: '/api/sessions/41/start-estimate',
    body: { exerciseId: 1, slotId: 10, ...start },
  })

  it('asks for a recent set in the thumb controls and sends it in one tap; the new plan replaces the sets', async () => {
    const session = buildUnplannedSession()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { session: plannedFromStart(session) } })
    const view = await mountRunner()
    expect(byId(view, 'start-prompt').text()).toContain('No starting load for Bench press yet.')
    expect(view.find('[data-testid="as-planned"]').exists()).toBe(false)
    for (const id of startButtons) expect(view.find(`[data-testid="${id}"]`).exists()).toBe(true)
    expect(byId(view, 'start-from-set').attributes()).toHaveProperty('disabled') // no load yet

    // A recent set: 27 kg (the 25 kg empty bar with collars, then 1 kg steps) × 6, one rep left.
    for (let i = 0; i < 3; i++) await byId(view, 'load-plus').trigger('click')
    await byId(view, 'reps-minus').trigger('click')
    await byId(view, 'rir-1').trigger('click')
    await byId(view, 'start-from-set').trigger('click')
    await flushPromises()

    expect(requests[1]).toMatchObject(startRequest({ loadKg: 27, reps: 6, rir: 1, source: 'recent_set' }))
    expect(byId(view, 'set-label').text()).toBe('Warm-up 1 of 1')
    expect(byId(view, 'target-load').text()).toBe('25 kg')
    expect(view.find('[data-testid="start-prompt"]').exists()).toBe(false)
    view.unmount()
  })

  it('"Find my load" ramps from the empty bar, about 20 % a set, and "Hard — about 2 left" sends that set as the start', async () => {
    const session = buildUnplannedSession()
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { session: plannedFromStart(session) } })
    const view = await mountRunner()

    await byId(view, 'find-load').trigger('click')
    expect(byId(view, 'set-label').text()).toBe('Find my load · ramp set 1')
    expect(byId(view, 'target-load').text()).toBe('25 kg') // the 20 kg bar with two 2.5 kg collars (IWF)
    expect(byId(view, 'reps-value').text()).toBe('5 reps')
    expect(byId(view, 'ramp-caution').text()).toMatch(/stops well short of failure/)

    // 25 x 1.2 = 30 kg, loadable (2.5 kg a side); 30 x 1.2 = 36 kg, loadable in 1 kg steps (arithmetic).
    await byId(view, 'ramp-heavier').trigger('click')
    expect(byId(view, 'target-load').text()).toBe('30 kg')
    await byId(view, 'ramp-heavier').trigger('click')
    expect(byId(view, 'set-label').text()).toBe('Find my load · ramp set 3')
    expect(byId(view, 'target-load').text()).toBe('36 kg')
    await byId(view, 'ramp-hard').trigger('click')
    await flushPromises()

    expect(requests[1]).toMatchObject(startRequest({ loadKg: 36, reps: 5, rir: 2, source: 'ramp' }))
    expect(byId(view, 'set-label').text()).toBe('Warm-up 1 of 1')
    view.unmount()
  })

  it('"Stop the ramp" goes back to asking for a recent set', async () => {
    stubFetch({ status: 200, body: { session: buildUnplannedSession() } })
    const view = await mountRunner()

    await byId(view, 'find-load').trigger('click')
    await byId(view, 'ramp-stop').trigger('click')

    expect(byId(view, 'start-prompt').attributes('data-mode')).toBe('ask')
    expect(byId(view, 'set-label').text()).toBe('Top set')
    view.unmount()
  })

  it('with no signal says the start needs the server and logs the set with the load the lifter chooses', async () => {
    const online = vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(false)
    const session = buildUnplannedSession()
    const { requests } = stubFetch({ status: 200, body: { session } })
    const view = await mountRunner()

    expect(byId(view, 'start-prompt').attributes('data-mode')).toBe('offline')
    expect(byId(view, 'as-planned').attributes()).toHaveProperty('disabled') // no load chosen yet
    for (let i = 0; i < 2; i++) await byId(view, 'load-plus').trigger('click')
    expect(byId(view, 'as-planned').attributes()).not.toHaveProperty('disabled')
    await byId(view, 'as-planned').trigger('click')
    await flushPromises()

    const top = useRunStore().sets.find((s) => s.kind === 'top')!
    expect(top).toMatchObject({ loadKg: 26, reps: 7, failure: true })
    expect(useRunStore().queue.map((e) => e.body)).toEqual([expect.objectContaining({ loadKg: 26, reps: 7, targetLoadKg: null })])
    expect(requests).toHaveLength(1) // only the load of the session: nothing sent with no network
    online.mockRestore()
    view.unmount()
  })

  it('when the start finds no signal, falls back to logging the set, keeping the ramp load', async () => {
    const session = buildUnplannedSession()
    stubFetch({ status: 200, body: { session } })
    const view = await mountRunner()
    await byId(view, 'find-load').trigger('click')
    await byId(view, 'ramp-heavier').trigger('click')
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))

    await byId(view, 'ramp-hard').trigger('click')
    await flushPromises()

    expect(byId(view, 'start-prompt').attributes('data-mode')).toBe('offline')
    expect(byId(view, 'load-value').text()).toBe('30 kg')
    expect(view.find('[data-testid="as-planned"]').exists()).toBe(true)
    view.unmount()
  })
})

describe('SessionRunView: adding a set past a cap', () => {
  it('asks first, naming the cap ("Squat pattern: 5 hard sets ..."), and adds the set only on "Add it anyway"', async () => {
    // The cap of 4 hard sets of one pattern per session: common practice, no published source.
    const session = buildRunSession()
    session.exercises = session.exercises.map((e) => ({ ...e, name: e.exerciseId === 1 ? 'Back squat' : 'Leg press', pattern: 'squat', role: e.exerciseId === 1 ? 'compound_primary' as const : 'accessory' as const }))
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: null, updated: [] } })
    const view = await mountRunner()
    const run = useRunStore()
    run.jumpTo(session.sets[4].id) // Leg press, set 1 of 2 (back squat: top and back-off)
    await flushPromises()
    const setsBefore = run.sets.length

    await byId(view, 'open-more').trigger('click')
    await flushPromises()
    ;[...document.querySelectorAll<HTMLElement>('.van-action-sheet__item')].find((b) => b.textContent?.includes('Add a set'))!.click()
    await vi.waitFor(() => expect(document.querySelector('[data-testid="add-set-confirm"]')).not.toBeNull())

    expect([...document.querySelectorAll('[data-testid="cap-warning"]')].map((p) => p.textContent)).toEqual([
      'Squat pattern: 5 hard sets in this session, the usual cap is 4.',
    ])
    expect(run.sets.length).toBe(setsBefore)
    document.querySelector<HTMLElement>('[data-testid="cap-add"]')!.click()
    await run.flush()

    expect(run.sets.length).toBe(setsBefore + 1)
    expect(requests[1]).toMatchObject({ method: 'PUT', body: { exerciseId: 2, position: 102, loggedAt: null } })
    view.unmount()
  })

  it('"Keep it as is" adds nothing, and within the caps the set is added at once', async () => {
    const session = buildRunSession()
    session.exercises = session.exercises.map((e) => ({ ...e, pattern: 'squat' }))
    stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: null, updated: [] } })
    const view = await mountRunner()
    const run = useRunStore()
    run.jumpTo(session.sets[4].id)
    await flushPromises()
    const setsBefore = run.sets.length
    const pick = async (name: string) => {
      await byId(view, 'open-more').trigger('click')
      await flushPromises()
      ;[...document.querySelectorAll<HTMLElement>('.van-action-sheet__item')].find((b) => b.textContent?.includes(name))!.click()
      await flushPromises()
    }

    await pick('Add a set')
    await vi.waitFor(() => expect(document.querySelector('[data-testid="add-set-confirm"]')).not.toBeNull())
    document.querySelector<HTMLElement>('[data-testid="cap-cancel"]')!.click()
    await flushPromises()
    expect(run.sets.length).toBe(setsBefore)

    // Skip the back-off: 1 + 2 hard sets of the pattern, so the new one makes 4, at the cap and not past it.
    run.skipSet(session.sets[3].id)
    run.jumpTo(session.sets[4].id)
    await pick('Add a set')
    await vi.waitFor(() => expect(run.sets.length).toBe(setsBefore + 1))
    view.unmount()
  })
})

