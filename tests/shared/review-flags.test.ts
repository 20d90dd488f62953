import { describe, expect, it } from 'vitest'
import { KG_COMPETITION_SET } from '../../shared/domain/equipment'
import { reviewFlags, type ReviewBlock } from '../../shared/domain/review-flags'
import type { Exposure } from '../../shared/domain/progression'

// Flag thresholds are the product's (common practice, no published source). Estimated 1RM by
// Epley (1985): w (1 + r/30).
const top = (loadKg: number, reps: number): Exposure => ({ sets: [{ kind: 'top', loadKg, reps, repsMin: 6, repsMax: 9 }] })
function block(history: Exposure[], now: Exposure, plannedDone = true): ReviewBlock {
  return {
    exercise: 'Back squat',
    role: 'compound_primary',
    equipment: KG_COMPETITION_SET,
    planned: [{ kind: 'top', repsMin: 6, repsMax: 9, done: plannedDone ? { loadKg: now.sets[0].loadKg, reps: now.sets[0].reps } : null }],
    history,
    exposure: now,
  }
}

describe('review desk flags', () => {
  it('flags a working set more than 5 % below last time (100 x 8 -> 100 x 5: Epley 126.7 -> 116.7, -7.9 %)', () => {
    const flags = reviewFlags({ blocks: [block([top(100, 8)], top(100, 5))], daysSincePrevious: 2, restDaysBetween: 1 })
    expect(flags).toContainEqual({ code: 'regression', exercise: 'Back squat', values: { dropPct: 7.9, set: 1 } })
  })

  it('does not flag a small dip (100 x 8 -> 100 x 7: -2.6 %)', () => {
    expect(reviewFlags({ blocks: [block([top(100, 8)], top(100, 7))], daysSincePrevious: 1, restDaysBetween: 0 })).toEqual([])
  })

  it('flags a top set two or more reps under its range', () => {
    const flags = reviewFlags({ blocks: [block([], top(100, 4))], daysSincePrevious: null, restDaysBetween: 0 })
    expect(flags).toContainEqual({ code: 'top_set_far_short', exercise: 'Back squat', values: { reps: 4, repsMin: 6, repsMax: 9 } })
  })

  it('flags a plateau after three exposures without a new best', () => {
    const flat = [top(100, 8), top(100, 8), top(100, 8)]
    const flags = reviewFlags({ blocks: [block(flat, top(100, 8))], daysSincePrevious: 1, restDaysBetween: 0 })
    expect(flags.map((f) => f.code)).toContain('plateau')
  })

  it('flags the rest clock skipped repeatedly: three or more rests under half the planned time', () => {
    const rests = [
      { plannedSec: 180, actualSec: 60 },
      { plannedSec: 120, actualSec: 45 },
      { plannedSec: 90, actualSec: 30 },
      { plannedSec: 90, actualSec: 100 },
    ]
    expect(reviewFlags({ blocks: [], rests, daysSincePrevious: null, restDaysBetween: 0 })).toEqual([
      { code: 'rest_skipped', values: { shortRests: 3, rests: 4 } },
    ])
    expect(reviewFlags({ blocks: [], rests: rests.slice(1), daysSincePrevious: null, restDaysBetween: 0 })).toEqual([])
  })

  it('flags a session cut short and the training days missed since the previous one', () => {
    const flags = reviewFlags({ blocks: [block([], top(100, 8), false)], daysSincePrevious: 5, restDaysBetween: 1 })
    expect(flags).toContainEqual({ code: 'cut_short', values: { done: 0, planned: 1 } })
    expect(flags).toContainEqual({ code: 'missed_days', values: { missed: 3 } })
  })
})
