import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { KG_COMPETITION_SET, LB_GYM_SET, isLoadable, stepUp, type Equipment } from '../../shared/domain/equipment'
import { epley } from '../../shared/domain/e1rm'
import {
  acsm2To10Pct,
  detectPlateau,
  doubleProgression,
  nextStep,
  nextSteps,
  nsca2For2,
  workChangePct,
  type Exposure,
  type PerformedSet,
} from '../../shared/domain/progression'
import { maxWorkingSets, SLOT_ROLES } from '../../shared/domain/schemes'
import { lbToKg } from '../../shared/domain/units'
import { engineErrorCode } from '../helpers/engine-error'

const lb = lbToKg
const codeOf = engineErrorCode
const top = (loadKg: number, reps: number, repsMin = 6, repsMax = 9): PerformedSet => ({ kind: 'top', loadKg, reps, repsMin, repsMax })
const fineSteps: Equipment = { kind: 'any', unit: 'kg', step: 0.5, min: 0 }

describe('percent more work (load x reps)', () => {
  // Common practice, no published source: one more rep at 8 reps is 12.5 % more work in that set.
  it('counts 8 -> 9 reps at the same load as 12.5 % more work', () => {
    expect(workChangePct(100, 8, 100, 9)).toBeCloseTo(12.5, 9)
  })
  // Common practice, no published source: 5 lb more on 365 lb is about 1.4 %.
  it('counts 5 lb more on 365 lb as about 1.4 % more work', () => {
    expect(workChangePct(lb(365), 8, lb(370), 8)).toBeCloseTo(1.4, 1)
  })
  it('has no percent from zero work', () => {
    expect(workChangePct(0, 10, 0, 11)).toBeNull()
  })
})

describe('double progression (common practice, no published source)', () => {
  it('when below the top of the range, the next step is one more rep at the same load', () => {
    const s = nextStep(top(100, 7), KG_COMPETITION_SET)
    expect(s.action).toBe('add_rep')
    expect(s.target.loadKg).toBe(100)
    expect(s.targetReps).toBe(8)
    expect(s.reason.code).toBe('ADD_REP_BELOW_TOP_OF_RANGE')
    expect(s.workChangePct).toBeCloseTo(100 / 7, 9)
  })

  it('when the top set reaches the top of its range, the next step adds the smallest load and resets reps', () => {
    const s = nextStep(top(100, 9), KG_COMPETITION_SET)
    expect(s.action).toBe('add_load')
    expect(s.target.loadKg).toBe(101) // smallest step: a pair of 0.5 kg discs
    expect(s.targetReps).toBe(6)
    expect(s.reason).toMatchObject({ code: 'ADD_LOAD_AT_TOP_OF_RANGE', values: { repsMin: 6, stepKg: 1 } })
  })

  it('offers the smallest load step when one more rep would be a large leap (365 lb x 8)', () => {
    const s = doubleProgression(top(lb(365), 8), LB_GYM_SET)
    expect(s.action).toBe('add_rep')
    expect(s.workChangePct).toBeCloseTo(12.5, 9) // above the 8 % default
    expect(s.alternative).not.toBeNull()
    expect(s.alternative!.target.load).toBe(370)
    expect(s.alternative!.targetReps).toBe(8)
    expect(s.alternative!.workChangePct).toBeCloseTo(1.4, 1)
    expect(s.alternative!.reason.code).toBe('SMALLER_JUMP_AS_LOAD_STEP')
  })

  it('offers no alternative when one more rep is a small step already', () => {
    expect(doubleProgression(top(100, 14, 12, 20), KG_COMPETITION_SET).alternative).toBeNull() // 1/14 = 7.1 %
    expect(doubleProgression(top(100, 8), KG_COMPETITION_SET, { largeLeapPct: 15 }).alternative).toBeNull()
  })

  it('holds the load when nothing heavier exists', () => {
    const dumbbells: Equipment = { kind: 'dumbbell', unit: 'kg', pairs: [10, 20] }
    const s = nextStep(top(20, 9), dumbbells)
    expect(s.action).toBe('hold')
    expect(s.reason.code).toBe('NO_HEAVIER_LOAD_AVAILABLE')
  })

  it('refuses zero, negative and more than 50 reps with typed errors', () => {
    expect(codeOf(() => nextStep(top(100, 0), KG_COMPETITION_SET))).toBe('INVALID_REPS')
    expect(codeOf(() => nextStep(top(100, -2), KG_COMPETITION_SET))).toBe('INVALID_REPS')
    expect(codeOf(() => nextStep(top(100, 51, 40, 50), KG_COMPETITION_SET))).toBe('REPS_ABOVE_LIMIT')
  })

  it('always suggests a loadable load, more reps or more load, never less work at the same reps', () => {
    fc.assert(
      fc.property(fc.integer({ min: 25, max: 250 }), fc.integer({ min: 1, max: 20 }), fc.integer({ min: 1, max: 15 }), fc.integer({ min: 0, max: 5 }), (load, reps, repsMin, span) => {
        const s = nextStep({ kind: 'straight', loadKg: load, reps, repsMin, repsMax: repsMin + span }, KG_COMPETITION_SET)
        expect(isLoadable(s.target.loadKg, KG_COMPETITION_SET)).toBe(true)
        if (s.action === 'add_rep') expect(s.targetReps).toBe(reps + 1)
        if (s.action === 'add_load') expect(s.target.loadKg).toBe(stepUp(load, KG_COMPETITION_SET)!.loadKg)
        if (s.alternative) expect(s.alternative.workChangePct!).toBeLessThan(s.workChangePct!)
      }),
    )
  })
})

