/**
 * Next step (what to beat next time) and plateau detection.
 *
 * Three progression policies, kept apart because they are different published rules:
 * - double progression (default; common practice, no published source),
 * - the NSCA "2-for-2" rule (Baechle & Earle, Essentials of Strength Training and Conditioning),
 * - the ACSM 2-10 % load increase (Ratamess et al., ACSM position stand, MSSE 41(3):687-708, 2009).
 * Every suggestion carries its reason as data (code + numbers).
 */
import { estimateOneRepMax, type E1rmFormula } from './e1rm'
import { EngineError, assertLoad, assertReps } from './errors'
import {
  GRID,
  atOrAboveGrid,
  atOrBelowGrid,
  compileEquipment,
  kgToGrid,
  optionFromGrid,
  stepUp,
  type Equipment,
  type LoadOption,
} from './equipment'
import { reason, type Reason } from './reasons'
import { fromKg } from './units'
import { maxWorkingSets, type SlotRole, type WorkingSetKind } from './schemes'

/** A working set as done. Loads in kg as stored. */
export interface PerformedSet {
  kind: WorkingSetKind
  loadKg: number
  reps: number
  /** The set's rep range (target). For a fixed-rep prescription repsMin = repsMax. */
  repsMin: number
  repsMax: number
  /** Reps in reserve when the set stopped short of failure; null/0 = to failure. */
  rir?: number | null
}

/** One exposure: the working sets of a slot in one session, in order. */
export interface Exposure {
  /** ISO date-time, for display only (the engine never reads the clock). */
  at?: string
  sets: PerformedSet[]
}

export type NextStepAction = 'add_rep' | 'add_load' | 'hold'

export interface NextStepOption {
  action: NextStepAction
  target: LoadOption
  /** The rep count to beat next time. */
  targetReps: number
  repsMin: number
  repsMax: number
  /** Percent more work in that set (load x reps) than last time; null when last time's work was 0. */
  workChangePct: number | null
  reason: Reason
}

export interface NextStep extends NextStepOption {
  policy: ProgressionPolicy
  /** A smaller jump offered beside the main suggestion, or null. */
  alternative: NextStepOption | null
}

export const PROGRESSION_POLICIES = ['double_progression', 'nsca_2_for_2', 'acsm_2_to_10_pct'] as const
export type ProgressionPolicy = (typeof PROGRESSION_POLICIES)[number]

export interface NextStepOptions {
  /** Double progression: a one-rep jump above this percent of work is a large leap (default 8). */
  largeLeapPct?: number
  /** ACSM: the load increase to aim for, within 2-10 % (default 2: the smallest allowed). */
  acsmIncreasePct?: number
  /** NSCA: minimum load increase in percent (default 0: the smallest loadable step). */
  nscaIncreasePct?: number
}

export const DEFAULT_LARGE_LEAP_PCT = 8

/** Percent more work (load x reps) going from (load0, reps0) to (load1, reps1); null from zero work. */
export function workChangePct(load0: number, reps0: number, load1: number, reps1: number): number | null {
  const before = load0 * reps0
  if (before <= 0) return null
  return ((load1 * reps1) / before - 1) * 100
}

function checkSet(set: PerformedSet): void {
  assertLoad(set.loadKg)
  assertReps(set.reps)
  assertReps(set.repsMin, 'repsMin')
  assertReps(set.repsMax, 'repsMax')
  if (set.repsMin > set.repsMax) {
    throw new EngineError('INVALID_SCHEME', 'repsMin must not exceed repsMax', { repsMin: set.repsMin, repsMax: set.repsMax })
  }
}

function sameLoad(set: PerformedSet, equipment: Equipment): LoadOption {
  const c = compileEquipment(equipment)
  const grid = kgToGrid(c, set.loadKg)
  // The load was done, so keep it as is; the plate list is filled in when the inventory can make it.
  const exact = atOrAboveGrid(c, grid) === grid
  return exact ? optionFromGrid(c, grid) : { loadKg: set.loadKg, load: grid / GRID, unit: c.unit }
}

