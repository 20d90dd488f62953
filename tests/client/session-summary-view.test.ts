import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { KG_COMPETITION_SET } from '@shared/domain/equipment'
import type { ExerciseReport, RunExercise, RunSession, SessionReport } from '@shared/schemas/run.schema'
import type { SessionSummary } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import SessionSummaryView from '@/views/SessionSummaryView.vue'
import { flagText } from '@/components/review/review-labels'
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
const session: SessionSummary = {
  id: 41, athleteId: 7, dayName: 'Push', version: 'I', status: 'completed',
  startedAt: '2026-12-01T17:00:00.000Z', completedAt: '2026-12-01T18:05:00.000Z', workingSets: 6, volumeKg: 3412.5, records: 1,
}

/** A bench press that has not moved for three sessions: the four plateau options are offered. */
const bench: ExerciseReport = {
  exerciseId: 1, slotId: 10, name: 'Bench press', loadMode: 'external', bodyMassKg: null,
  workingSets: 2, volumeKg: 1745, bestE1rmKg: 126.7, previousBestE1rmKg: 123.5, e1rmChangePct: 2.59,
  asPlanned: true, regression: false, deload: false,
  records: [{ kind: 'rep_record', loadKg: 100, reps: 9, e1rmKg: 130, previous: 8 }],
  nextStep: {
    action: 'add_load', targetLoadKg: 102.5, targetReps: 6, repsMin: 6, repsMax: 9,
    // Less work than last time (fewer reps at more load): never shown; the gain is the load step.
    workChangePct: -12.3, gain: { kind: 'load', pct: 2.5 },
    reason: reason('You reached the top of the range: add the smallest load and start again at the bottom.'),
  },
  alternative: {
    action: 'add_rep', targetLoadKg: 100, targetReps: 10, repsMin: 6, repsMax: 10, workChangePct: 11.1,
    gain: { kind: 'work', pct: 11.11 }, reason: reason('Or one more rep at the same load.'),
  },
  plateau: {
    exposuresWithoutProgress: 3, window: 4,
    options: [
      { kind: 'microload', reason: reason('A smaller load step: +1 % instead of the last +2.5 %'), targetLoadKg: 101, targetReps: 9, sets: null, rotate: null },
      { kind: 'rotate_version', reason: reason('Fresh exercises for version I of this day, the other version kept'), targetLoadKg: null, targetReps: null, sets: null, rotate: 'I' },
      { kind: 'add_set', reason: reason('One more set (2 -> 3, cap 5) at 2 reps in reserve'), targetLoadKg: null, targetReps: null, sets: 3, rotate: null },
      { kind: 'deload', reason: reason('A deload: about 90 % of the load and 50 % of the sets, then back to where you were'), targetLoadKg: null, targetReps: null, sets: null, rotate: null },
    ],
  },
  taken: null,
}
const fly: ExerciseReport = {
  ...bench, exerciseId: 2, slotId: 11, name: 'Cable fly', records: [], e1rmChangePct: -1.04, alternative: null, plateau: null,
  nextStep: {
    action: 'add_rep', targetLoadKg: 20, targetReps: 13, repsMin: 10, repsMax: 15, workChangePct: 8.3,
    gain: { kind: 'work', pct: 8.33 }, reason: reason('One more rep.'),
  },
}
const chinUp: ExerciseReport = {
  ...bench, exerciseId: 3, slotId: 12, name: 'Chin-up', loadMode: 'bodyweight', bodyMassKg: 63, records: [], e1rmChangePct: 1.6,
  volumeKg: 1530, alternative: null, plateau: null,
  nextStep: {
    action: 'add_rep', targetLoadKg: 5, targetReps: 8, repsMin: 6, repsMax: 10, workChangePct: 14.3,
    gain: { kind: 'work', pct: 14.29 }, reason: reason('7 reps is below the top of the range (10): one more rep at the same load'),
  },
}
const report: SessionReport = { session, durationSec: 3900, exercises: [bench, fly, chinUp] }

