/**
 * Estimated one-rep max (1RM), the NSCA reps-to-%1RM table, and RIR/RPE conversions.
 *
 * Every formula here has the form 1RM = w · f(r), so each also gives the inverse
 * (the load for r reps from a 1RM) as 1RM / f(r). Loads are in any one unit (kg as stored).
 */
import { EngineError, MAX_REPS, assertLoad, assertReps } from './errors'

export const E1RM_FORMULAS = ['epley', 'brzycki', 'lander', 'lombardi', 'mayhew', 'oconnor', 'wathen'] as const
export type E1rmFormula = (typeof E1RM_FORMULAS)[number]

/**
 * Reynolds, Gordon, Robergs, "Prediction of one repetition maximum strength from multiple
 * repetition maximum testing and anthropometry", JSCR 20(3):584-592, 2006: use no more than
 * about 10 reps in such equations. Estimates from more reps are flagged `reliable: false`.
 */
export const RELIABLE_REPS_MAX = 10

/**
 * Brzycki's denominator (37 - r) is zero at r = 37 and Lander's (101.3 - 2.67123 r) near
 * r = 37.9; both explode well before. We refuse r >= 37 for both rather than clamp.
 */
export const DENOMINATOR_FORMULAS_MAX_REPS = 36

/** The multiplier f(r) with 1RM = w · f(r). r is already validated. */
function multiplier(formula: E1rmFormula, r: number): number {
  switch (formula) {
    // Epley B., Poundage Chart, Boyd Epley Workout, 1985: w·(1 + r/30). Pinned to r/30, not 0.0333·r.
    case 'epley':
      return 1 + r / 30
    // Brzycki M., JOPERD 64(1):88-90, 1993: w·36/(37 - r).
    case 'brzycki':
      return 36 / (37 - r)
    // Lander J., NSCA Journal 6(6):60-61, 1985: 100·w/(101.3 - 2.67123·r).
    case 'lander':
      return 100 / (101.3 - 2.67123 * r)
    // Lombardi V.P., Beginning Weight Training, 1989: w·r^0.10.
    case 'lombardi':
      return r ** 0.1
    // Mayhew, Ball, Arnold, Bowen, J Appl Sport Sci Res 6(4):200-206, 1992.
    case 'mayhew':
      return 100 / (52.2 + 41.9 * Math.exp(-0.055 * r))
    // O'Connor, Simmons, O'Shea, Weight Training Today, 1989: w·(1 + 0.025·r).
    case 'oconnor':
      return 1 + 0.025 * r
    // Wathen D., in Baechle (ed.), Essentials of Strength Training and Conditioning, 1994.
    case 'wathen':
      return 100 / (48.8 + 53.8 * Math.exp(-0.075 * r))
    default:
      throw new EngineError('FORMULA_OUT_OF_RANGE', `Unknown 1RM formula: ${String(formula)}`, { formula })
  }
}

function checkedMultiplier(formula: E1rmFormula, reps: number): number {
  assertReps(reps)
  if ((formula === 'brzycki' || formula === 'lander') && reps > DENOMINATOR_FORMULAS_MAX_REPS) {
    throw new EngineError(
      'FORMULA_OUT_OF_RANGE',
      `The ${formula} formula is undefined at ${reps} reps (its denominator reaches zero near 37)`,
      { formula, reps, maxReps: DENOMINATOR_FORMULAS_MAX_REPS },
    )
  }
  return multiplier(formula, reps)
}

/** The raw published formula: 1RM from a set of `reps` to failure with `load` (no single-rep rule). */
export function e1rmFormula(formula: E1rmFormula, load: number, reps: number): number {
  assertLoad(load)
  return load * checkedMultiplier(formula, reps)
}

export const epley = (load: number, reps: number): number => e1rmFormula('epley', load, reps)
export const brzycki = (load: number, reps: number): number => e1rmFormula('brzycki', load, reps)
export const lander = (load: number, reps: number): number => e1rmFormula('lander', load, reps)
export const lombardi = (load: number, reps: number): number => e1rmFormula('lombardi', load, reps)
export const mayhew = (load: number, reps: number): number => e1rmFormula('mayhew', load, reps)
export const oconnor = (load: number, reps: number): number => e1rmFormula('oconnor', load, reps)
export const wathen = (load: number, reps: number): number => e1rmFormula('wathen', load, reps)

