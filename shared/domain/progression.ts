/**
 * Next step (what to beat next time) and plateau detection.
 *
 * The default policy is double progression as the trade runs it (common practice, no published
 * source), in the trade's two kinds of small step over last time: one more rep at the same load,
 * or the smallest load step at the same reps. Two published rules stay selectable beside it and
 * are kept apart from it: the NSCA "2-for-2" rule (Baechle & Earle, Essentials of Strength
 * Training and Conditioning) and the ACSM 2-10 % load increase (Ratamess et al., ACSM position
 * stand, MSSE 41(3):687-708, 2009). Every suggestion carries its reason as data.
 *
 * What counts as progress is one comparison for every screen (lift-progress.ts): the load moved
 * (body mass included for bodyweight lifts) and the estimated 1RM by Epley's formula.
 */
import { loadForReps, type E1rmFormula } from './e1rm'
import { EngineError, assertLoad, assertReps } from './errors'
import {
  GRID,
  atOrAboveGrid,
  atOrBelowGrid,
  compileEquipment,
  kgToGrid,
  optionFromGrid,
  type Equipment,
  type LoadOption,
} from './equipment'
import {
  beats, bestE1rmKg, loadOrderKey, movedLoadKg, sameLoad, setE1rmKg, type DoneSet, type LoadMode, type LoadReading,
} from './lift-progress'
import { reason, type Reason } from './reasons'
import { loadableAtMostMoved, maxWorkingSets, type SlotRole, type WorkingSetKind } from './schemes'

/** A working set as done, with its range and, when it was planned, its targets. Loads in kg as logged. */
export interface PerformedSet extends DoneSet {
  kind: WorkingSetKind
  /** The set's rep range. For a fixed-rep prescription repsMin = repsMax. */
  repsMin: number
  repsMax: number
  /** Planned reps in reserve; null or absent when planned to technical failure. */
  targetRir?: number | null
}

/** One exposure: the working sets of a slot in one session, in order. */
export interface Exposure {
  /** ISO date-time, for display only (the engine never reads the clock). */
  at?: string
  sets: PerformedSet[]
  /** The lifter's body mass that day (kg), for bodyweight and assisted lifts. */
  bodyMassKg?: number | null
  /** A planned deload: lighter on purpose, so it is left out of progress and plateau judgements. */
  deload?: boolean
}

/** What the engine needs to know about a lift besides its history. */
export interface LiftContext {
  equipment: Equipment
  /** How the logged load relates to the load moved (default: as logged). */
  mode?: LoadMode
  /** The exercise's own smallest load step in kg, honoured by every load step; null: the equipment's. */
  loadStepKg?: number | null
  formula?: E1rmFormula
}

export type NextStepAction = 'add_rep' | 'add_load' | 'hold' | 'cut_load'

/** What a step adds, as the lifter reads it: never a negative figure. */
export interface StepGain {
  kind: 'reps' | 'work' | 'load'
  pct: number
}

export interface NextStepOption {
  action: NextStepAction
  /** The load to log (the added load for a bodyweight lift, the help for an assisted one). */
  target: LoadOption
  /** The rep count to beat next time, always inside the range. */
  targetReps: number
  repsMin: number
  repsMax: number
  /** Percent more work (load moved x reps) in that set than last time; null from zero work. */
  workChangePct: number | null
  /** The figure shown with the step: more reps, more work or more load, in percent. */
  gain: StepGain
  reason: Reason
}

export interface NextStep extends NextStepOption {
  policy: ProgressionPolicy
  /** The other kind of step, offered beside the main one, or null. */
  alternative: NextStepOption | null
}

export const PROGRESSION_POLICIES = ['double_progression', 'nsca_2_for_2', 'acsm_2_to_10_pct'] as const
export type ProgressionPolicy = (typeof PROGRESSION_POLICIES)[number]

export interface NextStepOptions {
  /** ACSM: the load increase to aim for, within 2-10 % (default 2: the smallest allowed). */
  acsmIncreasePct?: number
  /** NSCA: minimum load increase in percent (default 0: the smallest loadable step). */
  nscaIncreasePct?: number
}

/**
 * Reps over the top of the range from which the next load is computed from the estimate rather
 * than taken as the smallest step. The ACSM position stand asks for 2-10 % more load at 1-2 reps
 * over the target (Ratamess et al. 2009); from 3 reps over, the smallest step would leave the
 * lifter far above the range again.
 */
