import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { KG_GYM_SET, LB_GYM_SET, isLoadable, type BarbellEquipment, type Equipment } from '../../shared/domain/equipment'
import { epley } from '../../shared/domain/e1rm'
import { KG_GYM } from '../../shared/domain/gym'
import {
  acsm2To10Pct,
  detectPlateau,
  doubleProgressionAt,
  nextSteps,
  nsca2For2,
  PLATEAU_WINDOW,
  workChangePct,
  type Exposure,
  type LiftContext,
  type PerformedSet,
} from '../../shared/domain/progression'
import { maxWorkingSets, SLOT_ROLES } from '../../shared/domain/schemes'
import { lbToKg } from '../../shared/domain/units'
import { engineErrorCode } from '../helpers/engine-error'

const lb = lbToKg
const kg: LiftContext = { equipment: KG_GYM_SET }
const lbGym: LiftContext = { equipment: LB_GYM_SET }
const top = (loadKg: number, reps: number, repsMin = 6, repsMax = 9): PerformedSet => ({ kind: 'top', loadKg, reps, repsMin, repsMax })
const once = (set: PerformedSet): Exposure[] => [{ sets: [set] }]
const step = (history: Exposure[], ctx: LiftContext = kg) => doubleProgressionAt(history, 0, ctx)!
const day = (n: number) => new Date(Date.UTC(2026, 0, 5) + n * 86_400_000).toISOString()

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

