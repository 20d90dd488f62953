/**
 * Flags the review desk puts on a completed session, so a coach with many athletes sees at a
 * glance what needs a look. Thresholds are the product's choices (common practice, no
 * published source); each flag carries its numbers.
 */
import type { LiftReport } from './lift-report'
import { REGRESSION_PCT } from './lift-progress'


export { REGRESSION_PCT }

/** A top set this many reps under the bottom of its range is "far short". */
export const FAR_SHORT_REPS = 2
/** A session with at least this share of its planned working sets not done was cut short. */
export const CUT_SHORT_SHARE = 0.25
/** A rest shorter than this share of the planned rest counts as a skipped rest clock... */
export const SHORT_REST_SHARE = 0.5
/** ...and this many in one session is "skipped repeatedly". */
export const SKIPPED_RESTS = 3

export type ReviewFlagCode = 'plateau' | 'regression' | 'top_set_far_short' | 'cut_short' | 'missed_days' | 'rest_skipped'

export interface ReviewFlag {
  code: ReviewFlagCode
  exercise?: string
  values: Record<string, number>
}

export interface ReviewBlock {
  exercise: string
  /** Planned working sets of this session, done or not, in order. */
  planned: Array<{ kind: 'top' | 'backoff' | 'straight'; repsMin: number | null; repsMax: number | null; done: { loadKg: number; reps: number } | null }>
  /**
   * The lift's report for this session (lift-report.ts): the same comparison the summary shows,
   * so a set done as planned is never a regression and a lift is never plateaued on a day it
   * set a record.
   */
  lift: LiftReport
}

export interface ReviewInput {
  blocks: ReviewBlock[]
  /** Between consecutive working sets of the same exercise: the rest planned and the time actually taken. */
  rests?: Array<{ plannedSec: number; actualSec: number }>
  /** Calendar days since the athlete's previous session, and plan rest days in between. */
  daysSincePrevious: number | null
  restDaysBetween: number
}

export function reviewFlags(input: ReviewInput): ReviewFlag[] {
  const flags: ReviewFlag[] = []
  let planned = 0
  let done = 0
  for (const block of input.blocks) {
    planned += block.planned.length
    done += block.planned.filter((p) => p.done).length
    const top = block.planned.find((p) => p.kind === 'top')
    if (top?.done && top.repsMin !== null && top.done.reps <= top.repsMin - FAR_SHORT_REPS) {
      flags.push({ code: 'top_set_far_short', exercise: block.exercise, values: { reps: top.done.reps, repsMin: top.repsMin, repsMax: top.repsMax ?? top.repsMin } })
    }
    const { change, plateau } = block.lift
    if (change.regression && change.e1rmChangePct !== null) {
      flags.push({ code: 'regression', exercise: block.exercise, values: { e1rmChangePct: Math.round(change.e1rmChangePct * 10) / 10 } })
    }
    if (plateau?.plateau) flags.push({ code: 'plateau', exercise: block.exercise, values: { exposures: plateau.exposuresWithoutProgress } })
  }
  if (planned > 0 && (planned - done) / planned >= CUT_SHORT_SHARE) {
    flags.push({ code: 'cut_short', values: { done, planned } })
  }
  const shortRests = (input.rests ?? []).filter((r) => r.actualSec < r.plannedSec * SHORT_REST_SHARE).length
  if (shortRests >= SKIPPED_RESTS) flags.push({ code: 'rest_skipped', values: { shortRests, rests: input.rests!.length } })
  if (input.daysSincePrevious !== null) {
    const missed = input.daysSincePrevious - 1 - input.restDaysBetween
    if (missed > 0) flags.push({ code: 'missed_days', values: { missed } })
  }
  return flags
}