describe('ACSM 2-10 % rule', () => {
  // Ratamess et al., ACSM position stand, "Progression models in resistance training for healthy
  // adults", MSSE 41(3):687-708, 2009: increase the load 2-10 % when the lifter can do the
  // current load for 1-2 reps over the target.
  it('raises the load by 2-10 % when the target is beaten by 1 or 2 reps', () => {
    for (const over of [1, 2]) {
      const s = acsm2To10Pct({ kind: 'straight', loadKg: 100, reps: 10 + over, repsMin: 10, repsMax: 10 }, KG_COMPETITION_SET)
      const pct = (s.target.loadKg / 100 - 1) * 100
      expect(pct).toBeGreaterThanOrEqual(2)
      expect(pct).toBeLessThanOrEqual(10)
      expect(s.reason.code).toBe('ACSM_TARGET_BEATEN')
      expect(s.targetReps).toBe(10)
    }
  })

  it('keeps the load when the target is met but not beaten', () => {
    const s = acsm2To10Pct({ kind: 'straight', loadKg: 100, reps: 10, repsMin: 10, repsMax: 10 }, KG_COMPETITION_SET)
    expect(s.action).toBe('hold')
    expect(s.target.loadKg).toBe(100)
    expect(s.reason.code).toBe('ACSM_TARGET_NOT_BEATEN')
  })

  it('lands inside 2-10 % for any load when the equipment allows fine steps', () => {
    fc.assert(
      fc.property(fc.integer({ min: 20, max: 400 }), fc.integer({ min: 1, max: 2 }), fc.integer({ min: 2, max: 10 }), (load, over, aim) => {
        const s = acsm2To10Pct({ kind: 'straight', loadKg: load, reps: 8 + over, repsMin: 8, repsMax: 8 }, fineSteps, { acsmIncreasePct: aim })
        const pct = (s.target.loadKg / load - 1) * 100
        expect(pct).toBeGreaterThanOrEqual(2 - 1e-9)
        expect(pct).toBeLessThanOrEqual(10 + 1e-9)
      }),
    )
  })
})

describe('NSCA 2-for-2 rule', () => {
  // Baechle & Earle (eds.), Essentials of Strength Training and Conditioning (secondary copy):
  // add load once the last set beats the target by 2 or more reps in two sessions in a row.
  const session = (lastReps: number): Exposure => ({
    sets: [
      { kind: 'straight', loadKg: 60, reps: 10, repsMin: 10, repsMax: 10 },
      { kind: 'straight', loadKg: 60, reps: lastReps, repsMin: 10, repsMax: 10 },
    ],
  })
  it('adds load when the last set beat the target by 2+ reps two sessions in a row', () => {
    const steps = nsca2For2(session(12), session(12), KG_COMPETITION_SET)
    expect(steps.every((s) => s.action === 'add_load' && s.target.loadKg > 60)).toBe(true)
    expect(steps[0].reason.code).toBe('NSCA_2_FOR_2_MET')
  })
  it('waits when it happened in only one of the two sessions', () => {
    expect(nsca2For2(session(12), session(11), KG_COMPETITION_SET).every((s) => s.action === 'hold')).toBe(true)
    expect(nsca2For2(session(12), undefined, KG_COMPETITION_SET)[0].reason.code).toBe('NSCA_2_FOR_2_NOT_MET')
  })
  it('is a different rule from ACSM: one session 1 rep over moves ACSM, not NSCA', () => {
    const latest = session(11)
    expect(nextSteps([session(11), latest], KG_COMPETITION_SET, { policy: 'nsca_2_for_2' })[1].action).toBe('hold')
    expect(nextSteps([session(11), latest], KG_COMPETITION_SET, { policy: 'acsm_2_to_10_pct' })[1].action).toBe('add_load')
  })
})