export const FAR_ABOVE_RANGE_REPS = 3
/** A kilogram step read in a pound gym (or the reverse) may fall this much short and still count. */
const LOAD_STEP_TOLERANCE = 0.9
const EPS = 1e-9

/** Percent more work (load x reps) going from (load0, reps0) to (load1, reps1); null from zero work. */
export function workChangePct(load0: number, reps0: number, load1: number, reps1: number): number | null {
  const before = load0 * reps0
  if (before <= 0) return null
  return ((load1 * reps1) / before - 1) * 100
}

/** One decimal for messages. */
const one = (x: number): number => Math.round(x * 10) / 10

function checkSet(set: PerformedSet): void {
  assertLoad(set.loadKg)
  assertReps(set.reps)
  assertReps(set.repsMin, 'repsMin')
  assertReps(set.repsMax, 'repsMax')
  if (set.repsMin > set.repsMax) {
    throw new EngineError('INVALID_SCHEME', 'repsMin must not exceed repsMax', { repsMin: set.repsMin, repsMax: set.repsMax })
  }
}

const readingOf = (ctx: LiftContext, exposure: Exposure | undefined): LoadReading => ({
  mode: ctx.mode ?? 'external',
  bodyMassKg: exposure?.bodyMassKg ?? null,
})

// ---------------------------------------------------------------------------------------------
// Loads in the lift's own direction: for an assisted lift, "heavier" is less help.

/** The load as done, with its plates when the inventory makes it exactly. */
function sameLoadOption(loadKg: number, equipment: Equipment): LoadOption {
  const c = compileEquipment(equipment)
  const grid = kgToGrid(c, loadKg)
  return atOrAboveGrid(c, grid) === grid ? optionFromGrid(c, grid) : { loadKg, load: grid / GRID, unit: c.unit }
}

/** The next heavier loadable load, at least the exercise's own step heavier; null at the end of the inventory. */
export function heavierStep(loadKg: number, ctx: LiftContext, minStepKg = ctx.loadStepKg ?? 0): LoadOption | null {
  const c = compileEquipment(ctx.equipment)
  const step = kgToGrid(c, Math.max(0, minStepKg) * LOAD_STEP_TOLERANCE)
  const here = kgToGrid(c, loadKg)
  const assisted = ctx.mode === 'assisted'
  const grid = assisted ? atOrBelowGrid(c, here - Math.max(1, step)) : atOrAboveGrid(c, here + Math.max(1, step))
  return grid === null ? null : optionFromGrid(c, grid)
}

/** The next lighter loadable load (more help for an assisted lift); null at the end of the inventory. */
function lighterStep(loadKg: number, ctx: LiftContext): LoadOption | null {
  const c = compileEquipment(ctx.equipment)
  const here = kgToGrid(c, loadKg)
  const grid = ctx.mode === 'assisted' ? atOrAboveGrid(c, here + 1) : atOrBelowGrid(c, here - 1)
  return grid === null ? null : optionFromGrid(c, grid)
}

/** The smallest step the equipment itself can make up (microloading), ignoring the exercise's own step. */
export function smallestStep(loadKg: number, ctx: LiftContext): LoadOption | null {
  return heavierStep(loadKg, ctx, 0)
}

// ---------------------------------------------------------------------------------------------
// Building options

function gainOf(action: NextStepAction, set: PerformedSet, reading: LoadReading, target: LoadOption, targetReps: number): StepGain {
  const before = movedLoadKg(set.loadKg, reading) ?? set.loadKg
  const after = movedLoadKg(target.loadKg, reading) ?? target.loadKg
  const work = workChangePct(before, set.reps, after, targetReps)
  if (action === 'add_load') return { kind: 'load', pct: before > 0 ? (after / before - 1) * 100 : 0 }
  if (action === 'add_rep' || (work !== null && work > 0)) return { kind: 'work', pct: Math.max(0, work ?? 0) }
  return { kind: 'reps', pct: Math.max(0, ((targetReps - set.reps) / set.reps) * 100) }
}

function option(
  set: PerformedSet,
  reading: LoadReading,
  action: NextStepAction,
  target: LoadOption,
  targetReps: number,
  why: Reason,
): NextStepOption {
  const before = movedLoadKg(set.loadKg, reading) ?? set.loadKg
  const after = movedLoadKg(target.loadKg, reading) ?? target.loadKg
  return {
    action,
    target,
    targetReps,
    repsMin: set.repsMin,
    repsMax: set.repsMax,
    workChangePct: workChangePct(before, set.reps, after, targetReps),
    gain: gainOf(action, set, reading, target, targetReps),
    reason: why,
  }
}

