import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { RouterView, createMemoryHistory, type Router } from 'vue-router'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import {
  adherenceText, filterAthletes, needsAttention, sortAthletes,
} from '@/components/coach/athlete-list'
import { sparklinePath, sparklinePoints } from '@/components/coach/sparkline'
import { buildUser, stubFetch } from './helpers/fetch-stub'

function athlete(overrides: Partial<AthleteRow> = {}): AthleteRow {
  return {
    id: 1,
    name: 'Ada Quill',
    email: 'ada@example.com',
    unit: 'kg',
    planId: 12,
    planName: 'Winter base',
    lastSessionAt: '2026-11-30T18:00:00.000Z',
    sessionsLast28Days: 7,
    plannedLast28Days: 8,
    adherencePct: 88,
    plateauLifts: [],
    waitingReview: 0,
    e1rmTrend: [],
    ...overrides,
  }
}

const ada = athlete()
const bram = athlete({
  id: 2, name: 'Bram Oduya', email: 'bram@example.com', lastSessionAt: '2026-12-01T07:00:00.000Z',
  sessionsLast28Days: 4, plannedLast28Days: 8, adherencePct: 50,
})
const cleo = athlete({
  id: 3, name: 'cleo Marsh', email: 'cleo@example.com', lastSessionAt: null, planId: null, planName: null,
  sessionsLast28Days: 0, plannedLast28Days: null, adherencePct: null, waitingReview: 3,
})
const dev = athlete({
  id: 4, name: 'Dev Anand', email: 'dev@example.com', lastSessionAt: '2026-11-20T07:00:00.000Z',
  sessionsLast28Days: 8, plannedLast28Days: 8, adherencePct: 100, plateauLifts: ['Back squat'],
})

describe('the Athletes list helpers', () => {
  it('sorts by name ignoring case, last session newest first, adherence lowest first and waiting most first', () => {
    const all = [dev, cleo, bram, ada]

    expect(sortAthletes(all, 'name').map((a) => a.id)).toEqual([1, 2, 3, 4])
    expect(sortAthletes(all, 'lastSession').map((a) => a.id)).toEqual([2, 1, 4, 3])
    expect(sortAthletes(all, 'adherence').map((a) => a.id)).toEqual([2, 1, 4, 3])
    expect(sortAthletes(all, 'waiting').map((a) => a.id)).toEqual([3, 1, 2, 4])
  })

  it('counts an athlete as needing attention for a plateau, a session waiting or adherence under 75 %', () => {
    expect(needsAttention(ada)).toBe(false)
    expect(needsAttention(bram)).toBe(true)
    expect(needsAttention(cleo)).toBe(true)
    expect(needsAttention(dev)).toBe(true)
    expect(needsAttention(athlete({ adherencePct: 75 }))).toBe(false)
    expect(needsAttention(athlete({ adherencePct: 74 }))).toBe(true)
  })

  it('filters by part of the name and by "needs attention" together', () => {
    const all = [ada, bram, cleo, dev]

    expect(filterAthletes(all, { search: ' CLE ', needsAttention: false }).map((a) => a.id)).toEqual([3])
    expect(filterAthletes(all, { search: '', needsAttention: true }).map((a) => a.id)).toEqual([2, 3, 4])
    expect(filterAthletes(all, { search: 'a', needsAttention: true }).map((a) => a.id)).toEqual([2, 3, 4])
    expect(filterAthletes(all, { search: 'ada', needsAttention: true })).toEqual([])
  })

  it('writes adherence as "7 of 8 · 88 %", and the bare count without a plan', () => {
    expect(adherenceText(ada)).toBe('7 of 8 · 88 %')
    expect(adherenceText(cleo)).toBe('0 sessions · no plan')
    expect(adherenceText(athlete({ planId: null, planName: null, plannedLast28Days: null, adherencePct: null, sessionsLast28Days: 1 }))).toBe(
      '1 session · no plan',
    )
  })
})

describe('the estimated-1RM sparkline', () => {
  const box = { width: 100, height: 20, padding: 0 }

  it('ends higher than it starts for a rising trend (SVG y grows downwards)', () => {
    const points = sparklinePoints([100, 102.5, 105, 110], box)

    expect(points[0]).toEqual({ x: 0, y: 20 })
    expect(points.at(-1)).toEqual({ x: 100, y: 0 })
    expect(sparklinePath([100, 102.5, 105, 110], box)).toBe('M0 20 L33.33 15 L66.67 10 L100 0')
  })

  it('ends lower than it starts for a falling trend', () => {
    const points = sparklinePoints([120, 118, 110], box)
    expect(points.at(-1)!.y).toBeGreaterThan(points[0]!.y)
  })

  it('draws a flat series through the middle and nothing for no points', () => {
    expect(sparklinePath([90, 90, 90], box)).toBe('M0 10 L50 10 L100 10')
    expect(sparklinePath([], box)).toBe('')
  })
})

