/**
 * One notion of progress for a lift, used by the next step, the plateau check, the summary's
 * estimated-1RM change, the records and the review desk's flags, so one lift reads the same
 * everywhere.
 *
 * - The load that counts is the load the lifter moves: the logged load for a barbell, dumbbell or
 *   machine; body mass plus the added load for a bodyweight lift (a chin-up with a 10 kg belt
 *   plate moves body + 10 kg); body mass minus the help for an assisted lift. The whole body mass
 *   counts (common practice for chin-ups and dips, no published source; a push-up moves less of
 *   it, which scales its estimate but not the comparison between two sessions of the same lift).
 * - A set beats another when it moved at least as much for at least as many reps, and more of
 *   one of the two: the trade's "beat last time" (common practice, no published source).
 * - Estimated 1RM: Epley's formula by default with reps in reserve counted as reps (e1rm.ts).
 */
import { estimateOneRepMax, type E1rmFormula } from './e1rm'

export const LOAD_MODES = ['external', 'bodyweight', 'assisted'] as const
/** How the logged load relates to the load moved: as is, added to body mass, or taken from it. */
export type LoadMode = (typeof LOAD_MODES)[number]

/** A working set as done, with what the plan asked of it when known. Loads in kg as logged. */
export interface DoneSet {
  loadKg: number
  reps: number
  rir?: number | null
  /** The planned load and rep count to beat; null or absent when the set was not planned. */
  targetLoadKg?: number | null
  targetReps?: number | null
  /** The bottom of the set's range, the target when no rep count was planned. */
  repsMin?: number
}

/** How the logged loads of one lift are read: its load mode and the lifter's body mass that day. */
export interface LoadReading {
  mode: LoadMode
  /** Body mass in kg for a bodyweight or assisted lift; null when none was ever logged. */
  bodyMassKg?: number | null
}

const EPS = 1e-9

/**
 * The load moved, kg; null for a bodyweight or assisted lift when the body mass is unknown (the
 * app then compares such sets by added load and reps only, and shows no estimated 1RM).
 */
export function movedLoadKg(loadKg: number, reading: LoadReading): number | null {
  if (reading.mode === 'external') return loadKg
  const body = reading.bodyMassKg
  if (body === null || body === undefined || !(body > 0)) return null
  return reading.mode === 'bodyweight' ? body + loadKg : Math.max(0, body - loadKg)
}

/**
 * A number that orders logged loads of one lift the way the lifter's effort orders them: the
 * load moved when known, otherwise the logged load (minus it for an assisted lift, where more
 * help is less load).
 */
export function loadOrderKey(loadKg: number, reading: LoadReading): number {
  const moved = movedLoadKg(loadKg, reading)
  if (moved !== null) return moved
  return reading.mode === 'assisted' ? -loadKg : loadKg
}

/** Estimated 1RM of a set from the load moved; null when that is unknown or zero. */
export function setE1rmKg(set: Pick<DoneSet, 'loadKg' | 'reps' | 'rir'>, reading: LoadReading, formula: E1rmFormula = 'epley'): number | null {
  const moved = movedLoadKg(set.loadKg, reading)
  if (moved === null || moved <= 0 || set.reps <= 0) return null
  return estimateOneRepMax(moved, Math.min(set.reps, 50), { formula, rir: set.rir ?? 0 }).e1rm
}

/** Best estimated 1RM over sets; null when none can be estimated. */
export function bestE1rmKg(sets: readonly Pick<DoneSet, 'loadKg' | 'reps' | 'rir'>[], reading: LoadReading, formula: E1rmFormula = 'epley'): number | null {
  let best: number | null = null
  for (const set of sets) {
    const e = setE1rmKg(set, reading, formula)
    if (e !== null && (best === null || e > best)) best = e
  }
  return best
}