/** Built property by property: an object spread here was most of the engine's time over a long logbook. */
function asStep(o: NextStepOption, policy: ProgressionPolicy, alternative: NextStepOption | null): NextStep {
  return {
    action: o.action,
    target: o.target,
    targetReps: o.targetReps,
    repsMin: o.repsMin,
    repsMax: o.repsMax,
    workChangePct: o.workChangePct,
    gain: o.gain,
    reason: o.reason,
    policy,
    alternative,
  }
}

const clamp = (n: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, n))

/**
 * The fewest reps at `load` whose estimated 1RM is not below `e1rm` (Epley's inverse), as reps
 * done before the planned reserve, clamped to [lo, hi].
 */
function repsToMatch(e1rmKg: number | null, movedKg: number | null, plannedRir: number, lo: number, hi: number, fallback: number): number {
  if (e1rmKg === null || movedKg === null || movedKg <= 0) return clamp(fallback, lo, hi)
  const toFailure = 30 * (e1rmKg / movedKg - 1)
  return clamp(Math.ceil(toFailure - plannedRir - EPS), lo, hi)
}

/**
 * Two exposures in a row at the same load without a rep more than the one before: one more rep
 * was missed twice (the set at `index` of each exposure, oldest first).
 */
export function missedOneMoreRepTwice(history: readonly Exposure[], index: number): boolean {
  const n = history.length
  if (n < 3) return false
  const a = history[n - 3].sets[index]
  const b = history[n - 2].sets[index]
  const c = history[n - 1].sets[index]
  if (!a || !b || !c) return false
  return sameLoad(a.loadKg, b.loadKg) && sameLoad(b.loadKg, c.loadKg) && b.reps <= a.reps && c.reps <= b.reps
}

/**
 * Double progression for the set at `index` of the latest exposure, over the lift's history
 * (oldest first, deloads already left out). Common practice, no published source:
 * - inside the range: one more rep at the same load; after one more rep was missed at the same
 *   load on two exposures in a row, the smallest load step at the same reps instead, so small
 *   real gains show as progress (microloading where the gym has small plates);
 * - at the top of the range (up to FAR_ABOVE_RANGE_REPS - 1 over): the smallest load step,
 *   keeping the reps reached (at most the top of the range); when that step is larger than one
 *   rep's worth of estimated 1RM, the fewest reps at the new load whose estimate is not below
 *   last time's (Epley's inverse), never below the range;
 * - far above the top: the load the estimate gives for the top of the range, at least one step;
 * - below the bottom: the same load for one more try at the bottom of the range, then the load
 *   that the last performance predicts for the bottom of the range.
 */
