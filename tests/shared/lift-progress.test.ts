import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { epley } from '../../shared/domain/e1rm'
import { KG_GYM_SET, LB_GYM_SET, isLoadable, type Equipment } from '../../shared/domain/equipment'
import { KG_GYM } from '../../shared/domain/gym'
import {
  beats, compareWithLastTime, movedLoadKg, REGRESSION_PCT, setE1rmKg, volumeKg, type LoadReading,
} from '../../shared/domain/lift-progress'
import { reportLift } from '../../shared/domain/lift-report'
import { planSlotSets } from '../../shared/domain/planned-sets'
import type { Exposure, PerformedSet } from '../../shared/domain/progression'
import { backoffTarget, DEFAULT_SCHEMES, SLOT_ROLES, type SlotRole } from '../../shared/domain/schemes'

const external: LoadReading = { mode: 'external' }
const body80: LoadReading = { mode: 'bodyweight', bodyMassKg: 80 }

describe('the load moved', () => {
  it('is the logged load for a barbell, body mass plus added load for a bodyweight lift, body mass minus help when assisted', () => {
    expect(movedLoadKg(100, external)).toBe(100)
    expect(movedLoadKg(10, body80)).toBe(90)
    expect(movedLoadKg(30, { mode: 'assisted', bodyMassKg: 80 })).toBe(50)
    expect(movedLoadKg(10, { mode: 'bodyweight', bodyMassKg: null })).toBeNull()
  })

  it('counts body mass in the estimate, so +10 -> +12.5 kg on chin-ups is a small change, not +25 %', () => {
    // Epley (1985): (80 + 10) x 6 -> 108.0; (80 + 12.5) x 6 -> 111.0: +2.8 %.
    const change = compareWithLastTime([{ loadKg: 12.5, reps: 6 }], [{ loadKg: 10, reps: 6 }], body80)
    expect(change.e1rmKg).toBeCloseTo(epley(92.5, 6), 9)
    expect(change.e1rmChangePct).toBeCloseTo((epley(92.5, 6) / epley(90, 6) - 1) * 100, 9)
    expect(change.e1rmChangePct!).toBeLessThan(3)
  })

  it('counts body mass in volume', () => {
    expect(volumeKg([{ loadKg: 0, reps: 10 }, { loadKg: 0, reps: 8 }], body80)).toBe(1440)
    expect(volumeKg([{ loadKg: 100, reps: 5 }], external)).toBe(500)
  })
})

describe('beating last time (common practice, no published source)', () => {
  it('is more load at the same reps or more, or more reps at the same load or more', () => {
    expect(beats({ loadKg: 100, reps: 9 }, { loadKg: 100, reps: 8 }, external)).toBe(true)
    expect(beats({ loadKg: 102.5, reps: 8 }, { loadKg: 100, reps: 8 }, external)).toBe(true)
    expect(beats({ loadKg: 102.5, reps: 7 }, { loadKg: 100, reps: 8 }, external)).toBe(false)
    expect(beats({ loadKg: 100, reps: 8 }, { loadKg: 100, reps: 8 }, external)).toBe(false)
    // Less help on an assisted machine is more load moved.
    expect(beats({ loadKg: 25, reps: 8 }, { loadKg: 30, reps: 8 }, { mode: 'assisted', bodyMassKg: null })).toBe(true)
  })
})

