import { describe, expect, it } from 'vitest'
import { checkPlan, defaultTrainingDaysPerWeek, sessionCapWarnings, type CheckDay } from '../../shared/domain/plan-checks'
import { lowerBackDaysBackToBack, PLAN_TEMPLATES, type PlanTemplate } from '../../shared/domain/plan-templates'
import { DEFAULT_SCHEMES } from '../../shared/domain/schemes'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'

const template = (id: string) => PLAN_TEMPLATES.find((t) => t.id === id)!

/** A template with its schemes and the library's muscles, as the plan builder sees it. */
function asCheckDays(t: PlanTemplate): CheckDay[] {
  return t.days.map((day) => ({
    name: day.name,
    isRest: day.isRest,
    versions: {
      I: day.slots.map((s) => slotFor(s.role, s.I, s.scheme.sets.length)),
      II: day.slots.map((s) => slotFor(s.role, s.II, s.scheme.sets.length)),
    },
  }))
}
function slotFor(role: keyof typeof DEFAULT_SCHEMES, name: string, workingSets: number) {
  const exercise = exerciseLibrary.find((e) => e.name === name)
  if (!exercise) throw new Error(`not in the library: ${name}`)
  return { role, exerciseName: name, pattern: exercise.pattern, workingSets, primaryMuscles: exercise.primaryMuscles, secondaryMuscles: exercise.secondaryMuscles }
}
const muscle = (checks: ReturnType<typeof checkPlan>, name: string) => checks.muscles.find((m) => m.muscle === name)!

describe('split templates', () => {
  it('name only exercises of the library, with the same movement pattern in version I and version II', () => {
    for (const t of PLAN_TEMPLATES) {
      for (const day of t.days) {
        for (const s of day.slots) {
          const I = exerciseLibrary.find((e) => e.name === s.I)
          const II = exerciseLibrary.find((e) => e.name === s.II)
          expect(I?.pattern, `${t.id} ${s.I}`).toBe(s.pattern)
          expect(II?.pattern, `${t.id} ${s.II}`).toBe(s.pattern)
          expect(s.I).not.toBe(s.II)
        }
      }
    }
  })

  it('offers a push/pull/legs order that keeps the lower-back-heavy days apart, unlike the plain one', () => {
    expect(lowerBackDaysBackToBack(template('ppl_twice').days)).toBe(true)
    expect(lowerBackDaysBackToBack(template('ppl_spaced').days)).toBe(false)
  })
})

// Weekly hard sets and frequency, counted by hand from the templates' schemes (primary compound 2
// working sets, accessory 3 or 2 when it repeats the day's pattern, isolation 2; primary muscle
// 1 set, secondary 0.5 — common practice, no published source). Thresholds: 10+ weekly sets (Schoenfeld,
// Ogborn, Krieger 2017, J Sports Sci 35(11)); at least twice a week (Schoenfeld, Ogborn,
// Krieger 2016, Sports Med 46(11)).
describe('weekly volume and frequency', () => {
  it('push/pull/legs twice a week: six sessions, chest 12 hard sets on 2 days', () => {
    const checks = checkPlan(asCheckDays(template('ppl_twice')))
    expect(checks.trainingDaysPerWeek).toBe(6)
    // Push I: bench 2 + incline dumbbell press 2 + cable fly 2; Push II: incline bench 2 + machine press 2 + machine fly 2.
    expect(muscle(checks, 'chest')).toEqual({ muscle: 'chest', weeklySets: 12, weeklyFrequency: 2 })
    // Lats are a primary mover on Pull I and Pull II.
    expect(muscle(checks, 'lats').weeklyFrequency).toBe(2)
    expect(checks.warnings.filter((w) => w.code === 'MUSCLE_UNDER_TWICE_A_WEEK' && w.values.muscle === 'chest')).toEqual([])
  })

  it('legs/push/pull with a rest day: 5.25 sessions a week, so chest drops under twice a week and is flagged', () => {
    const checks = checkPlan(asCheckDays(template('ppl_spaced')))
    expect(checks.trainingDaysPerWeek).toBe(5.3) // 7 x 3 / 4 = 5.25, shown to one decimal
    // 12 chest sets per rotation of 6 sessions, 5.25 sessions a week: 12 x 5.25 / 6 = 10.5.
    expect(muscle(checks, 'chest').weeklySets).toBe(10.5)
    expect(muscle(checks, 'chest').weeklyFrequency).toBe(1.8)
    const codes = checks.warnings.filter((w) => w.values.muscle === 'chest').map((w) => w.code).sort()
    expect(codes).toEqual(['MUSCLE_UNDER_TWICE_A_WEEK'])
  })

  it('assumes one plan day per calendar day when the plan has rest days, else two laps a week up to six', () => {
    const days = asCheckDays(template('upper_lower'))
    expect(defaultTrainingDaysPerWeek(days)).toBeCloseTo((7 * 2) / 3, 10)
    expect(defaultTrainingDaysPerWeek(asCheckDays(template('ppl_twice')))).toBe(6)
  })

  it('warns about a primary compound above 3 working sets and any movement above 4', () => {
    const days: CheckDay[] = [
      {
        name: 'Heavy',
        isRest: false,
        versions: {
          I: [
            { role: 'compound_primary', exerciseName: 'Back squat', workingSets: 4, primaryMuscles: ['quads'], secondaryMuscles: [] },
            { role: 'accessory', exerciseName: 'Leg press', workingSets: 5, primaryMuscles: ['quads'], secondaryMuscles: [] },
          ],
          II: [],
        },
      },
    ]
    const codes = checkPlan(days).warnings.map((w) => w.code)
    expect(codes).toContain('PRIMARY_COMPOUND_OVER_CAP')
    expect(codes).toContain('MOVEMENT_OVER_CAP')
  })

  it('counts a day for a muscle worked only as a secondary mover once it adds up to a hard set', () => {
    const bench = { role: 'compound_primary' as const, exerciseName: 'Barbell bench press', workingSets: 2, primaryMuscles: ['chest'], secondaryMuscles: ['triceps'] }
    const fly = { role: 'isolation' as const, exerciseName: 'Cable chest fly', workingSets: 1, primaryMuscles: ['chest'], secondaryMuscles: ['front_delts'] }
    const day: CheckDay = { name: 'Chest', isRest: false, versions: { I: [bench, fly], II: [bench, fly] } }
    const checks = checkPlan([day], 2)
    // Triceps: 2 sets x 0.5 = 1 hard set each day -> counted; front delts: 1 x 0.5 = 0.5 -> not.
    expect(muscle(checks, 'triceps')).toEqual({ muscle: 'triceps', weeklySets: 2, weeklyFrequency: 2 })
    expect(muscle(checks, 'front_delts')).toEqual({ muscle: 'front_delts', weeklySets: 1, weeklyFrequency: 0 })
  })

  it('flags very high weekly volume', () => {
    const many = { role: 'accessory' as const, exerciseName: 'Leg press', workingSets: 4, primaryMuscles: ['quads'], secondaryMuscles: [] }
    const day: CheckDay = { name: 'Legs', isRest: false, versions: { I: [many, many, many, many], II: [many, many, many, many] } }
    const checks = checkPlan([day], 6)
    expect(muscle(checks, 'quads').weeklySets).toBe(96)
    expect(checks.warnings.map((w) => w.code)).toContain('MUSCLE_VERY_HIGH_VOLUME')
  })
})

