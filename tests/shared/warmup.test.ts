import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { KG_COMPETITION_SET, LB_GYM_SET, isLoadable, minimumLoad, stepUp, type Equipment } from '../../shared/domain/equipment'
import { plateChange, warmupRamp, warmupSetCount } from '../../shared/domain/warmup'
import { lbToKg } from '../../shared/domain/units'
import { arbBarbell, arbEquipment } from './arbitraries'

const heaviest = (eq: Equipment): number => {
  let load = minimumLoad(eq).loadKg
  for (let up = stepUp(load, eq); up && up.loadKg < 400; up = stepUp(load, eq)) load = up.loadKg
  return load
}

describe('warm-up ramp', () => {
  // Common practice: empty bar first on barbell lifts (references.md §8).
  it('starts a barbell ramp with the empty bar and climbs to about 85 % with falling reps', () => {
    const ramp = warmupRamp(140, KG_COMPETITION_SET)
    expect(ramp.sets[0].target.loadKg).toBe(25) // 20 kg bar + 2 x 2.5 kg collars
    expect(ramp.sets[0].target.perSide).toEqual([])
    const pct = ramp.sets.map((s) => s.percentOfWorking)
    expect(pct[1]).toBeGreaterThanOrEqual(35)
    expect(pct[1]).toBeLessThanOrEqual(55)
    expect(pct[pct.length - 1]).toBeGreaterThanOrEqual(75)
    expect(pct[pct.length - 1]).toBeLessThan(95)
    const reps = ramp.sets.map((s) => s.reps)
    expect(reps[0]).toBe(6)
    expect(reps[reps.length - 1]).toBe(2)
    for (let i = 1; i < reps.length; i++) expect(reps[i]).toBeLessThanOrEqual(reps[i - 1])
  })

  // Common practice, no published source: light working loads one or two warm-ups, heavy four or five.
  it('grows the number of warm-ups with the working load', () => {
    expect(warmupRamp(40, KG_COMPETITION_SET).sets.length).toBeLessThanOrEqual(2)
    expect(warmupRamp(200, KG_COMPETITION_SET).sets.length).toBeGreaterThanOrEqual(4)
    expect(warmupSetCount(20)).toBeLessThan(warmupSetCount(80))
    expect(warmupSetCount(80)).toBeLessThan(warmupSetCount(200))
  })

  it('gives no warm-up when the working load is the empty bar itself', () => {
    expect(warmupRamp(25, KG_COMPETITION_SET).sets).toEqual([])
  })

  it('says which plates change per side at each step', () => {
    const ramp = warmupRamp(lbToKg(315), LB_GYM_SET)
    for (const s of ramp.sets) {
      expect(s.change!.count).toBe(s.change!.add.length + s.change!.remove.length)
    }
    expect(ramp.changeToWorking).toBeDefined()
    expect(plateChange([20, 10], [20, 10, 5])).toEqual({ remove: [], add: [5], count: 1 })
    // an inner plate can only change once the outer ones are off
    expect(plateChange([20, 5], [20, 10])).toEqual({ remove: [5], add: [10], count: 2 })
  })

  it('needs fewer plate changes than rounding each step on its own (315 lb, pound gym)', () => {
    const optimised = warmupRamp(lbToKg(315), LB_GYM_SET)
    const naive = warmupRamp(lbToKg(315), LB_GYM_SET, { strategy: 'nearest' })
    expect(optimised.sets.length).toBe(naive.sets.length)
    expect(optimised.totalPlateChanges).toBeLessThan(naive.totalPlateChanges)
  })

  it('never needs more plate changes than naive rounding on realistic kilogram loads', () => {
    let saved = 0
    for (let w = 60; w <= 220; w += 5) {
      const o = warmupRamp(w, KG_COMPETITION_SET)
      const n = warmupRamp(w, KG_COMPETITION_SET, { strategy: 'nearest' })
      if (o.sets.length === n.sets.length) {
        expect(o.totalPlateChanges).toBeLessThanOrEqual(n.totalPlateChanges)
        saved += n.totalPlateChanges - o.totalPlateChanges
      }
    }
    expect(saved).toBeGreaterThan(0)
  })

  it('puts warm-ups for a machine or dumbbells on loads that exist, without an empty bar', () => {
    const dumbbells: Equipment = { kind: 'dumbbell', unit: 'kg', pairs: [5, 7.5, 10, 12.5, 15, 17.5, 20, 22.5, 25, 27.5, 30] }
    const ramp = warmupRamp(30, dumbbells, { sets: 2 })
    // ideals 50 % and 80 % of 30 kg = 15 and 24 kg; 25 kg is the nearest pair to 24
    expect(ramp.sets.map((s) => s.target.loadKg)).toEqual([15, 25])
    expect(ramp.sets[0].change).toBeUndefined()
  })
})

describe('warm-up ramp: properties', () => {
  it('is loadable, strictly below the working load and non-decreasing, for any equipment', () => {
    fc.assert(
      fc.property(arbEquipment, fc.double({ min: 0, max: 1, noNaN: true }), fc.option(fc.integer({ min: 0, max: 5 })), (eq, f, sets) => {
        const lo = minimumLoad(eq).loadKg
        const workingKg = lo + f * (heaviest(eq) - lo)
        const ramp = warmupRamp(workingKg, eq, sets === null ? {} : { sets })
        let prev = -Infinity
        for (const s of ramp.sets) {
          expect(isLoadable(s.target.loadKg, eq)).toBe(true)
          expect(s.target.loadKg).toBeLessThan(ramp.working.loadKg)
          expect(s.target.loadKg).toBeGreaterThanOrEqual(prev)
          expect(s.reps).toBeGreaterThanOrEqual(2)
          expect(s.reps).toBeLessThanOrEqual(6)
          prev = s.target.loadKg
        }
        if (sets !== null) expect(ramp.sets.length).toBeLessThanOrEqual(sets)
      }),
    )
  })

  it('lists plates per side that add up to every barbell warm-up load', () => {
    fc.assert(
      fc.property(arbBarbell, fc.double({ min: 0, max: 1, noNaN: true }), (eq, f) => {
        const lo = minimumLoad(eq).loadKg
        const ramp = warmupRamp(lo + f * (heaviest(eq) - lo), eq)
        let onBar: readonly number[] = []
        for (const s of [...ramp.sets.map((x) => x.target), ramp.working]) {
          const total = eq.barMass + 2 * eq.collarMass + 2 * s.perSide!.reduce((a, b) => a + b, 0)
          expect(total).toBeCloseTo(s.load, 6)
          onBar = s.perSide!
        }
        expect(onBar).toEqual(ramp.working.perSide)
        const counted = ramp.sets.reduce((a, s) => a + s.change!.count, 0) + (ramp.changeToWorking?.count ?? 0)
        expect(ramp.totalPlateChanges).toBe(counted)
      }),
    )
  })
})
