import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  IWF_COLLAR_KG,
  IWF_MEN_BAR_KG,
  IWF_PLATES_KG,
  IWF_WOMEN_BAR_KG,
  KG_COMPETITION_SET,
  KG_COMPETITION_SET_15KG_BAR,
  LB_GYM_SET,
  equipmentSchema,
  isLoadable,
  loadable,
  minIncrement,
  minimumLoad,
  platesPerSide,
  stepDown,
  stepUp,
  type BarbellEquipment,
  type Equipment,
} from '../../shared/domain/equipment'
import { IWF_PLATE_COLOURS, plateColour, plateDiameterMm } from '../../shared/domain/plates'
import { fromKg, kgToLb, lbToKg, toKg } from '../../shared/domain/units'
import { arbEquipment, arbBarbell } from './arbitraries'
import { engineErrorCode } from '../helpers/engine-error'

const codeOf = engineErrorCode
const lb = lbToKg
const sum = (xs: readonly number[]): number => xs.reduce((a, b) => a + b, 0)

describe('IWF and IPF bars, plates and colours', () => {
  // IWF Technical and Competition Rules & Regulations, sport equipment (secondary copy):
  // men's bar 20 kg, women's 15 kg; discs 25 ... 0.5 kg; collars 2.5 kg each, counted.
  // IPF Technical Rules (older edition, secondary copy) agree on the 20 kg bar, 2.5 kg
  // collars and 25/20/15 kg discs coloured red/blue/yellow.
  it('uses the IWF bar, collar and disc masses', () => {
    expect(IWF_MEN_BAR_KG).toBe(20)
    expect(IWF_WOMEN_BAR_KG).toBe(15)
    expect(IWF_COLLAR_KG).toBe(2.5)
    expect([...IWF_PLATES_KG]).toEqual([25, 20, 15, 10, 5, 2.5, 2, 1.5, 1, 0.5])
    expect(KG_COMPETITION_SET.plates.map((p) => p.mass)).toEqual([...IWF_PLATES_KG])
    // empty competition bar with both collars: 20 + 2 x 2.5 = 25 kg (IPF: bar with collars 25 kg)
    expect(minimumLoad(KG_COMPETITION_SET).loadKg).toBe(25)
  })

  it('colours kilogram plates by the IWF code and pound plates grey', () => {
    // IWF colour code: 25 and 2.5 red; 20 and 2 blue; 15 and 1.5 yellow; 10 and 1 green; 5 and 0.5 white.
    const code: [number, string][] = [
      [25, 'red'], [2.5, 'red'], [20, 'blue'], [2, 'blue'], [15, 'yellow'], [1.5, 'yellow'],
      [10, 'green'], [1, 'green'], [5, 'white'], [0.5, 'white'],
    ]
    for (const [mass, colour] of code) expect(plateColour(mass, 'kg')).toBe(colour)
    expect(Object.keys(IWF_PLATE_COLOURS)).toHaveLength(10)
    expect(plateColour(45, 'lb')).toBe('grey')
    expect(plateColour(1.25, 'kg')).toBe('grey')
  })

  it('draws discs of 10 kg and more at 450 mm and marks smaller sizes approximate', () => {
    // IWF: discs of 10 kg and more are 450 mm across.
    for (const mass of [25, 20, 15, 10]) expect(plateDiameterMm(mass, 'kg')).toEqual({ mm: 450, approximate: false })
    expect(plateDiameterMm(5, 'kg').approximate).toBe(true)
    expect(plateDiameterMm(5, 'kg').mm).toBeLessThan(450)
    expect(plateDiameterMm(2.5, 'lb').mm).toBeLessThan(plateDiameterMm(45, 'lb').mm)
  })
})

