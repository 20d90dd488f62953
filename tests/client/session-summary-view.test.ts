import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { ExerciseReport, SessionReport } from '@shared/schemas/run.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import SessionSummaryView from '@/views/SessionSummaryView.vue'
import { buildRunSession } from './helpers/run-fixtures'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser()
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/train/session/41/summary')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

const reason = (message: string) => ({ code: 'X', values: {}, message })
const bench: ExerciseReport = {
  exerciseId: 1, slotId: 10, name: 'Bench press', workingSets: 2, volumeKg: 1745, bestE1rmKg: 126.7, previousBestE1rmKg: 123.5,
  e1rmChangePct: 2.59,
  records: [{ kind: 'rep_record', loadKg: 100, reps: 9, e1rmKg: 130, previous: 8 }],
  nextStep: {
    action: 'add_load', targetLoadKg: 102.5, targetReps: 6, repsMin: 6, repsMax: 9, workChangePct: -12.3,
    reason: reason('You reached the top of the range: add the smallest load and start again at the bottom.'),
  },
  alternative: {
    action: 'add_load', targetLoadKg: 101, targetReps: 6, repsMin: 6, repsMax: 9, workChangePct: -13.6,
    reason: reason('A smaller step with your 0.5 kg discs.'),
  },
  plateau: null,
  taken: null,
}
const fly: ExerciseReport = {
  ...bench, exerciseId: 2, slotId: 11, name: 'Cable fly', records: [], e1rmChangePct: null, alternative: null,
  nextStep: { action: 'add_rep', targetLoadKg: 20, targetReps: 13, repsMin: 10, repsMax: 15, workChangePct: 8.3, reason: reason('One more rep.') },
  plateau: { exposuresWithoutImprovement: 3, options: [{ kind: 'deload', reason: reason('Drop the load by a tenth for a week.') }] },
}
const report: SessionReport = {
  session: { ...buildRunSession(), status: 'completed', completedAt: '2026-12-01T18:05:00.000Z', workingSets: 4, volumeKg: 3412.5 },
  durationSec: 3900,
  exercises: [bench, fly],
}

async function mountSummary(...more: { status: number; body?: unknown }[]) {
  const stub = stubFetch({ status: 200, body: { report } }, { status: 200, body: { session: buildRunSession() } }, ...more)
  const wrapper = mount(SessionSummaryView, { props: { id: 41 }, global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}

describe('SessionSummaryView', () => {
  it('shows sets, volume, duration, records, the estimated-1RM change and each next step with its percent of work', async () => {
    const { wrapper, requests } = await mountSummary()
    const text = wrapper.get('[data-testid="session-summary"]').text()

    expect(requests.map((r) => r.url)).toEqual(['/api/sessions/41/report', '/api/sessions/41/run'])
    expect(wrapper.get('[data-testid="summary-sets"]').text()).toBe('4')
    expect(wrapper.get('[data-testid="summary-volume"]').text()).toBe('3,413 kg')
    expect(wrapper.get('[data-testid="summary-duration"]').text()).toBe('1 h 05 min')
    expect(text).toContain('Rep record: 100 kg × 9 (was 8)')
    expect(wrapper.get('[data-testid="e1rm-change"]').text()).toBe('+2.6 %')
    const cards = wrapper.findAll('[data-testid="next-step"]')
    expect(cards[0].get('[data-testid="next-step-title"]').text()).toBe('Add load: 102.5 kg × 6')
    expect(cards[0].get('[data-testid="next-step-work"]').text()).toBe('−12.3 % work')
    expect(cards[0].text()).toContain('Or a smaller step: Add load: 101 kg × 6')
    expect(cards[1].get('[data-testid="next-step-title"]').text()).toBe('One more rep: 20 kg × 13')
    expect(cards[1].get('[data-testid="plateau"]').text()).toContain('Deload — Drop the load by a tenth for a week.')
  })

  it('Take it sends that exercise next step as it stands', async () => {
    const taken = { ...report, exercises: [{ ...bench, taken: { targetLoadKg: 102.5, targetReps: 6, status: 'taken' } }, fly] }
    const { wrapper, requests } = await mountSummary({ status: 200, body: { report: taken } })

    await wrapper.findAll('[data-testid="take-it"]')[0].trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({
      method: 'POST',
      url: '/api/sessions/41/next-steps',
      body: { steps: [{ exerciseId: 1, slotId: 10, targetLoadKg: 102.5, targetReps: 6, edited: false }] },
    })
    expect(wrapper.get('[data-testid="next-step-taken"]').text()).toBe('Taken: 102.5 kg × 6')
  })

  it('Edit then Take it sends the edited load and reps, stepped by the equipment', async () => {
    const { wrapper, requests } = await mountSummary({ status: 200, body: { report } })
    const card = wrapper.findAll('[data-testid="next-step"]')[0]

    await card.get('[data-testid="edit-next-step"]').trigger('click')
    await card.get('[data-testid="edit-load-minus"]').trigger('click') // to 102 kg: bar and collars are 25 kg and the discs pair up, so this set makes whole kilograms only
    await card.get('[data-testid="edit-reps-plus"]').trigger('click')
    await card.get('[data-testid="take-edited"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({ steps: [{ exerciseId: 1, slotId: 10, targetLoadKg: 102, targetReps: 7, edited: true }] })
  })

  it('Take all sends every next step not yet taken in one request', async () => {
    const { wrapper, requests } = await mountSummary({ status: 200, body: { report } })

    await wrapper.get('[data-testid="take-all"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({
      steps: [
        { exerciseId: 1, slotId: 10, targetLoadKg: 102.5, targetReps: 6, edited: false },
        { exerciseId: 2, slotId: 11, targetLoadKg: 20, targetReps: 13, edited: false },
      ],
    })
  })
})