describe('one comparison for the summary and the review desk', () => {
  it('never calls a planned load step a regression, and gives one figure (the demo bench: 56 x 9, then the planned 57.5 x 8)', () => {
    const last: PerformedSet = { kind: 'top', loadKg: 56, reps: 9, repsMin: 6, repsMax: 9 }
    const planned = planSlotSets({ role: 'compound_primary', equipment: KG_GYM_SET, history: [{ sets: [last] }] }).find((s) => s.kind === 'top')!
    expect(planned).toMatchObject({ targetLoadKg: 57.5, targetReps: 8 })
    const done: PerformedSet = { ...last, loadKg: 57.5, reps: 8, targetLoadKg: 57.5, targetReps: 8 }
    const change = compareWithLastTime([done], [last], external)
    expect(change.asPlanned).toBe(true)
    expect(change.regression).toBe(false)
    // Epley: 57.5 x 8 = 72.83 against 56 x 9 = 72.80.
    expect(change.e1rmChangePct).toBeCloseTo((epley(57.5, 8) / epley(56, 9) - 1) * 100, 9)
    expect(change.e1rmChangePct!).toBeGreaterThanOrEqual(0)
  })

  it('flags a real step back: more than 5 % below last time, short of the plan (100 x 8 -> 100 x 5: -7.9 %)', () => {
    const change = compareWithLastTime(
      [{ loadKg: 100, reps: 5, targetLoadKg: 100, targetReps: 9 }],
      [{ loadKg: 100, reps: 8 }],
      external,
    )
    expect(REGRESSION_PCT).toBe(5)
    expect(change.e1rmChangePct).toBeCloseTo((epley(100, 5) / epley(100, 8) - 1) * 100, 9)
    expect(change.regression).toBe(true)
    // A small dip is not one: 100 x 7 is -2.6 %.
    expect(compareWithLastTime([{ loadKg: 100, reps: 7, targetLoadKg: 100, targetReps: 9 }], [{ loadKg: 100, reps: 8 }], external).regression).toBe(false)
  })

  it('never flags a session done exactly as the engine planned it, for any role, gym and history', () => {
    const equipmentFor: Record<SlotRole, Equipment[]> = {
      compound_primary: [KG_GYM_SET, LB_GYM_SET],
      accessory: [KG_GYM.dumbbell, KG_GYM.stack, KG_GYM_SET],
      isolation: [KG_GYM.dumbbell, KG_GYM.stack],
    }
    fc.assert(
      fc.property(
        fc.constantFrom(...SLOT_ROLES),
        fc.integer({ min: 0, max: 2 }),
        fc.array(fc.record({ e1rm: fc.integer({ min: 30, max: 220 }), noise: fc.integer({ min: -3, max: 3 }) }), { minLength: 1, maxLength: 6 }),
        (role, gymIndex, days) => {
          const options = equipmentFor[role]
          const equipment = options[gymIndex % options.length]
          const history: Exposure[] = []
          for (const d of days) {
            // A lifter who does roughly what the plan asks, some days more, some less.
            const planned = planSlotSets({ role, equipment, history, startE1rmKg: d.e1rm }).filter((s) => s.kind !== 'warmup')
            const done: PerformedSet[] = []
            for (const p of planned) {
              const load = p.kind === 'backoff'
                ? backoffTarget({ topLoadKg: done[0].loadKg, topReps: done[0].reps, repsMin: p.targetRepsMin, repsMax: p.targetRepsMax, equipment }).target.loadKg
                : p.targetLoadKg!
              done.push({ kind: p.kind as PerformedSet['kind'], loadKg: load, reps: Math.max(1, p.targetReps + d.noise), repsMin: p.targetRepsMin, repsMax: p.targetRepsMax, targetLoadKg: load, targetReps: p.targetReps, targetRir: p.targetRir })
            }
            history.push({ sets: done })
          }
          // The next session, done exactly as planned.
          const next = planSlotSets({ role, equipment, history }).filter((s) => s.kind !== 'warmup')
          const asPlanned: PerformedSet[] = []
          for (const p of next) {
            expect(p.targetReps).toBeGreaterThanOrEqual(p.targetRepsMin)
            expect(p.targetReps).toBeLessThanOrEqual(p.targetRepsMax)
            expect(isLoadable(p.targetLoadKg!, equipment)).toBe(true)
            const load = p.kind === 'backoff'
              ? backoffTarget({ topLoadKg: asPlanned[0].loadKg, topReps: asPlanned[0].reps, repsMin: p.targetRepsMin, repsMax: p.targetRepsMax, equipment }).target.loadKg
              : p.targetLoadKg!
            asPlanned.push({ kind: p.kind as PerformedSet['kind'], loadKg: load, reps: p.targetReps, repsMin: p.targetRepsMin, repsMax: p.targetRepsMax, targetLoadKg: load, targetReps: p.targetReps, targetRir: p.targetRir })
          }
          const report = reportLift({ role, lift: { equipment }, history, current: { sets: asPlanned }, recordHistory: history.flatMap((e) => e.sets) })
          expect(report.change.asPlanned).toBe(true)
          expect(report.change.regression).toBe(false)
          expect(report.nextStep!.gain.pct).toBeGreaterThanOrEqual(0)
        },
      ),
      { numRuns: 200 },
    )
  })

  it('reads a set with reps in reserve as reps to failure (Epley with RIR counted)', () => {
    expect(setE1rmKg({ loadKg: 100, reps: 5, rir: 2 }, external)).toBeCloseTo(epley(100, 7), 9)
  })
})
