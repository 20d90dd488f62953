/**
 * Live checks on a plan while it is edited: hard sets per muscle per week, how many times a
 * week each muscle is trained, and warnings against the set caps and the research thresholds.
 *
 * Counting (common practice, no published source): a working set counts as one hard set for
 * each primary muscle and half a set for each secondary muscle; warm-ups do not count.
 */
import { MAX_HARD_SETS_PER_PATTERN } from './progression'
import { MAX_WORKING_SETS_ANY, MAX_WORKING_SETS_PRIMARY, type SlotRole } from './schemes'

/**
 * Volume: each added weekly set per muscle adds growth; the meta-analysis grouped lifters by
 * < 5, 5-9 and 10+ weekly sets, with 10+ growing most (Schoenfeld, Ogborn, Krieger, J Sports Sci
 * 35(11):1073-1082, 2017). We flag fewer than 10 as "low".
 */
export const LOW_WEEKLY_SETS = 10
/** A very high weekly volume per muscle: common practice, no published source (the 2017 meta-analysis's top group was open-ended at 10+). */
export const VERY_HIGH_WEEKLY_SETS = 25
/**
 * Frequency: training a muscle at least twice a week beat once a week (Schoenfeld, Ogborn,
 * Krieger, Sports Med 46(11):1689-1697, 2016); with volume equal, frequency matters little
 * (Schoenfeld, Grgic, Krieger, J Sports Sci 2019), so this is a warning, not an error.
 */
export const MIN_WEEKLY_FREQUENCY = 2

export interface CheckSlot {
  role: SlotRole
  /** Working sets in the slot's scheme. */
  workingSets: number
  exerciseName: string
  /** The exercise's movement pattern (squat, hinge...), for the caps across a session. */
  pattern?: string
  primaryMuscles: readonly string[]
  secondaryMuscles: readonly string[]
}

export interface CheckDay {
  name: string
  isRest: boolean
  versions: { I: readonly CheckSlot[]; II: readonly CheckSlot[] }
}

export interface MuscleWeek {
  muscle: string
  /** Hard sets per week (primary 1, secondary 0.5). */
  weeklySets: number
  /** Training days per week on which the muscle gets at least one hard set (secondary sets count half). */
  weeklyFrequency: number
}

export type PlanWarningCode =
  | 'PRIMARY_COMPOUND_OVER_CAP'
  | 'MOVEMENT_OVER_CAP'
  | 'MUSCLE_UNDER_TWICE_A_WEEK'
  | 'MUSCLE_LOW_VOLUME'
  | 'MUSCLE_VERY_HIGH_VOLUME'
  | 'EXERCISE_OVER_SESSION_CAP'
  | 'PATTERN_OVER_SESSION_CAP'

export interface PlanWarning {
  code: PlanWarningCode
  message: string
  values: Record<string, string | number>
}

export interface PlanChecks {
  /** Training days per week the figures assume. */
  trainingDaysPerWeek: number
  muscles: MuscleWeek[]
  warnings: PlanWarning[]
}

/**
 * Training days per week when the plan does not say: with rest days in the plan, one plan day
 * per calendar day; without, two laps a week up to six days (common practice for splits run
 * "twice a week").
 */
export function defaultTrainingDaysPerWeek(days: readonly CheckDay[]): number {
  const training = days.filter((d) => !d.isRest).length
  if (training === 0) return 0
  return days.some((d) => d.isRest) ? (7 * training) / days.length : Math.min(6, 2 * training)
}

const round1 = (n: number) => Math.round(n * 10) / 10