export function doubleProgressionAt(history: readonly Exposure[], index: number, ctx: LiftContext): NextStep | null {
  const latest = history.at(-1)
  const set = latest?.sets[index]
  if (!latest || !set) return null
  checkSet(set)
  const reading = readingOf(ctx, latest)
  const formula = ctx.formula ?? 'epley'
  const plannedRir = set.targetRir ?? 0
  const e1rm = setE1rmKg(set, reading, formula)
  const moved = (o: LoadOption) => movedLoadKg(o.loadKg, reading)
  const here = sameLoadOption(set.loadKg, ctx.equipment)
  const up = heavierStep(set.loadKg, ctx)
  const { repsMin, repsMax, reps } = set
  const policy: ProgressionPolicy = 'double_progression'

  if (reps < repsMin) {
    const previous = history.at(-2)?.sets[index]
    const secondTime = previous !== undefined && previous.reps < previous.repsMin
      && loadOrderKey(set.loadKg, reading) >= loadOrderKey(previous.loadKg, reading) - EPS
    if (secondTime && e1rm !== null) {
      const cut = loadableAtMostMoved(loadForReps(e1rm, repsMin + plannedRir, formula), reading, ctx.equipment)
      const lighter = loadOrderKey(cut.loadKg, reading) < loadOrderKey(set.loadKg, reading) - EPS ? cut : lighterStep(set.loadKg, ctx)
      if (lighter) {
        return asStep(option(set, reading, 'cut_load', lighter, repsMin, reason(
          'CUT_LOAD_BELOW_RANGE',
          { reps, repsMin, previousReps: previous.reps, loadKg: lighter.loadKg, e1rmKg: e1rm },
          () => `${reps} reps, below the range (${repsMin}) for the second time: a lighter load for ${repsMin} reps`,
        )), policy, null)
      }
    }
    return asStep(option(set, reading, 'hold', here, repsMin, reason(
      'HOLD_BELOW_RANGE',
      { reps, repsMin },
      () => `${reps} reps is below the range: the same load once more, aiming for ${repsMin}`,
    )), policy, null)
  }

  if (reps >= repsMax) {
    if (!up) {
      return asStep(option(set, reading, 'hold', here, repsMax, reason(
        'NO_HEAVIER_LOAD_AVAILABLE',
        { reps, repsMax, loadKg: set.loadKg },
        'Top of the range reached but the equipment has no heavier load: keep the load and the top of the range',
      )), policy, null)
    }
    if (reps >= repsMax + FAR_ABOVE_RANGE_REPS && e1rm !== null) {
      const computed = loadableAtMostMoved(loadForReps(e1rm, repsMax + plannedRir, formula), reading, ctx.equipment)
      const jump = loadOrderKey(computed.loadKg, reading) > loadOrderKey(up.loadKg, reading) + EPS ? computed : up
      const targetReps = repsToMatch(e1rm, moved(jump), plannedRir, repsMin, repsMax, repsMax)
      return asStep(option(set, reading, 'add_load', jump, targetReps, reason(
        'LARGER_JUMP_FAR_ABOVE_RANGE',
        { reps, repsMax, over: reps - repsMax, loadKg: jump.loadKg, e1rmKg: e1rm },
        () => `${reps} reps is ${reps - repsMax} over the range: the load your estimate gives for ${repsMax} reps`,
      )), policy, null)
    }
    const kept = Math.min(reps, repsMax)
    const oneRepWorth = setE1rmKg({ loadKg: set.loadKg, reps: kept + 1, rir: plannedRir }, reading, formula)
    const atKept = setE1rmKg({ loadKg: up.loadKg, reps: kept, rir: plannedRir }, reading, formula)
    const large = oneRepWorth !== null && atKept !== null && atKept > oneRepWorth * (1 + EPS)
    const targetReps = large ? repsToMatch(e1rm, moved(up), plannedRir, repsMin, kept, kept) : kept
    return asStep(option(set, reading, 'add_load', up, targetReps, reason(
      'ADD_LOAD_AT_TOP_OF_RANGE',
      { reps, repsMax, targetReps, keptReps: large ? 0 : 1, stepKg: up.loadKg - set.loadKg },
      () => large
        ? `${reps} reps reached the top of the range: the next load step, ${targetReps} reps to match your estimate`
        : `${reps} reps reached the top of the range: the next load step for the same ${targetReps} reps`,
    )), policy, null)
  }

  // Inside the range.
  if (up && missedOneMoreRepTwice(history, index)) {
    return asStep(option(set, reading, 'add_load', up, reps, reason(
      'ADD_LOAD_AFTER_MISSED_REP',
      { reps, stepKg: up.loadKg - set.loadKg },
      () => `One more rep did not come twice at this load: the smallest load step for the same ${reps} reps`,
    )), policy, null)
  }
  const main = option(set, reading, 'add_rep', here, reps + 1, reason(
    'ADD_REP_BELOW_TOP_OF_RANGE',
    { reps, repsMax },
    () => `${reps} reps is below the top of the range (${repsMax}): one more rep at the same load`,
  ))
  const alternative = up
    ? option(set, reading, 'add_load', up, reps, reason(
      'LOAD_STEP_SAME_REPS',
      { reps, stepKg: up.loadKg - set.loadKg },
      () => `Or the smallest load step for the same ${reps} reps`,
    ))
    : null
  return asStep(main, policy, alternative)
}

// ---------------------------------------------------------------------------------------------
// The published rules, kept apart from double progression.

/** Smallest loadable load at least `pct` % heavier (pct 0: the next step), or null. */
function increaseBy(loadKg: number, pct: number, ctx: LiftContext): LoadOption | null {
  if (pct <= 0) return heavierStep(loadKg, ctx)
  const c = compileEquipment(ctx.equipment)
  const wanted = kgToGrid(c, loadKg * (1 + pct / 100))
  const grid = atOrAboveGrid(c, Math.max(wanted, kgToGrid(c, loadKg) + 1))
  return grid === null ? null : optionFromGrid(c, grid)
}