describe('double progression: the two kinds of small step (common practice, no published source)', () => {
  it('inside the range, the next step is one more rep at the same load, with the smallest load step beside it', () => {
    // 365 lb x 8 in 6-9 on the pound gym: one more rep is 12.5 % more work; 5 lb is about 1.4 % more load.
    const s = step(once(top(lb(365), 8)), lbGym)
    expect(s).toMatchObject({ action: 'add_rep', targetReps: 9, reason: { code: 'ADD_REP_BELOW_TOP_OF_RANGE' } })
    expect(s.target.load).toBe(365)
    expect(s.gain).toEqual({ kind: 'work', pct: expect.closeTo(12.5, 9) })
    expect(s.alternative).toMatchObject({ action: 'add_load', targetReps: 8, reason: { code: 'LOAD_STEP_SAME_REPS' } })
    expect(s.alternative!.target.load).toBe(370)
    expect(s.alternative!.gain.kind).toBe('load')
    expect(s.alternative!.gain.pct).toBeCloseTo(1.4, 1)
  })

  it('at the top of the range, a small load step keeps the reps reached (100 x 9 -> 102.5 x 9)', () => {
    // Epley (1985): 102.5 x 9 = 133.25 is below 100 x 10 = 133.33, so the step is worth less than one rep: the reps stay.
    const s = step(once(top(100, 9)))
    expect(s).toMatchObject({ action: 'add_load', targetReps: 9, reason: { code: 'ADD_LOAD_AT_TOP_OF_RANGE' } })
    expect(s.target.loadKg).toBe(102.5)
    expect(s.gain.kind).toBe('load')
    expect(s.gain.pct).toBeCloseTo(2.5, 9)
  })

  it('at the top of the range, a large step takes the fewest reps that match last time\'s estimate (56 x 9 -> 57.5 x 8)', () => {
    // Epley: 56 x 9 -> 72.8 kg; at 57.5 kg, r = 30 (72.8 / 57.5 - 1) = 7.98 -> 8 reps (57.5 x 8 = 72.83, not below).
    // The kilogram gym makes 57.5 (20 + 2 x 18.75), not 56, so its next step is 57.5; 57.5 x 9 (74.75) would be more than one rep's worth (56 x 10 = 74.67).
    const s = step(once(top(56, 9)))
    expect(s).toMatchObject({ action: 'add_load', targetReps: 8 })
    expect(s.target.loadKg).toBe(57.5)
    expect(epley(57.5, 8)).toBeGreaterThanOrEqual(epley(56, 9))
    expect(s.gain.pct).toBeGreaterThan(0)
    expect(s.workChangePct!).toBeLessThan(0) // less work, more load: the figure shown is the load
  })

  it('far above the top, the load is computed from the estimate, not the smallest step (100 x 15 in 6-9 -> 115 x 9)', () => {
    // Epley: 100 x 15 -> 150 kg; the load for 9 reps is 150 / 1.3 = 115.4 -> 115 kg on the kilogram gym.
    const s = step(once(top(100, 15)))
    expect(s).toMatchObject({ action: 'add_load', targetReps: 9, reason: { code: 'LARGER_JUMP_FAR_ABOVE_RANGE' } })
    expect(s.target.loadKg).toBe(115)
  })

  it('below the range, keeps the load once more, then cuts it to what the last set predicts for the bottom of the range', () => {
    const first = step(once(top(100, 4)))
    expect(first).toMatchObject({ action: 'hold', targetReps: 6, reason: { code: 'HOLD_BELOW_RANGE' } })
    expect(first.target.loadKg).toBe(100)
    expect(first.gain).toEqual({ kind: 'work', pct: 50 }) // 6 reps at 100 kg against 4
    // Epley: 100 x 4 -> 113.3 kg; for 6 reps 113.3 / 1.2 = 94.4 -> 92.5 kg loadable.
    const second = step([{ sets: [top(100, 4)] }, { sets: [top(100, 4)] }])
    expect(second).toMatchObject({ action: 'cut_load', targetReps: 6, reason: { code: 'CUT_LOAD_BELOW_RANGE' } })
    expect(second.target.loadKg).toBe(92.5)
    expect(second.gain).toEqual({ kind: 'work', pct: expect.closeTo(38.75, 9) }) // 92.5 x 6 = 555 against 400
  })

  it('after one more rep was missed twice at one load, the smallest load step at the same reps', () => {
    const s = step([{ sets: [top(80, 7)] }, { sets: [top(80, 7)] }, { sets: [top(80, 7)] }])
    expect(s).toMatchObject({ action: 'add_load', targetReps: 7, reason: { code: 'ADD_LOAD_AFTER_MISSED_REP' } })
    expect(s.target.loadKg).toBe(82.5)
    // One miss is not enough: one more rep again.
    expect(step([{ sets: [top(80, 6)] }, { sets: [top(80, 7)] }, { sets: [top(80, 7)] }]).action).toBe('add_rep')
  })

  it('holds at the top of the range when nothing heavier exists', () => {
    const dumbbells: Equipment = { kind: 'dumbbell', unit: 'kg', pairs: [10, 20] }
    const s = step(once(top(20, 9)), { equipment: dumbbells })
    expect(s).toMatchObject({ action: 'hold', targetReps: 9, reason: { code: 'NO_HEAVIER_LOAD_AVAILABLE' } })
  })

  it('honours the exercise\'s own load step, a kilogram step read in a pound gym rounding to the plates', () => {
    expect(step(once(top(100, 9)), { equipment: KG_GYM_SET, loadStepKg: 5 }).target.loadKg).toBe(105)
    // 2.5 kg = 5.51 lb; a pair of 2.5 lb plates (5 lb = 2.27 kg) is within the 10 % allowed for the unit change.
    expect(step(once(top(lb(135), 9)), { equipment: LB_GYM_SET, loadStepKg: 2.5 }).target.load).toBe(140)
  })

  it('counts body mass for a bodyweight lift: reps first at no added load, then the smallest belt plate', () => {
    const chin = (added: number, reps: number): Exposure => ({ sets: [{ kind: 'straight', loadKg: added, reps, repsMin: 8, repsMax: 10 }], bodyMassKg: 80 })
    const ctx: LiftContext = { equipment: KG_GYM.bodyweight, mode: 'bodyweight' }
    expect(step([chin(0, 8)], ctx)).toMatchObject({ action: 'add_rep', targetReps: 9 })
    // 80 kg body: +1.25 kg is 1.56 % more load moved; 81.25 x 10 (108.3) is under 80 x 11 (109.3): the reps stay.
    const s = step([chin(0, 10)], ctx)
    expect(s).toMatchObject({ action: 'add_load', targetReps: 10 })
    expect(s.target.loadKg).toBe(1.25)
    expect(s.gain.pct).toBeCloseTo(1.5625, 9)
  })

  it('reads an assisted lift the other way: progress is less help', () => {
    const ctx: LiftContext = { equipment: KG_GYM.stack, mode: 'assisted' }
    const s = step([{ sets: [{ kind: 'straight', loadKg: 30, reps: 10, repsMin: 8, repsMax: 10 }], bodyMassKg: 80 }], ctx)
    expect(s.action).toBe('add_load')
    expect(s.target.loadKg).toBe(27.5) // less help: 52.5 kg moved instead of 50
    expect(s.gain.pct).toBeCloseTo(5, 9)
  })

  it('refuses zero, negative and more than 50 reps with typed errors', () => {
    expect(engineErrorCode(() => step(once(top(100, 0))))).toBe('INVALID_REPS')
    expect(engineErrorCode(() => step(once(top(100, -2))))).toBe('INVALID_REPS')
    expect(engineErrorCode(() => step(once(top(100, 51, 40, 50))))).toBe('REPS_ABOVE_LIMIT')
  })

  it('always gives a loadable target inside the range and a figure that is never negative', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ load: fc.integer({ min: 8, max: 100 }), reps: fc.integer({ min: 1, max: 25 }) }), { minLength: 1, maxLength: 5 }),
        fc.integer({ min: 1, max: 15 }),
        fc.integer({ min: 0, max: 6 }),
        fc.constantFrom<Equipment>(KG_GYM_SET, LB_GYM_SET, KG_GYM.dumbbell, KG_GYM.stack),
        (sets, repsMin, span, equipment) => {
          const history = sets.map((s) => ({ sets: [{ kind: 'straight' as const, loadKg: s.load * 2.5, reps: s.reps, repsMin, repsMax: repsMin + span }] }))
          const next = step(history, { equipment })
          for (const o of [next, ...(next.alternative ? [next.alternative] : [])]) {
            expect(o.targetReps).toBeGreaterThanOrEqual(repsMin)
            expect(o.targetReps).toBeLessThanOrEqual(repsMin + span)
            expect(o.gain.pct).toBeGreaterThanOrEqual(0)
            const last = history.at(-1)!.sets[0].loadKg
            if (o.action === 'add_rep') expect(o.target.loadKg).toBe(last)
            if (o.action === 'add_load') expect(o.target.loadKg).toBeGreaterThan(last)
            if (o.action === 'cut_load') expect(o.target.loadKg).toBeLessThan(last)
            if (o.action !== 'hold' && o.action !== 'add_rep') expect(isLoadable(o.target.loadKg, equipment)).toBe(true)
          }
        },
      ),
    )
  })
})