describe('loadable: worked loadings (references.md §4, computed)', () => {
  // Pound gym, common practice: 45 lb bar, plates 45, 35, 25, 10, 5, 2.5 lb.
  it('loads 225 lb as 45 + 45 per side on the 45 lb bar', () => {
    expect(platesPerSide(lb(225), LB_GYM_SET)).toEqual([45, 45])
  })
  it('loads 185 lb as 45 + 25 per side', () => {
    expect(platesPerSide(lb(185), LB_GYM_SET)).toEqual([45, 25])
  })
  it('loads 100 lb as 25 + 2.5 per side', () => {
    expect(platesPerSide(lb(100), LB_GYM_SET)).toEqual([25, 2.5])
  })
  it('cannot make 137.5 lb and offers 135 and 140', () => {
    const r = loadable(lb(137.5), LB_GYM_SET)
    expect(r.exact).toBe(false)
    expect(r.below.load).toBe(135)
    expect(r.above.load).toBe(140)
    expect(r.below.perSide).toEqual([45])
    expect(r.above.perSide).toEqual([45, 2.5])
    expect(r.unit).toBe('lb')
    expect(r.below.loadKg).toBeCloseTo(135 * 0.45359237, 12)
  })
  // IWF men's bar with collars: 100 kg -> 25 + 10 + 2.5 per side; women's bar with collars: 60 kg -> 20 per side.
  it('loads 100 kg as 25 + 10 + 2.5 per side on the men\'s bar with collars', () => {
    expect(platesPerSide(100, KG_COMPETITION_SET)).toEqual([25, 10, 2.5])
  })
  it('loads 60 kg as 20 per side on the women\'s bar with collars', () => {
    expect(platesPerSide(60, KG_COMPETITION_SET_15KG_BAR)).toEqual([20])
  })
  // Many "45 lb" bars are 20 kg = 44.09 lb (references.md §4, computed from 1 lb = 0.45359237 kg).
  it('handles a 20 kg bar in a pound gym as 44.09 lb', () => {
    const mixed: BarbellEquipment = { ...LB_GYM_SET, barMass: kgToLb(20) }
    expect(minimumLoad(mixed).load).toBeCloseTo(44.092, 3)
    expect(minimumLoad(mixed).loadKg).toBeCloseTo(20, 6)
  })
})

describe('loadable: inventory limits', () => {
  it('respects how many of each plate exist', () => {
    // Only one pair of 10 kg: 40 kg per side cannot be 4 x 10, it is 25 + 15.
    const r = loadable(105, KG_COMPETITION_SET)
    expect(r.exact).toBe(true)
    expect(sum(r.below.perSide!)).toBe(40)
    expect(r.below.perSide!.filter((p) => p === 10).length).toBeLessThanOrEqual(1)
  })

  it('reports the smallest increment of each kind of equipment', () => {
    expect(minIncrement(KG_COMPETITION_SET).value).toBe(1) // 2 x 0.5 kg
    expect(minIncrement(LB_GYM_SET).value).toBe(5) // 2 x 2.5 lb
    expect(minIncrement({ kind: 'dumbbell', unit: 'kg', pairs: [10, 12.5, 15, 17.5] }).value).toBe(2.5)
    expect(minIncrement({ kind: 'stack', unit: 'lb', steps: [10, 20, 30], addOns: [{ mass: 2.5, count: 2 }] }).value).toBe(2.5)
    expect(minIncrement({ kind: 'any', unit: 'kg', step: 1.25, min: 0 }).value).toBe(1.25)
    expect(minIncrement({ kind: 'bodyweight', unit: 'kg', added: [{ mass: 5, count: 2 }, { mass: 2.5, count: 1 }] }).kg).toBe(2.5)
  })

  it('steps up and down to the neighbouring loadable loads', () => {
    expect(stepUp(lb(365), LB_GYM_SET)!.load).toBe(370)
    expect(stepDown(100, KG_COMPETITION_SET)!.loadKg).toBe(99)
    expect(stepUp(1000, KG_COMPETITION_SET)).toBeNull()
  })

  it('throws TARGET_BELOW_MINIMUM below the empty bar', () => {
    expect(codeOf(() => loadable(15, KG_COMPETITION_SET))).toBe('TARGET_BELOW_MINIMUM')
    expect(codeOf(() => loadable(lb(40), LB_GYM_SET))).toBe('TARGET_BELOW_MINIMUM')
  })

  it('throws NOT_ENOUGH_PLATES above what the plates on hand can make', () => {
    expect(codeOf(() => loadable(400, KG_COMPETITION_SET))).toBe('NOT_ENOUGH_PLATES')
    expect(codeOf(() => platesPerSide(100.25, KG_COMPETITION_SET))).toBe('NOT_ENOUGH_PLATES')
  })

  it('throws TARGET_ABOVE_MAXIMUM past the heaviest dumbbell', () => {
    expect(codeOf(() => loadable(60, { kind: 'dumbbell', unit: 'kg', pairs: [10, 20] }))).toBe('TARGET_ABOVE_MAXIMUM')
  })

  it('throws UNKNOWN_EQUIPMENT_KIND and INVALID_EQUIPMENT for bad profiles', () => {
    expect(codeOf(() => loadable(50, { kind: 'kettlebell', unit: 'kg' } as unknown as Equipment))).toBe('UNKNOWN_EQUIPMENT_KIND')
    expect(codeOf(() => loadable(50, { ...LB_GYM_SET, barMass: -5 }))).toBe('INVALID_EQUIPMENT')
    expect(codeOf(() => loadable(-1, LB_GYM_SET))).toBe('INVALID_LOAD')
  })
})

