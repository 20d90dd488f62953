import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { epley, loadForReps } from '../../shared/domain/e1rm'
import { KG_GYM_SET, LB_GYM_SET, isLoadable, type Equipment } from '../../shared/domain/equipment'
import { KG_GYM } from '../../shared/domain/gym'
import { planSlotSets } from '../../shared/domain/planned-sets'
import type { Exposure, PerformedSet } from '../../shared/domain/progression'
import { ACCESSORY_TWO_SETS_SCHEME, DEFAULT_SCHEMES, maxWorkingSets, SLOT_ROLES, type SlotRole } from '../../shared/domain/schemes'
import { lbToKg } from '../../shared/domain/units'

const cable: Equipment = { kind: 'stack', unit: 'kg', steps: Array.from({ length: 20 }, (_, i) => (i + 1) * 5), addOns: [{ mass: 2.5, count: 1 }] }
const working = (sets: ReturnType<typeof planSlotSets>) => sets.filter((s) => s.kind !== 'warmup')

describe('planned sets for a slot', () => {
  it('plans a first session from a starting estimate: the load for the middle of the range', () => {
    // Epley (1985): an estimated 1RM of 100 kg does 7 reps (the middle of 6-9) at 100 / (1 + 7/30) = 81.1 kg -> 80 kg.
    const sets = planSlotSets({ role: 'compound_primary', equipment: KG_GYM_SET, startE1rmKg: 100 })
    const top = sets.find((s) => s.kind === 'top')!
    expect(top).toMatchObject({ targetLoadKg: 80, targetReps: 7, targetRepsMin: 6, targetRepsMax: 9, toFailure: true, source: 'start_estimate' })
    expect(loadForReps(100, 7)).toBeCloseTo(81.08, 2)
    const backoff = sets.find((s) => s.kind === 'backoff')!
    expect(backoff).toMatchObject({ source: 'backoff_from_top_set', targetReps: 9 })
    expect(backoff.targetLoadKg!).toBeLessThan(80)
    expect(sets.map((s) => s.position)).toEqual(sets.map((_, i) => i))
  })

  it('asks for a start (no target load) when a lift has no history and no estimate', () => {
    const sets = planSlotSets({ role: 'isolation', equipment: cable })
    expect(sets.every((s) => s.target === null && s.source === 'needs_start')).toBe(true)
    expect(sets.every((s) => s.targetReps >= s.targetRepsMin && s.targetReps <= s.targetRepsMax)).toBe(true)
  })

  it('applies last time\'s next step: one more rep below the top of the range', () => {
    const sets = planSlotSets({
      role: 'compound_primary',
      equipment: LB_GYM_SET,
      history: [{ sets: [{ kind: 'top', loadKg: lbToKg(315), reps: 7, repsMin: 6, repsMax: 9 }, { kind: 'backoff', loadKg: lbToKg(275), reps: 10, repsMin: 9, repsMax: 12 }] }],
    })
    const top = sets.find((s) => s.kind === 'top')!
    expect(top.target!.load).toBe(315)
    expect(top).toMatchObject({ targetReps: 8, source: 'next_step' })
    expect(sets.filter((s) => s.kind === 'warmup').every((w) => w.target!.load < 315 && w.plateChange)).toBe(true)
  })

  it('lets a taken (edited) next step win over the derived one, its reps kept inside the range', () => {
    const history: Exposure[] = [{ sets: [{ kind: 'top', loadKg: 100, reps: 9, repsMin: 6, repsMax: 9 }] }]
    const taken = planSlotSets({ role: 'compound_primary', equipment: KG_GYM_SET, history, taken: { loadKg: 103, targetReps: 12 } })
    // 103 kg is not loadable on the kilogram gym: rounded down to 102.5; 12 reps clamped into 6-9.
    expect(taken.find((s) => s.kind === 'top')).toMatchObject({ targetLoadKg: 102.5, targetReps: 9, source: 'taken_next_step' })
  })

  it('steps accessory sets down in load and up in reps, as their scheme says', () => {
    // A first session from an estimate of 66 kg (the stack): the first set aims at 9 reps (the middle
    // of 8-10, at 1 in reserve: Epley 66 / (1 + 10/30) = 49.5 -> 47.5 kg, 45 plus the 2.5 kg add-on), then
    // each set 10 % lighter, with the reps the estimate gives there, inside each set's range.
    const sets = planSlotSets({ role: 'accessory', equipment: cable, startE1rmKg: 66 })
    const w = working(sets)
    expect(w.map((s) => [s.targetRepsMin, s.targetRepsMax])).toEqual([[8, 10], [10, 12], [12, 15]])
    expect(w.map((s) => s.targetLoadKg)).toEqual([47.5, 42.5, 37.5])
    for (let i = 1; i < w.length; i++) {
      expect(w[i].targetLoadKg!).toBeLessThanOrEqual(w[i - 1].targetLoadKg! * 0.9 + 1e-9)
      expect(w[i].targetReps).toBeGreaterThanOrEqual(w[i - 1].targetReps)
    }
    for (const s of w) expect(s.targetReps).toBeGreaterThanOrEqual(s.targetRepsMin)
  })

  it('keeps stepped-down accessory targets in their ranges after a history where they fell short (the demo\'s "aim for 7 in 8-10")', () => {
    const history: Exposure[] = [{
      sets: [
        { kind: 'straight', loadKg: 40, reps: 6, repsMin: 8, repsMax: 10, targetRir: 1 },
        { kind: 'straight', loadKg: 35, reps: 7, repsMin: 10, repsMax: 12, targetRir: 1 },
        { kind: 'straight', loadKg: 30, reps: 10, repsMin: 12, repsMax: 15, targetRir: 1 },
      ],
    }]
    const w = working(planSlotSets({ role: 'accessory', equipment: cable, history }))
    expect(w.map((s) => s.targetReps)).toEqual([8, 10, 12])
  })

  it('ramps up a barbell lift in an accessory slot (a 110 kg Romanian deadlift) and shortens the ramp when the pattern is warm', () => {
    const history: Exposure[] = [{ sets: [
      { kind: 'straight', loadKg: 110, reps: 9, repsMin: 8, repsMax: 10, targetRir: 1 },
    ] }]
    const full = planSlotSets({ role: 'accessory', equipment: KG_GYM_SET, history, compound: true, scheme: ACCESSORY_TWO_SETS_SCHEME })
    const warmups = full.filter((s) => s.kind === 'warmup')
    // 100 kg or more: at least three warm-up sets above the empty bar (common practice).
    expect(warmups.filter((s) => s.targetLoadKg! > 20).length).toBeGreaterThanOrEqual(3)
    const short = planSlotSets({ role: 'accessory', equipment: KG_GYM_SET, history, compound: true, patternWarmedUp: true, scheme: ACCESSORY_TWO_SETS_SCHEME })
    const shortWarmups = short.filter((s) => s.kind === 'warmup')
    expect(shortWarmups.length).toBeGreaterThanOrEqual(1)
    expect(shortWarmups.length).toBeLessThan(warmups.length)
    expect(shortWarmups.every((s) => s.targetLoadKg! > 20)).toBe(true)
  })

  it('plans no ramp for an isolation lift on a machine, and none when the scheme turns warm-ups off', () => {
    expect(planSlotSets({ role: 'isolation', equipment: cable, startE1rmKg: 60 }).some((s) => s.kind === 'warmup')).toBe(false)
    const off = { ...DEFAULT_SCHEMES.compound_primary, warmup: false }
    expect(planSlotSets({ role: 'compound_primary', scheme: off, equipment: KG_GYM_SET, startE1rmKg: 150 }).some((s) => s.kind === 'warmup')).toBe(false)
  })

  it('plans a deload at about 90 % of the load, half the sets, short of failure, then resumes from before it', () => {
    const history: Exposure[] = [{ sets: [{ kind: 'top', loadKg: 100, reps: 7, repsMin: 6, repsMax: 9 }, { kind: 'backoff', loadKg: 85, reps: 10, repsMin: 9, repsMax: 12 }] }]
    const deload = working(planSlotSets({ role: 'compound_primary', equipment: KG_GYM_SET, history, deload: true }))
    expect(deload).toHaveLength(1)
    expect(deload[0]).toMatchObject({ source: 'deload', toFailure: false, targetRir: 3, targetLoadKg: 90 })
    // After the deload exposure, the next step continues from the session before it (100 x 7 -> one more rep).
    const after = working(planSlotSets({
      role: 'compound_primary', equipment: KG_GYM_SET,
      history: [...history, { deload: true, sets: [{ kind: 'top', loadKg: 90, reps: 7, repsMin: 6, repsMax: 9 }] }],
    }))
    expect(after[0]).toMatchObject({ targetLoadKg: 100, targetReps: 8 })
  })

  it('adds the sets a plateau option added, within the caps, at 2 in reserve', () => {
    const plus = working(planSlotSets({ role: 'compound_primary', equipment: KG_GYM_SET, startE1rmKg: 120, extraSets: 5 }))
    expect(plus).toHaveLength(maxWorkingSets('compound_primary'))
    expect(plus.at(-1)).toMatchObject({ kind: 'backoff', toFailure: false, targetRir: 2 })
  })

  it('counts body mass for a bodyweight lift: a chin-up with no added load plans reps, then belt plates', () => {
    const history: Exposure[] = [{ bodyMassKg: 80, sets: [{ kind: 'straight', loadKg: 0, reps: 8, repsMin: 8, repsMax: 10, targetRir: 1 }] }]
    const first = working(planSlotSets({ role: 'accessory', equipment: KG_GYM.bodyweight, mode: 'bodyweight', bodyMassKg: 80, history, scheme: ACCESSORY_TWO_SETS_SCHEME }))[0]
    expect(first).toMatchObject({ targetLoadKg: 0, targetReps: 9 })
    // From a starting estimate of 130 kg moved (body 80 kg): 9 reps at 1 in reserve is Epley 130 / (1 + 10/30)
    // = 97.5 kg moved, 17.5 kg added: the belt plates make 17.5 (10 + 5 + 2.5).
    const fresh = working(planSlotSets({ role: 'accessory', equipment: KG_GYM.bodyweight, mode: 'bodyweight', bodyMassKg: 80, startE1rmKg: 130, scheme: ACCESSORY_TWO_SETS_SCHEME }))[0]
    expect(loadForReps(130, 10)).toBeCloseTo(97.5, 9)
    expect(fresh).toMatchObject({ targetLoadKg: 17.5, targetReps: 9 })
    expect(epley(97.5, 10)).toBeCloseTo(130, 9)
  })

  it('plans only loadable loads, inside their ranges, within the set caps, for any role, start and history', () => {
    fc.assert(
      fc.property(
        fc.constantFrom<SlotRole>(...SLOT_ROLES),
        fc.integer({ min: 25, max: 300 }),
        fc.array(fc.integer({ min: 1, max: 20 }), { maxLength: 3 }),
        (role, start, repsDone) => {
          const equipment = role === 'isolation' ? cable : KG_GYM_SET
          const history: Exposure[] = []
          for (const reps of repsDone) {
            const plan = working(planSlotSets({ role, equipment, history, startE1rmKg: start }))
            const done: PerformedSet[] = plan.map((p) => ({ kind: p.kind as PerformedSet['kind'], loadKg: p.targetLoadKg!, reps, repsMin: p.targetRepsMin, repsMax: p.targetRepsMax, targetRir: p.targetRir }))
            history.push({ sets: done })
          }
          const sets = planSlotSets({ role, equipment, history, startE1rmKg: start })
          for (const s of sets) {
            expect(isLoadable(s.targetLoadKg!, equipment)).toBe(true)
            expect(s.targetReps).toBeGreaterThanOrEqual(s.targetRepsMin)
            expect(s.targetReps).toBeLessThanOrEqual(s.targetRepsMax)
          }
          const w = working(sets)
          expect(w.length).toBeLessThanOrEqual(maxWorkingSets(role))
          const heaviest = Math.max(...w.map((s) => s.targetLoadKg!))
          for (const s of sets.filter((x) => x.kind === 'warmup')) expect(s.targetLoadKg!).toBeLessThan(heaviest)
        },
      ),
    )
  })
})
