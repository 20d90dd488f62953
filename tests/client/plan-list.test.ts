import { describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import type { Plan, PlanSummary } from '@shared/schemas/plan.schema'
import type { Today } from '@shared/schemas/train.schema'
import { useSessionStore } from '@/stores/session'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

async function signInAndOpen(role: 'coach' | 'lifter', path: string) {
  useSessionStore().user = buildUser({ id: 7, role })
  useSessionStore().token = 'tok'
  await router.push(path)
}

useAppHarness((p, r) => {
  pinia = p
  router = r
})

const summary: PlanSummary = {
  id: 3, name: 'Winter base', splitKind: 'upper_lower', archived: false, dayCount: 3, assignedCount: 4, updatedAt: '2026-11-28T10:00:00.000Z',
}
const templates = {
  templates: [
    { id: 'upper_lower', name: 'Upper / Lower', splitKind: 'upper_lower', description: 'Upper, lower, rest: about four sessions a week.', days: ['Upper', 'Lower', 'Rest'] },
    { id: 'blank', name: 'Blank', splitKind: 'custom', description: 'One empty day to build on.', days: ['Day 1'] },
  ],
}
const created: Plan = {
  id: 5, ownerId: 7, name: 'Block A', splitKind: 'upper_lower', archived: false, updatedAt: '2026-12-01T10:00:00.000Z',
  days: [{ id: 50, position: 0, name: 'Upper', isRest: false, versions: { I: [], II: [] } }],
}

async function mountRoute() {
  const wrapper = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}
const byId = (w: VueWrapper, id: string) => w.get(`[data-testid="${id}"]`)

describe('PlansView', () => {
  it("lists the coach's current plans with their days, athletes and last change", async () => {
    const { requests } = stubFetch({ status: 200, body: { plans: [summary] } }, { status: 200, body: templates })
    await signInAndOpen('coach', '/plans')

    const view = await mountRoute()

    expect(requests[0]).toMatchObject({ method: 'GET', url: '/api/plans?archived=false' })
    const rows = view.findAll('[data-testid="plan-row"]')
    expect(rows).toHaveLength(1)
    expect(rows[0].text()).toContain('Winter base')
    expect(rows[0].text()).toContain('3 days · 4 athletes · updated')
    view.unmount()
  })

  it('creates a plan from the chosen template with the typed name, then opens it in the editor', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { plans: [summary] } },
      { status: 200, body: templates },
      { status: 201, body: { plan: created } },
      { status: 200, body: { plan: created } },
      { status: 200, body: { athletes: [] } },
    )
    await signInAndOpen('coach', '/plans')
    const view = await mountRoute()

    await byId(view, 'new-plan').trigger('click')
    await flushPromises()
    await byId(view, 'template-upper_lower').trigger('click')
    const name = byId(view, 'plan-name-field').get('input')
    expect((name.element as HTMLInputElement).value).toBe('Upper / Lower')
    await name.setValue('Block A')
    await byId(view, 'create-plan').trigger('click')

    // The editor's chunk is loaded on first use: allow for that.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('plan-edit'), { timeout: 10_000 })
    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/plans/from-template', body: { templateId: 'upper_lower', name: 'Block A' } })
    expect(router.currentRoute.value.params.id).toBe('5')
    view.unmount()
  })
})

describe('PlanView (lifter)', () => {
  const today: Today = {
    plan: { id: 5, name: 'Block A' }, day: null, planDays: [], nextTraining: null, inProgressSessionId: null, lastSession: null,
  }

  it("shows the lifter's current plan read-only, fetched by the id Train knows", async () => {
    const plan: Plan = {
      ...created,
      ownerId: 99,
      days: [
        {
          id: 50, position: 0, name: 'Upper', isRest: false,
          versions: {
            I: [{ id: 1, exerciseId: 1, exerciseName: 'Barbell bench press', pattern: 'horizontal_push', primaryMuscles: ['chest'], secondaryMuscles: [], role: 'compound_primary', scheme: { sets: [{ kind: 'top', repsMin: 6, repsMax: 9, toFailure: true, targetRir: null, loadStepDownPct: null }], warmup: true, warmupSets: null }, restSec: 180 }],
            II: [{ id: 2, exerciseId: 3, exerciseName: 'Incline barbell bench press', pattern: 'horizontal_push', primaryMuscles: ['chest'], secondaryMuscles: [], role: 'compound_primary', scheme: { sets: [{ kind: 'top', repsMin: 6, repsMax: 9, toFailure: true, targetRir: null, loadStepDownPct: null }], warmup: true, warmupSets: null }, restSec: 180 }],
          },
        },
      ],
    }
    const { requests } = stubFetch({ status: 200, body: today }, { status: 200, body: templates }, { status: 200, body: { plan } })
    await signInAndOpen('lifter', '/plan')

    const view = await mountRoute()
    await flushPromises()

    expect(requests.map((r) => r.url)).toContain('/api/plans/5')
    const text = view.text()
    expect(text).toContain('Set by your coach.')
    expect(text).toContain('Barbell bench press')
    expect(text).toContain('Incline barbell bench press')
    expect(text).toContain('top set 6-9 to failure · warm-up · rest 3:00')
    expect(view.find('[data-testid="edit-own-plan"]').exists()).toBe(false)
    view.unmount()
  })

  it('offers a lifter without a plan to build their own from a template', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { ...today, plan: null } },
      { status: 200, body: templates },
      { status: 201, body: { plan: created } },
      { status: 200, body: { plan: created } },
    )
    await signInAndOpen('lifter', '/plan')
    const view = await mountRoute()

    await byId(view, 'build-own-plan').trigger('click')
    await flushPromises()
    await byId(view, 'template-blank').trigger('click')
    await byId(view, 'create-plan').trigger('click')

    // The editor's chunk is loaded on first use: allow for that.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('plan-edit'), { timeout: 10_000 })
    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/plans/from-template', body: { templateId: 'blank', name: 'Blank' } })
    view.unmount()
  })
})