export function checkPlan(days: readonly CheckDay[], trainingDaysPerWeek = defaultTrainingDaysPerWeek(days)): PlanChecks {
  const warnings: PlanWarning[] = []
  const sets = new Map<string, number>()
  const hits = new Map<string, number>()
  const trainingDays = days.filter((d) => !d.isRest)
  // Versions alternate, so one full rotation is every training day once in each version.
  const sessionsInRotation = trainingDays.length * 2

  for (const day of trainingDays) {
    for (const label of ['I', 'II'] as const) {
      const setsToday = new Map<string, number>()
      for (const slot of day.versions[label]) {
        const where = { day: day.name, version: label, exercise: slot.exerciseName, sets: slot.workingSets }
        if (slot.role === 'compound_primary' && slot.workingSets > MAX_WORKING_SETS_PRIMARY) {
          warnings.push({
            code: 'PRIMARY_COMPOUND_OVER_CAP',
            message: `${slot.exerciseName} (${day.name} ${label}): ${slot.workingSets} working sets on a primary compound, the cap is ${MAX_WORKING_SETS_PRIMARY}`,
            values: { ...where, cap: MAX_WORKING_SETS_PRIMARY },
          })
        } else if (slot.workingSets > MAX_WORKING_SETS_ANY) {
          warnings.push({
            code: 'MOVEMENT_OVER_CAP',
            message: `${slot.exerciseName} (${day.name} ${label}): ${slot.workingSets} working sets, the cap is ${MAX_WORKING_SETS_ANY}`,
            values: { ...where, cap: MAX_WORKING_SETS_ANY },
          })
        }
        const add = (m: string, n: number) => {
          sets.set(m, (sets.get(m) ?? 0) + n)
          setsToday.set(m, (setsToday.get(m) ?? 0) + n)
        }
        for (const m of slot.primaryMuscles) add(m, slot.workingSets)
        for (const m of slot.secondaryMuscles) add(m, slot.workingSets / 2)
      }
      for (const [m, n] of setsToday) if (n >= 1) hits.set(m, (hits.get(m) ?? 0) + 1)
      for (const w of sessionCapWarnings(day.versions[label])) {
        warnings.push({ ...w, message: `${day.name} ${label}: ${w.message}`, values: { ...w.values, day: day.name, version: label } })
      }
    }
  }

  const perWeek = sessionsInRotation > 0 ? trainingDaysPerWeek / sessionsInRotation : 0
  const muscles: MuscleWeek[] = [...sets.keys()]
    .sort()
    .map((muscle) => ({
      muscle,
      weeklySets: round1((sets.get(muscle) ?? 0) * perWeek),
      weeklyFrequency: round1((hits.get(muscle) ?? 0) * perWeek),
    }))
  for (const m of muscles) {
    if (m.weeklyFrequency > 0 && m.weeklyFrequency < MIN_WEEKLY_FREQUENCY) {
      warnings.push({
        code: 'MUSCLE_UNDER_TWICE_A_WEEK',
        message: `${m.muscle} is trained ${m.weeklyFrequency} times a week; at least ${MIN_WEEKLY_FREQUENCY} grows more`,
        values: { muscle: m.muscle, weeklyFrequency: m.weeklyFrequency, minimum: MIN_WEEKLY_FREQUENCY },
      })
    }
    if (m.weeklySets > VERY_HIGH_WEEKLY_SETS) {
      warnings.push({
        code: 'MUSCLE_VERY_HIGH_VOLUME',
        message: `${m.muscle}: ${m.weeklySets} hard sets a week is very high volume`,
        values: { muscle: m.muscle, weeklySets: m.weeklySets, threshold: VERY_HIGH_WEEKLY_SETS },
      })
    } else if (m.weeklyFrequency > 0 && m.weeklySets < LOW_WEEKLY_SETS) {
      warnings.push({
        code: 'MUSCLE_LOW_VOLUME',
        message: `${m.muscle}: ${m.weeklySets} hard sets a week, below ${LOW_WEEKLY_SETS}`,
        values: { muscle: m.muscle, weeklySets: m.weeklySets, threshold: LOW_WEEKLY_SETS },
      })
    }
  }
  return { trainingDaysPerWeek: round1(trainingDaysPerWeek), muscles, warnings }
}

/** Multi-joint movement patterns: their exercises are compounds (common practice). */
export const COMPOUND_PATTERNS: ReadonlySet<string> = new Set([
  'horizontal_push', 'vertical_push', 'horizontal_pull', 'vertical_pull', 'squat', 'hinge', 'lunge',
])

export interface SessionCapSlot {
  role: SlotRole
  exerciseName: string
  pattern?: string
  workingSets: number
}

const patternWords = (pattern: string) => pattern.replaceAll('_', ' ')

/**
 * Caps across one session, over every slot of the day (common practice, no published source): at
 * most MAX_WORKING_SETS_PRIMARY hard sets of one compound exercise and MAX_HARD_SETS_PER_PATTERN of
 * one movement pattern, however the sets are spread over slots. (A slot's own cap is checked by
 * its scheme.)
 */
export function sessionCapWarnings(slots: readonly SessionCapSlot[]): PlanWarning[] {
  const warnings: PlanWarning[] = []
  const byExercise = new Map<string, { sets: number; compound: boolean; slots: number }>()
  const byPattern = new Map<string, { sets: number; exercises: Set<string> }>()
  for (const slot of slots) {
    const compound = slot.role === 'compound_primary' || (slot.pattern !== undefined && COMPOUND_PATTERNS.has(slot.pattern))
    const e = byExercise.get(slot.exerciseName) ?? { sets: 0, compound: false, slots: 0 }
    byExercise.set(slot.exerciseName, { sets: e.sets + slot.workingSets, compound: e.compound || compound, slots: e.slots + 1 })
    if (slot.pattern) {
      const p = byPattern.get(slot.pattern) ?? { sets: 0, exercises: new Set<string>() }
      p.sets += slot.workingSets
      p.exercises.add(slot.exerciseName)
      byPattern.set(slot.pattern, p)
    }
  }
  for (const [exercise, e] of byExercise) {
    // One slot over its own cap is reported by that slot's check; here only sums over slots.
    if (e.slots > 1 && e.compound && e.sets > MAX_WORKING_SETS_PRIMARY) {
      warnings.push({
        code: 'EXERCISE_OVER_SESSION_CAP',
        message: `${exercise}: ${e.sets} hard sets in one session, the cap for a compound exercise is ${MAX_WORKING_SETS_PRIMARY}`,
        values: { exercise, sets: e.sets, cap: MAX_WORKING_SETS_PRIMARY },
      })
    }
  }
  for (const [pattern, p] of byPattern) {
    if (p.sets > MAX_HARD_SETS_PER_PATTERN) {
      warnings.push({
        code: 'PATTERN_OVER_SESSION_CAP',
        message: `${patternWords(pattern)}: ${p.sets} hard sets in one session over ${p.exercises.size} ${p.exercises.size === 1 ? 'exercise' : 'exercises'}, the cap for one movement pattern is ${MAX_HARD_SETS_PER_PATTERN}`,
        values: { pattern, sets: p.sets, exercises: p.exercises.size, cap: MAX_HARD_SETS_PER_PATTERN },
      })
    }
  }
  return warnings
}