describe('AthletesView', () => {
  let pinia: Pinia
  let router: Router

  // The route's view is a lazy chunk: load it once before the timed tests.
  beforeAll(async () => {
    await import('@/views/AthletesView.vue')
    await import('@/views/AthleteDetailView.vue')
  }, 30_000)

  beforeEach(() => {
    localStorage.clear()
    pinia = createPinia()
    setActivePinia(pinia)
    router = createAppRouter(createMemoryHistory())
  })

  afterEach(() => {
    setAuthToken(null)
    vi.unstubAllGlobals()
    document.body.innerHTML = ''
  })

  async function openAthletes(athletes: AthleteRow[], unit: 'kg' | 'lb' = 'kg') {
    const stub = stubFetch({ status: 200, body: { athletes } }, { status: 200, body: { invites: [] } })
    const session = useSessionStore()
    session.user = buildUser({ role: 'coach', unit })
    session.token = 'tok'
    await router.push('/athletes')
    const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
    await flushPromises()
    return { view, ...stub }
  }
  const names = (view: VueWrapper) => view.findAll('[data-testid="athlete-row"] th a').map((a) => a.text())

  it("asks for the coach's athletes and shows plan, adherence, plateau chips and the waiting badge", async () => {
    const { view, requests } = await openAthletes([dev, cleo, ada])

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/athletes', 'GET /api/invites'])
    const rows = view.findAll('[data-testid="athlete-row"]')
    expect(names(view)).toEqual(['Ada Quill', 'cleo Marsh', 'Dev Anand'])
    expect(rows[0]!.get('[data-testid="adherence"]').text()).toBe('7 of 8 · 88 %')
    expect(rows[2]!.findAll('[data-testid="plateau-chip"]').map((c) => c.text())).toEqual(['Back squat'])
    const badge = rows[1]!.get('[data-testid="waiting-review"]')
    expect(badge.text()).toBe('3 waiting')
    expect(badge.attributes('href')).toBe('/review')
    expect(rows[0]!.find('[data-testid="waiting-review"]').exists()).toBe(false)
    view.unmount()
  })

  it('sorts on a tap and narrows the list by name and by "needs attention"', async () => {
    const { view } = await openAthletes([ada, bram, cleo, dev])

    await view.get('[data-testid="sort-adherence"]').trigger('click')
    expect(names(view)).toEqual(['Bram Oduya', 'Ada Quill', 'Dev Anand', 'cleo Marsh'])

    await view.get('[data-testid="needs-attention"]').trigger('click')
    expect(names(view)).toEqual(['Bram Oduya', 'Dev Anand', 'cleo Marsh'])

    await view.get('[data-testid="athlete-search"] input').setValue('dev')
    expect(names(view)).toEqual(['Dev Anand'])

    await view.get('[data-testid="athlete-search"] input').setValue('ada')
    expect(view.findAll('[data-testid="athlete-row"]')).toHaveLength(0)
    expect(view.get('[data-testid="no-match"]').text()).toContain('No athlete matches')
    view.unmount()
  })

  it("draws a rising sparkline per main lift and labels it with the coach's unit", async () => {
    const trend = {
      exercise: 'Back squat',
      points: [
        { date: '2026-10-10T10:00:00.000Z', e1rmKg: 100 },
        { date: '2026-10-24T10:00:00.000Z', e1rmKg: 104 },
        { date: '2026-11-07T10:00:00.000Z', e1rmKg: 110 },
      ],
    }
    const { view } = await openAthletes([athlete({ e1rmTrend: [trend] })], 'lb')

    const svg = view.get('[data-testid="e1rm-sparkline"]')
    const coords = svg.get('path').attributes('d')!.match(/-?\d+(\.\d+)?/g)!.map(Number)
    const [firstY, lastY] = [coords[1]!, coords.at(-1)!]
    expect(lastY).toBeLessThan(firstY)
    expect(svg.attributes('data-direction')).toBe('up')
    expect(svg.attributes('aria-label')).toBe('Back squat estimated 1RM, 220.5 lb to 242.5 lb over 3 sessions')
    view.unmount()
  })

  it("opens an athlete's page when the row is tapped", async () => {
    const { view } = await openAthletes([ada])
    stubFetch()

    await view.get('[data-testid="athlete-row"]').trigger('click')

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('athlete-detail'))
    expect(router.currentRoute.value.params.id).toBe('1')
    view.unmount()
  })
})
