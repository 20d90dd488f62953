import type { ExerciseEquipment, Muscle, MovementPattern } from '@shared/schemas/exercise.schema'

/* Plain words for the exercise library's codes, for the plan builder's filters and checks. */

export const MUSCLE_LABELS: Record<Muscle, string> = {
  chest: 'Chest',
  front_delts: 'Front delts',
  side_delts: 'Side delts',
  rear_delts: 'Rear delts',
  triceps: 'Triceps',
  biceps: 'Biceps',
  forearms: 'Forearms',
  lats: 'Lats',
  upper_back: 'Upper back',
  traps: 'Traps',
  lower_back: 'Lower back',
  quads: 'Quads',
  hamstrings: 'Hamstrings',
  glutes: 'Glutes',
  adductors: 'Adductors',
  calves: 'Calves',
  abs: 'Abs',
}

export const PATTERN_LABELS: Record<MovementPattern, string> = {
  horizontal_push: 'Horizontal push',
  vertical_push: 'Vertical push',
  horizontal_pull: 'Horizontal pull',
  vertical_pull: 'Vertical pull',
  squat: 'Squat',
  hinge: 'Hinge',
  lunge: 'Lunge',
  knee_flexion: 'Knee flexion (leg curl)',
  knee_extension: 'Knee extension',
  hip_extension: 'Hip extension',
  calf: 'Calf raise',
  elbow_flexion: 'Elbow flexion (curl)',
  elbow_extension: 'Elbow extension',
  lateral_raise: 'Lateral raise',
  chest_fly: 'Chest fly',
  rear_delt: 'Rear delt',
  shrug: 'Shrug',
  core: 'Core',
}

export const EQUIPMENT_LABELS: Record<ExerciseEquipment, string> = {
  barbell: 'Barbell',
  dumbbell: 'Dumbbell',
  machine: 'Machine',
  cable: 'Cable',
  bodyweight: 'Bodyweight',
  sled: 'Plate-loaded sled',
}

/** A muscle code in plain words; unknown codes lose their underscores. */
export function muscleLabel(code: string): string {
  return (MUSCLE_LABELS as Record<string, string>)[code] ?? code.replaceAll('_', ' ')
}
