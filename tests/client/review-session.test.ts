import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { ExerciseReport, SessionReport } from '@shared/schemas/run.schema'
import type { Comment, ReviewDeskRow, SessionReview } from '@shared/schemas/review.schema'
import type { SessionDetail, SetLog } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import SessionReviewView from '@/views/SessionReviewView.vue'
import { formatDay } from '@/utils/dates'
import { uuid } from './helpers/run-fixtures'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser({ id: 3, name: 'Dana Reyes', role: 'coach' })
  useSessionStore().token = 'tok'
  router = createAppRouter(createMemoryHistory())
  await router.push('/review/41')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

function setLog(overrides: Partial<SetLog>): SetLog {
  return {
    id: uuid(), sessionId: 41, exerciseId: 1, exerciseName: 'Bench press', position: 0, kind: 'straight',
    targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, toFailure: false,
    loadKg: 100, reps: 8, rir: null, failure: false, note: null, loggedAt: '2026-12-01T11:30:00.000Z', videoId: null,
    ...overrides,
  }
}

const warmup1 = setLog({ position: 0, kind: 'warmup', targetLoadKg: 20, targetRepsMin: 6, targetRepsMax: 6, loadKg: 20, reps: 6 })
const warmup2 = setLog({ position: 1, kind: 'warmup', targetLoadKg: 80, targetRepsMin: 3, targetRepsMax: 3, loadKg: 80, reps: 3 })
const topSet = setLog({ position: 2, kind: 'top', toFailure: true, reps: 4, failure: true, note: 'Left shoulder felt tight' })
const backoff = setLog({ position: 3, kind: 'backoff', targetLoadKg: 85, targetRepsMin: 9, targetRepsMax: 12, loadKg: 85, reps: 13, rir: 1 })
const fly1 = setLog({ exerciseId: 2, exerciseName: 'Cable fly', position: 100, targetLoadKg: 20, targetRepsMin: 10, targetRepsMax: 15, loadKg: 20, reps: 12 })
const fly2 = setLog({ exerciseId: 2, exerciseName: 'Cable fly', position: 101, targetLoadKg: 20, targetRepsMin: 10, targetRepsMax: 15, loadKg: 20, reps: 11 })

const summary = {
  id: 41, athleteId: 12, dayName: 'Push', version: 'I' as const, status: 'completed' as const,
  startedAt: '2026-12-01T11:00:00.000Z', completedAt: '2026-12-01T12:00:00.000Z', workingSets: 4, volumeKg: 2145, records: 0,
}
const detail: SessionDetail = { ...summary, note: 'Left shoulder felt tight on the last set.', sets: [warmup1, warmup2, topSet, backoff, fly1, fly2] }

const reason = (message: string) => ({ code: 'X', values: {}, message })
/** The lifter's bench press fell and has not moved for three sessions: a plateau with its options. */
const benchReport: ExerciseReport = {
  exerciseId: 1, slotId: 10, name: 'Bench press', loadMode: 'external', bodyMassKg: null,
  workingSets: 2, volumeKg: 1505, bestE1rmKg: 112, previousBestE1rmKg: 121.6, e1rmChangePct: -7.894736842105263,
  asPlanned: false, regression: true, deload: false, records: [],
  nextStep: {
    action: 'hold', targetLoadKg: 100, targetReps: 6, repsMin: 6, repsMax: 9, workChangePct: 50,
    gain: { kind: 'work', pct: 50 }, reason: reason('4 reps is below the range: the same load once more, aiming for 6'),
  },
  alternative: null,
  plateau: {
    exposuresWithoutProgress: 3, window: 4,
    options: [
      { kind: 'rotate_version', reason: reason('No progress for 3 sessions: fresh exercises for version I of this day, the other version kept'), targetLoadKg: null, targetReps: null, sets: null, rotate: 'I' },
      { kind: 'deload', reason: reason('A deload: about 90 % of the load and 50 % of the sets, then back to where you were'), targetLoadKg: null, targetReps: null, sets: null, rotate: null },
    ],
  },
  taken: { option: 'next_step', targetLoadKg: 100, targetReps: 6, status: 'taken', by: 'lifter' },
}
const flyReport: ExerciseReport = {
  ...benchReport, exerciseId: 2, slotId: 11, name: 'Cable fly', e1rmChangePct: 1.2, regression: false, asPlanned: true, plateau: null, taken: null,
  nextStep: {
    action: 'add_rep', targetLoadKg: 20, targetReps: 13, repsMin: 10, repsMax: 15, workChangePct: 8.3,
    gain: { kind: 'work', pct: 8.33 }, reason: reason('One more rep.'),
  },
  alternative: {
    action: 'add_load', targetLoadKg: 22.5, targetReps: 12, repsMin: 10, repsMax: 15, workChangePct: -1.2,
    gain: { kind: 'load', pct: 12.5 }, reason: reason('Or the smallest load step for the same 12 reps'),
  },
}
const report: SessionReport = { session: summary, durationSec: 3900, exercises: [benchReport, flyReport] }

