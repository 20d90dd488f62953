import { minimumLoad, roundDownToLoadable, stepDown, stepUp, type Equipment } from './equipment'
import { loadOrderKey, movedLoadKg, type LoadReading } from './lift-progress'
import { loadableAtMostMoved } from './schemes'

/**
 * "Find my load": for a lift with no history and no starting estimate, a short ramp done on the
 * spot. It starts at the lightest load, each set is RAMP_REPS clean reps, and each easy set is
 * followed by one about 10 to 20 % heavier, until a set feels hard with about two reps left; that
 * set is the lift's start. The step sizes and the 5 reps are common practice, no published source.
 * Loads are logged loads (kg): the added load of a bodyweight lift, the help of an assisted one.
 */

export const RAMP_REPS = 5
/** The largest jump between two ramp sets, percent of the load moved. */
export const RAMP_MAX_STEP_PCT = 20
/** Reps in reserve of the set that ends the ramp ("Hard — about 2 left"). */
export const RAMP_LAST_SET_RIR = 2

/** The ramp's first load: the empty bar (or sled), nothing added; for an assisted lift the most help. */
export function rampStartLoadKg(equipment: Equipment, reading: LoadReading): number {
  if (reading.mode !== 'assisted') return minimumLoad(equipment).loadKg
  // The most help the equipment gives, but no more than the lifter's body mass when it is known.
  return roundDownToLoadable(reading.bodyMassKg ?? Number.MAX_SAFE_INTEGER, equipment).loadKg
}

/**
 * The next ramp load after an easy set: the heaviest loadable load that moves at most 20 % more;
 * when the equipment has nothing heavier within 20 %, its next heavier load. For an assisted lift,
 * heavier means less help. Null at the heaviest load the equipment makes.
 */
export function nextRampLoadKg(loadKg: number, equipment: Equipment, reading: LoadReading): number | null {
  const oneStep = () => (reading.mode === 'assisted' ? stepDown(loadKg, equipment) : stepUp(loadKg, equipment))?.loadKg ?? null
  const moved = movedLoadKg(loadKg, reading)
  if (moved === null || moved <= 0) return oneStep()
  const within = loadableAtMostMoved(moved * (1 + RAMP_MAX_STEP_PCT / 100), reading, equipment)
  return loadOrderKey(within.loadKg, reading) > loadOrderKey(loadKg, reading) + 1e-9 ? within.loadKg : oneStep()
}
