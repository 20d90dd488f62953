import { beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import type { AthleteRow, Progress } from '@shared/schemas/athlete.schema'
import type { SessionSummary } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { useSessionStore } from '@/stores/session'
import MeNotifySetting from '@/components/me/MeNotifySetting.vue'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/AthleteDetailView.vue')
  await import('@/views/AthletesView.vue')
  await import('@/views/MeView.vue')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

const noor: AthleteRow = {
  id: 5, name: 'Noor Vale', email: 'noor@example.com', unit: 'kg', planId: 12, planName: 'Winter base',
  lastSessionAt: '2026-11-30T18:00:00.000Z', sessionsLast28Days: 6, plannedLast28Days: 8, adherencePct: 75,
  plateauLifts: [], waitingReview: 1, e1rmTrend: [],
}
const sessions: SessionSummary[] = [
  { id: 90, athleteId: 5, dayName: 'Lower', version: 'II', status: 'completed', startedAt: '2026-11-30T17:00:00.000Z', completedAt: '2026-11-30T18:00:00.000Z', workingSets: 14, volumeKg: 9000, records: 0 },
]
const progress: Progress = {
  e1rm: [{ exerciseId: 1, exercise: 'Back squat', points: [{ date: '2026-11-02T10:00:00.000Z', e1rmKg: 100 }, { date: '2026-11-30T10:00:00.000Z', e1rmKg: 105 }] }],
  weeklySets: [{ weekStart: '2026-11-23', muscle: 'Quads', sets: 10 }],
  planWeeklySets: [{ muscle: 'Quads', sets: 12 }],
  bodyWeight: [],
}

async function openNoor(...after: Array<{ status: number; body?: unknown }>) {
  const stub = stubFetch(
    { status: 200, body: { athletes: [noor] } },
    { status: 200, body: { sessions } },
    { status: 200, body: { progress } },
    ...after,
  )
  const session = useSessionStore()
  session.user = buildUser({ role: 'coach', unit: 'lb' })
  session.token = 'tok'
  setAuthToken('tok')
  await router.push('/athletes/5')
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { view, ...stub }
}

describe('AthleteDetailView', () => {
  it("loads the athlete, their sessions and progress, links their plan and summarises the charts in the coach's unit", async () => {
    const { view, requests } = await openNoor()

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual([
      'GET /api/athletes', 'GET /api/sessions?athleteId=5', 'GET /api/progress?athleteId=5&weeks=26',
    ])
    expect(view.get('h1').text()).toBe('Noor Vale')
    expect(view.get('[data-testid="athlete-plan"]').attributes('href')).toBe('/plans/12')
    expect(view.text()).toContain('Lower · version II')
    const e1rm = view.get('[data-testid="chart-e1rm"]')
    expect(e1rm.get('figcaption').text()).toContain('Estimated 1RM per exercise (lb')
    expect(e1rm.get('[data-testid="chart-summary"]').text()).toContain('231.5 lb')
    expect(view.get('[data-testid="chart-weekly-sets"] [data-testid="chart-summary"]').text()).toContain('plan 12 per week')
    expect(view.get('[data-testid="chart-body-weight"]').text()).toContain('No body weight entered yet.')
    view.unmount()
  })

  it('asks again for progress over the weeks the coach picks', async () => {
    const { view, requests } = await openNoor({ status: 200, body: { progress } })

    await view.findAll('[role="radio"]').find((r) => r.text() === '52 weeks')!.trigger('click')
    await flushPromises()

    expect(requests[3]).toMatchObject({ method: 'GET', url: '/api/progress?athleteId=5&weeks=52' })
    view.unmount()
  })

  it('links to the starting loads of the athlete\'s plan lifts', async () => {
    const { view } = await openNoor()

    expect(view.get('#athlete-start-loads-heading').text()).toBe('Starting loads')
    await view.get('[data-testid="athlete-start-loads-link"]').trigger('click')
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/athletes/5/start-loads'))
    view.unmount()
  })

  it('removes the athlete only after a confirm that says they keep their data, then returns to Athletes', async () => {
    const { view, requests } = await openNoor(
      { status: 204 },
      { status: 200, body: { athletes: [] } },
      { status: 200, body: { invites: [] } },
    )

    // Cancelled: nothing is sent and the page stays.
    await view.get('[data-testid="remove-athlete"]').trigger('click')
    await flushPromises()
    expect(document.body.textContent).toContain('They keep their account, logbook and progress.')
    ;(document.querySelector('.van-dialog__cancel') as HTMLButtonElement).click()
    await flushPromises()
    expect(requests).toHaveLength(3)
    expect(router.currentRoute.value.name).toBe('athlete-detail')

    // Confirmed: DELETE, then back to the list.
    await view.get('[data-testid="remove-athlete"]').trigger('click')
    await flushPromises()
    ;(document.querySelector('.van-dialog__confirm') as HTMLButtonElement).click()
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('athletes'))
    expect(requests[3]).toMatchObject({ method: 'DELETE', url: '/api/athletes/5' })
    view.unmount()
  })
})

describe("the coach's e-mail setting", () => {
  it('offers each session, a daily digest or off and emits the choice', async () => {
    const wrapper = mount(MeNotifySetting, { props: { value: 'each' } })

    expect(wrapper.text()).toContain('E-mail me when an athlete finishes a session')
    await wrapper.get('[data-testid="notify-daily"]').trigger('click')

    expect(wrapper.emitted('change')).toEqual([['daily']])
  })

  it('is saved with PATCH /me on the Me page, for coaches only', async () => {
    const coach = buildUser({ role: 'coach', notifyCompleted: 'each' })
    const { requests } = stubFetch({ status: 200, body: { user: { ...coach, notifyCompleted: 'off' } } })
    const session = useSessionStore()
    session.user = coach
    session.token = 'tok'
    await router.push('/me')
    const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
    await flushPromises()

    await view.get('[data-testid="notify-off"]').trigger('click')
    await flushPromises()

    expect(requests[0]).toMatchObject({ method: 'PATCH', url: '/api/me', body: { notifyCompleted: 'off' } })
    expect(session.user?.notifyCompleted).toBe('off')
    view.unmount()

    session.user = buildUser({ role: 'lifter' })
    const lifterView = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
    await flushPromises()
    expect(lifterView.find('[data-testid="notify-completed"]').exists()).toBe(false)
    lifterView.unmount()
  })
})

describe("AthleteDetailView: the athlete's logbook file", () => {
  it("downloads the athlete's logbook as CSV with the coach's token", async () => {
    const csv = 'date,exercise\n'
    const { view, fetchMock } = await openNoor()
    fetchMock.mockResolvedValueOnce(new Response(csv, { status: 200, headers: { 'Content-Type': 'text/csv', 'Content-Disposition': 'attachment; filename="chalkline-logbook.csv"' } }))
    const createObjectURL = vi.fn(() => 'blob:x')
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL, revokeObjectURL: vi.fn() }))
    await view.get('[data-testid="athlete-export-csv"]').trigger('click')
    await flushPromises()
    const [url, init] = fetchMock.mock.calls.at(-1) as [string, RequestInit]
    expect(url).toBe('/api/logbook/export?format=csv&athleteId=5')
    expect((init.headers as Record<string, string>).Authorization).toBe('Bearer tok')
    expect(createObjectURL).toHaveBeenCalled()
    view.unmount()
  })
})