function option(
  set: PerformedSet,
  action: NextStepAction,
  target: LoadOption,
  targetReps: number,
  why: Reason,
): NextStepOption {
  return {
    action,
    target,
    targetReps,
    repsMin: set.repsMin,
    repsMax: set.repsMax,
    workChangePct: workChangePct(set.loadKg, set.reps, target.loadKg, targetReps),
    reason: why,
  }
}

/** One decimal for messages (cheaper than toFixed on the hot path). */
const one = (x: number): number => Math.round(x * 10) / 10

/** Explicit construction (object spread is measurably slower on the logbook benchmark). */
function asStep(o: NextStepOption, policy: ProgressionPolicy, alternative: NextStepOption | null): NextStep {
  return {
    action: o.action,
    target: o.target,
    targetReps: o.targetReps,
    repsMin: o.repsMin,
    repsMax: o.repsMax,
    workChangePct: o.workChangePct,
    reason: o.reason,
    policy,
    alternative,
  }
}

/**
 * Double progression inside the set's rep range (common practice, no published source):
 * below the top of the range -> one more rep at the same load; at or above the top -> the
 * smallest loadable load increase with reps reset to the bottom of the range. When one more rep
 * is a large leap (more than `largeLeapPct` % more work) and the smallest load step is a
 * smaller jump, that load step (same reps) is offered as the alternative.
 */
export function doubleProgression(set: PerformedSet, equipment: Equipment, options: NextStepOptions = {}): NextStep {
  checkSet(set)
  const largeLeapPct = options.largeLeapPct ?? DEFAULT_LARGE_LEAP_PCT
  const here = sameLoad(set, equipment)
  const up = stepUp(set.loadKg, equipment)

  if (set.reps < set.repsMax) {
    const main = option(
      set,
      'add_rep',
      here,
      set.reps + 1,
      reason(
        'ADD_REP_BELOW_TOP_OF_RANGE',
        { reps: set.reps, repsMax: set.repsMax, workChangePct: (100 * 1) / set.reps },
        () => `${set.reps} reps is below the top of the range (${set.repsMax}): one more rep at the same load`,
      ),
    )
    let alternative: NextStepOption | null = null
    const repPct = main.workChangePct
    if (up && repPct !== null && repPct > largeLeapPct) {
      const loadPct = workChangePct(set.loadKg, set.reps, up.loadKg, set.reps)!
      if (loadPct < repPct) {
        alternative = option(
          set,
          'add_load',
          up,
          set.reps,
          reason(
            'SMALLER_JUMP_AS_LOAD_STEP',
            { repWorkChangePct: repPct, loadWorkChangePct: loadPct, largeLeapPct, step: up.load - here.load },
            () => `One more rep is ${one(repPct)} % more work (above ${largeLeapPct} %); the smallest load step is ${one(loadPct)} %`,
          ),
        )
      }
    }
    return asStep(main, 'double_progression', alternative)
  }

  if (!up) {
    const main = option(
      set,
      'hold',
      here,
      Math.min(set.reps + 1, 50),
      reason(
        'NO_HEAVIER_LOAD_AVAILABLE',
        { reps: set.reps, repsMax: set.repsMax, loadKg: set.loadKg },
        'Top of the range reached but the equipment has no heavier load: keep the load, add a rep',
      ),
    )
    return asStep(main, 'double_progression', null)
  }
  const main = option(
    set,
    'add_load',
    up,
    set.repsMin,
    reason(
      'ADD_LOAD_AT_TOP_OF_RANGE',
      { reps: set.reps, repsMax: set.repsMax, repsMin: set.repsMin, step: up.load - here.load, stepKg: up.loadKg - set.loadKg },
      () => `${set.reps} reps reached the top of the range (${set.repsMax}): smallest load step, back to ${set.repsMin} reps`,
    ),
  )
  return asStep(main, 'double_progression', null)
}

/** One set's next step with the default policy (double progression). */
export const nextStep = doubleProgression

/** Smallest loadable load at least `pct` % heavier (pct 0: strictly heavier), or null. */
function increaseBy(loadKg: number, pct: number, equipment: Equipment): LoadOption | null {
  if (pct <= 0) return stepUp(loadKg, equipment)
  const c = compileEquipment(equipment)
  const wanted = kgToGrid(c, loadKg * (1 + pct / 100))
  const grid = atOrAboveGrid(c, Math.max(wanted, kgToGrid(c, loadKg) + 1))
  return grid === null ? null : optionFromGrid(c, grid)
}

