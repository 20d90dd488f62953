/**
 * The one error type of the training engine. Callers switch on `code`; `details` carries the
 * numbers behind the message so the UI or the server can say exactly what was wrong.
 */
export type EngineErrorCode =
  | 'TARGET_BELOW_MINIMUM' // e.g. a target below the empty bar
  | 'NOT_ENOUGH_PLATES' // the barbell inventory cannot reach the target
  | 'TARGET_ABOVE_MAXIMUM' // dumbbells, stack or added load cannot reach the target
  | 'INVALID_LOAD' // negative, NaN or infinite load
  | 'INVALID_REPS' // zero, negative or fractional reps
  | 'REPS_ABOVE_LIMIT' // more than MAX_REPS reps
  | 'FORMULA_OUT_OF_RANGE' // e.g. Brzycki at 37 reps or more (division by zero)
  | 'OUT_OF_TABLE' // a lookup outside a published table
  | 'UNKNOWN_EQUIPMENT_KIND'
  | 'INVALID_EQUIPMENT'
  | 'INVALID_SCHEME'
  | 'SET_CAP_EXCEEDED'
  | 'NO_START_LOAD'

export class EngineError extends Error {
  readonly code: EngineErrorCode
  readonly details: Readonly<Record<string, unknown>>

  constructor(code: EngineErrorCode, message: string, details: Record<string, unknown> = {}) {
    super(message)
    this.name = 'EngineError'
    this.code = code
    this.details = details
  }
}

/** Sets of more than this many reps are refused: they are endurance work, not something to estimate from. */
export const MAX_REPS = 50

/** Throws unless `reps` is a whole number from 1 to MAX_REPS. */
export function assertReps(reps: number, what = 'reps'): void {
  if (!Number.isInteger(reps) || reps < 1) {
    throw new EngineError('INVALID_REPS', `${what} must be a whole number of at least 1 (got ${reps})`, {
      reps,
    })
  }
  if (reps > MAX_REPS) {
    throw new EngineError('REPS_ABOVE_LIMIT', `${what} above ${MAX_REPS} are not supported (got ${reps})`, {
      reps,
      max: MAX_REPS,
    })
  }
}

/** Throws unless `load` is a finite number at or above zero. */
export function assertLoad(load: number, what = 'load'): void {
  if (!Number.isFinite(load) || load < 0) {
    throw new EngineError('INVALID_LOAD', `${what} must be a finite number at or above 0 (got ${load})`, {
      load,
    })
  }
}