describe('ACSM 2-10 % rule', () => {
  // Ratamess et al., ACSM position stand, "Progression models in resistance training for healthy
  // adults", MSSE 41(3):687-708, 2009: increase the load 2-10 % when the lifter can do the
  // current load for 1-2 reps over the target.
  const fineSteps: LiftContext = { equipment: { kind: 'any', unit: 'kg', step: 0.5, min: 0 } }
  it('raises the load by 2-10 % when the target is beaten by 1 or 2 reps', () => {
    for (const over of [1, 2]) {
      const s = acsm2To10Pct({ kind: 'straight', loadKg: 100, reps: 10 + over, repsMin: 10, repsMax: 10 }, kg)
      const pct = (s.target.loadKg / 100 - 1) * 100
      expect(pct).toBeGreaterThanOrEqual(2)
      expect(pct).toBeLessThanOrEqual(10)
      expect(s.reason.code).toBe('ACSM_TARGET_BEATEN')
      expect(s.targetReps).toBe(10)
    }
  })
  it('keeps the load when the target is met but not beaten', () => {
    const s = acsm2To10Pct({ kind: 'straight', loadKg: 100, reps: 10, repsMin: 10, repsMax: 10 }, kg)
    expect(s).toMatchObject({ action: 'hold', reason: { code: 'ACSM_TARGET_NOT_BEATEN' } })
    expect(s.target.loadKg).toBe(100)
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
    const steps = nsca2For2(session(12), session(12), kg)
    expect(steps.every((s) => s.action === 'add_load' && s.target.loadKg > 60)).toBe(true)
    expect(steps[0].reason.code).toBe('NSCA_2_FOR_2_MET')
  })
  it('waits when it happened in only one of the two sessions', () => {
    expect(nsca2For2(session(12), session(11), kg).every((s) => s.action === 'hold')).toBe(true)
    expect(nsca2For2(session(12), undefined, kg)[0].reason.code).toBe('NSCA_2_FOR_2_NOT_MET')
  })
  it('is a different rule from ACSM: one session 1 rep over moves ACSM, not NSCA', () => {
    const latest = session(11)
    expect(nextSteps([session(11), latest], kg, { policy: 'nsca_2_for_2' })[1].action).toBe('hold')
    expect(nextSteps([session(11), latest], kg, { policy: 'acsm_2_to_10_pct' })[1].action).toBe('add_load')
  })
})

