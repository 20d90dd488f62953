import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'
import { IWF_COLLAR_KG, IWF_MEN_BAR_KG, KG_COMPETITION_SET, isLoadable, platesPerSide } from '../../shared/domain/equipment'
import { KG_GYM, LB_GYM, defaultGym, equipmentFor, gymProfileSchema, loadRangeOf, type GymProfile } from '../../shared/domain/gym'
import { lbToKg } from '../../shared/domain/units'
import { GYM_LIMITS, MASS_GRID, gymInputSchema } from '../../shared/schemas/gym.schema'

const copyOf = (gym: GymProfile): GymProfile => JSON.parse(JSON.stringify(gym))

describe('what a piece of equipment can load (loadRangeOf)', () => {
  it('gives the kilogram preset bar: empty 20 kg, a 2.5 kg step, 535 kg with every plate on', () => {
    // IWF men's bar 20 kg (IWF Technical and Competition Rules). A pair of 1.25 kg plates is the
    // smallest step, 2.5 kg; 20 + 2 x (6x25 + 2x20 + 2x15 + 2x10 + 2x5 + 2x2.5 + 2x1.25) = 535 kg
    // (arithmetic on the preset's plate list, which is common practice, no published source).
    expect(loadRangeOf(KG_GYM.barbell)).toEqual({ unit: 'kg', lightest: IWF_MEN_BAR_KG, heaviest: 535, smallestStep: 2.5 })
  })

  it('counts two IWF collars in the empty bar: 20 + 2 x 2.5 = 25 kg, and the IWF 0.5 kg discs make a 1 kg step', () => {
    // IWF: collars 2.5 kg each, counted in the total; discs down to 0.5 kg (IWF Technical and
    // Competition Rules). 25 kg, then steps of 2 x 0.5 = 1 kg.
    const range = loadRangeOf(KG_COMPETITION_SET)
    expect(range.lightest).toBe(IWF_MEN_BAR_KG + 2 * IWF_COLLAR_KG)
    expect(range.smallestStep).toBe(1)
  })

  it('gives the pound preset bar a 5 lb step and its sled a 100 lb start (common practice)', () => {
    // 45 lb bar, smallest plate 2.5 lb: 2 x 2.5 = 5 lb a step (common practice, no published source).
    expect(loadRangeOf(LB_GYM.barbell)).toMatchObject({ unit: 'lb', lightest: 45, smallestStep: 5 })
    expect(loadRangeOf(LB_GYM.sled)).toMatchObject({ unit: 'lb', lightest: 100, smallestStep: 5 })
  })

  it('says there is no step when only one load can be made', () => {
    expect(loadRangeOf({ kind: 'dumbbell', unit: 'kg', pairs: [12] }).smallestStep).toBeNull()
  })
})

describe('gymProfileSchema', () => {
  it('fills in a row stored before the gym editor: collars from collarMass and the unit\'s default sled', () => {
    const { sled: _sled, ...older } = copyOf(LB_GYM)
    const { collars: _collars, ...bar } = older.barbell
    const parsed = gymProfileSchema.parse({ ...older, barbell: { ...bar, collarMass: 0 } })

    expect(parsed.barbell.collars).toEqual({ counted: false, mass: 0 })
    expect(parsed.sled).toMatchObject({ kind: 'barbell', unit: 'lb', barMass: 100, collarMass: 0 })
  })

  it("derives the engine's collarMass from the collars: one collar's mass when counted, 0 when not", () => {
    const gym = copyOf(KG_GYM)
    gym.barbell.collars = { counted: true, mass: 2.5 }
    gym.barbell.collarMass = 0
    expect(gymProfileSchema.parse(gym).barbell.collarMass).toBe(2.5)

    gym.barbell.collars = { counted: false, mass: 2.5 }
    gym.barbell.collarMass = 2.5
    const notCounted = gymProfileSchema.parse(gym).barbell
    expect(notCounted.collarMass).toBe(0)
    // Remembered for the form, not loaded.
    expect(notCounted.collars.mass).toBe(2.5)
  })

  it('loads the sled like a bar with no collars: leg press loads are the sled plus plates a side', () => {
    // 50 kg sled + 2 x (25 + 25 + 25) = 200 kg (arithmetic).
    expect(platesPerSide(200, KG_GYM.sled)).toEqual([25, 25, 25])
    expect(isLoadable(lbToKg(190), LB_GYM.sled)).toBe(true) // 100 + 2 x 45
  })
})