describe('caps across one session (common practice, no published source)', () => {
  const slot = (exerciseName: string, pattern: string, workingSets: number, role: 'compound_primary' | 'accessory' | 'isolation' = 'accessory') =>
    ({ role, exerciseName, pattern, workingSets, primaryMuscles: ['quads'], secondaryMuscles: [] })

  it('warns when three squat-pattern slots add up to 11 hard sets in one session', () => {
    const warnings = sessionCapWarnings([slot('Back squat', 'squat', 3, 'compound_primary'), slot('Leg press', 'squat', 4), slot('Hack squat machine', 'squat', 4)])
    expect(warnings).toContainEqual(expect.objectContaining({ code: 'PATTERN_OVER_SESSION_CAP', values: expect.objectContaining({ pattern: 'squat', sets: 11, cap: 4, exercises: 3 }) }))
  })

  it('warns when one compound exercise gets more than 3 hard sets over two slots, and not within the caps', () => {
    const twice = sessionCapWarnings([slot('Back squat', 'squat', 2, 'compound_primary'), slot('Back squat', 'squat', 2)])
    expect(twice.map((w) => w.code)).toContain('EXERCISE_OVER_SESSION_CAP')
    expect(sessionCapWarnings([slot('Back squat', 'squat', 2, 'compound_primary'), slot('Leg press', 'squat', 2), slot('Romanian deadlift', 'hinge', 3)])).toEqual([])
  })

  it('is part of the live plan checks, per day and version', () => {
    const day: CheckDay = { name: 'Legs', isRest: false, versions: { I: [slot('Back squat', 'squat', 3, 'compound_primary'), slot('Leg press', 'squat', 3)], II: [] } }
    const warning = checkPlan([day]).warnings.find((w) => w.code === 'PATTERN_OVER_SESSION_CAP')!
    expect(warning.values).toMatchObject({ day: 'Legs', version: 'I', sets: 6 })
  })

  it('holds for every split template the product ships', () => {
    for (const t of PLAN_TEMPLATES) {
      for (const day of t.days) {
        for (const label of ['I', 'II'] as const) {
          const slots = day.slots.map((s) => {
            const exercise = exerciseLibrary.find((e) => e.name === s[label])!
            return { role: s.role, exerciseName: exercise.name, pattern: exercise.pattern, workingSets: s.scheme.sets.length }
          })
          expect(sessionCapWarnings(slots), `${t.id} ${day.name} ${label}`).toEqual([])
        }
      }
    }
  })
})
