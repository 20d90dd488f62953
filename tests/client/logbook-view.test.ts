import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Progress } from '@shared/schemas/athlete.schema'
import type { SessionSummary } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import LogbookView from '@/views/LogbookView.vue'
import { localDay } from '@/utils/dates'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().token = 'tok'
  setAuthToken('tok')
  router = createAppRouter(createMemoryHistory())
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
  vi.restoreAllMocks()
})

const sessions: SessionSummary[] = [
  { id: 41, athleteId: 7, dayName: 'Push', version: 'II', status: 'completed', startedAt: '2026-12-01T11:00:00.000Z', completedAt: '2026-12-01T12:05:00.000Z', workingSets: 9, volumeKg: 4535.9237, records: 0 },
]
const progress: Progress = {
  e1rm: [
    { exerciseId: 3, exercise: 'Bench press', points: [{ date: '2026-11-24T11:00:00.000Z', e1rmKg: 120 }, { date: '2026-12-01T11:00:00.000Z', e1rmKg: 123.5 }] },
    { exerciseId: 8, exercise: 'Back squat', points: [{ date: '2026-11-26T11:00:00.000Z', e1rmKg: 160 }] },
  ],
  weeklySets: [], planWeeklySets: [], bodyWeight: [],
}

async function openLogbook(unit: 'kg' | 'lb', ...more: Array<{ status: number; body?: unknown }>) {
  useSessionStore().user = buildUser({ unit })
  await router.push('/logbook')
  const stub = stubFetch({ status: 200, body: { sessions } }, { status: 200, body: { progress } }, ...more)
  const wrapper = mount(LogbookView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, ...stub }
}

describe('LogbookView', () => {
  it('lists sessions with day, version, duration, working sets and volume in the lifter unit', async () => {
    const { wrapper, requests } = await openLogbook('lb')

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/sessions', 'GET /api/progress?weeks=260'])
    const row = wrapper.get('[data-testid="logbook-session"]')
    expect(row.text()).toContain('Push · version II')
    expect(row.text()).toContain('1 h 05 min')
    // 4535.9237 kg / 0.45359237 kg per lb = 10,000 lb.
    expect(row.text()).toContain('9 sets · 10,000 lb')
    wrapper.unmount()
  })

  it('lists the lifts with their best estimated 1RM, each opening its history', async () => {
    const { wrapper } = await openLogbook('kg')

    const lifts = wrapper.findAll('[data-testid="lift-row"]')
    expect(lifts.map((l) => l.text())).toEqual(['Back squatBest est. 1RM160 kg', 'Bench pressBest est. 1RM123.5 kg'])
    await lifts[1].trigger('click')
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/logbook/exercise/3'))
    wrapper.unmount()
  })

  it('sends a pound lifter body weight in kilograms and reloads the trend', async () => {
    const { wrapper, requests } = await openLogbook(
      'lb',
      { status: 201, body: { entry: { date: '2026-12-02', weightKg: 81.6466266 } } },
      { status: 200, body: { progress: { ...progress, bodyWeight: [{ date: '2026-12-02', weightKg: 81.6466266 }] } } },
    )

    expect((wrapper.get('[data-testid="body-weight-date"]').element as HTMLInputElement).value).toBe(localDay().date)
    await wrapper.get('[data-testid="body-weight-date"]').setValue('2026-12-02')
    await wrapper.get('[data-testid="body-weight-input"]').setValue('180')
    await wrapper.get('[data-testid="body-weight-save"]').trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/body-weights' })
    const body = requests[2].body as { date: string; weightKg: number }
    expect(body.date).toBe('2026-12-02')
    // 1 lb = 0.45359237 kg exactly (International Yard and Pound Agreement, 1959): 180 lb = 81.6466266 kg.
    expect(body.weightKg).toBeCloseTo(81.6466266, 9)
    expect(requests[3]).toMatchObject({ method: 'GET', url: '/api/progress?weeks=260' })
    wrapper.unmount()
  })

  it('refuses an empty body weight without calling the server', async () => {
    const { wrapper, requests } = await openLogbook('kg')

    await wrapper.get('[data-testid="body-weight-save"]').trigger('click')
    await flushPromises()

    expect(requests).toHaveLength(2)
    expect(wrapper.get('[data-testid="body-weight-error"]').text()).toBe('Enter your body weight in kg.')
    wrapper.unmount()
  })

  it('exports CSV: fetches the file with the bearer token and saves it under the server file name', async () => {
    const { wrapper, fetchMock } = await openLogbook('kg')
    const csv = 'date,exercise,set_kind,load,unit,reps\n2026-12-01T11:00:00.000Z,Bench press,top,100,kg,7\n'
    fetchMock.mockImplementationOnce(async () =>
      new Response(csv, { status: 200, headers: { 'Content-Type': 'text/csv', 'Content-Disposition': 'attachment; filename="chalkline-logbook.csv"' } }),
    )
    const createObjectURL = vi.fn((_blob: Blob) => 'blob:chalkline-export')
    Object.defineProperty(URL, 'createObjectURL', { value: createObjectURL, configurable: true })
    Object.defineProperty(URL, 'revokeObjectURL', { value: vi.fn(), configurable: true })
    const clicked: Array<{ href: string; download: string }> = []
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push({ href: this.href, download: this.download })
    })

    await wrapper.get('[data-testid="export-csv"]').trigger('click')
    await flushPromises()

    const [url, init] = fetchMock.mock.calls[2] as [string, RequestInit]
    expect(url).toBe('/api/logbook/export?format=csv')
    expect((init.headers as Record<string, string>).Authorization).toBe('Bearer tok')
    expect(await createObjectURL.mock.calls[0][0].text()).toBe(csv)
    expect(clicked).toEqual([{ href: 'blob:chalkline-export', download: 'chalkline-logbook.csv' }])
    wrapper.unmount()
  })
})
