import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { KG_COMPETITION_SET, LB_GYM_SET, isLoadable, type Equipment } from '../../shared/domain/equipment'
import { planSlotSets } from '../../shared/domain/planned-sets'
import { DEFAULT_SCHEMES, maxWorkingSets, SLOT_ROLES } from '../../shared/domain/schemes'
import { lbToKg } from '../../shared/domain/units'
import { engineErrorCode } from '../helpers/engine-error'

const codeOf = engineErrorCode
const cable: Equipment = { kind: 'stack', unit: 'kg', steps: Array.from({ length: 20 }, (_, i) => (i + 1) * 5), addOns: [{ mass: 2.5, count: 1 }] }

describe('planned sets for a slot', () => {
  it('plans warm-ups, a top set and a back-off set for a primary compound from a start load', () => {
    const sets = planSlotSets({ role: 'compound_primary', equipment: KG_COMPETITION_SET, startLoadKg: 100 })
    const kinds = sets.map((s) => s.kind)
    expect(kinds.slice(-2)).toEqual(['top', 'backoff'])
    expect(kinds.filter((k) => k === 'warmup').length).toBeGreaterThanOrEqual(3)
    expect(sets.map((s) => s.position)).toEqual(sets.map((_, i) => i))
    const topSet = sets.find((s) => s.kind === 'top')!
    expect(topSet).toMatchObject({ targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, toFailure: true, restSeconds: 180 })
    const backoff = sets.find((s) => s.kind === 'backoff')!
    expect(backoff.source).toBe('backoff_from_top_set')
    expect(backoff.targetLoadKg).toBeLessThan(100)
    expect(backoff.reason!.code).toBe('BACKOFF_FROM_TOP_SET')
  })

  it('applies last time\'s next step: one more rep below the top of the range', () => {
    const sets = planSlotSets({
      role: 'compound_primary',
      equipment: LB_GYM_SET,
      last: { sets: [{ kind: 'top', loadKg: lbToKg(315), reps: 7, repsMin: 6, repsMax: 9 }, { kind: 'backoff', loadKg: lbToKg(275), reps: 10, repsMin: 9, repsMax: 12 }] },
    })
    const topSet = sets.find((s) => s.kind === 'top')!
    expect(topSet.target.load).toBe(315)
    expect(topSet.targetReps).toBe(8)
    expect(topSet.source).toBe('next_step')
    expect(sets.filter((s) => s.kind === 'warmup').every((w) => w.target.load < 315 && w.plateChange)).toBe(true)
  })

  it('lets a taken (edited) next step win over the derived one', () => {
    const sets = planSlotSets({
      role: 'compound_primary',
      equipment: KG_COMPETITION_SET,
      last: { sets: [{ kind: 'top', loadKg: 100, reps: 9, repsMin: 6, repsMax: 9 }] },
      taken: [{ loadKg: 103, targetReps: 6 }],
    })
    const topSet = sets.find((s) => s.kind === 'top')!
    expect(topSet).toMatchObject({ targetLoadKg: 103, targetReps: 6, source: 'taken_next_step' })
    // 102.5 kg needs 0.25 kg discs the competition set lacks: rounded down to 102 kg
    const edited = planSlotSets({ role: 'compound_primary', equipment: KG_COMPETITION_SET, taken: [{ loadKg: 102.5 }] })
    expect(edited.find((s) => s.kind === 'top')!.targetLoadKg).toBe(102)
  })

  it('steps the load down across accessory sets and plans no warm-up by default', () => {
    const sets = planSlotSets({ role: 'accessory', equipment: cable, startLoadKg: 50 })
    expect(sets.map((s) => s.kind)).toEqual(['straight', 'straight', 'straight'])
    expect(sets.map((s) => s.targetLoadKg)).toEqual([50, 45, 40]) // 10 % down each time, rounded down to the stack
    expect(sets.map((s) => [s.targetRepsMin, s.targetRepsMax])).toEqual([[8, 10], [10, 12], [12, 15]])
    expect(sets.every((s) => s.restSeconds === 120)).toBe(true)
  })

  it('adds one or two accessory warm-ups when the scheme asks for them', () => {
    const scheme = { ...DEFAULT_SCHEMES.accessory, warmup: true, warmupSets: 2 }
    const sets = planSlotSets({ role: 'accessory', scheme, equipment: cable, startLoadKg: 50 })
    expect(sets.filter((s) => s.kind === 'warmup')).toHaveLength(2)
  })

  it('refuses a slot without history, taken step or start load', () => {
    expect(codeOf(() => planSlotSets({ role: 'isolation', equipment: cable }))).toBe('NO_START_LOAD')
  })

  it('plans only loadable loads, within the set caps, for any role and start load', () => {
    fc.assert(
      fc.property(fc.constantFrom(...SLOT_ROLES), fc.integer({ min: 25, max: 300 }), (role, start) => {
        const sets = planSlotSets({ role, equipment: KG_COMPETITION_SET, startLoadKg: start })
        for (const s of sets) expect(isLoadable(s.targetLoadKg, KG_COMPETITION_SET)).toBe(true)
        expect(sets.filter((s) => s.kind !== 'warmup').length).toBeLessThanOrEqual(maxWorkingSets(role))
        const heaviest = Math.max(...sets.filter((s) => s.kind !== 'warmup').map((s) => s.targetLoadKg))
        for (const w of sets.filter((s) => s.kind === 'warmup')) expect(w.targetLoadKg).toBeLessThan(heaviest)
      }),
    )
  })
})
