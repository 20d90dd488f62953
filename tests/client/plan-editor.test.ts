import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type DOMWrapper, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { RouterView, createMemoryHistory, type Router } from 'vue-router'
import { DEFAULT_REST_SECONDS, DEFAULT_SCHEMES } from '@shared/domain/schemes'
import type { Exercise } from '@shared/schemas/exercise.schema'
import type { Plan, Slot } from '@shared/schemas/plan.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  localStorage.clear()
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser({ id: 7, role: 'coach' })
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/plans/1')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

function slot(id: number, exerciseId: number, exerciseName: string, role: Slot['role'], primaryMuscles: string[], secondaryMuscles: string[] = []): Slot {
  return {
    id, exerciseId, exerciseName, pattern: role === 'isolation' ? 'lateral_raise' : 'horizontal_push',
    primaryMuscles, secondaryMuscles, role, scheme: structuredClone(DEFAULT_SCHEMES[role]), restSec: DEFAULT_REST_SECONDS[role],
  }
}

/** One training day (Push) and a rest day: with a rest day, one plan day per calendar day. */
function buildPlan(): Plan {
  return {
    id: 1, ownerId: 7, name: 'Spring block', splitKind: 'custom', archived: false, updatedAt: '2026-11-30T09:00:00.000Z',
    days: [
      {
        id: 10, position: 0, name: 'Push', isRest: false,
        versions: {
          I: [slot(100, 1, 'Barbell bench press', 'compound_primary', ['chest'], ['triceps']), slot(101, 2, 'Dumbbell lateral raise', 'isolation', ['side_delts'])],
          II: [slot(200, 3, 'Incline barbell bench press', 'compound_primary', ['chest'], ['front_delts']), slot(201, 4, 'Cable lateral raise', 'isolation', ['side_delts'])],
        },
      },
      { id: 11, position: 1, name: 'Rest', isRest: true, versions: { I: [], II: [] } },
    ],
  }
}

const athletes = { athletes: [{ id: 21, name: 'Sam Okafor', email: 'sam@example.com', unit: 'kg', planId: null, planName: null, lastSessionAt: null, sessionsLast28Days: 0, plannedLast28Days: null, adherencePct: null, plateauLifts: [], waitingReview: 0, e1rmTrend: [] }] }
const cableFly: Exercise = {
  id: 9, name: 'Cable chest fly', pattern: 'chest_fly', primaryMuscles: ['chest'], secondaryMuscles: [],
  equipmentKind: 'cable', loadMode: 'external', loadStepKg: 0, defaultRestSec: 90, custom: false,
}

async function mountEditor() {
  const wrapper = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}
const byId = (w: VueWrapper | DOMWrapper<Element>, id: string) => w.get(`[data-testid="${id}"]`)
const firstDay = (w: VueWrapper) => w.findAll('[data-testid="plan-day"]')[0]
const slotNames = (w: VueWrapper) => firstDay(w).findAll('[data-testid="slot-exercise"]').map((s) => s.text())

async function showVersion(w: VueWrapper, version: 'I' | 'II') {
  await firstDay(w).get(`[data-testid="version-tab-${version}"]`).trigger('click')
  await flushPromises()
}

