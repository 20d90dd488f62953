/**
 * Flags the review desk puts on a completed session, so a coach with many athletes sees at a
 * glance what needs a look. Thresholds are the product's choices (common practice, no
 * published source); each flag carries its numbers.
 */
import { estimateOneRepMax } from './e1rm'
import { detectPlateau, type Exposure } from './progression'
import type { Equipment } from './equipment'
import type { SlotRole } from './schemes'

/** A working set this much below last time's same set (estimated 1RM) counts as a regression. */
export const REGRESSION_PCT = 5
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
  role: SlotRole
  equipment: Equipment
  /** Planned working sets of this session, done or not, in order. */
  planned: Array<{ kind: 'top' | 'backoff' | 'straight'; repsMin: number | null; repsMax: number | null; done: { loadKg: number; reps: number } | null }>
  /** Earlier exposures of the same slot, oldest first. */
  history: Exposure[]
  /** This session's exposure (working sets done). */
  exposure: Exposure
}

export interface ReviewInput {
  blocks: ReviewBlock[]
  /** Between consecutive working sets of the same exercise: the rest planned and the time actually taken. */
  rests?: Array<{ plannedSec: number; actualSec: number }>
  /** Calendar days since the athlete's previous session, and plan rest days in between. */
  daysSincePrevious: number | null
  restDaysBetween: number
}

const e1rm = (loadKg: number, reps: number) => (reps > 0 && loadKg > 0 ? estimateOneRepMax(loadKg, Math.min(reps, 50)).e1rm : 0)

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
    const last = block.history.at(-1)
    if (last) {
      const worst = block.exposure.sets.reduce<{ dropPct: number; index: number } | null>((acc, set, i) => {
        const before = last.sets[i]
        if (!before) return acc
        const dropPct = (1 - e1rm(set.loadKg, set.reps) / e1rm(before.loadKg, before.reps)) * 100
        return dropPct > (acc?.dropPct ?? REGRESSION_PCT) ? { dropPct, index: i } : acc
      }, null)
      if (worst) flags.push({ code: 'regression', exercise: block.exercise, values: { dropPct: Math.round(worst.dropPct * 10) / 10, set: worst.index + 1 } })
    }
    if (block.exposure.sets.length > 0) {
      const plateau = detectPlateau([...block.history, block.exposure], { role: block.role, equipment: block.equipment })
      if (plateau.plateau) flags.push({ code: 'plateau', exercise: block.exercise, values: { exposures: plateau.exposuresWithoutImprovement } })
    }
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