const ACSM_MIN_PCT = 2
const ACSM_MAX_PCT = 10

function acsmIncrease(loadKg: number, aim: number, ctx: LiftContext): LoadOption | null {
  const up = increaseBy(loadKg, aim, ctx)
  if (up && up.loadKg <= loadKg * (1 + ACSM_MAX_PCT / 100) * (1 + 1e-12)) return up
  const c = compileEquipment(ctx.equipment)
  const cap = atOrBelowGrid(c, kgToGrid(c, loadKg * (1 + ACSM_MAX_PCT / 100)))
  if (cap !== null) {
    const o = optionFromGrid(c, cap)
    if (o.loadKg >= loadKg * (1 + ACSM_MIN_PCT / 100) * (1 - 1e-12)) return o
  }
  return up ?? heavierStep(loadKg, ctx)
}

/**
 * ACSM position stand (Ratamess et al., MSSE 41(3):687-708, 2009): "increase the load 2-10 %
 * when the lifter can do the current load for 1-2 reps over the target". The target is the top
 * of the set's range.
 */
export function acsm2To10Pct(set: PerformedSet, ctx: LiftContext, options: NextStepOptions = {}): NextStep {
  checkSet(set)
  const aim = options.acsmIncreasePct ?? 2
  if (aim < ACSM_MIN_PCT || aim > ACSM_MAX_PCT) {
    throw new EngineError('INVALID_SCHEME', `The ACSM increase is 2-10 % (got ${aim})`, { acsmIncreasePct: aim })
  }
  const reading = readingOf(ctx, undefined)
  const target = set.repsMax
  const over = set.reps - target
  const up = over >= 1 ? acsmIncrease(set.loadKg, aim, ctx) : null
  if (up) {
    const pct = (up.loadKg / set.loadKg - 1) * 100
    return asStep(option(set, reading, 'add_load', up, target, reason(
      'ACSM_TARGET_BEATEN',
      { reps: set.reps, target, repsOver: over, loadIncreasePct: pct, withinBand: pct >= ACSM_MIN_PCT - 1e-9 && pct <= ACSM_MAX_PCT + 1e-9 ? 1 : 0 },
      () => `${over} rep(s) over the target of ${target}: load up ${one(pct)} % (ACSM 2-10 %)`,
    )), 'acsm_2_to_10_pct', null)
  }
  return asStep(option(set, reading, 'hold', sameLoadOption(set.loadKg, ctx.equipment), target, reason(
    'ACSM_TARGET_NOT_BEATEN',
    { reps: set.reps, target, repsOver: over },
    over >= 1 ? 'Target beaten but no heavier load is available' : `Target of ${target} not beaten yet: same load`,
  )), 'acsm_2_to_10_pct', null)
}

/**
 * NSCA "2-for-2" rule (Baechle & Earle, Essentials of Strength Training and Conditioning;
 * secondary copy): add load once the LAST set of the exercise beats its target by 2 or more
 * reps in two sessions in a row. Applies to every working set of the slot at once.
 */
export function nsca2For2(latest: Exposure, previous: Exposure | undefined, ctx: LiftContext, options: NextStepOptions = {}): NextStep[] {
  const beatBy = (e: Exposure | undefined): number | null => {
    const last = e?.sets[e.sets.length - 1]
    return last ? last.reps - last.repsMax : null
  }
  const nowBy = beatBy(latest)
  const beforeBy = beatBy(previous)
  const met = nowBy !== null && beforeBy !== null && nowBy >= 2 && beforeBy >= 2
  const reading = readingOf(ctx, latest)
  return latest.sets.map((set) => {
    checkSet(set)
    const up = met ? increaseBy(set.loadKg, options.nscaIncreasePct ?? 0, ctx) : null
    const values = { lastSetRepsOverTarget: nowBy, previousLastSetRepsOverTarget: beforeBy, required: 2 }
    const o = up
      ? option(set, reading, 'add_load', up, set.repsMax, reason('NSCA_2_FOR_2_MET', values, 'Last set beat the target by 2+ reps two sessions in a row: add load'))
      : option(set, reading, 'hold', sameLoadOption(set.loadKg, ctx.equipment), set.repsMax, reason('NSCA_2_FOR_2_NOT_MET', values, 'Not yet 2+ reps over the target on the last set two sessions in a row: same load'))
    return asStep(o, 'nsca_2_for_2', null)
  })
}