describe('plateau detection', () => {
  const exposure = (loadKg: number, reps: number, sets = 2): Exposure => ({
    sets: Array.from({ length: sets }, (_, i) => ({ kind: i === 0 ? 'top' : 'backoff', loadKg: i === 0 ? loadKg : loadKg * 0.9, reps, repsMin: 6, repsMax: 9 }) as PerformedSet),
  })

  it('sees no plateau while the estimated 1RM keeps rising', () => {
    const r = detectPlateau([exposure(100, 6), exposure(100, 7), exposure(100, 8), exposure(100, 9)], { role: 'compound_primary', equipment: KG_COMPETITION_SET })
    expect(r.plateau).toBe(false)
    expect(r.options).toEqual([])
    expect(r.bestE1rmKg).toBeCloseTo(epley(100, 9), 9)
  })

  it('flags a plateau after 3 exposures in a row without a new best, and offers the options in order', () => {
    const history = [exposure(90, 8), exposure(100, 8), exposure(100, 8), exposure(100, 7), exposure(100, 8)]
    const r = detectPlateau(history, { role: 'compound_primary', equipment: KG_COMPETITION_SET, version: 'I' })
    expect(r.plateau).toBe(true)
    expect(r.exposuresWithoutImprovement).toBe(3)
    expect(r.options.map((o) => o.kind)).toEqual(['microload', 'rotate_version', 'add_set', 'deload'])
    const micro = r.options[0]
    expect(micro.target!.loadKg).toBe(101) // 1 % instead of the last 11.1 % jump
    expect(micro.reason.values.lastJumpPct).toBeCloseTo(11.11, 2)
    expect(r.options[1]).toMatchObject({ rotate: 'I', keep: 'II' })
    expect(r.options[2]).toMatchObject({ sets: 3, targetRir: 2 })
    for (const o of r.options) expect(o.reason.values.exposuresWithoutImprovement).toBe(3)
  })

  it('counts a new best load x reps as progress even when the estimated 1RM did not rise', () => {
    // 100 x 8 (e1rm 126.7, work 800) then 80 x 12 (e1rm 112, work 960): work improved.
    const r = detectPlateau([exposure(100, 8), exposure(100, 8), exposure(100, 8), exposure(80, 12)], { role: 'accessory', equipment: KG_COMPETITION_SET })
    expect(r.exposuresWithoutImprovement).toBe(0)
  })

  it('waits for a configurable number of exposures', () => {
    const flat = [exposure(100, 8), exposure(100, 8), exposure(100, 8)]
    expect(detectPlateau(flat, { role: 'compound_primary', equipment: KG_COMPETITION_SET }).plateau).toBe(false)
    expect(detectPlateau(flat, { role: 'compound_primary', equipment: KG_COMPETITION_SET, exposuresInRow: 2 }).plateau).toBe(true)
  })

  it('never suggests a set beyond the caps', () => {
    fc.assert(
      fc.property(fc.constantFrom(...SLOT_ROLES), fc.integer({ min: 1, max: 4 }), fc.integer({ min: 4, max: 8 }), (role, sets, n) => {
        // n identical exposures: the first sets the best, the other n - 1 (>= 3) do not beat it
        const history = Array.from({ length: n }, () => exposure(100, 8, Math.min(sets, maxWorkingSets(role))))
        const r = detectPlateau(history, { role, equipment: KG_COMPETITION_SET })
        expect(r.plateau).toBe(true)
        for (const o of r.options) if (o.kind === 'add_set') expect(o.sets!).toBeLessThanOrEqual(maxWorkingSets(role))
        const atCap = Math.min(sets, maxWorkingSets(role)) === maxWorkingSets(role)
        expect(r.options.some((o) => o.kind === 'add_set')).toBe(!atCap)
      }),
    )
  })
})