describe('equipmentSchema', () => {
  it('accepts the presets and every generated profile, and rejects unknown kinds', () => {
    expect(equipmentSchema.safeParse(KG_COMPETITION_SET).success).toBe(true)
    expect(equipmentSchema.safeParse(LB_GYM_SET).success).toBe(true)
    expect(equipmentSchema.safeParse({ kind: 'kettlebell', unit: 'kg' }).success).toBe(false)
    expect(equipmentSchema.safeParse({ kind: 'any', unit: 'st', step: 1, min: 0 }).success).toBe(false)
    fc.assert(fc.property(arbEquipment, (eq) => equipmentSchema.safeParse(eq).success))
  })
})

/** Every per-side plate list possible with an inventory, by brute force (independent of the engine). */
function bruteForceLoads(eq: BarbellEquipment): Set<number> {
  let sums = [0]
  for (const p of eq.plates) {
    const next: number[] = []
    for (const s of sums) for (let c = 0; c <= p.count; c++) next.push(s + c * p.mass)
    sums = next
  }
  return new Set(sums.map((s) => Math.round((eq.barMass + 2 * eq.collarMass + 2 * s) * 1000)))
}

describe('loadable: properties', () => {
  it('agrees with a brute-force enumeration of the inventory', () => {
    fc.assert(
      fc.property(arbBarbell, fc.double({ min: 0, max: 1, noNaN: true }), (eq, f) => {
        const all = bruteForceLoads(eq)
        const max = Math.max(...all) / 1000
        const min = Math.min(...all) / 1000
        const target = min + f * (max - min)
        const r = loadable(toKg(target, eq.unit), eq)
        expect(all.has(Math.round(r.below.load * 1000))).toBe(true)
        expect(all.has(Math.round(r.above.load * 1000))).toBe(true)
        // nothing loadable strictly between below and above
        for (const m of all) {
          expect(m <= Math.round(r.below.load * 1000) || m >= Math.round(r.above.load * 1000)).toBe(true)
        }
      }),
    )
  })

  it('returns loads the equipment can make, bracketing the target', () => {
    fc.assert(
      fc.property(arbEquipment, fc.double({ min: 0, max: 1, noNaN: true }), (eq, f) => {
        const lo = minimumLoad(eq).loadKg
        const hi = eq.kind === 'any' ? lo + 500 : stepDownFromTop(eq)
        const targetKg = lo + f * (hi - lo)
        const r = loadable(targetKg, eq)
        expect(isLoadable(r.below.loadKg, eq)).toBe(true)
        expect(isLoadable(r.above.loadKg, eq)).toBe(true)
        expect(r.below.loadKg).toBeLessThanOrEqual(targetKg + 1e-6)
        expect(r.above.loadKg).toBeGreaterThanOrEqual(targetKg - 1e-6)
        expect([r.below, r.above]).toContain(r.nearest)
      }),
    )
  })

  it('lists plates per side that sum to the load and never use more plates than exist', () => {
    fc.assert(
      fc.property(arbBarbell, fc.double({ min: 0, max: 1, noNaN: true }), (eq, f) => {
        const lo = minimumLoad(eq).loadKg
        const r = loadable(lo + f * (stepDownFromTop(eq) - lo), eq)
        for (const option of [r.below, r.above]) {
          const total = eq.barMass + 2 * eq.collarMass + 2 * sum(option.perSide!)
          expect(total).toBeCloseTo(option.load, 6)
          for (const p of eq.plates) {
            const onHand = eq.plates.filter((q) => q.mass === p.mass).reduce((a, q) => a + q.count, 0)
            expect(option.perSide!.filter((m) => m === p.mass).length).toBeLessThanOrEqual(onHand)
          }
          // heaviest (innermost) first
          expect([...option.perSide!].sort((a, b) => b - a)).toEqual(option.perSide)
        }
      }),
    )
  })
})

/** The heaviest load of a finite equipment profile, in kg. */
function stepDownFromTop(eq: Equipment): number {
  let load = minimumLoad(eq).loadKg
  for (;;) {
    const up = stepUp(load, eq)
    if (!up) return load
    load = up.loadKg
  }
}

it('keeps pound plates in pounds: no kilogram rounding leaks into a pound gym', () => {
  const r = loadable(lb(315), LB_GYM_SET)
  expect(r.exact).toBe(true)
  expect(fromKg(r.below.loadKg, 'lb')).toBe(315)
})