export interface E1rmEstimate {
  /** Estimated 1RM, same unit as the load (kg as stored). */
  e1rm: number
  formula: E1rmFormula
  /** Reps counted: reps done plus reps in reserve. */
  repsToFailure: number
  /** False beyond RELIABLE_REPS_MAX reps to failure (Reynolds et al. 2006). */
  reliable: boolean
}

/**
 * Estimated 1RM of a set, with the single-rep rule: a single taken to failure (RIR 0) IS a 1RM,
 * so its estimate is the load lifted (formulas disagree at r = 1: Epley 103.3 %, Mayhew 108.9 %).
 * `rir` (reps in reserve) adds to the reps: a set of 5 with 2 in reserve counts as 7 to failure.
 */
export function estimateOneRepMax(
  load: number,
  reps: number,
  options: { formula?: E1rmFormula; rir?: number } = {},
): E1rmEstimate {
  const formula = options.formula ?? 'epley'
  const rir = options.rir ?? 0
  assertLoad(load)
  assertReps(reps)
  if (!Number.isInteger(rir) || rir < 0) {
    throw new EngineError('INVALID_REPS', `Reps in reserve must be a whole number at or above 0 (got ${rir})`, { rir })
  }
  // Reps plus reserve can pass the 50-rep limit of the formulas (45 reps at RIR 10): such an
  // estimate is unreliable anyway, so count it at the limit instead of refusing the set.
  const repsToFailure = Math.min(reps + rir, MAX_REPS)
  const e1rm = repsToFailure === 1 ? load : e1rmFormula(formula, load, repsToFailure)
  return { e1rm, formula, repsToFailure, reliable: repsToFailure <= RELIABLE_REPS_MAX }
}

/**
 * The load a lifter with estimated 1RM `e1rm` can lift for `reps` to failure: the inverse of
 * the formula, with the same single-rep rule (1 rep -> the 1RM itself).
 */
export function loadForReps(e1rm: number, reps: number, formula: E1rmFormula = 'epley'): number {
  assertLoad(e1rm, 'estimated 1RM')
  if (reps === 1) return e1rm
  return e1rm / checkedMultiplier(formula, reps)
}

// ---------------------------------------------------------------------------------------------
// NSCA table

/**
 * Reps allowed at a percent of 1RM. Baechle & Earle (eds.), Essentials of Strength Training
 * and Conditioning, 3rd ed., 2008, Table 15.7 (same in 4th ed., Haff & Triplett 2016,
 * Table 17.7; edition and table numbers from memory). 1-10 reps confirmed from a secondary
 * copy; 70 % -> 11, 67 % -> 12, 65 % -> 15 from memory (the textbook version; one NSCA
 * handout pairs 70 % with 12 instead).
 */
export const NSCA_PERCENT_BY_REPS: Readonly<Record<number, number>> = {
  1: 100,
  2: 95,
  3: 93,
  4: 90,
  5: 87,
  6: 85,
  7: 83,
  8: 80,
  9: 77,
  10: 75,
  11: 70,
  12: 67,
  15: 65,
}

/** %1RM for a rep count listed in the NSCA table; OUT_OF_TABLE otherwise (13, 14, 16+). */
export function nscaPercentForReps(reps: number): number {
  assertReps(reps)
  const pct = NSCA_PERCENT_BY_REPS[reps]
  if (pct === undefined) {
    throw new EngineError('OUT_OF_TABLE', `The NSCA table has no row for ${reps} reps`, {
      reps,
      rows: Object.keys(NSCA_PERCENT_BY_REPS).map(Number),
    })
  }
  return pct
}

/** Most reps the NSCA table allows at `percent` of 1RM (65-100 %). */
export function nscaRepsAtPercent(percent: number): number {
  if (!(percent >= 65 && percent <= 100)) {
    throw new EngineError('OUT_OF_TABLE', `The NSCA table covers 65-100 % of 1RM (got ${percent})`, { percent })
  }
  let best = 1
  for (const [reps, pct] of Object.entries(NSCA_PERCENT_BY_REPS)) {
    if (pct >= percent) best = Math.max(best, Number(reps))
  }
  return best
}

