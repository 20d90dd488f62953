import { describe, expect, it } from 'vitest'
import { KG_GYM_SET } from '../../shared/domain/equipment'
import { reportLift } from '../../shared/domain/lift-report'
import { reviewFlags, type ReviewBlock } from '../../shared/domain/review-flags'
import type { Exposure } from '../../shared/domain/progression'

// Flag thresholds are the product's (common practice, no published source). Estimated 1RM by
// Epley (1985): w (1 + r/30). The flags read the same lift report the summary shows (lift-report.ts).
const day = (n: number) => new Date(Date.UTC(2026, 0, 5) + n * 86_400_000).toISOString()
const top = (loadKg: number, reps: number, target?: { loadKg: number; reps: number }, at?: string): Exposure => ({
  at,
  sets: [{ kind: 'top', loadKg, reps, repsMin: 6, repsMax: 9, targetLoadKg: target?.loadKg ?? null, targetReps: target?.reps ?? null }],
})
function block(history: Exposure[], now: Exposure, plannedDone = true): ReviewBlock {
  return {
    exercise: 'Back squat',
    planned: [{ kind: 'top', repsMin: 6, repsMax: 9, done: plannedDone ? { loadKg: now.sets[0].loadKg, reps: now.sets[0].reps } : null }],
    lift: reportLift({ role: 'compound_primary', lift: { equipment: KG_GYM_SET }, history, current: now, recordHistory: history.flatMap((e) => e.sets) }),
  }
}

describe('review desk flags', () => {
  it('flags a lift more than 5 % below last time and short of its plan (100 x 8 -> 100 x 5 of a planned 9: Epley 126.7 -> 116.7, -7.9 %)', () => {
    const flags = reviewFlags({ blocks: [block([top(100, 8)], top(100, 5, { loadKg: 100, reps: 9 }))], daysSincePrevious: 2, restDaysBetween: 1 })
    expect(flags).toContainEqual({ code: 'regression', exercise: 'Back squat', values: { e1rmChangePct: -7.9 } })
  })

  it('does not flag a small dip (100 x 8 -> 100 x 7: -2.6 %), nor a lighter session done as planned', () => {
    expect(reviewFlags({ blocks: [block([top(100, 8)], top(100, 7, { loadKg: 100, reps: 9 }))], daysSincePrevious: 1, restDaysBetween: 0 })).toEqual([])
    // A lighter session done as planned (a load cut, a deload): 92.5 x 6 after 100 x 8 is Epley -12.4 %, and no flag.
    expect(reviewFlags({ blocks: [block([top(100, 8)], top(92.5, 6, { loadKg: 92.5, reps: 6 }))], daysSincePrevious: 1, restDaysBetween: 0 })).toEqual([])
  })

  it('flags a top set two or more reps under its range', () => {
    const flags = reviewFlags({ blocks: [block([], top(100, 4))], daysSincePrevious: null, restDaysBetween: 0 })
    expect(flags).toContainEqual({ code: 'top_set_far_short', exercise: 'Back squat', values: { reps: 4, repsMin: 6, repsMax: 9 } })
  })

  it('flags a plateau with the same check the summary shows, and not on a day with a record', () => {
    const flat = [top(100, 8, undefined, day(0)), top(100, 8, undefined, day(7)), top(100, 8, undefined, day(14)), top(102.5, 7, undefined, day(21))]
    const flags = reviewFlags({ blocks: [block(flat, top(102.5, 7, undefined, day(28)))], daysSincePrevious: 1, restDaysBetween: 0 })
    expect(flags).toContainEqual({ code: 'plateau', exercise: 'Back squat', values: { exposures: 4 } })
    // 102.5 x 8 after 102.5 x 7: a rep record and a set that beat last time.
    const record = reviewFlags({ blocks: [block(flat, top(102.5, 8, undefined, day(28)))], daysSincePrevious: 1, restDaysBetween: 0 })
    expect(record.map((f) => f.code)).not.toContain('plateau')
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
