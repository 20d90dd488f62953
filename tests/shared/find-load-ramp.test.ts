import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { isLoadable, KG_GYM_SET, LB_GYM_SET, type Equipment } from '@shared/domain/equipment'
import { KG_GYM } from '@shared/domain/gym'
import { movedLoadKg } from '@shared/domain/lift-progress'
import { lbToKg } from '@shared/domain/units'
import { nextRampLoadKg, rampStartLoadKg } from '@shared/domain/find-load-ramp'

// The ramp's rule (each easy set followed by one about 10 to 20 % heavier, 5 reps a set): common
// practice, no published source. The loads below are checked by arithmetic on the equipment.
const external = { mode: 'external' as const }

describe('the find-your-load ramp', () => {
  it('starts at the empty bar: 20 kg on the kilogram gym set, 45 lb on the pound set', () => {
    expect(rampStartLoadKg(KG_GYM_SET, external)).toBe(20)
    expect(rampStartLoadKg(LB_GYM_SET, external)).toBeCloseTo(lbToKg(45), 9)
  })

  it('goes up by at most 20 % to a load the plates make: 20 -> 22.5 -> 25 -> 30 -> 35 -> 40 kg on 20 kg + 1.25 kg pairs', () => {
    // 20 x 1.2 = 24 -> 22.5 (25 is over); 22.5 x 1.2 = 27 -> 25 (27.5 is over); 25 x 1.2 = 30; 30 x 1.2 = 36 -> 35; 35 x 1.2 = 42 -> 40 (arithmetic).
    const loads = [20]
    for (let i = 0; i < 5; i++) loads.push(nextRampLoadKg(loads.at(-1)!, KG_GYM_SET, external)!)

    expect(loads).toEqual([20, 22.5, 25, 30, 35, 40])
  })

  it('takes the next load up when the equipment has nothing within 20 %: a 10 kg pin stack from 10 kg goes to 20 kg', () => {
    const stack: Equipment = { kind: 'stack', unit: 'kg', steps: [10, 20, 30, 40], addOns: [] }

    expect(nextRampLoadKg(10, stack, external)).toBe(20)
    expect(nextRampLoadKg(40, stack, external)).toBeNull() // the heaviest pin
  })

  it('reads a bodyweight lift by the load moved: 80 kg body, nothing added -> at most 96 kg moved -> 15 kg on the belt', () => {
    // KG_GYM's belt plates are 20, 10, 5, 2.5, 1.25, 1.25 kg: the heaviest added load at most 16 kg is 10 + 5 = 15 (arithmetic).
    const reading = { mode: 'bodyweight' as const, bodyMassKg: 80 }

    expect(rampStartLoadKg(KG_GYM.bodyweight, reading)).toBe(0)
    expect(nextRampLoadKg(0, KG_GYM.bodyweight, reading)).toBe(15)
  })

  it('with no body mass known, adds the smallest step to a bodyweight lift', () => {
    expect(nextRampLoadKg(0, KG_GYM.bodyweight, { mode: 'bodyweight', bodyMassKg: null })).toBe(1.25)
  })

  it('for an assisted lift starts at the most help (no more than the body mass) and goes heavier by taking help away', () => {
    const assist: Equipment = { kind: 'stack', unit: 'kg', steps: [0, 5, 10, 15, 20, 25, 30, 35, 40, 45, 50, 55, 60, 65, 70, 75, 80, 85, 90, 95, 100], addOns: [] }
    const reading = { mode: 'assisted' as const, bodyMassKg: 70 }

    expect(rampStartLoadKg(assist, reading)).toBe(70)
    // 70 kg body - 40 kg help = 30 kg moved; at most 36 kg moved needs at least 34 kg of help: 35 (arithmetic).
    expect(nextRampLoadKg(40, assist, reading)).toBe(35)
    expect(nextRampLoadKg(0, assist, reading)).toBeNull() // no help left to take away
  })

  it('property: from any bar load, the next is loadable, heavier, within 20 %, and the heaviest such load', () => {
    // KG_GYM_SET makes every load from 20 kg in 2.5 kg steps (a 1.25 kg pair), up to its heaviest (arithmetic).
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 150 }), (k) => {
        const load = 20 + 2.5 * k
        const next = nextRampLoadKg(load, KG_GYM_SET, external)
        expect(next).not.toBeNull()
        expect(isLoadable(next!, KG_GYM_SET)).toBe(true)
        expect(next!).toBeGreaterThan(load)
        expect(movedLoadKg(next!, external)!).toBeLessThanOrEqual(load * 1.2 + 1e-9)
        expect(next! + 2.5).toBeGreaterThan(load * 1.2)
      }),
    )
  })
})