/** Exposures that judge progress: planned deloads are left out. */
export function progressHistory(exposures: readonly Exposure[]): Exposure[] {
  return exposures.filter((e) => !e.deload && e.sets.length > 0)
}

/** Next steps for every working set of the latest exposure that is not a deload (exposures oldest first). */
export function nextSteps(
  exposures: readonly Exposure[],
  ctx: LiftContext,
  options: NextStepOptions & { policy?: ProgressionPolicy } = {},
): NextStep[] {
  const history = progressHistory(exposures)
  const latest = history.at(-1)
  if (!latest) return []
  switch (options.policy ?? 'double_progression') {
    case 'double_progression':
      return latest.sets.map((_, i) => doubleProgressionAt(history, i, ctx)!)
    case 'nsca_2_for_2':
      return nsca2For2(latest, history.at(-2), ctx, options)
    case 'acsm_2_to_10_pct':
      return latest.sets.map((s) => acsm2To10Pct(s, ctx, options))
    default:
      throw new EngineError('INVALID_SCHEME', `Unknown progression policy: ${String(options.policy)}`, { policy: options.policy })
  }
}

// ---------------------------------------------------------------------------------------------
// Plateau

export type PlateauOptionKind = 'microload' | 'rotate_version' | 'add_set' | 'deload'

export interface PlateauOption {
  kind: PlateauOptionKind
  reason: Reason
  /** microload: the lighter jump to take, at the reps of the latest top set. */
  target?: LoadOption
  targetReps?: number
  /** add_set: the new working-set count and its effort. */
  sets?: number
  targetRir?: number
  /** rotate_version: the version that gets fresh exercises and the one kept. */
  rotate?: 'I' | 'II' | null
  keep?: 'I' | 'II' | null
}

/**
 * Exposures over which a lift must show no progress to count as plateaued: four, so that one more
 * rep has been tried and missed twice at one load and the smallest load step has been tried
 * after that (double progression above switches after two misses), with one exposure to spare
 * for a lifter whose true gains are smaller than one step. Common practice, no published source.
 */
export const PLATEAU_WINDOW = 4
/**
 * ...and spanning at least four weeks when the exposures are dated: a lift trained two or three
 * times a week needs more exposures than one trained weekly to show a small real gain, and the
 * trade speaks of a lift that "stops moving for a few weeks" (common practice, no published source).
 */
export const PLATEAU_MIN_DAYS = 28
const DAY_MS = 86_400_000

/** How many of the latest exposures the plateau window covers: at least `window`, and every one within PLATEAU_MIN_DAYS of the latest. */
export function exposuresInWindow(history: readonly Exposure[], window: number): number {
  const latest = history.at(-1)?.at
  if (!latest) return window
  const end = Date.parse(latest)
  let n = 0
  for (let i = history.length - 1; i >= 0; i--) {
    const at = history[i].at
    if (n >= window && (!at || end - Date.parse(at) >= PLATEAU_MIN_DAYS * DAY_MS)) break
    n += 1
  }
  return n
}
/**
 * A best estimate has to rise by more than this to count: a whole rep traded for a small load
 * step moves Epley's estimate by less than 1 % without the lifter being stronger.
 */
export const PLATEAU_E1RM_TOLERANCE_PCT = 0

export interface PlateauContext extends LiftContext {
  role: SlotRole
  /** Exposures without progress that make a plateau (default PLATEAU_WINDOW). */
  window?: number
  /** The version of the day this slot belongs to, for the rotation option. */
  version?: 'I' | 'II'
  /** The latest session set a record on this lift: never a plateau on that day. */
  recordToday?: boolean
  /** Hard sets of this lift's movement pattern in the latest session, for the caps across a session. */
  patternSetsInSession?: number
}

export interface PlateauReport {
  plateau: boolean
  /** Latest exposures in a row without progress (no set beat the exposure before, no higher best estimate). */
  exposuresWithoutProgress: number
  window: number
  /** In the window: one more rep tried at a load, and a heavier load tried. */
  triedRepStep: boolean
  triedLoadStep: boolean
  bestE1rmKg: number | null
  /** In order: microload, rotate version, add a set (within the caps), deload. Empty without a plateau. */
  options: PlateauOption[]
}