describe('PlanEditView', () => {
  it('recomputes the weekly sets per muscle and shows the cap warning when a main lift gets a 4th working set', async () => {
    stubFetch({ status: 200, body: { plan: buildPlan() } }, { status: 200, body: athletes })
    const view = await mountEditor()
    // Push + Rest: 3.5 training days a week over 2 sessions per rotation (I and II), so x1.75.
    // Chest: 2 sets in version I + 2 in version II = 4 -> 7 a week.
    expect(byId(view, 'muscle-chest').text()).toContain('7')
    expect(byId(view, 'plan-checks').text()).not.toContain('Keep a main lift to 3')

    await firstDay(view).findAll('[data-testid="edit-sets"]')[0].trigger('click')
    await flushPromises()
    await byId(view, 'scheme-both-versions').trigger('click') // this version only
    const plus = byId(view, 'scheme-set-count').get('.van-stepper__plus')
    await plus.trigger('click')
    await plus.trigger('click')
    await byId(view, 'scheme-done').trigger('click')
    await flushPromises()

    // Version I now 4 sets + version II 2 sets = 6 -> 10.5 a week.
    expect(byId(view, 'muscle-chest').text()).toContain('10.5')
    expect(byId(view, 'plan-cap-warnings').text()).toContain(
      'Barbell bench press (Push, version I): 4 working sets on a main lift. Keep a main lift to 3.',
    )
    view.unmount()
  })

  it('adds a new slot to both versions, and an exercise picked in version II leaves version I alone', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { plan: buildPlan() } },
      { status: 200, body: athletes },
      { status: 200, body: { exercises: [cableFly] } },
    )
    const view = await mountEditor()

    await byId(firstDay(view), 'add-slot').trigger('click')
    await flushPromises()
    const accessory = view.findAll('.van-action-sheet__item').find((item) => item.text() === 'Accessory')
    await accessory!.trigger('click')
    await flushPromises()

    expect(slotNames(view)).toEqual(['Barbell bench press', 'Dumbbell lateral raise', 'Pick an exercise'])
    await showVersion(view, 'II')
    expect(slotNames(view)).toEqual(['Incline barbell bench press', 'Cable lateral raise', 'Pick an exercise'])

    await firstDay(view).findAll('[data-testid="slot-exercise"]')[2].trigger('click')
    await flushPromises()
    expect(requests[2]).toMatchObject({ method: 'GET', url: '/api/exercises' })
    await byId(view, 'exercise-option-9').trigger('click')
    await flushPromises()

    expect(slotNames(view)).toEqual(['Incline barbell bench press', 'Cable lateral raise', 'Cable chest fly'])
    await showVersion(view, 'I')
    expect(slotNames(view)).toEqual(['Barbell bench press', 'Dumbbell lateral raise', 'Pick an exercise'])
    view.unmount()
  })

  it('saves with PUT /api/plans/:id, sending the ids of existing days and slots and none for new ones', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { plan: buildPlan() } },
      { status: 200, body: athletes },
      { status: 200, body: { plan: buildPlan() } },
    )
    const view = await mountEditor()

    await firstDay(view).get('[data-testid="day-name"] input').setValue('Push A')
    await byId(view, 'add-training-day').trigger('click')
    await byId(view, 'save-plan').trigger('click')
    await flushPromises()

    const put = requests[2]
    expect(put.method).toBe('PUT')
    expect(put.url).toBe('/api/plans/1')
    const side = (id: number, exerciseId: number, role: Slot['role']) => ({
      id, exerciseId, role, scheme: DEFAULT_SCHEMES[role], restSec: DEFAULT_REST_SECONDS[role],
    })
    expect(put.body).toEqual({
      name: 'Spring block',
      splitKind: 'custom',
      days: [
        {
          id: 10, name: 'Push A', isRest: false,
          versions: {
            I: [side(100, 1, 'compound_primary'), side(101, 2, 'isolation')],
            II: [side(200, 3, 'compound_primary'), side(201, 4, 'isolation')],
          },
        },
        { id: 11, name: 'Rest', isRest: true, versions: { I: [], II: [] } },
        { name: 'Day 2', isRest: false, versions: { I: [], II: [] } },
      ],
    })
    view.unmount()
  })

  it('does not send a plan with a slot still missing its exercise, and marks the slot', async () => {
    const { requests } = stubFetch({ status: 200, body: { plan: buildPlan() } }, { status: 200, body: athletes })
    const view = await mountEditor()

    await byId(firstDay(view), 'add-slot').trigger('click')
    await flushPromises()
    await view.findAll('.van-action-sheet__item').find((item) => item.text() === 'Isolation')!.trigger('click')
    await byId(view, 'save-plan').trigger('click')
    await flushPromises()

    expect(requests).toHaveLength(2)
    const rows = firstDay(view).findAll('[data-testid="plan-slot"]')
    expect(rows[2].text()).toContain('Pick an exercise')
    expect(rows[2].find('[role="alert"]').text()).toBe('Pick an exercise')
    view.unmount()
  })

  it("shows a server 400 issue at the slot its path names", async () => {
    stubFetch(
      { status: 200, body: { plan: buildPlan() } },
      { status: 200, body: athletes },
      {
        status: 400,
        body: { error: { code: 'validation_error', message: 'Some fields are not valid', issues: [{ path: 'days.0.versions.I.1.restSec', message: 'At most 10 min' }] } },
      },
    )
    const view = await mountEditor()

    await firstDay(view).get('[data-testid="day-name"] input').setValue('Push A')
    await byId(view, 'save-plan').trigger('click')
    await flushPromises()

    const rows = firstDay(view).findAll('[data-testid="plan-slot"]')
    expect(rows[0].find('[role="alert"]').exists()).toBe(false)
    expect(rows[1].get('[role="alert"]').text()).toBe('At most 10 min')
    view.unmount()
  })

  it('applies a rotation proposal with one swap unticked, sending only the ticked swap', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { plan: buildPlan() } },
      { status: 200, body: athletes },
      {
        status: 200,
        body: {
          proposal: {
            dayId: 10, version: 'I',
            swaps: [
              { slotId: 100, fromExerciseId: 1, fromName: 'Barbell bench press', toExerciseId: 31, toName: 'Dumbbell bench press' },
              { slotId: 101, fromExerciseId: 2, fromName: 'Dumbbell lateral raise', toExerciseId: 32, toName: 'Machine lateral raise' },
            ],
          },
        },
      },
      { status: 200, body: { plan: buildPlan() } },
    )
    const view = await mountEditor()

    await byId(firstDay(view), 'rotate-version').trigger('click')
    await flushPromises()
    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/plans/1/rotation-proposal', body: { dayId: 10, version: 'I' } })
    expect(byId(view, 'rotation-swap-100').text()).toMatch(/Barbell bench press.*Dumbbell bench press/)
    expect(byId(view, 'rotation-swap-101').text()).toMatch(/Dumbbell lateral raise.*Machine lateral raise/)

    await byId(view, 'rotation-swap-101').trigger('click')
    await byId(view, 'apply-rotation').trigger('click')
    await flushPromises()

    expect(requests[3]).toMatchObject({
      method: 'POST',
      url: '/api/plans/1/rotation',
      body: { dayId: 10, version: 'I', swaps: [{ slotId: 100, toExerciseId: 31 }] },
    })
    view.unmount()
  })

  it('assigns the plan to the ticked athletes from the chosen start date', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { plan: buildPlan() } },
      { status: 200, body: athletes },
      { status: 201, body: { assignment: { planId: 1, athleteIds: [21], startDate: '2026-12-07' } } },
    )
    const view = await mountEditor()

    await byId(view, 'assign-plan').trigger('click')
    await flushPromises()
    await byId(view, 'assign-athlete-21').trigger('click')
    await byId(view, 'assign-start-date').get('input').setValue('2026-12-07')
    await byId(view, 'confirm-assign').trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/plans/1/assignments', body: { athleteIds: [21], startDate: '2026-12-07' } })
    view.unmount()
  })
})