describe('plateau (common practice, no published source)', () => {
  const weekly = (sets: Array<[number, number]>, start = 0): Exposure[] =>
    sets.map(([load, reps], i) => ({ at: day(start + 7 * i), sets: [top(load, reps)] }))
  // A gym with 0.5 kg plates: its smallest step on the bar is 1 kg, smaller than the usual 2.5 kg jump.
  const fractional: BarbellEquipment = { ...KG_GYM_SET, plates: [...KG_GYM_SET.plates, { mass: 0.5, count: 1 }] }

  it('is flagged when the estimate has not risen over the window despite one more rep and a load step', () => {
    // 100 x 8 (Epley 126.7), then one more rep missed twice, then 102.5 x 7 twice (126.4).
    const history = weekly([[100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7]])
    const r = detectPlateau(history, { equipment: fractional, role: 'compound_primary', version: 'I' })
    expect(r).toMatchObject({ plateau: true, triedRepStep: true, triedLoadStep: true, window: PLATEAU_WINDOW })
    expect(r.options.map((o) => o.kind)).toEqual(['microload', 'rotate_version', 'add_set', 'deload'])
    // 1 kg is 0.98 % against the last 2.5 % jump (100 -> 102.5).
    expect(r.options[0].target!.loadKg).toBe(103.5)
    expect(r.options[0].targetReps).toBe(7)
    expect(r.options[0].reason.values.lastJumpPct).toBeCloseTo(2.5, 9)
    expect(r.options[1]).toMatchObject({ rotate: 'I', keep: 'II' })
    expect(r.options[2]).toMatchObject({ sets: 2, targetRir: 2 })
  })

  it('offers the smaller step only when it is strictly smaller than the last jump', () => {
    const history = weekly([[100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7]])
    const r = detectPlateau(history, { equipment: KG_GYM_SET, role: 'compound_primary' })
    expect(r.plateau).toBe(true)
    expect(r.options.map((o) => o.kind)).not.toContain('microload') // 2.5 kg again is not a smaller step than 2.5 kg
  })

  it('is never flagged while reps or load rise, on a day with a record, or before both kinds of step were tried', () => {
    const rising = weekly([[100, 6], [100, 7], [100, 8], [102.5, 8], [102.5, 9]])
    expect(detectPlateau(rising, { ...kg, role: 'compound_primary' }).plateau).toBe(false)
    const flat = weekly([[100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7]])
    expect(detectPlateau(flat, { ...kg, role: 'compound_primary', recordToday: true }).plateau).toBe(false)
    // The latest set beat the one before: not a plateau, whatever came before.
    const beat = weekly([[100, 8], [100, 8], [100, 8], [102.5, 6], [102.5, 7]])
    expect(detectPlateau(beat, { ...kg, role: 'compound_primary' }).plateau).toBe(false)
    // Only one more rep was ever tried.
    const repsOnly = weekly([[100, 8], [100, 8], [100, 8], [100, 8], [100, 8], [100, 8]])
    expect(detectPlateau(repsOnly, { ...kg, role: 'compound_primary' }).triedLoadStep).toBe(false)
    expect(detectPlateau(repsOnly, { ...kg, role: 'compound_primary' }).plateau).toBe(false)
  })

  it('never flags chin-ups whose reps rise at no added load (8, 9, 10, 11 reps), body mass counted', () => {
    const ctx = { equipment: KG_GYM.bodyweight, mode: 'bodyweight' as const, role: 'accessory' as const }
    const chins = [8, 9, 10, 11].map((reps, i): Exposure => ({
      at: day(7 * i), bodyMassKg: 80, sets: [{ kind: 'straight', loadKg: 0, reps, repsMin: 8, repsMax: 12 }],
    }))
    const r = detectPlateau(chins, ctx)
    expect(r.plateau).toBe(false)
    // Epley with body mass: 80 x 8 = 101.3 kg, 80 x 11 = 109.3 kg; the added load alone would read 0.
    expect(r.bestE1rmKg).toBeCloseTo(epley(80, 11), 9)
  })

  it('widens the window to four weeks for a lift trained more than once a week', () => {
    // Twice a week: four exposures are only 10 days, so the window takes every exposure of the last 28 days.
    const history = [[100, 8], [100, 8], [100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7], [102.5, 7], [100, 8], [100, 8]]
      .map(([load, reps], i) => ({ at: day(3.5 * i), sets: [top(load, reps)] }))
    const r = detectPlateau(history, { ...kg, role: 'compound_primary' })
    expect(r.window).toBe(8)
    expect(r.plateau).toBe(true)
  })

  it('leaves deloads out and never offers a set beyond the caps', () => {
    const deloaded: Exposure[] = [...weekly([[100, 8], [100, 8], [100, 8], [102.5, 7]]), { at: day(28), deload: true, sets: [top(90, 6)] }, { at: day(35), sets: [top(102.5, 7)] }]
    expect(detectPlateau(deloaded, { ...kg, role: 'compound_primary' }).plateau).toBe(true)
    fc.assert(
      fc.property(fc.constantFrom(...SLOT_ROLES), fc.integer({ min: 1, max: 4 }), fc.integer({ min: 0, max: 5 }), (role, sets, patternSets) => {
        const n = Math.min(sets, maxWorkingSets(role))
        const flat = weekly([[100, 8], [100, 8], [100, 8], [102.5, 7], [102.5, 7]]).map((e) => ({ ...e, sets: Array.from({ length: n }, () => e.sets[0]) }))
        const r = detectPlateau(flat, { ...kg, role, patternSetsInSession: patternSets })
        expect(r.plateau).toBe(true)
        const add = r.options.find((o) => o.kind === 'add_set')
        expect(add !== undefined).toBe(n < maxWorkingSets(role) && patternSets < 4)
        if (add) expect(add.sets!).toBeLessThanOrEqual(maxWorkingSets(role))
      }),
    )
  })
})