/** ACSM band: a load increase of 2 to 10 %. */
const ACSM_MIN_PCT = 2
const ACSM_MAX_PCT = 10

/**
 * The lightest loadable load at least `aim` % heavier if that stays within 10 %; else the
 * heaviest within 10 % if that is at least 2 %; else (coarse equipment) the smallest step up.
 */
function acsmIncrease(loadKg: number, aim: number, equipment: Equipment): LoadOption | null {
  const up = increaseBy(loadKg, aim, equipment)
  if (up && up.loadKg <= loadKg * (1 + ACSM_MAX_PCT / 100) * (1 + 1e-12)) return up
  const c = compileEquipment(equipment)
  const cap = atOrBelowGrid(c, kgToGrid(c, loadKg * (1 + ACSM_MAX_PCT / 100)))
  if (cap !== null) {
    const option = optionFromGrid(c, cap)
    if (option.loadKg >= loadKg * (1 + ACSM_MIN_PCT / 100) * (1 - 1e-12)) return option
  }
  return up ?? stepUp(loadKg, equipment)
}

/**
 * ACSM position stand (Ratamess et al., MSSE 41(3):687-708, 2009): "increase the load 2-10 %
 * when the lifter can do the current load for 1-2 reps over the target". The target is the top
 * of the set's range. Aims at `acsmIncreasePct` (default 2 %) and takes the lightest loadable
 * load at or above it; `withinBand` in the reason says whether that landed inside 2-10 %.
 */
export function acsm2To10Pct(set: PerformedSet, equipment: Equipment, options: NextStepOptions = {}): NextStep {
  checkSet(set)
  const aim = options.acsmIncreasePct ?? 2
  if (aim < ACSM_MIN_PCT || aim > ACSM_MAX_PCT) {
    throw new EngineError('INVALID_SCHEME', `The ACSM increase is 2-10 % (got ${aim})`, { acsmIncreasePct: aim })
  }
  const target = set.repsMax
  const over = set.reps - target
  const up = over >= 1 ? acsmIncrease(set.loadKg, aim, equipment) : null
  if (up) {
    const pct = (up.loadKg / set.loadKg - 1) * 100
    return asStep(
      option(
        set,
        'add_load',
        up,
        target,
        reason(
          'ACSM_TARGET_BEATEN',
          { reps: set.reps, target, repsOver: over, loadIncreasePct: pct, withinBand: pct >= ACSM_MIN_PCT - 1e-9 && pct <= ACSM_MAX_PCT + 1e-9 ? 1 : 0 },
          () => `${over} rep(s) over the target of ${target}: load up ${one(pct)} % (ACSM 2-10 %)`,
        ),
      ),
      'acsm_2_to_10_pct',
      null,
    )
  }
  return asStep(
    option(
      set,
      'hold',
      sameLoad(set, equipment),
      target,
      reason(
        'ACSM_TARGET_NOT_BEATEN',
        { reps: set.reps, target, repsOver: over },
        over >= 1 ? 'Target beaten but no heavier load is available' : `Target of ${target} not beaten yet: same load`,
      ),
    ),
    'acsm_2_to_10_pct',
    null,
  )
}

/**
 * NSCA "2-for-2" rule (Baechle & Earle, Essentials of Strength Training and Conditioning;
 * secondary copy): add load once the LAST set of the exercise beats its target by 2 or more
 * reps in two sessions in a row. Applies to every working set of the slot at once.
 */
export function nsca2For2(
  latest: Exposure,
  previous: Exposure | undefined,
  equipment: Equipment,
  options: NextStepOptions = {},
): NextStep[] {
  const beatBy = (e: Exposure | undefined): number | null => {
    const last = e?.sets[e.sets.length - 1]
    return last ? last.reps - last.repsMax : null
  }
  const nowBy = beatBy(latest)
  const beforeBy = beatBy(previous)
  const met = nowBy !== null && beforeBy !== null && nowBy >= 2 && beforeBy >= 2
  return latest.sets.map((set) => {
    checkSet(set)
    const up = met ? increaseBy(set.loadKg, options.nscaIncreasePct ?? 0, equipment) : null
    const values = { lastSetRepsOverTarget: nowBy, previousLastSetRepsOverTarget: beforeBy, required: 2 }
    const o = up
      ? option(set, 'add_load', up, set.repsMax, reason('NSCA_2_FOR_2_MET', values, 'Last set beat the target by 2+ reps two sessions in a row: add load'))
      : option(
          set,
          'hold',
          sameLoad(set, equipment),
          set.repsMax,
          reason('NSCA_2_FOR_2_NOT_MET', values, 'Not yet 2+ reps over the target on the last set two sessions in a row: same load'),
        )
    return asStep(o, 'nsca_2_for_2', null)
  })
}

