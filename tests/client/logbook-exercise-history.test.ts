import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Progress } from '@shared/schemas/athlete.schema'
import type { LogbookExport } from '@/api/logbook'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import ExerciseHistoryView from '@/views/ExerciseHistoryView.vue'
import { exerciseRecords, exerciseWorkingSets } from '@/components/logbook/exercise-history'
import { formatDay } from '@/utils/dates'
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
})

const set = (kind: 'warmup' | 'top' | 'backoff', loadKg: number, reps: number, exercise = 'Bench press') => ({
  exercise, kind, loadKg, reps, rir: null, failure: kind === 'top', note: null,
})
const logbook: LogbookExport = {
  unit: 'kg',
  sessions: [
    { date: '2026-10-05T17:00:00.000Z', completedAt: '2026-10-05T18:00:00.000Z', day: 'Push', version: 'I', note: null,
      sets: [set('warmup', 60, 5), set('top', 100, 5), set('backoff', 90, 8), set('top', 140, 5, 'Back squat')] },
    { date: '2026-10-12T17:00:00.000Z', completedAt: '2026-10-12T18:00:00.000Z', day: 'Push', version: 'II', note: null,
      sets: [set('warmup', 60, 5), set('top', 100, 7), set('backoff', 90, 10)] },
    { date: '2026-10-19T17:00:00.000Z', completedAt: '2026-10-19T18:00:00.000Z', day: 'Push', version: 'I', note: null,
      sets: [set('top', 105, 4), set('backoff', 90, 9)] },
  ],
}
const progress: Progress = {
  e1rm: [{ exerciseId: 3, exercise: 'Bench press', points: [
    { date: '2026-10-05T17:00:00.000Z', e1rmKg: 116.67 }, { date: '2026-10-12T17:00:00.000Z', e1rmKg: 123.33 }, { date: '2026-10-19T17:00:00.000Z', e1rmKg: 119 },
  ] }],
  weeklySets: [], planWeeklySets: [], bodyWeight: [],
}

async function openHistory(unit: 'kg' | 'lb' = 'kg') {
  useSessionStore().user = buildUser({ unit })
  await router.push('/logbook/exercise/3')
  const stub = stubFetch({ status: 200, body: { progress } }, { status: 200, body: logbook })
  const wrapper = mount(ExerciseHistoryView, { props: { exerciseId: 3 }, global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}

describe('ExerciseHistoryView', () => {
  it('reads the whole logbook and the estimated-1RM trend with the bearer token', async () => {
    const { requests } = await openHistory()

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/progress?weeks=260', 'GET /api/logbook/export?format=json'])
    expect(requests.every((r) => r.headers.Authorization === 'Bearer tok')).toBe(true)
  })

  it('lists every working set of the lift, newest session first, without warm-ups or other lifts', async () => {
    const { wrapper } = await openHistory()

    const history = wrapper.get('[data-testid="exercise-history"]')
    const sessions = history.findAll('[data-testid="history-session"]')
    expect(sessions).toHaveLength(3)
    expect(sessions[0].text()).toContain(formatDay('2026-10-19T17:00:00.000Z'))
    expect(sessions[0].findAll('[data-testid="history-set"]').map((s) => s.text())).toEqual([
      'Top set 105 kg × 4, failure',
      'Back-off set 90 kg × 9',
    ])
    expect(history.findAll('[data-testid="history-set"]')).toHaveLength(6)
    expect(history.text()).not.toContain('60 kg')
    expect(history.text()).not.toContain('140 kg')
  })

  it('shows the best reps at each load, heaviest first, with the session that first reached them', async () => {
    const { wrapper } = await openHistory()

    const rows = wrapper.get('[data-testid="rep-records"]').findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text()))
    expect(rows).toEqual([
      ['105 kg', '4', formatDay('2026-10-19T17:00:00.000Z')],
      ['100 kg', '7', formatDay('2026-10-12T17:00:00.000Z')],
      ['90 kg', '10', formatDay('2026-10-12T17:00:00.000Z')],
    ])
  })

  it('names the estimated-1RM record from the shared engine and the heaviest set', async () => {
    const { wrapper } = await openHistory()

    // Epley 1985, 1RM = w · (1 + r/30): 100 × 7 -> 123.33; 90 × 10 -> 120; 105 × 4 -> 119;
    // 100 × 5 -> 116.67; 90 × 9 -> 117; 90 × 8 -> 114. The record is 100 kg × 7.
    const record = wrapper.get('[data-testid="e1rm-record"]').text()
    expect(record).toContain('123.33 kg')
    expect(record).toContain(`from 100 kg × 7 on ${formatDay('2026-10-12T17:00:00.000Z')}`)
    expect(wrapper.get('[data-testid="heaviest-set"]').text()).toContain('105 kg × 4')
  })

  it('shows the records in pounds for a pound lifter', async () => {
    const { wrapper } = await openHistory('lb')

    // Epley 1985: 100 kg × (1 + 7/30) = 123.333 kg = 271.9 lb (1 lb = 0.45359237 kg); 100 kg = 220.5 lb.
    expect(wrapper.get('[data-testid="e1rm-record"]').text()).toContain('271.9 lb')
    expect(wrapper.get('[data-testid="rep-records"]').findAll('tbody tr')[1].text()).toContain('220.5 lb')
  })
})

describe('exerciseRecords', () => {
  it('keeps the first session that reached a rep record and ignores a later tie', () => {
    const groups = exerciseWorkingSets(
      [
        { date: '2026-01-01', day: null, version: null, sets: [set('top', 80, 8)] },
        { date: '2026-01-08', day: null, version: null, sets: [set('top', 80, 8), set('backoff', 70, 12)] },
      ],
      'bench press',
    )
    const records = exerciseRecords(groups)

    expect(records.repRecords).toEqual([
      { loadKg: 80, reps: 8, date: '2026-01-01' },
      { loadKg: 70, reps: 12, date: '2026-01-08' },
    ])
    // Epley 1985: 80 × (1 + 8/30) = 101.33; 70 × (1 + 12/30) = 98.
    expect(records.e1rm?.e1rmKg).toBeCloseTo(101.3333, 4)
    expect(records.e1rm?.set).toEqual({ loadKg: 80, reps: 8, date: '2026-01-01' })
  })
})
