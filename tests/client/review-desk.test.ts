import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { DropdownItem } from 'vant'
import type { ReviewDeskRow } from '@shared/schemas/review.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import ReviewDeskView from '@/views/ReviewDeskView.vue'
import { flagText } from '@/components/review/review-labels'
import { formatDay } from '@/utils/dates'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser({ id: 3, name: 'Dana Reyes', role: 'coach' })
  useSessionStore().token = 'tok'
  setAuthToken('tok')
  router = createAppRouter(createMemoryHistory())
  await router.push('/review')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

function row(id: number, athlete: { id: number; name: string }, overrides: Partial<ReviewDeskRow> = {}): ReviewDeskRow {
  return {
    session: {
      id, athleteId: athlete.id, dayName: 'Push', version: 'I', status: 'completed',
      startedAt: '2026-12-01T11:00:00.000Z', completedAt: '2026-12-01T12:00:00.000Z', workingSets: 10, volumeKg: 6543.2, records: 0,
    },
    athlete,
    flags: [],
    reviewedAt: null,
    commentCount: 0,
    ...overrides,
  }
}

const sam = { id: 12, name: 'Sam Okafor' }
const lee = { id: 14, name: 'Lee Brandt' }
const waiting: ReviewDeskRow[] = [
  row(41, sam, {
    commentCount: 2,
    flags: [
      { code: 'plateau', exercise: 'Barbell bench press', values: { exposures: 3 } },
      { code: 'regression', exercise: 'Back squat', values: { e1rmChangePct: -7.9 } },
      { code: 'top_set_far_short', exercise: 'Bench press', values: { reps: 4, repsMin: 6 } },
      { code: 'cut_short', values: { done: 8, planned: 12 } },
      { code: 'missed_days', values: { missed: 3 } },
    ],
  }),
  row(38, lee, { session: { ...row(38, lee).session, dayName: 'Legs', version: 'II', workingSets: 1, completedAt: '2026-11-29T12:00:00.000Z' }, commentCount: 1 }),
]
const reviewed: ReviewDeskRow[] = [row(30, sam, { reviewedAt: '2026-11-28T12:00:00.000Z' })]

async function mountDesk(...replies: { status: number; body?: unknown }[]) {
  const stub = stubFetch({ status: 200, body: { sessions: waiting } }, ...replies)
  const wrapper = mount(ReviewDeskView, { global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}

describe('ReviewDeskView', () => {
  it('asks for the waiting sessions and lists them newest first with day, version, date, sets, volume and comments', async () => {
    const { wrapper, requests } = await mountDesk()

    expect(requests[0]).toMatchObject({ method: 'GET', url: '/api/review-desk?status=waiting' })
    expect(requests[0].headers.Authorization).toBe('Bearer tok')
    const rows = wrapper.findAll('[data-testid="desk-row"]')
    expect(rows).toHaveLength(2)
    expect(rows[0].get('[data-testid="desk-athlete"]').text()).toBe('Sam Okafor')
    expect(rows[0].get('[data-testid="desk-day"]').text()).toBe('Push · version I')
    expect(rows[0].get('[data-testid="desk-date"]').text()).toBe(formatDay('2026-12-01T12:00:00.000Z'))
    expect(rows[0].get('[data-testid="desk-numbers"]').text()).toBe('10 sets · 6,543 kg · 2 comments')
    expect(rows[0].get('[data-testid="desk-state"]').text()).toBe('Waiting')
    expect(rows[1].get('[data-testid="desk-day"]').text()).toBe('Legs · version II')
    expect(rows[1].get('[data-testid="desk-numbers"]').text()).toBe('1 set · 6,543 kg · 1 comment')
  })

  it('shows every flag as a readable chip', async () => {
    const { wrapper } = await mountDesk()
    const row = wrapper.findAll('[data-testid="desk-row"]')[0]
    const chip = (code: string) => row.get(`[data-testid="flag-${code}"]`).text()

    expect(chip('plateau')).toBe('Plateau: Barbell bench press (3 sessions)')
    expect(chip('regression')).toBe('Regression: Back squat estimated 1RM −7.9 %')
    expect(chip('top_set_far_short')).toBe('Top set far short: Bench press, 4 of 6+')
    expect(chip('cut_short')).toBe('Cut short: 8 of 12 sets')
    expect(chip('missed_days')).toBe('Missed 3 training days')
    expect(wrapper.findAll('[data-testid="desk-row"]')[1].find('[data-testid^="flag-"]').exists()).toBe(false)
  })

  it('a row opens the review of that session', async () => {
    const { wrapper } = await mountDesk()

    expect(wrapper.findAll('[data-testid="desk-row"]')[1].attributes('href')).toBe('/review/38')
  })

  it('switching to "Reviewed" asks for status=reviewed and shows the reviewed date', async () => {
    const { wrapper, requests } = await mountDesk({ status: 200, body: { sessions: reviewed } })

    await wrapper.get('[data-testid="status-reviewed"]').trigger('click')
    await flushPromises()

    expect(requests[1]).toMatchObject({ method: 'GET', url: '/api/review-desk?status=reviewed' })
    const rows = wrapper.findAll('[data-testid="desk-row"]')
    expect(rows).toHaveLength(1)
    expect(rows[0].get('[data-testid="desk-state"]').text()).toBe(`Reviewed ✓ ${formatDay('2026-11-28T12:00:00.000Z')}`)
  })

  it('filtering by athlete asks for that athlete only, and "All athletes" drops the filter', async () => {
    const { wrapper, requests } = await mountDesk(
      { status: 200, body: { sessions: [waiting[1]] } },
      { status: 200, body: { sessions: waiting } },
    )
    const filter = wrapper.findComponent(DropdownItem)
    expect((filter.props('options') as Array<{ text: string }>).map((o) => o.text)).toEqual(['All athletes', 'Lee Brandt', 'Sam Okafor'])

    filter.vm.$emit('update:modelValue', lee.id)
    await flushPromises()
    expect(requests[1].url).toBe('/api/review-desk?status=waiting&athleteId=14')
    expect(wrapper.findAll('[data-testid="desk-athlete"]').map((a) => a.text())).toEqual(['Lee Brandt'])

    filter.vm.$emit('update:modelValue', 0)
    await flushPromises()
    expect(requests[2].url).toBe('/api/review-desk?status=waiting')
  })

  it('says so when nothing is waiting', async () => {
    stubFetch({ status: 200, body: { sessions: [] } })
    const wrapper = mount(ReviewDeskView, { global: { plugins: [pinia, router] } })
    await flushPromises()

    expect(wrapper.find('[data-testid="desk-row"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('Nothing waiting.')
  })
})

describe('flagText', () => {
  it('counts in the singular for one', () => {
    expect(flagText({ code: 'missed_days', values: { missed: 1 } })).toBe('Missed 1 training day')
    expect(flagText({ code: 'plateau', exercise: 'Row', values: { exposures: 1 } })).toBe('Plateau: Row (1 session)')
  })

  it('shows the whole rep range of a far-short top set when the top of it is known', () => {
    const flag = { code: 'top_set_far_short' as const, exercise: 'Bench press', values: { reps: 4, repsMin: 6 } }
    expect(flagText(flag, 9)).toBe('Top set far short: Bench press, 4 of 6–9')
  })
})