/** Deload week: about 90 % of the load, half the sets, stopping short of failure (common practice, no published source). */
export const DELOAD = { loadPct: 90, setsPct: 50, targetRir: 3 } as const
/** The set added on a plateau is taken at lower effort (common practice, no published source). */
export const ADDED_SET_RIR = 2

/**
 * A plateau: over the last `window` exposures (deloads left out) no set beat the same set of the
 * exposure before it, the best estimated 1RM did not rise by more than the tolerance above the
 * best before the window, and both kinds of step were tried (one more rep at a load, and a
 * heavier load); never on a day the lift set a record. The options, in order: a load step
 * strictly smaller than the last one taken (only when the equipment has one), fresh exercises for
 * that day's version, one more set within the caps at lower effort, a deload week.
 */
export function detectPlateau(exposures: readonly Exposure[], context: PlateauContext): PlateauReport {
  const window = context.window ?? PLATEAU_WINDOW
  if (!Number.isInteger(window) || window < 2) {
    throw new EngineError('INVALID_SCHEME', `The plateau window must be a whole number of at least 2 (got ${window})`, { window })
  }
  const history = progressHistory(exposures)
  const formula = context.formula ?? 'epley'
  const mode = context.mode ?? 'external'
  const reading = (e: Exposure): LoadReading => ({ mode, bodyMassKg: e.bodyMassKg ?? null })
  const best = (e: Exposure) => bestE1rmKg(e.sets, reading(e), formula)

  // The latest exposure beat the one before it (more load or more reps): never a plateau that day.
  const latestBeat = history.length > 1 && history[history.length - 1].sets.some((s, k) => {
    const before = history[history.length - 2]
    return before.sets[k] !== undefined && beatsAcrossDays(s, history[history.length - 1], before.sets[k], before, mode)
  })
  const span = exposuresInWindow(history, window)
  const recent = history.slice(-span)
  const earlier = history.slice(0, -span)
  let triedRepStep = false
  let triedLoadStep = false
  for (let i = Math.max(1, history.length - span); i < history.length; i++) {
    const a = history[i - 1].sets[0]
    const b = history[i].sets[0]
    if (!a || !b) continue
    if (sameLoad(a.loadKg, b.loadKg)) triedRepStep = true
    else if (loadOrderKey(b.loadKg, reading(history[i])) > loadOrderKey(a.loadKg, reading(history[i - 1]))) triedLoadStep = true
  }
  const bestBefore = earlier.reduce<number | null>((m, e) => maxOf(m, best(e)), null)
  const bestRecent = recent.reduce<number | null>((m, e) => maxOf(m, best(e)), null)
  const estimateRose = bestBefore !== null && bestRecent !== null && bestRecent > bestBefore * (1 + PLATEAU_E1RM_TOLERANCE_PCT / 100)
  // Sessions in a row, latest last, without a best estimate above every earlier one.
  let streak = 0
  let bestSoFar = -Infinity
  history.forEach((e, i) => {
    const b = best(e) ?? -Infinity
    streak = i > 0 && b <= bestSoFar * (1 + PLATEAU_E1RM_TOLERANCE_PCT / 100) ? streak + 1 : 0
    bestSoFar = Math.max(bestSoFar, b)
  })
  const plateau = history.length > span && !latestBeat && !estimateRose && triedRepStep && triedLoadStep && !context.recordToday
  const report: PlateauReport = {
    plateau,
    exposuresWithoutProgress: streak,
    window: span,
    triedRepStep,
    triedLoadStep,
    bestE1rmKg: maxOf(bestBefore, bestRecent),
    options: [],
  }
  if (!plateau) return report
  const latest = history[history.length - 1]
  const values = { exposuresWithoutProgress: streak, window }

  // 1. A load step strictly smaller than the last jump taken (compared in logged kilograms: the
  //    same 2.5 kg is not a smaller step because it is a smaller share of a heavier load).
  const top = latest.sets[0]
  const micro = top ? smallestStep(top.loadKg, context) : null
  if (top && micro) {
    const movedNow = movedLoadKg(top.loadKg, reading(latest)) ?? top.loadKg
    const stepPct = movedNow > 0 ? ((movedLoadKg(micro.loadKg, reading(latest)) ?? micro.loadKg) / movedNow - 1) * 100 : 0
    const stepKg = Math.abs(micro.loadKg - top.loadKg)
    let lastJump: { kg: number; pct: number } | null = null
    for (let i = history.length - 1; i > 0 && lastJump === null; i--) {
      const a = history[i - 1].sets[0]
      const b = history[i].sets[0]
      if (!a || !b) continue
      const ma = movedLoadKg(a.loadKg, reading(history[i - 1])) ?? a.loadKg
      const mb = movedLoadKg(b.loadKg, reading(history[i])) ?? b.loadKg
      if (loadOrderKey(b.loadKg, reading(history[i])) > loadOrderKey(a.loadKg, reading(history[i - 1])) + EPS && ma > 0) {
        lastJump = { kg: Math.abs(b.loadKg - a.loadKg), pct: (mb / ma - 1) * 100 }
      }
    }
    if (lastJump !== null && stepKg < lastJump.kg - 1e-6) {
      const lastJumpPct = lastJump.pct
      report.options.push({
        kind: 'microload',
        target: micro,
        targetReps: clamp(top.reps, top.repsMin, top.repsMax),
        reason: reason(
          'PLATEAU_MICROLOAD',
          { ...values, stepPct, lastJumpPct, stepKg, lastJumpKg: lastJump.kg },
          () => `A smaller load step: +${one(stepPct)} % instead of the last +${one(lastJumpPct)} %`,
        ),
      })
    }
  }

  // 2. Fresh exercises for that day's version, keeping the other version.
  const other = context.version === 'I' ? 'II' : context.version === 'II' ? 'I' : null
  report.options.push({
    kind: 'rotate_version',
    rotate: context.version ?? null,
    keep: other,
    reason: reason(
      'PLATEAU_ROTATE_VERSION',
      { ...values, rotate: context.version ?? null, keep: other },
      () => `No progress for ${streak} sessions: fresh exercises for version ${context.version ?? 'I/II'} of this day, the other version kept`,
    ),
  })

  // 3. One more working set, only within the caps for the lift and for its pattern in a session.
  const sets = latest.sets.length
  const cap = maxWorkingSets(context.role)
  const patternRoom = context.patternSetsInSession === undefined || context.patternSetsInSession + 1 <= MAX_HARD_SETS_PER_PATTERN
  if (sets + 1 <= cap && patternRoom) {
    report.options.push({
      kind: 'add_set',
      sets: sets + 1,
      targetRir: ADDED_SET_RIR,
      reason: reason(
        'PLATEAU_ADD_SET',
        { ...values, sets, newSets: sets + 1, cap, targetRir: ADDED_SET_RIR },
        () => `One more set (${sets} -> ${sets + 1}, cap ${cap}) at ${ADDED_SET_RIR} reps in reserve`,
      ),
    })
  }

  // 4. A deload week.
  report.options.push({
    kind: 'deload',
    reason: reason(
      'PLATEAU_DELOAD',
      { ...values, loadPct: DELOAD.loadPct, setsPct: DELOAD.setsPct },
      () => `A deload: about ${DELOAD.loadPct} % of the load and ${DELOAD.setsPct} % of the sets, then back to where you were`,
    ),
  })
  return report
}

/** Hard sets of one movement pattern in one session, at most (common practice, no published source). */
export const MAX_HARD_SETS_PER_PATTERN = 4

function maxOf(a: number | null, b: number | null): number | null {
  if (a === null) return b
  if (b === null) return a
  return Math.max(a, b)
}

/** Whether set `a` (of exposure ea) beat set `b` (of exposure eb), each read with its own day's body mass. */
function beatsAcrossDays(a: PerformedSet, ea: Exposure, b: PerformedSet, eb: Exposure, mode: LoadMode): boolean {
  const ma = movedLoadKg(a.loadKg, { mode, bodyMassKg: ea.bodyMassKg ?? null })
  const mb = movedLoadKg(b.loadKg, { mode, bodyMassKg: eb.bodyMassKg ?? null })
  if (ma !== null && mb !== null) {
    // A body-mass change alone is not progress: compare the logged load when it did not change.
    if (sameLoad(a.loadKg, b.loadKg)) return a.reps > b.reps
    return beats({ loadKg: ma, reps: a.reps }, { loadKg: mb, reps: b.reps }, { mode: 'external' })
  }
  return beats(a, b, { mode, bodyMassKg: null })
}
