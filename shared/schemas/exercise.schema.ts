import { z } from 'zod'

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
  id: z.number().int(),
  name: z.string(),
  pattern: movementPatternSchema,
  primaryMuscles: z.array(muscleSchema),
  secondaryMuscles: z.array(muscleSchema),
  equipmentKind: exerciseEquipmentSchema,
  loadStepKg: z.number().positive(),
  defaultRestSec: z.number().int().positive(),
  custom: z.boolean(),
})
export type Exercise = z.infer<typeof exerciseSchema>

export const createExerciseSchema = exerciseSchema.omit({ id: true, custom: true }).extend({
  name: z.string().trim().min(2).max(80),
  primaryMuscles: z.array(muscleSchema).min(1, 'Pick at least one primary muscle'),
  loadStepKg: z.number().positive().max(50),
  defaultRestSec: z.number().int().min(15).max(600),
})
export type CreateExerciseInput = z.infer<typeof createExerciseSchema>

export const listExercisesQuerySchema = z.object({
  q: z.string().trim().max(80).optional(),
  pattern: movementPatternSchema.optional(),
  muscle: muscleSchema.optional(),
  equipment: exerciseEquipmentSchema.optional(),
})
export type ListExercisesQuery = z.infer<typeof listExercisesQuerySchema>
