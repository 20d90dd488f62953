import { describe, expect, it } from 'vitest'
import { bestE1rm, sessionRecords } from '../../shared/domain/records'

// Record rules are the product's definitions (common practice, no published source); the
// estimated 1RM is Epley (1985): w (1 + r/30), checked against references.md's worked values.
describe('records', () => {
  it('finds the best estimated 1RM with Epley: 100 x 5 -> 116.667, 100 x 10 -> 133.333', () => {
    const best = bestE1rm([{ loadKg: 100, reps: 5 }, { loadKg: 100, reps: 10 }])
    expect(best!.e1rmKg).toBeCloseTo(133.333, 3)
    expect(best!.set).toEqual({ loadKg: 100, reps: 10 })
  })

  it('counts more reps at a load done before as a rep record, and an estimate above every earlier one', () => {
    const history = [{ loadKg: 100, reps: 6 }, { loadKg: 90, reps: 9 }]
    const records = sessionRecords([{ loadKg: 100, reps: 8 }], history)
    expect(records).toEqual([
      expect.objectContaining({ kind: 'rep_record', loadKg: 100, reps: 8, previous: 6 }),
      expect.objectContaining({ kind: 'e1rm_record', loadKg: 100, reps: 8, previous: expect.closeTo(120, 6) }),
    ])
  })

  it('does not count a set beaten earlier by a heavier set with as many reps', () => {
    expect(sessionRecords([{ loadKg: 90, reps: 6 }], [{ loadKg: 100, reps: 6 }])).toEqual([])
  })

  it('does not count a load lifted for the first time as a rep record (no earlier number at that load)', () => {
    expect(sessionRecords([{ loadKg: 105, reps: 3 }], [{ loadKg: 100, reps: 8 }]).filter((r) => r.kind === 'rep_record')).toEqual([])
  })

  it('sets no record on a first session (nothing to beat yet)', () => {
    expect(sessionRecords([{ loadKg: 60, reps: 10 }], [])).toEqual([])
  })

  it('lists each rep record once when later sets of the same session beat earlier ones', () => {
    const records = sessionRecords([{ loadKg: 100, reps: 7 }, { loadKg: 100, reps: 9 }], [{ loadKg: 100, reps: 6 }])
    expect(records.filter((r) => r.kind === 'rep_record')).toEqual([expect.objectContaining({ reps: 9 })])
  })
})