/** A policy turns the latest exposure (and the one before) into a next step per working set. */
export type PolicyFn = (
  latest: Exposure,
  previous: Exposure | undefined,
  equipment: Equipment,
  options: NextStepOptions,
) => NextStep[]

export const POLICIES: Readonly<Record<ProgressionPolicy, PolicyFn>> = {
  double_progression: (latest, _previous, eq, o) => latest.sets.map((s) => doubleProgression(s, eq, o)),
  nsca_2_for_2: nsca2For2,
  acsm_2_to_10_pct: (latest, _previous, eq, o) => latest.sets.map((s) => acsm2To10Pct(s, eq, o)),
}

/** Next steps for every working set of the latest exposure (exposures oldest first). */
export function nextSteps(
  exposures: readonly Exposure[],
  equipment: Equipment,
  options: NextStepOptions & { policy?: ProgressionPolicy } = {},
): NextStep[] {
  if (!exposures.length) return []
  const policy = POLICIES[options.policy ?? 'double_progression']
  if (!policy) {
    throw new EngineError('INVALID_SCHEME', `Unknown progression policy: ${String(options.policy)}`, { policy: options.policy })
  }
  return policy(exposures[exposures.length - 1], exposures[exposures.length - 2], equipment, options)
}

// ---------------------------------------------------------------------------------------------
// Plateau

export type PlateauOptionKind = 'microload' | 'rotate_version' | 'add_set' | 'deload'

export interface PlateauOption {
  kind: PlateauOptionKind
  reason: Reason
  /** microload: the lighter jump to take. */
  target?: LoadOption
  /** add_set: the new working-set count and its effort. */
  sets?: number
  targetRir?: number
  /** rotate_version: the version that gets fresh exercises and the one kept. */
  rotate?: 'I' | 'II' | null
  keep?: 'I' | 'II' | null
}

export interface PlateauContext {
  role: SlotRole
  equipment: Equipment
  /** Exposures in a row without improvement that make a plateau (default 3). */
  exposuresInRow?: number
  /** The version of the day this slot belongs to, for the rotation option. */
  version?: 'I' | 'II'
  formula?: E1rmFormula
}

export interface PlateauReport {
  plateau: boolean
  /** Latest exposures in a row without a new best estimated 1RM or load x reps. */
  exposuresWithoutImprovement: number
  exposuresInRow: number
  bestE1rmKg: number
  bestWorkKg: number
  /** In order: microload, rotate version, add a set (within caps), deload. Empty without a plateau. */
  options: PlateauOption[]
}

/** Best estimated 1RM and best load x reps of one exposure. */
export function exposureBests(e: Exposure, formula: E1rmFormula = 'epley'): { e1rmKg: number; workKg: number } {
  let e1rmKg = 0
  let workKg = 0
  for (const s of e.sets) {
    const est = estimateOneRepMax(s.loadKg, s.reps, { formula, rir: s.rir ?? 0 }).e1rm
    if (est > e1rmKg) e1rmKg = est
    const work = s.loadKg * s.reps
    if (work > workKg) workKg = work
  }
  return { e1rmKg, workKg }
}

/** Deload week: about 90 % of the load, half the sets (common practice, no published source). */
export const DELOAD = { loadPct: 90, setsPct: 50, weeks: 1 } as const
/** The set added on a plateau is taken at lower effort (common practice). */
export const ADDED_SET_RIR = 2

/**
 * Plateau: no new best estimated 1RM and no new best load x reps for N exposures in a row
 * (default 3). A new best means beating every earlier exposure. On a plateau, the options in
 * order: a smaller load step (microloading), rotating that day's version to fresh exercises
 * (keeping the other version), adding a set within the caps at lower effort, a deload week.
 */
