import { z } from './zod'

export const movementPatternSchema = z.enum([
  'horizontal_push', 'vertical_push', 'horizontal_pull', 'vertical_pull', 'squat', 'hinge', 'lunge',
  'knee_flexion', 'knee_extension', 'hip_extension', 'calf', 'elbow_flexion', 'elbow_extension',
  'lateral_raise', 'chest_fly', 'rear_delt', 'shrug', 'core',
])
export type MovementPattern = z.infer<typeof movementPatternSchema>

export const muscleSchema = z.enum([
  'chest', 'front_delts', 'side_delts', 'rear_delts', 'triceps', 'biceps', 'forearms', 'lats',
  'upper_back', 'traps', 'lower_back', 'quads', 'hamstrings', 'glutes', 'adductors', 'calves', 'abs',
])
export type Muscle = z.infer<typeof muscleSchema>

/**
 * How an exercise is loaded; the engine maps each to an equipment kind that knows its loads.
 * `sled`: a plate-loaded machine (leg press, hack squat), plates on a sled whose own mass counts.
 */
export const exerciseEquipmentSchema = z.enum(['barbell', 'dumbbell', 'machine', 'cable', 'bodyweight', 'sled'])
export type ExerciseEquipment = z.infer<typeof exerciseEquipmentSchema>

/**
 * How the logged load relates to the load moved: as logged (barbell, dumbbell, machine), added to
 * the lifter's body mass (a weighted chin-up logs the belt plate), or help taken from it (an
 * assisted pull-up logs the assistance).
 */
export const loadModeSchema = z.enum(['external', 'bodyweight', 'assisted'])
export type LoadModeValue = z.infer<typeof loadModeSchema>

export const exerciseSchema = z.object({
  id: z.int(),
  name: z.string(),
  pattern: movementPatternSchema,
  primaryMuscles: z.array(muscleSchema),
  secondaryMuscles: z.array(muscleSchema),
  equipmentKind: exerciseEquipmentSchema,
  loadMode: loadModeSchema,
  /** The exercise's own smallest load step in kg; 0: the smallest step the lifter's equipment makes. */
  loadStepKg: z.number().check(z.gte(0)),
  defaultRestSec: z.int().check(z.positive()),
  custom: z.boolean(),
})
export type Exercise = z.infer<typeof exerciseSchema>

export const createExerciseSchema = z.extend(z.omit(exerciseSchema, { id: true, custom: true }), {
  name: z.string().check(z.trim(), z.minLength(2), z.maxLength(80)),
  primaryMuscles: z.array(muscleSchema).check(z.minLength(1, 'Pick at least one primary muscle')),
  loadStepKg: z._default(z.number().check(z.gte(0), z.lte(50)), 0),
  /** When absent: body weight plus added load for bodyweight equipment, else the weight lifted. */
  loadMode: z.optional(loadModeSchema),
  defaultRestSec: z.int().check(z.gte(15), z.lte(600)),
})
export type CreateExerciseInput = z.infer<typeof createExerciseSchema>

export const listExercisesQuerySchema = z.object({
  q: z.optional(z.string().check(z.trim(), z.maxLength(80))),
  pattern: z.optional(movementPatternSchema),
  muscle: z.optional(muscleSchema),
  equipment: z.optional(exerciseEquipmentSchema),
})
export type ListExercisesQuery = z.infer<typeof listExercisesQuerySchema>