/** Volume of sets: load moved × reps, summed (kg). */
export function volumeKg(sets: readonly Pick<DoneSet, 'loadKg' | 'reps'>[], reading: LoadReading): number {
  let total = 0
  for (const set of sets) total += (movedLoadKg(set.loadKg, reading) ?? set.loadKg) * set.reps
  return total
}

/** True when `a` moved at least as much as `b` for at least as many reps, and more of one. */
export function beats(a: Pick<DoneSet, 'loadKg' | 'reps'>, b: Pick<DoneSet, 'loadKg' | 'reps'>, reading: LoadReading): boolean {
  const la = loadOrderKey(a.loadKg, reading)
  const lb = loadOrderKey(b.loadKg, reading)
  const heavierOrSame = la >= lb - EPS
  const moreOrSameReps = a.reps >= b.reps
  return heavierOrSame && moreOrSameReps && (la > lb + EPS || a.reps > b.reps)
}

/** True when two logged loads are the same load (to a millionth of a kilogram). */
export function sameLoad(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-6
}

/**
 * A set met its plan when it moved at least the planned load for at least the planned reps (the
 * bottom of its range when no rep count was planned). Sets that were not planned say nothing.
 */
export function metPlan(set: DoneSet, reading: LoadReading): boolean | null {
  if (set.targetLoadKg === null || set.targetLoadKg === undefined) return null
  const reps = set.targetReps ?? set.repsMin
  if (reps === undefined || reps === null) return null
  return loadOrderKey(set.loadKg, reading) >= loadOrderKey(set.targetLoadKg, reading) - EPS && set.reps >= reps
}

/** A session's estimate more than this many percent below last time's counts as a regression. */
export const REGRESSION_PCT = 5

export interface LiftChange {
  /** Best estimated 1RM of these sets and of last time's; null when they cannot be estimated. */
  e1rmKg: number | null
  previousE1rmKg: number | null
  /** Percent change of the best estimated 1RM against last time; null without both. */
  e1rmChangePct: number | null
  /** Some set beat last time's set in the same place (more load, same reps or more, or the reverse). */
  beatLastTime: boolean
  /** Every planned set met its plan (false when nothing was planned). */
  asPlanned: boolean
  /**
   * A real step back: the estimate fell more than REGRESSION_PCT and the sets neither met their
   * plan nor beat last time. A set done as planned is never a regression, whatever the plan (a
   * load cut after a miss, a deload, a load step with fewer reps).
   */
  regression: boolean
}

/** How these working sets compare with last time's, in the one way every screen uses. */
export function compareWithLastTime(
  sets: readonly DoneSet[],
  last: readonly DoneSet[] | undefined,
  reading: LoadReading,
  lastReading: LoadReading = reading,
  formula: E1rmFormula = 'epley',
): LiftChange {
  const e1rmKg = bestE1rmKg(sets, reading, formula)
  const previousE1rmKg = last && last.length ? bestE1rmKg(last, lastReading, formula) : null
  const e1rmChangePct = e1rmKg !== null && previousE1rmKg !== null && previousE1rmKg > 0 ? (e1rmKg / previousE1rmKg - 1) * 100 : null
  const beatLastTime = !!last && sets.some((set, i) => {
    const before = last[i]
    if (!before) return false
    // Both read in their own day's body mass: a heavier lifter doing the same chin-ups moved more.
    const a = movedLoadKg(set.loadKg, reading)
    const b = movedLoadKg(before.loadKg, lastReading)
    if (a !== null && b !== null) return beats({ loadKg: a, reps: set.reps }, { loadKg: b, reps: before.reps }, { mode: 'external' })
    return beats(set, before, reading)
  })
  const verdicts = sets.map((s) => metPlan(s, reading)).filter((v): v is boolean => v !== null)
  const asPlanned = verdicts.length > 0 && verdicts.every(Boolean)
  const regression = e1rmChangePct !== null && e1rmChangePct < -REGRESSION_PCT && !asPlanned && !beatLastTime
  return { e1rmKg, previousE1rmKg, e1rmChangePct, beatLastTime, asPlanned, regression }
}