export function detectPlateau(exposures: readonly Exposure[], context: PlateauContext): PlateauReport {
  const n = context.exposuresInRow ?? 3
  if (!Number.isInteger(n) || n < 1) {
    throw new EngineError('INVALID_SCHEME', `exposuresInRow must be a whole number of at least 1 (got ${n})`, { n })
  }
  const formula = context.formula ?? 'epley'
  let bestE1rm = 0
  let bestWork = 0
  let streak = 0
  const eps = 1e-9
  exposures.forEach((e, i) => {
    const b = exposureBests(e, formula)
    const improved = i === 0 || b.e1rmKg > bestE1rm * (1 + eps) || b.workKg > bestWork * (1 + eps)
    streak = improved ? 0 : streak + 1
    bestE1rm = Math.max(bestE1rm, b.e1rmKg)
    bestWork = Math.max(bestWork, b.workKg)
  })
  const report: PlateauReport = {
    plateau: streak >= n,
    exposuresWithoutImprovement: streak,
    exposuresInRow: n,
    bestE1rmKg: bestE1rm,
    bestWorkKg: bestWork,
    options: [],
  }
  if (!report.plateau) return report
  const latest = exposures[exposures.length - 1]
  const values = { exposuresWithoutImprovement: streak, exposuresInRow: n }

  // 1. Microloading: the smallest load step, when it is smaller than the last jump taken.
  const top = latest.sets[0]
  const up = top ? stepUp(top.loadKg, context.equipment) : null
  if (top && up && top.loadKg > 0) {
    const stepPct = (up.loadKg / top.loadKg - 1) * 100
    let lastJumpPct: number | null = null
    for (let i = exposures.length - 1; i > 0 && lastJumpPct === null; i--) {
      const a = exposures[i - 1].sets[0]?.loadKg
      const b = exposures[i].sets[0]?.loadKg
      if (a !== undefined && b !== undefined && b > a * (1 + eps)) lastJumpPct = (b / a - 1) * 100
    }
    if (lastJumpPct === null || stepPct < lastJumpPct - 1e-9) {
      report.options.push({
        kind: 'microload',
        target: up,
        reason: reason(
          'PLATEAU_MICROLOAD',
          { ...values, stepPct, lastJumpPct, step: up.load - fromKg(top.loadKg, up.unit), stepKg: up.loadKg - top.loadKg },
          () => `A smaller load step: +${one(stepPct)} %${lastJumpPct === null ? '' : ` instead of the last +${one(lastJumpPct)} %`}`,
        ),
      })
    }
  }

  // 2. Rotate that day's version to fresh exercises, keeping the other version.
  const other = context.version === 'I' ? 'II' : context.version === 'II' ? 'I' : null
  report.options.push({
    kind: 'rotate_version',
    rotate: context.version ?? null,
    keep: other,
    reason: reason(
      'PLATEAU_ROTATE_VERSION',
      { ...values, rotate: context.version ?? null, keep: other },
      () => `No improvement for ${streak} exposures: give version ${context.version ?? 'I/II'} fresh exercises, keep the other version`,
    ),
  })

  // 3. One more working set, only within the caps.
  const sets = latest.sets.length
  const cap = maxWorkingSets(context.role)
  if (sets + 1 <= cap) {
    report.options.push({
      kind: 'add_set',
      sets: sets + 1,
      targetRir: ADDED_SET_RIR,
      reason: reason(
        'PLATEAU_ADD_SET',
        { ...values, sets, newSets: sets + 1, cap, targetRir: ADDED_SET_RIR },
        () => `Add a set (${sets} -> ${sets + 1}, cap ${cap}) at ${ADDED_SET_RIR} reps in reserve`,
      ),
    })
  }

  // 4. Deload week.
  report.options.push({
    kind: 'deload',
    reason: reason(
      'PLATEAU_DELOAD',
      { ...values, loadPct: DELOAD.loadPct, setsPct: DELOAD.setsPct, weeks: DELOAD.weeks },
      () => `A deload week: about ${DELOAD.loadPct} % of the load and ${DELOAD.setsPct} % of the sets`,
    ),
  })
  return report
}
