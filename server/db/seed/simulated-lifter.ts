/**
 * An invented lifter for the demo history and the engine's simulation tests: how many reps a
 * lifter of a given true strength gets on a set. Reps to failure follow Epley's formula inverted,
 * r = 30 (1RM / w - 1) (Epley 1985); the fatigue cost per earlier working set and the day-to-day
 * noise are invented for the simulation (no published source).
 */

/** Reps to failure for a lifter with estimated 1RM `e1rmKg` at a load moved of `movedKg`. */
export function repsToFailure(e1rmKg: number, movedKg: number): number {
  return 30 * (e1rmKg / movedKg - 1)
}

/** Strength lost per working set already done on the exercise, as a share (invented). */
export const FATIGUE_PER_SET = 0.04

export interface SimulatedSetInput {
  /** The lifter's true estimated 1RM (kg moved) today. */
  e1rmKg: number
  movedKg: number
  /** Working sets of this exercise already done in the session. */
  setsBefore: number
  set: { toFailure: boolean; targetRir: number | null; targetRepsMax: number }
  /** A number in [0, 1) for day-to-day form; 0.5 is no noise. */
  noise: number
  /** How far the noise moves the reps (default ±0.8 reps). */
  noiseReps?: number
}

/**
 * The reps done and the reserve rated: a set to failure ends at the last whole rep (a few past the
 * range at most: the lifter stops); a set with a target reserve stops that many reps short.
 * Lifters rate reserve only up to about 5 reps (RIR scale, Zourdos et al., JSCR 30(1):267-275, 2016).
 */
export function simulatedSet(input: SimulatedSetInput): { reps: number; rir: number } {
  const capacity = repsToFailure(input.e1rmKg * (1 - FATIGUE_PER_SET * input.setsBefore), input.movedKg) + (input.noise - 0.5) * 2 * (input.noiseReps ?? 0.8)
  const { set } = input
  const reps = set.toFailure
    ? Math.max(1, Math.min(set.targetRepsMax + 3, Math.floor(capacity)))
    : Math.max(1, Math.min(set.targetRepsMax + 1, Math.floor(capacity - (set.targetRir ?? 0))))
  const rir = set.toFailure ? 0 : Math.min(5, Math.max(0, Math.floor(capacity) - reps))
  return { reps, rir }
}