const runExercise = (exercise: ExerciseReport): RunExercise => ({
  exerciseId: exercise.exerciseId, slotId: exercise.slotId, name: exercise.name, pattern: 'horizontal_push', role: 'compound_primary',
  restSec: 180, equipment: KG_COMPETITION_SET, loadMode: exercise.loadMode, bodyMassKg: exercise.bodyMassKg,
  lastTime: [], lastTimeAt: null, coachComments: [], nextStepBy: null,
})
const run: RunSession = { ...session, exercises: report.exercises.map(runExercise), sets: [] }

async function mountSummary(first: SessionReport, ...more: { status: number; body?: unknown }[]) {
  const stub = stubFetch({ status: 200, body: { report: first } }, { status: 200, body: { session: run } }, ...more)
  const wrapper = mount(SessionSummaryView, { props: { id: 41 }, global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}
const card = (wrapper: VueWrapper, i: number) => wrapper.findAll('[data-testid="next-step"]')[i]
const choose = async (wrapper: VueWrapper, i: number, option: string) =>
  card(wrapper, i).get(`[data-testid="choice-${option}"] input`).setValue(true)
const withTaken = (exercise: ExerciseReport, taken: ExerciseReport['taken']): ExerciseReport => ({ ...exercise, taken })

describe('SessionSummaryView', () => {
  it('shows the totals, each lift\'s estimated-1RM change, and the next step with its gain figure and why', async () => {
    const { wrapper, requests } = await mountSummary(report)

    expect(requests.map((r) => r.url)).toEqual(['/api/sessions/41/report', '/api/sessions/41/run'])
    expect(wrapper.get('[data-testid="summary-sets"]').text()).toBe('6')
    expect(wrapper.get('[data-testid="summary-volume"]').text()).toBe('3,413 kg')
    expect(wrapper.get('[data-testid="summary-duration"]').text()).toBe('1 h 05 min')
    expect(card(wrapper, 0).text()).toContain('Rep record: 100 kg × 9 (was 8)')
    expect(card(wrapper, 0).get('[data-testid="e1rm-change"]').text()).toBe('+2.6 %')
    expect(card(wrapper, 1).get('[data-testid="e1rm-change"]').text()).toBe('−1 %')

    const next = card(wrapper, 1).get('[data-testid="choice-next_step"]')
    expect(next.get('[data-testid="choice-label"]').text()).toBe('One more rep')
    expect(next.get('[data-testid="choice-target"]').text()).toBe('20 kg × 13')
    expect(next.get('[data-testid="choice-gain"]').text()).toBe('+8.3 % work')
    expect(next.get('[data-testid="choice-why"]').text()).toBe('One more rep.')
    // The other kind of step is the second choice, with its own figure.
    const other = card(wrapper, 0).get('[data-testid="choice-alternative"]')
    expect(other.get('[data-testid="choice-target"]').text()).toBe('100 kg × 10')
    expect(other.get('[data-testid="choice-gain"]').text()).toBe('+11.1 % work')
    // The next step is chosen until the lifter picks another.
    expect((card(wrapper, 0).get('[data-testid="choice-next_step"] input').element as HTMLInputElement).checked).toBe(true)
  })

  it('the estimated-1RM change reads exactly as the review desk\'s regression flag for the same lift', async () => {
    // The server rounds the flag's figure to one decimal (review-flags.ts); the summary gets it unrounded.
    const drop = -7.94
    const fell = { ...fly, e1rmChangePct: drop, regression: true }
    const { wrapper } = await mountSummary({ ...report, exercises: [fell] })

    const summaryFigure = card(wrapper, 0).get('[data-testid="e1rm-change"]').text()
    const flag = flagText({ code: 'regression', exercise: 'Cable fly', values: { e1rmChangePct: Math.round(drop * 10) / 10 } })
    expect(summaryFigure).toBe('−7.9 %')
    expect(flag).toBe(`Regression: Cable fly estimated 1RM ${summaryFigure}`)
  })

  it('shows every gain as "+x % kind", never the negative change of work', async () => {
    const { wrapper } = await mountSummary(report)

    const gains = wrapper.findAll('[data-testid="choice-gain"]').map((g) => g.text())
    expect(gains).toEqual(['+2.5 % load', '+11.1 % work', '+8.3 % work', '+14.3 % work'])
    expect(card(wrapper, 0).text()).not.toContain('12.3')
    for (const gain of gains) expect(gain).toMatch(/^\+\d+(\.\d)? % (reps|work|load)$/)
  })

  it('for a plateau says for how long and offers every option, each with its target or reason', async () => {
    const { wrapper } = await mountSummary(report)
    const benchCard = card(wrapper, 0)

    expect(benchCard.get('[data-testid="plateau"]').text()).toContain('No progress for 3 sessions.')
    const labelOf = (option: string) => benchCard.get(`[data-testid="choice-${option}"] [data-testid="choice-label"]`).text()
    expect(labelOf('microload')).toBe('Smaller load step')
    expect(benchCard.get('[data-testid="choice-microload"] [data-testid="choice-target"]').text()).toBe('101 kg × 9')
    expect(labelOf('rotate_version')).toBe('Fresh exercises for version I')
    expect(labelOf('add_set')).toBe('One more set: 3 sets')
    expect(labelOf('deload')).toBe('Deload next time')
    expect(benchCard.get('[data-testid="choice-deload"] [data-testid="choice-why"]').text()).toBe(
      'A deload: about 90 % of the load and 50 % of the sets, then back to where you were',
    )
    expect(card(wrapper, 1).find('[data-testid="plateau"]').exists()).toBe(false)
  })

  it('Take all takes the option chosen on each card: a plateau option where picked, the next step elsewhere', async () => {
    const answer = {
      ...report,
      exercises: [
        withTaken(bench, { option: 'deload', targetLoadKg: null, targetReps: null, status: 'taken', by: 'lifter' }),
        withTaken(fly, { option: 'alternative', targetLoadKg: 22.5, targetReps: 10, status: 'taken', by: 'lifter' }),
        withTaken(chinUp, { option: 'next_step', targetLoadKg: 5, targetReps: 8, status: 'taken', by: 'lifter' }),
      ],
    }
    const { wrapper, requests } = await mountSummary(report, { status: 200, body: { report: answer } })

    await choose(wrapper, 0, 'deload')
    await wrapper.get('[data-testid="take-all"]').trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'POST', url: '/api/sessions/41/next-steps' })
    expect(requests[2].body).toEqual({
      steps: [
        { exerciseId: 1, slotId: 10, option: 'deload' },
        { exerciseId: 2, slotId: 11, option: 'next_step', targetLoadKg: 20, targetReps: 13 },
        { exerciseId: 3, slotId: 12, option: 'next_step', targetLoadKg: 5, targetReps: 8 },
      ],
    })
    expect(card(wrapper, 0).get('[data-testid="next-step-taken"]').text()).toBe('Taken: deload next time')
    expect(card(wrapper, 2).get('[data-testid="next-step-taken"]').text()).toBe('Taken: Body mass + 5 kg × 8')
    // Everything is taken: only Done is left in the bar.
    expect(wrapper.find('[data-testid="take-all"]').exists()).toBe(false)
    expect(wrapper.get('[data-testid="summary-done"]').text()).toBe('Done')
  })

  it('Take all sends the smaller load step with the target the server offered, and skips what is taken', async () => {
    const flyTaken = withTaken(fly, { option: 'next_step', targetLoadKg: 20, targetReps: 13, status: 'taken', by: 'lifter' })
    const { wrapper, requests } = await mountSummary({ ...report, exercises: [bench, flyTaken, chinUp] }, { status: 200, body: { report } })

    expect(wrapper.get('[data-testid="take-all"]').text()).toBe('Take all (2)')
    await choose(wrapper, 0, 'microload')
    await choose(wrapper, 2, 'next_step')
    await wrapper.get('[data-testid="take-all"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({
      steps: [
        { exerciseId: 1, slotId: 10, option: 'microload', targetLoadKg: 101, targetReps: 9 },
        { exerciseId: 3, slotId: 12, option: 'next_step', targetLoadKg: 5, targetReps: 8 },
      ],
    })
  })

  it('Take it sends that exercise\'s chosen option and then says what was taken', async () => {
    const answer = { ...report, exercises: [withTaken(bench, { option: 'alternative', targetLoadKg: 100, targetReps: 10, status: 'taken', by: 'lifter' }), fly, chinUp] }
    const { wrapper, requests } = await mountSummary(report, { status: 200, body: { report: answer } })

    await choose(wrapper, 0, 'alternative')
    await card(wrapper, 0).get('[data-testid="take-it"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({ steps: [{ exerciseId: 1, slotId: 10, option: 'alternative', targetLoadKg: 100, targetReps: 10 }] })
    expect(card(wrapper, 0).get('[data-testid="next-step-taken"]').text()).toBe('Taken: 100 kg × 10')
    expect(card(wrapper, 0).get('[data-testid="take-it"]').text()).toBe('Taken ✓')
    expect(card(wrapper, 0).get('[data-testid="choice-alternative"]').text()).toContain('Taken ✓')
  })

  it('Edit then Take it sends an edited target, stepped by the equipment', async () => {
    const { wrapper, requests } = await mountSummary(report, { status: 200, body: { report } })
    const benchCard = card(wrapper, 0)

    await benchCard.get('[data-testid="edit-next-step"]').trigger('click')
    await benchCard.get('[data-testid="edit-load-minus"]').trigger('click') // to 102 kg: bar and collars are 25 kg and the discs pair up, so this set makes whole kilograms only
    await benchCard.get('[data-testid="edit-reps-plus"]').trigger('click')
    await benchCard.get('[data-testid="take-edited"]').trigger('click')
    await flushPromises()

    expect(requests[2].body).toEqual({ steps: [{ exerciseId: 1, slotId: 10, option: 'edited', targetLoadKg: 102, targetReps: 7 }] })
  })

  it('a deload session says "Deload" rather than a drop in estimated 1RM', async () => {
    const deloaded: ExerciseReport = { ...fly, deload: true, e1rmChangePct: -10.4, regression: false }
    const { wrapper } = await mountSummary({ ...report, exercises: [deloaded] })

    expect(card(wrapper, 0).get('[data-testid="e1rm-change"]').text()).toBe('Deload')
    expect(card(wrapper, 0).get('[data-testid="deload-note"]').text()).toContain('lighter on purpose')
    expect(card(wrapper, 0).text()).not.toContain('10.4')
  })

  it('for a bodyweight lift says the body mass counted and gives the added load in the target', async () => {
    const { wrapper } = await mountSummary(report)
    const chin = card(wrapper, 2)

    expect(chin.get('[data-testid="body-mass"]').text()).toBe('incl. 63 kg body mass')
    expect(chin.get('[data-testid="choice-next_step"] [data-testid="choice-target"]').text()).toBe('Body mass + 5 kg × 8')
    expect(card(wrapper, 0).find('[data-testid="body-mass"]').exists()).toBe(false)
  })

  it('says when the coach set the next step', async () => {
    const byCoach = withTaken(fly, { option: 'edited', targetLoadKg: 22.5, targetReps: 12, status: 'edited', by: 'coach' })
    const { wrapper } = await mountSummary({ ...report, exercises: [byCoach] })

    expect(card(wrapper, 0).get('[data-testid="next-step-taken"]').text()).toBe('Taken: 22.5 kg × 12 (set by your coach)')
  })
})
