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

/** How an exercise is loaded; the engine maps each to an equipment kind that knows its loads. */
export const exerciseEquipmentSchema = z.enum(['barbell', 'dumbbell', 'machine', 'cable', 'bodyweight'])
export type ExerciseEquipment = z.infer<typeof exerciseEquipmentSchema>

export const exerciseSchema = z.object({
  id: z.int(),
  name: z.string(),
  pattern: movementPatternSchema,
  primaryMuscles: z.array(muscleSchema),
  secondaryMuscles: z.array(muscleSchema),
  equipmentKind: exerciseEquipmentSchema,
  loadStepKg: z.number().check(z.positive()),
  defaultRestSec: z.int().check(z.positive()),
  custom: z.boolean(),
})
export type Exercise = z.infer<typeof exerciseSchema>

export const createExerciseSchema = z.extend(z.omit(exerciseSchema, { id: true, custom: true }), {
  name: z.string().check(z.trim(), z.minLength(2), z.maxLength(80)),
  primaryMuscles: z.array(muscleSchema).check(z.minLength(1, 'Pick at least one primary muscle')),
  loadStepKg: z.number().check(z.positive(), z.lte(50)),
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