describe('equipmentFor', () => {
  it('loads the library\'s leg press and hack squat from the sled, other machines from the stack', () => {
    const kinds = Object.fromEntries(exerciseLibrary.map((e) => [e.name, e.equipmentKind]))
    expect(kinds['Leg press']).toBe('sled')
    expect(kinds['Hack squat machine']).toBe('sled')
    expect(kinds['Leg extension']).toBe('machine')
    for (const gym of [KG_GYM, LB_GYM]) {
      expect(equipmentFor(gym, 'sled')).toBe(gym.sled)
      expect(equipmentFor(gym, 'machine')).toBe(gym.stack)
    }
  })

  it('starts each unit from its own preset', () => {
    expect(defaultGym('kg')).toBe(KG_GYM)
    expect(defaultGym('lb')).toBe(LB_GYM)
  })
})

describe('gymInputSchema', () => {
  it('accepts both presets as they are, dropping the names and the derived collarMass', () => {
    for (const gym of [KG_GYM, LB_GYM]) {
      const parsed = gymInputSchema.parse(gym)
      expect(parsed.barbell).not.toHaveProperty('collarMass')
      expect(parsed.barbell).not.toHaveProperty('name')
      expect(parsed.sled).not.toHaveProperty('collarMass')
      expect(parsed.barbell.plates).toEqual(gym.barbell.plates)
    }
  })

  it('accepts microloading plates: 0.25 and 0.5 kg, 1.25 lb', () => {
    const kg = copyOf(KG_GYM)
    kg.barbell.plates.push({ mass: 0.5, count: 1 }, { mass: 0.25, count: 1 })
    const lb = copyOf(LB_GYM)
    lb.barbell.plates.push({ mass: 1.25, count: 1 })
    expect(gymInputSchema.safeParse(kg).success).toBe(true)
    expect(gymInputSchema.safeParse(lb).success).toBe(true)
    // One 0.25 kg plate a side: a 0.5 kg step (arithmetic).
    expect(loadRangeOf(gymProfileSchema.parse(gymInputSchema.parse(kg)).barbell).smallestStep).toBe(0.5)
  })

  it('words its bounds in the unit of the piece of equipment', () => {
    const lb = copyOf(LB_GYM)
    lb.dumbbell.pairs = [0.5]
    lb.stack.addOns = [{ mass: 60, count: 1 }]
    const messages = gymInputSchema.safeParse(lb).error?.issues.map((i) => [i.path.join('.'), i.message])
    expect(messages).toEqual([
      ['dumbbell.pairs.0', 'Dumbbells weigh 1 to 220 lb'],
      ['stack.addOns.0.mass', 'Add-on weights weigh 0.25 to 55 lb'],
    ])
  })

  it('keeps any accepted bar within what the engine loads, heaviest = bar + collars + every plate (property)', () => {
    // Plate sizes on the 0.05 kg grid up to 25 kg, at most 3 pairs of 6 sizes: within the 500 kg a side.
    const gridSteps = fc.integer({ min: Math.round(GYM_LIMITS.kg.plate[0] / MASS_GRID), max: Math.round(25 / MASS_GRID) })
    fc.assert(
      fc.property(
        fc.uniqueArray(gridSteps, { minLength: 1, maxLength: 6 }).map((steps) => steps.map((n) => Math.round(n * MASS_GRID * 100) / 100)),
        fc.array(fc.integer({ min: 1, max: 3 }), { minLength: 6, maxLength: 6 }),
        fc.integer({ min: 1, max: 50 }),
        fc.boolean(),
        (masses, counts, barMass, counted) => {
          const gym = copyOf(KG_GYM)
          gym.barbell = { ...gym.barbell, barMass, collars: { counted, mass: 2.5 }, plates: masses.map((mass, i) => ({ mass, count: counts[i] })) }
          const input = gymInputSchema.safeParse(gym)
          expect(input.success).toBe(true)
          const bar = gymProfileSchema.parse(input.data).barbell
          const range = loadRangeOf(bar)
          const plates = bar.plates.reduce((sum, p) => sum + p.mass * p.count, 0)
          const empty = barMass + (counted ? 5 : 0)
          expect(range.lightest).toBeCloseTo(empty, 9)
          expect(range.heaviest).toBeCloseTo(empty + 2 * plates, 9)
          expect(range.smallestStep).not.toBeNull()
        },
      ),
      { numRuns: 200 },
    )
  })
})
