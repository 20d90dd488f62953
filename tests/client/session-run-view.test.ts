import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import { useRunStore } from '@/stores/run'
import SessionRunView from '@/views/SessionRunView.vue'
import { buildRunSession } from './helpers/run-fixtures'
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
    const session = buildRunSession()
    session.sets[0] = { ...session.sets[0], loadKg: 25, reps: 6, loggedAt: '2026-12-01T17:50:00.000Z', editedAt: '2026-12-01T17:50:00.000Z' }
    session.sets[1] = { ...session.sets[1], loadKg: 80, reps: 3, loggedAt: '2026-12-01T17:53:00.000Z', editedAt: '2026-12-01T17:53:00.000Z' }
    const { requests } = stubFetch({ status: 200, body: { session } }, { status: 200, body: { set: session.sets[2], updated: [] } })
    const view = await mountRunner()
    expect(byId(view, 'set-label').text()).toBe('Top set')

    await byId(view, 'as-planned').trigger('click')
    await useRunStore().flush() // sent once the set is in the phone's outbox (IndexedDB)
    await flushPromises()

    expect(requests[1]).toMatchObject({
      method: 'PUT',
      url: `/api/sessions/41/sets/${session.sets[2].id}`,
      body: { loadKg: 100, reps: 8, loggedAt: NOW.toISOString() },
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