const coachComment = (overrides: Partial<Comment>): Comment => ({
  id: 1, sessionId: 41, setLogId: null, author: { id: 3, name: 'Dana Reyes', role: 'coach' }, body: 'Good work',
  createdAt: '2026-12-01T13:00:00.000Z', ...overrides,
})
const review: SessionReview = {
  reviewedAt: null,
  reviewedBy: null,
  flags: [
    { code: 'top_set_far_short', exercise: 'Bench press', values: { reps: 4, repsMin: 6 } },
    { code: 'regression', exercise: 'Bench press', values: { e1rmChangePct: -7.9 } },
  ],
  comments: [coachComment({ id: 1, setLogId: backoff.id, body: 'Add load on the back-off set next time' })],
}
const deskRow: ReviewDeskRow = {
  session: summary, athlete: { id: 12, name: 'Sam Okafor' }, flags: review.flags, reviewedAt: null, commentCount: 1,
}

async function mountReview(...more: { status: number; body?: unknown }[]) {
  return mountReviewWith(detail, ...more)
}

async function mountReviewWith(session: SessionDetail, ...more: { status: number; body?: unknown }[]) {
  const stub = stubFetch(
    { status: 200, body: { session } },
    { status: 200, body: { report } },
    { status: 200, body: { review } },
    { status: 200, body: { sessions: [deskRow] } },
    ...more,
  )
  const wrapper = mount(SessionReviewView, { props: { id: 41 }, global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, ...stub }
}
const exerciseCard = (wrapper: Awaited<ReturnType<typeof mountReview>>['wrapper'], i: number) =>
  wrapper.findAll('[data-testid="review-exercise"]')[i]
const setRow = (wrapper: Awaited<ReturnType<typeof mountReview>>['wrapper'], id: string) => wrapper.get(`[data-testid="review-set"][data-set-id="${id}"]`)

describe('SessionReviewView', () => {
  it('loads the session, its report and review, and names the athlete in the header with the flags', async () => {
    const { wrapper, requests } = await mountReview()

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual([
      'GET /api/sessions/41',
      'GET /api/sessions/41/report',
      'GET /api/sessions/41/review',
      'GET /api/review-desk?status=all&athleteId=12&limit=200',
    ])
    const header = wrapper.get('[data-testid="review-header"]')
    expect(header.get('[data-testid="review-athlete"]').text()).toBe('Sam Okafor')
    expect(header.text()).toContain('Push · version I')
    expect(header.get('[data-testid="review-date"]').text()).toBe(formatDay('2026-12-01T12:00:00.000Z'))
    expect(header.get('[data-testid="review-duration"]').text()).toBe('1 h 05 min')
    expect(header.get('[data-testid="review-volume"]').text()).toBe('2,145 kg')
    // The top of the rep range comes from the session's own top set.
    expect(header.get('[data-testid="flag-top_set_far_short"]').text()).toBe('Top set far short: Bench press, 4 of 6–9')
    expect(header.get('[data-testid="flag-regression"]').text()).toBe('Regression: Bench press estimated 1RM −7.9 %')
  })

  it('folds warm-ups away until the Warm-ups toggle opens them', async () => {
    const { wrapper } = await mountReview()
    const bench = exerciseCard(wrapper, 0)

    expect(bench.findAll('[data-testid="review-set"]').map((r) => r.attributes('data-set-id'))).toEqual([topSet.id, backoff.id])
    expect(bench.get('[data-testid="warmup-toggle"]').text()).toBe('Warm-ups (2)')

    await bench.get('[data-testid="warmup-toggle"]').trigger('click')

    expect(bench.findAll('[data-testid="review-set"]').map((r) => r.attributes('data-set-id'))).toEqual([warmup1.id, warmup2.id, topSet.id, backoff.id])
    expect(exerciseCard(wrapper, 1).find('[data-testid="warmup-toggle"]').exists()).toBe(false)
  })

  it('shows target against actual and marks sets below and above the rep range', async () => {
    const { wrapper } = await mountReview()

    const top = setRow(wrapper, topSet.id)
    expect(top.text()).toContain('Target 100 kg × 6–9 to failure')
    expect(top.get('[data-testid="set-actual"]').text()).toBe('Actual 100 kg × 4, failure below the range')
    expect(top.attributes('data-standing')).toBe('below')
    expect(top.classes()).toContain('session-review-set--below')
    expect(top.get('[data-testid="lifter-note"]').text()).toBe("Lifter's note: Left shoulder felt tight")
    expect(setRow(wrapper, backoff.id).attributes('data-standing')).toBe('above')
    expect(setRow(wrapper, fly1.id).attributes('data-standing')).toBe('within')
    expect(exerciseCard(wrapper, 0).get('[data-testid="review-e1rm-change"]').text()).toBe('−7.9 %')
  })

  it('shows a comment on a set beside that set', async () => {
    const { wrapper } = await mountReview()

    expect(setRow(wrapper, backoff.id).get('[data-testid="comment"]').text()).toContain('Add load on the back-off set next time')
    expect(setRow(wrapper, topSet.id).find('[data-testid="comment"]').exists()).toBe(false)
  })

  it('"Comment on this set" sends the body with that set id and shows the new comment under it', async () => {
    const created = coachComment({ id: 2, setLogId: topSet.id, body: 'Pins at chest height next time' })
    const { wrapper, requests } = await mountReview({ status: 201, body: { comment: created } })
    const top = () => setRow(wrapper, topSet.id)

    expect(top().find('[data-testid="comment-body"]').exists()).toBe(false)
    await top().get('[data-testid="comment-set"]').trigger('click')
    await top().get('[data-testid="comment-body"]').setValue('  Pins at chest height next time ')
    await top().get('[data-testid="send-comment"]').trigger('click')
    await flushPromises()

    expect(requests[4]).toMatchObject({
      method: 'POST',
      url: '/api/sessions/41/comments',
      body: { body: 'Pins at chest height next time', setLogId: topSet.id },
    })
    expect(top().get('[data-testid="comment"]').text()).toContain('Pins at chest height next time')
    expect(top().find('[data-testid="comment-body"]').exists()).toBe(false)
  })

  it('a comment on the session is sent with setLogId null', async () => {
    const created = coachComment({ id: 3, body: 'Solid session' })
    const { wrapper, requests } = await mountReview({ status: 201, body: { comment: created } })
    const thread = wrapper.get('[aria-label="Comments on the session"]')

    await thread.get('[data-testid="comment-body"]').setValue('Solid session')
    await thread.get('[data-testid="send-comment"]').trigger('click')
    await flushPromises()

    expect(requests[4].body).toEqual({ body: 'Solid session', setLogId: null })
    expect(wrapper.get('[aria-label="Comments on the session"]').get('[data-testid="comment"]').text()).toContain('Solid session')
  })

  it('keeps the text when a comment cannot be sent', async () => {
    const { wrapper } = await mountReview({ status: 500, body: { error: { code: 'internal', message: 'Server trouble' } } })
    const thread = wrapper.get('[aria-label="Comments on the session"]')

    await thread.get('[data-testid="comment-body"]').setValue('Solid session')
    await thread.get('[data-testid="send-comment"]').trigger('click')
    await flushPromises()

    expect((thread.get('[data-testid="comment-body"]').element as HTMLTextAreaElement).value).toBe('Solid session')
    expect(thread.find('[data-testid="comment"]').exists()).toBe(false)
  })

  it('"Mark reviewed" posts and then shows the reviewed badge with the date', async () => {
    const done = { ...review, reviewedAt: '2026-12-02T12:00:00.000Z', reviewedBy: 'Dana Reyes' }
    const { wrapper, requests } = await mountReview({ status: 200, body: { review: done } })

    await wrapper.get('[data-testid="mark-reviewed"]').trigger('click')
    await flushPromises()

    expect(requests[4]).toMatchObject({ method: 'POST', url: '/api/sessions/41/reviewed' })
    expect(wrapper.get('[data-testid="reviewed-badge"]').text()).toBe(`Reviewed ✓ ${formatDay('2026-12-02T12:00:00.000Z')}`)
    expect(wrapper.find('[data-testid="mark-reviewed"]').exists()).toBe(false)
  })

  it('the regression flag and the exercise show the same estimated-1RM figure', async () => {
    const { wrapper } = await mountReview()

    const figure = exerciseCard(wrapper, 0).get('[data-testid="review-e1rm-change"]').text()
    expect(figure).toBe('−7.9 %')
    expect(wrapper.get('[data-testid="flag-regression"]').text()).toBe(`Regression: Bench press estimated 1RM ${figure}`)
  })

  it('shows what the lifter took, or that nothing is taken, and every choice with the summary\'s gain figures', async () => {
    const { wrapper } = await mountReview()
    const bench = exerciseCard(wrapper, 0).get('[data-testid="review-next-step"]')
    const fly = exerciseCard(wrapper, 1).get('[data-testid="review-next-step"]')

    expect(bench.get('[data-testid="next-step-standing"]').text()).toBe('Taken by the lifter:')
    expect(bench.get('[data-testid="next-step-taken"]').text()).toBe('100 kg × 6')
    expect(bench.get('[data-testid="coach-take-next_step"]').text()).toBe('Taken ✓')
    expect(fly.get('[data-testid="next-step-standing"]').text()).toBe('Not taken yet')
    expect(fly.get('[data-testid="coach-choice-next_step"] [data-testid="choice-target"]').text()).toBe('20 kg × 13')
    expect(fly.get('[data-testid="coach-choice-next_step"] [data-testid="choice-gain"]').text()).toBe('+8.3 % work')
    // The alternative's work falls (−1.2 %); the figure shown is its load step.
    expect(fly.get('[data-testid="coach-choice-alternative"] [data-testid="choice-gain"]').text()).toBe('+12.5 % load')
    expect(fly.text()).not.toContain('−1.2')
    expect(fly.get('[data-testid="coach-take-alternative"]').text()).toBe('Take for Sam')
  })

  it('shows the plateau with its options as buttons the coach can take for the athlete', async () => {
    const { wrapper } = await mountReview()
    const bench = exerciseCard(wrapper, 0).get('[data-testid="review-next-step"]')

    expect(bench.get('[data-testid="plateau"]').text()).toContain('No progress for 3 sessions.')
    expect(bench.get('[data-testid="coach-choice-rotate_version"] [data-testid="choice-label"]').text()).toBe('Fresh exercises for version I')
    expect(bench.get('[data-testid="coach-choice-deload"] [data-testid="choice-why"]').text()).toContain('about 90 % of the load')
    expect(bench.get('[data-testid="coach-take-deload"]').text()).toBe('Take for Sam')
  })

  it('the coach takes a plateau option for the athlete: one POST with that option, then "Changed by coach"', async () => {
    const changed = {
      ...report,
      exercises: [{ ...benchReport, taken: { option: 'deload' as const, targetLoadKg: null, targetReps: null, status: 'edited' as const, by: 'coach' as const } }, flyReport],
    }
    const { wrapper, requests } = await mountReview({ status: 200, body: { report: changed } })
    const bench = () => exerciseCard(wrapper, 0)

    await bench().get('[data-testid="coach-take-deload"]').trigger('click')
    await flushPromises()

    expect(requests[4]).toMatchObject({ method: 'POST', url: '/api/sessions/41/next-steps' })
    expect(requests[4].body).toEqual({ steps: [{ exerciseId: 1, slotId: 10, option: 'deload' }] })
    expect(bench().get('[data-testid="edited-by-coach"]').text()).toBe('Changed by coach:')
    expect(bench().get('[data-testid="next-step-taken"]').text()).toBe('deload next time')
    expect(bench().get('[data-testid="coach-take-deload"]').text()).toBe('Taken ✓')
  })

  it('the coach takes the alternative step for the athlete with its target', async () => {
    const { wrapper, requests } = await mountReview({ status: 200, body: { report } })

    await exerciseCard(wrapper, 1).get('[data-testid="coach-take-alternative"]').trigger('click')
    await flushPromises()

    expect(requests[4].body).toEqual({ steps: [{ exerciseId: 2, slotId: 11, option: 'alternative', targetLoadKg: 22.5, targetReps: 12 }] })
  })

  it('editing a next step posts the stepped load and reps as an edit, then says "Changed by coach"', async () => {
    const edited = { ...report, exercises: [{ ...benchReport, taken: { option: 'edited' as const, targetLoadKg: 100.5, targetReps: 7, status: 'edited' as const, by: 'coach' as const } }, flyReport] }
    const { wrapper, requests } = await mountReview({ status: 200, body: { report: edited } })
    const bench = () => exerciseCard(wrapper, 0)

    await bench().get('[data-testid="edit-next-step-coach"]').trigger('click')
    await bench().get('[data-testid="coach-edit-load-plus"]').trigger('click') // 100 -> 100.5 kg
    await bench().get('[data-testid="coach-edit-reps-plus"]').trigger('click') // 6 -> 7
    await bench().get('[data-testid="save-next-step"]').trigger('click')
    await flushPromises()

    expect(requests[4]).toMatchObject({ method: 'POST', url: '/api/sessions/41/next-steps' })
    expect(requests[4].body).toEqual({ steps: [{ exerciseId: 1, slotId: 10, option: 'edited', targetLoadKg: 100.5, targetReps: 7 }] })
    expect(bench().get('[data-testid="edited-by-coach"]').text()).toBe('Changed by coach:')
    expect(bench().get('[data-testid="next-step-taken"]').text()).toBe('100.5 kg × 7')
    expect(bench().find('[data-testid="save-next-step"]').exists()).toBe(false)
  })
})

describe('SessionReviewView: the lifter\'s note', () => {
  it('shows the note the lifter left on the session', async () => {
    const { wrapper } = await mountReview()
    expect(wrapper.get('[data-testid="session-note"]').text()).toContain('Left shoulder felt tight on the last set.')
    wrapper.unmount()
  })
})

describe('SessionReviewView: form-check videos', () => {
  it("plays the athlete's video of a set from a signed address", async () => {
    const withVideo = { ...detail, sets: detail.sets.map((s) => (s.kind === 'top' ? { ...s, videoId: 77 } : s)) }
    const { wrapper, requests } = await mountReviewWith(withVideo, {
      status: 200,
      body: { url: '/api/uploads/77/stream?sig=abc', video: { id: 77, setLogId: 'x', mimeType: 'video/mp4', sizeBytes: 10, createdAt: '2026-12-01T12:00:00.000Z' } },
    })
    await wrapper.get('[data-testid="video-play"]').trigger('click')
    await flushPromises()
    expect(requests.at(-1)).toMatchObject({ method: 'GET', url: '/api/uploads/77/url' })
    expect(document.querySelector('[data-testid="video-player"]')?.getAttribute('src')).toBe('/api/uploads/77/stream?sig=abc')
    wrapper.unmount()
  })
})
