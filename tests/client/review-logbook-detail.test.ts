import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Comment, SessionReview } from '@shared/schemas/review.schema'
import type { SessionDetail, SetLog } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import SessionDetailView from '@/views/SessionDetailView.vue'
import { formatDay } from '@/utils/dates'
import { uuid } from './helpers/run-fixtures'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser({ id: 12, name: 'Sam Okafor', role: 'lifter' })
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/logbook/41')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

function setLog(overrides: Partial<SetLog>): SetLog {
  return {
    id: uuid(), sessionId: 41, exerciseId: 1, exerciseName: 'Bench press', position: 0, kind: 'top',
    targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, toFailure: true,
    loadKg: 100, reps: 7, rir: null, failure: true, note: null, loggedAt: '2026-12-01T11:30:00.000Z', videoId: null,
    ...overrides,
  }
}
const topSet = setLog({ position: 2 })
const backoff = setLog({ position: 3, kind: 'backoff', targetLoadKg: 85, targetRepsMin: 9, targetRepsMax: 12, toFailure: false, loadKg: 85, reps: 10, failure: false })
const detail: SessionDetail = {
  id: 41, athleteId: 12, dayName: 'Push', version: 'I', status: 'completed',
  startedAt: '2026-12-01T11:00:00.000Z', completedAt: '2026-12-01T12:00:00.000Z', workingSets: 2, volumeKg: 1550, records: 0, note: null,
  sets: [topSet, backoff],
}
const comment = (overrides: Partial<Comment>): Comment => ({
  id: 1, sessionId: 41, setLogId: null, author: { id: 3, name: 'Dana Reyes', role: 'coach' }, body: 'Good work',
  createdAt: '2026-12-01T13:00:00.000Z', ...overrides,
})
const review: SessionReview = {
  reviewedAt: '2026-12-02T12:00:00.000Z',
  reviewedBy: 'Dana Reyes',
  flags: [],
  comments: [
    comment({ id: 1, setLogId: topSet.id, body: 'Bar speed looked good, pause the first rep' }),
    comment({ id: 2, body: 'Well done overall' }),
  ],
}

async function mountDetail(reviewBody: SessionReview = review, ...more: { status: number; body?: unknown }[]) {
  const stub = stubFetch({ status: 200, body: { session: detail } }, { status: 200, body: { review: reviewBody } }, ...more)
  const wrapper = mount(SessionDetailView, { props: { id: 41 }, global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}

describe('SessionDetailView with the coach review', () => {
  it('shows the coach comment right under its set, and "Reviewed by" with the date', async () => {
    const { wrapper, requests } = await mountDetail()

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/sessions/41', 'GET /api/sessions/41/review'])
    const rows = wrapper.findAll('tbody tr')
    expect(rows[0].attributes('data-set-id')).toBe(topSet.id)
    expect(rows[1].get('[data-testid="set-comments"]').attributes('data-set-id')).toBe(topSet.id)
    expect(rows[1].get('[data-testid="coach-comment"]').text()).toContain('Bar speed looked good, pause the first rep')
    expect(rows[1].get('[data-testid="coach-comment"]').text()).toContain('Dana Reyes · coach')
    expect(rows[2].attributes('data-set-id')).toBe(backoff.id) // no comment on the back-off set: no extra row
    expect(wrapper.get('[data-testid="reviewed-by"]').text()).toBe(`Reviewed by Dana Reyes on ${formatDay('2026-12-02T12:00:00.000Z')}`)
    expect(wrapper.get('[aria-label="Comments on the session"]').get('[data-testid="coach-comment"]').text()).toContain('Well done overall')
  })

  it('says nothing about a review before the coach has reviewed', async () => {
    const { wrapper } = await mountDetail({ ...review, reviewedAt: null, reviewedBy: null, comments: [] })

    expect(wrapper.find('[data-testid="reviewed-by"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="coach-comment"]').exists()).toBe(false)
  })

  it('the lifter replies on a set: the reply is posted with that set id and shows next to it', async () => {
    const reply = comment({ id: 3, setLogId: topSet.id, body: 'Will do', author: { id: 12, name: 'Sam Okafor', role: 'lifter' } })
    const { wrapper, requests } = await mountDetail(review, { status: 201, body: { comment: reply } })
    const thread = () => wrapper.get(`[data-testid="set-comments"][data-set-id="${topSet.id}"]`)

    await thread().get('[data-testid="reply-set"]').trigger('click')
    await thread().get('[data-testid="comment-body"]').setValue('Will do')
    await thread().get('[data-testid="send-comment"]').trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/sessions/41/comments', body: { body: 'Will do', setLogId: topSet.id } })
    expect(thread().get('[data-testid="comment"]').text()).toContain('Will do')
  })

  it('the lifter replies on the session with setLogId null', async () => {
    const reply = comment({ id: 4, body: 'Thanks!', author: { id: 12, name: 'Sam Okafor', role: 'lifter' } })
    const { wrapper, requests } = await mountDetail(review, { status: 201, body: { comment: reply } })
    const thread = wrapper.get('[aria-label="Comments on the session"]')

    await thread.get('[data-testid="comment-body"]').setValue('Thanks!')
    await thread.get('[data-testid="send-comment"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({ body: 'Thanks!', setLogId: null })
    expect(wrapper.get('[aria-label="Comments on the session"]').get('[data-testid="comment"]').text()).toContain('Thanks!')
  })

  it('still shows the sets when the review cannot be loaded', async () => {
    stubFetch({ status: 200, body: { session: detail } }, { status: 500, body: { error: { code: 'internal', message: 'Down' } } })
    const wrapper = mount(SessionDetailView, { props: { id: 41 }, global: { plugins: [pinia, router] } })
    await flushPromises()

    expect(wrapper.findAll('[data-testid="logbook-set"]')).toHaveLength(2)
    expect(wrapper.find('[data-testid="reviewed-by"]').exists()).toBe(false)
  })
})
