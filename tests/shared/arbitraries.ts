/** fast-check generators for equipment profiles (shared by the property tests). */
import fc from 'fast-check'
import type { BarbellEquipment, Equipment } from '../../shared/domain/equipment'

const KG_PLATES = [25, 20, 15, 10, 5, 2.5, 2, 1.5, 1.25, 1, 0.5]
const LB_PLATES = [45, 35, 25, 10, 5, 2.5]

export const arbBarbell: fc.Arbitrary<BarbellEquipment> = fc
  .constantFrom<'kg' | 'lb'>('kg', 'lb')
  .chain((unit) =>
    fc.record({
      kind: fc.constant('barbell' as const),
      unit: fc.constant(unit),
      barMass: unit === 'kg' ? fc.constantFrom(15, 20) : fc.constantFrom(45, 35),
      collarMass: unit === 'kg' ? fc.constantFrom(0, 2.5) : fc.constant(0),
      plates: fc
        .subarray(unit === 'kg' ? KG_PLATES : LB_PLATES, { minLength: 1 })
        .chain((masses) => fc.tuple(...masses.map((mass) => fc.integer({ min: 1, max: 4 }).map((count) => ({ mass, count }))))),
    }),
  )

const arbDumbbell: fc.Arbitrary<Equipment> = fc.record({
  kind: fc.constant('dumbbell' as const),
  unit: fc.constantFrom<'kg' | 'lb'>('kg', 'lb'),
  pairs: fc.uniqueArray(fc.integer({ min: 1, max: 80 }).map((n) => n * 1.25), { minLength: 2, maxLength: 30 }),
})

const arbStack: fc.Arbitrary<Equipment> = fc.record({
  kind: fc.constant('stack' as const),
  unit: fc.constantFrom<'kg' | 'lb'>('kg', 'lb'),
  steps: fc.integer({ min: 2, max: 20 }).chain((n) => fc.integer({ min: 1, max: 10 }).map((step) => Array.from({ length: n }, (_, i) => (i + 1) * step * 2.5))),
  addOns: fc.array(fc.record({ mass: fc.constantFrom(1, 1.25, 2.5), count: fc.integer({ min: 0, max: 2 }) }), { maxLength: 2 }),
})

const arbBodyweight: fc.Arbitrary<Equipment> = fc.record({
  kind: fc.constant('bodyweight' as const),
  unit: fc.constantFrom<'kg' | 'lb'>('kg', 'lb'),
  added: fc.array(fc.record({ mass: fc.constantFrom(2.5, 5, 10, 20), count: fc.integer({ min: 1, max: 3 }) }), { minLength: 1, maxLength: 4 }),
})

const arbAny: fc.Arbitrary<Equipment> = fc.record({
  kind: fc.constant('any' as const),
  unit: fc.constantFrom<'kg' | 'lb'>('kg', 'lb'),
  step: fc.constantFrom(0.5, 1, 1.25, 2.5, 5),
  min: fc.constantFrom(0, 5, 10),
})

export const arbEquipment: fc.Arbitrary<Equipment> = fc.oneof(arbBarbell, arbDumbbell, arbStack, arbBodyweight, arbAny)
