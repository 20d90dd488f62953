/**
 * Why the engine suggested something, as data: a code the UI translates plus the numbers
 * behind it. `message` is a plain-English fallback for logs and tests.
 */
export type ReasonCode =
  // back-off set
  | 'BACKOFF_FROM_TOP_SET'
  // next step: double progression
  | 'ADD_REP_BELOW_TOP_OF_RANGE'
  | 'ADD_LOAD_AT_TOP_OF_RANGE'
  | 'LOAD_STEP_SAME_REPS'
  | 'ADD_LOAD_AFTER_MISSED_REP'
  | 'LARGER_JUMP_FAR_ABOVE_RANGE'
  | 'HOLD_BELOW_RANGE'
  | 'CUT_LOAD_BELOW_RANGE'
  | 'NO_HEAVIER_LOAD_AVAILABLE'
  // next step: NSCA 2-for-2
  | 'NSCA_2_FOR_2_MET'
  | 'NSCA_2_FOR_2_NOT_MET'
  // next step: ACSM 2-10 %
  | 'ACSM_TARGET_BEATEN'
  | 'ACSM_TARGET_NOT_BEATEN'
  // plateau options
  | 'PLATEAU_MICROLOAD'
  | 'PLATEAU_ROTATE_VERSION'
  | 'PLATEAU_ADD_SET'
  | 'PLATEAU_DELOAD'

export interface Reason {
  code: ReasonCode
  values: Record<string, number | string | null>
  /** Plain-English fallback, built on first read (and included in JSON). */
  readonly message: string
}

/** Messages are built lazily: the logbook benchmark makes tens of thousands of reasons. */
class LazyReason implements Reason {
  code: ReasonCode
  values: Record<string, number | string | null>
  private readonly describe: () => string

  constructor(code: ReasonCode, values: Reason['values'], describe: () => string) {
    this.code = code
    this.values = values
    this.describe = describe
  }

  get message(): string {
    return this.describe()
  }

  toJSON(): { code: ReasonCode; values: Reason['values']; message: string } {
    return { code: this.code, values: this.values, message: this.message }
  }
}

export function reason(code: ReasonCode, values: Reason['values'], message: string | (() => string)): Reason {
  return new LazyReason(code, values, typeof message === 'string' ? () => message : message)
}