/** 1RM from the NSCA table: load / (%1RM for reps). 100 x 5 -> 100 / 0.87 = 114.94. */
export function nscaOneRepMax(load: number, reps: number): number {
  assertLoad(load)
  return load / (nscaPercentForReps(reps) / 100)
}

// ---------------------------------------------------------------------------------------------
// RIR and RPE

export interface Range {
  min: number
  max: number
}

/**
 * Zourdos et al., "Novel resistance training-specific rating of perceived exertion scale
 * measuring repetitions in reserve", JSCR 30(1):267-275, 2016, Table 1 (values from a
 * secondary copy, citation from memory): RPE 10 -> 0 RIR; 9.5 -> 0 (could add load);
 * 9 -> 1; 8.5 -> 1-2; 8 -> 2; 7.5 -> 2-3; 7 -> 3; 5-6 -> 4-6.
 */
export function rirFromRpe(rpe: number): Range & { couldAddLoad: boolean } {
  const exact: Record<string, [number, number]> = {
    '10': [0, 0],
    '9.5': [0, 0],
    '9': [1, 1],
    '8.5': [1, 2],
    '8': [2, 2],
    '7.5': [2, 3],
    '7': [3, 3],
  }
  const hit = exact[String(rpe)]
  if (hit) return { min: hit[0], max: hit[1], couldAddLoad: rpe === 9.5 }
  if (rpe >= 5 && rpe <= 6) return { min: 4, max: 6, couldAddLoad: false }
  throw new EngineError('OUT_OF_TABLE', `The RIR-based RPE scale has no row for RPE ${rpe}`, { rpe })
}

/** The inverse of the Zourdos et al. 2016 scale: 0-3 RIR -> RPE 10-7; 4-6 RIR -> RPE 5-6. */
export function rpeFromRir(rir: number): Range {
  if (Number.isInteger(rir) && rir >= 0 && rir <= 3) return { min: 10 - rir, max: 10 - rir }
  if (Number.isInteger(rir) && rir >= 4 && rir <= 6) return { min: 5, max: 6 }
  throw new EngineError('OUT_OF_TABLE', `The RIR-based RPE scale covers 0-6 reps in reserve (got ${rir})`, { rir })
}

/**
 * %1RM to failure (RPE 10) for 1-11 reps: Helms, Cronin, Storey, Zourdos, "Application of the
 * repetitions in reserve-based rating of perceived exertion scale for resistance training",
 * Strength Cond J 38(4):42-49, 2016. The table's other rows follow from it: the %1RM for r reps
 * at RPE p is this value at r + (10 - p) reps. The 11th value (70 %) is the table's 10 reps at
 * RPE 9 (one rep in reserve).
 */
export const HELMS_RPE10_PERCENT: readonly number[] = [100, 95, 91, 87, 85, 83, 81, 79, 76, 73, 70]

/** %1RM for `reps` at `rpe` (whole RPE 7-10, reps 1-10, reps + RIR <= 11, as in the table). */
export function percentOfOneRepMaxAt(reps: number, rpe: number): number {
  assertReps(reps)
  if (!Number.isInteger(rpe) || rpe < 7 || rpe > 10) {
    throw new EngineError('OUT_OF_TABLE', `The %1RM table covers whole RPE 7-10 (got ${rpe})`, { rpe })
  }
  const index = reps + (10 - rpe) - 1
  if (reps > 10 || index >= HELMS_RPE10_PERCENT.length) {
    throw new EngineError('OUT_OF_TABLE', `The %1RM table has no cell for ${reps} reps at RPE ${rpe}`, { reps, rpe })
  }
  return HELMS_RPE10_PERCENT[index]
}

/** 1RM from a set's load, reps and RPE via the Helms et al. 2016 table. */
export function oneRepMaxFromRpe(load: number, reps: number, rpe: number): number {
  assertLoad(load)
  return load / (percentOfOneRepMaxAt(reps, rpe) / 100)
}
