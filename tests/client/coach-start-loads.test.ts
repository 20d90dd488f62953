import { beforeAll, describe, expect, it } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import type { StartEstimateRow } from '@shared/schemas/start-estimate.schema'
import { setAuthToken } from '@/api/client'
import { useSessionStore } from '@/stores/session'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/AthleteStartLoadsView.vue')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

/** 1 lb = 0.45359237 kg exactly (International Yard and Pound Agreement, 1959; NIST SP 811, App. B). */
const KG_PER_LB = 0.45359237

const noor: AthleteRow = {
  id: 5, name: 'Noor Vale', email: 'noor@example.com', unit: 'lb', planId: 12, planName: 'Winter base',
  lastSessionAt: null, sessionsLast28Days: 0, plannedLast28Days: 8, adherencePct: 0,
  plateauLifts: [], waitingReview: 0, e1rmTrend: [],
}
const bench: StartEstimateRow = { exerciseId: 1, exerciseName: 'Barbell bench press', hasHistory: false, e1rmKg: null, loadKg: null, reps: null, setBy: null }
// Noor entered 25 lb × 6 on the set card herself (stored in kg).
const chinUp: StartEstimateRow = {
  exerciseId: 2, exerciseName: 'Chin-up', hasHistory: false, e1rmKg: 70, loadKg: 25 * KG_PER_LB, reps: 6, setBy: 'lifter',
}
const squat: StartEstimateRow = { exerciseId: 3, exerciseName: 'Back squat', hasHistory: true, e1rmKg: null, loadKg: null, reps: null, setBy: null }

async function openStartLoads(...after: Array<{ status: number; body?: unknown }>) {
  const stub = stubFetch(
    { status: 200, body: { athletes: [noor] } },
    { status: 200, body: { estimates: [bench, chinUp, squat] } },
    ...after,
  )
  const session = useSessionStore()
  session.user = buildUser({ id: 3, role: 'coach', unit: 'kg' })
  session.token = 'tok'
  setAuthToken('tok')
  await router.push('/athletes/5/start-loads')
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { view, ...stub }
}
const row = (view: VueWrapper, exerciseId: number) => view.get(`[data-testid="start-load-row"][data-exercise-id="${exerciseId}"]`)

describe('AthleteStartLoadsView', () => {
  it('lists the plan exercises without history in the athlete\'s unit, with what is saved and who set it', async () => {
    const { view, requests } = await openStartLoads()

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/athletes', 'GET /api/athletes/5/start-estimates'])
    expect(view.get('h1').text()).toBe('Noor Vale: starting loads')
    expect(view.findAll('[data-testid="start-load-row"]').map((r) => r.attributes('data-exercise-id'))).toEqual(['1', '2'])
    // The athlete trains in pounds (the coach in kilograms): the saved 11.34 kg reads as 25 lb.
    expect((row(view, 2).get('[data-testid="start-load-load"] input').element as HTMLInputElement).value).toBe('25')
    expect(row(view, 2).get('[data-testid="start-load-load"]').text()).toContain('lb')
    expect(row(view, 2).get('[data-testid="start-load-saved"]').text()).toBe('Saved: 25 lb × 6 · estimated 1RM 154.3 lb · entered by Noor')
    expect(row(view, 1).find('[data-testid="start-load-saved"]').exists()).toBe(false)
    expect(view.get('[data-testid="start-loads-history"]').text()).toBe('Planned from the logbook: Back squat.')
    expect(view.get('[data-testid="start-loads-save"]').text()).toBe('Nothing to save')
  })

  it('Save sends only the rows the coach changed, loads converted from lb to kg, and shows them saved by the coach', async () => {
    const saved: StartEstimateRow = {
      ...bench, loadKg: 135 * KG_PER_LB, reps: 8,
      // As the server answers: Epley (1985), 135 × (1 + 8/30) = 171 lb.
      e1rmKg: 171 * KG_PER_LB, setBy: 'coach',
    }
    const { view, requests } = await openStartLoads({ status: 200, body: { estimates: [saved, chinUp, squat] } })

    await row(view, 1).get('[data-testid="start-load-load"] input').setValue('135')
    await row(view, 1).get('[data-testid="start-load-reps"] input').setValue('8')
    expect(view.get('[data-testid="start-loads-save"]').text()).toBe('Save 1 starting load')
    await view.get('[data-testid="start-loads"]').trigger('submit')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'PUT', url: '/api/athletes/5/start-estimates' })
    const body = requests[2].body as { estimates: Array<{ exerciseId: number; loadKg: number; reps: number }> }
    expect(body.estimates).toHaveLength(1)
    expect(body.estimates[0].exerciseId).toBe(1)
    expect(body.estimates[0].reps).toBe(8)
    // 135 lb × 0.45359237 kg/lb = 61.23497 kg, sent at full precision.
    expect(body.estimates[0].loadKg).toBeCloseTo(61.23497, 5)
    expect(row(view, 1).get('[data-testid="start-load-saved"]').text()).toBe('Saved: 135 lb × 8 · estimated 1RM 171 lb · set by coach')
    expect(view.get('[data-testid="start-loads-save"]').text()).toBe('Nothing to save')
  })

  it('a row with a load but no reps is marked and nothing is sent', async () => {
    const { view, requests } = await openStartLoads()

    await row(view, 1).get('[data-testid="start-load-load"] input').setValue('135')
    await view.get('[data-testid="start-loads"]').trigger('submit')
    await flushPromises()

    expect(row(view, 1).get('[data-testid="start-load-error"]').text()).toBe('Enter a load and a whole number of reps')
    expect(requests).toHaveLength(2)
  })

  it('a set of more than 20 reps is refused by the shared schema before sending', async () => {
    const { view, requests } = await openStartLoads()

    await row(view, 1).get('[data-testid="start-load-load"] input').setValue('95')
    await row(view, 1).get('[data-testid="start-load-reps"] input').setValue('25')
    await view.get('[data-testid="start-loads"]').trigger('submit')
    await flushPromises()

    expect(row(view, 1).get('[data-testid="start-load-error"]').text()).toBe('Use a set of 20 reps or fewer')
    expect(requests).toHaveLength(2)
  })
})
