/**
 * A gym profile: the equipment a lifter trains with, one entry per kind, so each exercise can
 * be loaded with what is really there. Stored per lifter (EquipmentProfile) and editable by the
 * lifter and their coach.
 */
import { z } from 'zod/mini'
import {
  barbellSchema, bodyweightSchema, compileEquipment, dumbbellSchema, IWF_COLLAR_KG, KG_GYM_SET, LB_GYM_SET,
  minIncrement, minimumLoad, optionFromGrid, stackSchema,
  type BarbellEquipment, type Equipment,
} from './equipment'
import type { Unit } from './units'

/** The gym's collars as its owner describes them. */
export const collarsSchema = z.object({
  /** Whether a load counts the two collars (IWF counts them; many gyms use clips nobody weighs). */
  counted: z.boolean(),
  /** Mass of ONE collar, kept while not counted so that counting them again needs no retyping. */
  mass: z.number().check(z.gte(0)),
})
export type Collars = z.infer<typeof collarsSchema>

/** Derived from `collars` when they are described; optional so a described gym can leave it out. */
const derivedCollarMass = { collarMass: z.optional(z.number().check(z.gte(0))) }

/**
 * What a stored (or sent) profile may look like. Rows written before the gym editor have no
 * `collars` (only the engine's `collarMass`) and no `sled`; `gymProfileSchema` fills both in.
 */
const storedGymProfileSchema = z.object({
  barbell: z.extend(barbellSchema, { ...derivedCollarMass, collars: z.optional(collarsSchema) }),
  dumbbell: dumbbellSchema,
  /** Pin-loaded machines and cable stacks. */
  stack: stackSchema,
  bodyweight: bodyweightSchema,
  /**
   * Plate-loaded machines (leg press, hack squat): plates on a sled whose own mass counts.
   * The engine loads it as a barbell whose bar is the sled (`barMass`) and which has no collars.
   */
  sled: z.optional(z.extend(barbellSchema, derivedCollarMass)),
})
type StoredGymProfile = z.infer<typeof storedGymProfileSchema>

/**
 * Parses a stored or edited profile into a complete one: collars described (from the engine's
 * `collarMass` on older rows), the engine's `collarMass` derived from them (one collar's mass
 * when counted, 0 when not), and the unit's default sled where there is none.
 */
export const gymProfileSchema = z.pipe(
  storedGymProfileSchema,
  z.transform((stored: StoredGymProfile) => {
    const { collars: described, ...bar } = stored.barbell
    const collars = described ?? { counted: (bar.collarMass ?? 0) > 0, mass: bar.collarMass ?? 0 }
    const sled = stored.sled ?? defaultSled(bar.unit)
    return {
      ...stored,
      barbell: { ...bar, collarMass: collars.counted ? collars.mass : 0, collars },
      sled: { ...sled, collarMass: 0 },
    }
  }),
)
export type GymProfile = z.output<typeof gymProfileSchema>
export type GymBarbell = GymProfile['barbell']

/** How an exercise is loaded (the exercise library's equipment field). */
export type ExerciseEquipmentKind = 'barbell' | 'dumbbell' | 'machine' | 'cable' | 'bodyweight' | 'sled'

const range = (from: number, to: number, step: number) =>
  Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step)

/**
 * A plate-loaded sled of a kilogram gym: 50 kg of its own, loaded from the gym's plate set.
 * Sleds weigh what their maker says (often printed on the machine); 50 kg and 100 lb are common
 * practice, no published source.
 */
const KG_SLED: BarbellEquipment = { kind: 'barbell', name: 'Sled', unit: 'kg', barMass: 50, collarMass: 0, plates: KG_GYM_SET.plates.map((p) => ({ ...p })) }
const LB_SLED: BarbellEquipment = { kind: 'barbell', name: 'Sled', unit: 'lb', barMass: 100, collarMass: 0, plates: LB_GYM_SET.plates.map((p) => ({ ...p })) }

function defaultSled(unit: Unit): BarbellEquipment {
  return unit === 'lb' ? LB_SLED : KG_SLED
}

/**
 * A kilogram gym: the common gym plate set on a 20 kg bar (KG_GYM_SET) with IWF 2.5 kg collars
 * on hand but not counted, dumbbells 2-50 kg in 2 kg steps, machines 5-250 kg in 5 kg steps with
 * a 2.5 kg add-on, a 50 kg sled for the leg press and hack squat, 1.25-20 kg plates for a dip belt.
 * The counts and ranges are common practice for a commercial gym, no published source.
 */
export const KG_GYM: GymProfile = {
  barbell: { ...KG_GYM_SET, collars: { counted: false, mass: IWF_COLLAR_KG } },
  dumbbell: { kind: 'dumbbell', unit: 'kg', pairs: range(2, 50, 2) },
  stack: { kind: 'stack', unit: 'kg', steps: range(5, 250, 5), addOns: [{ mass: 2.5, count: 1 }] },
  bodyweight: {
    kind: 'bodyweight',
    unit: 'kg',
    added: [{ mass: 20, count: 1 }, { mass: 10, count: 1 }, { mass: 5, count: 1 }, { mass: 2.5, count: 1 }, { mass: 1.25, count: 2 }],
  },
  sled: KG_SLED,
}

/**
 * A pound gym: the common 45 lb bar set without collars (their mass is left for the owner to
 * enter), dumbbells 5-100 lb in 5 lb steps, machines 10-550 lb in 10 lb steps with a 5 lb add-on,
 * a 100 lb sled, 2.5-45 lb plates for a dip belt (common practice).
 */
export const LB_GYM: GymProfile = {
  barbell: { ...LB_GYM_SET, collars: { counted: false, mass: 0 } },
  dumbbell: { kind: 'dumbbell', unit: 'lb', pairs: range(5, 100, 5) },
  stack: { kind: 'stack', unit: 'lb', steps: range(10, 550, 10), addOns: [{ mass: 5, count: 1 }] },
  bodyweight: {
    kind: 'bodyweight',
    unit: 'lb',
    added: [{ mass: 45, count: 1 }, { mass: 25, count: 1 }, { mass: 10, count: 1 }, { mass: 5, count: 1 }, { mass: 2.5, count: 2 }],
  },
  sled: LB_SLED,
}

/** The preset for a unit: what a lifter trains with until someone describes their gym. */
export function defaultGym(unit: Unit): GymProfile {
  return unit === 'lb' ? LB_GYM : KG_GYM
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
    case 'sled':
      return gym.sled
  }
}

/** What a piece of equipment can make, in its own unit: for the gym editor's plain words. */
export interface LoadRange {
  unit: Unit
  /** The lightest load: the empty bar (collars counted included), the lightest dumbbell... */
  lightest: number
  /** The heaviest load everything on hand makes. */
  heaviest: number
  /** Smallest jump between two loads; null when only one load can be made. */
  smallestStep: number | null
}

/** Throws the engine's INVALID_EQUIPMENT error for a profile the engine cannot load. */
export function loadRangeOf(equipment: Equipment): LoadRange {
  const compiled = compileEquipment(equipment)
  const step = minIncrement(equipment).value
  return {
    unit: compiled.unit,
    lightest: minimumLoad(equipment).load,
    heaviest: optionFromGrid(compiled, compiled.maxGrid).load,
    smallestStep: Number.isFinite(step) ? step : null,
  }
}
