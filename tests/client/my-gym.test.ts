import { beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import { KG_GYM, LB_GYM, type GymProfile } from '@shared/domain/gym'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import type { Role } from '@shared/schemas/common.schema'
import { setAuthToken } from '@/api/client'
import { useSessionStore } from '@/stores/session'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/MyGymView.vue')
  await import('@/views/AthleteGymView.vue')
  await import('@/views/MeView.vue')
  await import('@shared/schemas/gym.schema')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

const SAVED_AT = '2026-12-02T18:30:00.000Z'
const answer = (gym: GymProfile, savedAt: string | null = null) => ({ status: 200, body: { gym, savedAt } })
/** What the server is sent for a piece: the stored shape without names (and without collarMass for a bar or sled). */
const sent = <T extends { name?: string }>(piece: T) => {
  const { name: _name, ...rest } = piece
  return rest
}

async function open(path: string, role: Role, ...replies: Array<{ status: number; body?: unknown }>) {
  const stub = stubFetch(...replies)
  const session = useSessionStore()
  session.user = buildUser({ role })
  session.token = 'tok'
  setAuthToken('tok')
  await router.push(path)
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { view, ...stub }
}

const text = (view: VueWrapper, id: string) => view.get(`[data-testid="${id}"]`).text()
const summary = (view: VueWrapper, part: string) => view.findAll(`[data-testid="gym-${part}-summary"] li`).map((li) => li.text())

describe('MyGymView', () => {
  it('starts from the preset, says what the bar can load, and sends the edited gym on Save', async () => {
    const { view, requests } = await open('/me/gym', 'lifter', answer(KG_GYM))

    expect(requests[0]).toMatchObject({ method: 'GET', url: '/api/me/gym' })
    expect(text(view, 'gym-save-status')).toBe('Not saved yet: the kilogram gym preset')
    // KG_GYM_SET: 20 kg bar; a 1.25 kg pair makes a 2.5 kg step; 20 + 2 x (6x25 + 2x20 + 2x15 + 2x10
    // + 2x5 + 2x2.5 + 2x1.25) = 20 + 2 x 257.5 = 535 kg with every plate on (arithmetic).
    expect(summary(view, 'barbell')).toEqual(['Empty bar: 20 kg', 'Smallest step on the bar: 2.5 kg', 'Heaviest bar load: 535 kg'])

    await view.get('[data-testid="gym-bar-mass"] input').setValue('15')
    await view.get('[data-testid="gym-collars-counted"]').trigger('click')
    // The preset remembers IWF collars (2.5 kg each): counting them needs no typing.
    expect((view.get('[data-testid="gym-collar-mass"] input').element as HTMLInputElement).value).toBe('2.5')
    await view.get('[data-testid="gym-bar-plates-row"][data-mass="1.25"] [data-testid="gym-bar-plates-remove"]').trigger('click')
    await view.get('[data-testid="gym-bar-plates-new"]').setValue('0.5')
    await view.get('[data-testid="gym-bar-plates"] form').trigger('submit')

    // 15 + 2 x 2.5 = 20 kg empty; one 0.5 kg plate a side: a 1 kg step; 20 + 2 x 255.5 = 531 kg (arithmetic).
    expect(summary(view, 'barbell')).toEqual([
      'Empty bar with collars: 20 kg', 'Smallest step on the bar: 1 kg', 'Heaviest bar load: 531 kg',
    ])
    await view.get('[data-testid="gym-bar-plates-row"][data-mass="0.5"] button[aria-label="One more: 0.5 kg plates a side"]').trigger('click')
    // A second 0.5 kg a side: 20 + 2 x 256 = 532 kg.
    expect(summary(view, 'barbell')[2]).toBe('Heaviest bar load: 532 kg')
    expect(text(view, 'gym-save-status')).toContain('Changes not saved yet')

    const saved = { ...KG_GYM, barbell: { ...KG_GYM.barbell, barMass: 15 } }
    const { requests: puts } = stubFetch(answer(saved, SAVED_AT))
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    expect(puts).toHaveLength(1)
    expect(puts[0]).toMatchObject({ method: 'PUT', url: '/api/me/gym' })
    expect(puts[0].body).toEqual({
      barbell: {
        kind: 'barbell', unit: 'kg', barMass: 15, collars: { counted: true, mass: 2.5 },
        plates: [
          { mass: 25, count: 6 }, { mass: 20, count: 2 }, { mass: 15, count: 2 }, { mass: 10, count: 2 },
          { mass: 5, count: 2 }, { mass: 2.5, count: 2 }, { mass: 0.5, count: 2 },
        ],
      },
      sled: { kind: 'barbell', unit: 'kg', barMass: 50, plates: KG_GYM.sled.plates },
      dumbbell: sent(KG_GYM.dumbbell),
      stack: sent(KG_GYM.stack),
      bodyweight: sent(KG_GYM.bodyweight),
    })
    expect(text(view, 'gym-save-status')).toMatch(/^Saved \w{3}, Dec \d, 2026$/)
    view.unmount()
  })

  it('starts again from the pound gym and sends it whole', async () => {
    const { view } = await open('/me/gym', 'lifter', answer(KG_GYM))
    await view.get('[data-testid="gym-preset-lb"]').trigger('click')

    // LB_GYM_SET: 45 lb bar, smallest step 2 x 2.5 lb = 5 lb (arithmetic).
    expect(summary(view, 'barbell')).toEqual(['Empty bar: 45 lb', 'Smallest step on the bar: 5 lb', 'Heaviest bar load: 820 lb'])
    expect(summary(view, 'dumbbell')).toEqual(['Dumbbells from 5 lb to 100 lb', 'Smallest step between dumbbells: 5 lb'])
    const { requests } = stubFetch(answer(LB_GYM, SAVED_AT))
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    const { collarMass: _bar, ...barbell } = sent(LB_GYM.barbell)
    const { collarMass: _sled, ...sled } = sent(LB_GYM.sled)
    expect(requests[0].body).toEqual({
      barbell, sled, dumbbell: sent(LB_GYM.dumbbell), stack: sent(LB_GYM.stack), bodyweight: sent(LB_GYM.bodyweight),
    })
    view.unmount()
  })

  it('adds a run of dumbbells and a new pin run, and sends them', async () => {
    const { view } = await open('/me/gym', 'lifter', answer(KG_GYM))
    await view.get('[data-testid="gym-dumbbell-from"]').setValue('51')
    await view.get('[data-testid="gym-dumbbell-to"]').setValue('55')
    await view.get('[data-testid="gym-dumbbell-every"]').setValue('2')
    await view.get('[data-testid="gym-dumbbell"] form').trigger('submit')
    await view.get('[data-testid="gym-stack-heaviest"] input').setValue('100')
    await view.get('[data-testid="gym-stack-every"] input').setValue('10')

    expect(view.findAll('[data-testid="gym-dumbbell-chip"]').slice(-3).map((c) => c.text())).toEqual(['51 kg ×', '53 kg ×', '55 kg ×'])
    // 5 to 100 every 10 with a 2.5 kg add-on: 5 ... 95 and 97.5 (arithmetic).
    expect(summary(view, 'stack')).toEqual(['Machine loads from 5 kg to 97.5 kg', 'Smallest step on a machine: 2.5 kg'])
    const { requests } = stubFetch(answer(KG_GYM, SAVED_AT))
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    const body = requests[0].body as GymProfile
    expect(body.dumbbell.pairs).toEqual([...KG_GYM.dumbbell.pairs, 51, 53, 55])
    expect(body.stack.steps).toEqual([5, 15, 25, 35, 45, 55, 65, 75, 85, 95])
    view.unmount()
  })

  it('sends nothing while a field is wrong, and says what is wrong where', async () => {
    const { view, requests } = await open('/me/gym', 'lifter', answer(KG_GYM))
    await view.get('[data-testid="gym-bar-mass"] input').setValue('')
    await view.get('[data-testid="gym-sled-mass"] input').setValue('300')
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    expect(requests).toHaveLength(1)
    expect(view.get('[data-testid="gym-bar-mass"]').text()).toContain("Enter the bar's mass in numbers")
    expect(summary(view, 'barbell')).toEqual(['Fix the fields marked above to see what this loads.'])

    await view.get('[data-testid="gym-bar-mass"] input').setValue('20')
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()
    expect(requests).toHaveLength(1)
    expect(view.get('[data-testid="gym-sled-mass"]').text()).toContain('A sled weighs 0 to 250 kg')
    view.unmount()
  })

  it("shows the server's refusal on the field it names", async () => {
    const { view } = await open('/me/gym', 'lifter', answer(KG_GYM))
    stubFetch({
      status: 400,
      body: { error: { code: 'validation_failed', message: 'Some fields are not valid', issues: [{ path: 'barbell.plates.0.count', message: 'At most 20' }] } },
    })
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    expect(view.get('[data-testid="gym-bar-plates-row"][data-mass="25"]').text()).toContain('At most 20')
    view.unmount()
  })

  it('is reached from the Me screen by a lifter, not shown to a coach', async () => {
    const lifter = await open('/me', 'lifter')
    expect(lifter.view.get('[data-testid="me-gym-link"]').text()).toContain('My gym')
    lifter.view.unmount()

    const coach = await open('/me', 'coach')
    expect(coach.view.find('[data-testid="me-gym-link"]').exists()).toBe(false)
    coach.view.unmount()
  })
})

describe('AthleteGymView', () => {
  const noor: AthleteRow = {
    id: 5, name: 'Noor Vale', email: 'noor@example.com', unit: 'kg', planId: null, planName: null,
    lastSessionAt: null, sessionsLast28Days: 0, plannedLast28Days: 0, adherencePct: null,
    plateauLifts: [], waitingReview: 0, e1rmTrend: [],
  }

  it("lets the coach edit the athlete's gym and saves it under the athlete", async () => {
    const { view, requests } = await open('/athletes/5/gym', 'coach', { status: 200, body: { athletes: [noor] } }, answer(KG_GYM, SAVED_AT))

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/athletes', 'GET /api/athletes/5/gym'])
    expect(view.get('h1').text()).toBe("Noor Vale's gym")
    await view.get('[data-testid="gym-sled-mass"] input').setValue('62.5')
    expect(summary(view, 'sled')[0]).toBe('Empty sled: 62.5 kg')
    const { requests: puts } = stubFetch(answer(KG_GYM, SAVED_AT))
    await view.get('[data-testid="gym-save"]').trigger('click')
    await flushPromises()

    expect(puts[0]).toMatchObject({ method: 'PUT', url: '/api/athletes/5/gym' })
    expect((puts[0].body as GymProfile).sled.barMass).toBe(62.5)
    view.unmount()
  })

  it('is reached from the athlete page', async () => {
    const { view } = await open(
      '/athletes/5', 'coach',
      { status: 200, body: { athletes: [noor] } },
      { status: 200, body: { sessions: [] } },
      { status: 200, body: { progress: { e1rm: [], weeklySets: [], planWeeklySets: [], bodyWeight: [] } } },
    )
    await view.get('[data-testid="athlete-gym-link"]').trigger('click')
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/athletes/5/gym'))
    view.unmount()
  })
})
