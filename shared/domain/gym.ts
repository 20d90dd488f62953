/**
 * A gym profile: the equipment a lifter trains with, one entry per kind, so each exercise can
 * be loaded with what is really there. Stored per lifter (EquipmentProfile) and editable.
 */
import { z } from 'zod/mini'
import {
  barbellSchema, bodyweightSchema, dumbbellSchema, KG_COMPETITION_SET, LB_GYM_SET, stackSchema,
  type Equipment,
} from './equipment'

export const gymProfileSchema = z.object({
  barbell: barbellSchema,
  dumbbell: dumbbellSchema,
  /** Pin-loaded machines and cable stacks. */
  stack: stackSchema,
  bodyweight: bodyweightSchema,
})
export type GymProfile = z.infer<typeof gymProfileSchema>

/** How an exercise is loaded (the exercise library's equipment field). */
export type ExerciseEquipmentKind = 'barbell' | 'dumbbell' | 'machine' | 'cable' | 'bodyweight'

const range = (from: number, to: number, step: number) =>
  Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step)

/**
 * A kilogram gym: the competition plate set on a 20 kg bar, dumbbells 2-50 kg in 2 kg steps,
 * machines 5-250 kg in 5 kg steps with a 2.5 kg add-on (the heavy end is the plate-loaded leg
 * press and hack squat), 1.25-20 kg plates for a dip belt.
 * The counts and ranges are common practice for a commercial gym, no published source.
 */
export const KG_GYM: GymProfile = {
  barbell: KG_COMPETITION_SET,
  dumbbell: { kind: 'dumbbell', unit: 'kg', pairs: range(2, 50, 2) },
  stack: { kind: 'stack', unit: 'kg', steps: range(5, 250, 5), addOns: [{ mass: 2.5, count: 1 }] },
  bodyweight: {
    kind: 'bodyweight',
    unit: 'kg',
    added: [{ mass: 20, count: 1 }, { mass: 10, count: 1 }, { mass: 5, count: 1 }, { mass: 2.5, count: 1 }, { mass: 1.25, count: 2 }],
  },
}

/**
 * A pound gym: the common 45 lb bar set, dumbbells 5-100 lb in 5 lb steps, machines 10-550 lb in
 * 10 lb steps with a 5 lb add-on, 2.5-45 lb plates for a dip belt (common practice).
 */
export const LB_GYM: GymProfile = {
  barbell: LB_GYM_SET,
  dumbbell: { kind: 'dumbbell', unit: 'lb', pairs: range(5, 100, 5) },
  stack: { kind: 'stack', unit: 'lb', steps: range(10, 550, 10), addOns: [{ mass: 5, count: 1 }] },
  bodyweight: {
    kind: 'bodyweight',
    unit: 'lb',
    added: [{ mass: 45, count: 1 }, { mass: 25, count: 1 }, { mass: 10, count: 1 }, { mass: 5, count: 1 }, { mass: 2.5, count: 2 }],
  },
}

export function equipmentFor(gym: GymProfile, kind: ExerciseEquipmentKind): Equipment {
  switch (kind) {
    case 'barbell':
      return gym.barbell
    case 'dumbbell':
      return gym.dumbbell
    case 'machine':
    case 'cable':
      return gym.stack
    case 'bodyweight':
      return gym.bodyweight
  }
}
