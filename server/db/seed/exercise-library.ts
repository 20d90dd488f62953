import type { CreateExerciseInput, ExerciseEquipment, Muscle, MovementPattern } from '@shared/schemas/exercise.schema'

/*
 * The shared exercise library: generic names only. Default rest follows the rest-interval
 * research (Schoenfeld et al., JSCR 30(7):1805-1812, 2016; Grgic et al., Sports Med
 * 48(1):137-151, 2018; ACSM position stand 2009): 180 s for heavy multi-joint lifts, 120 s for
 * other compound work, 90 s for isolation. Load steps come from each lifter's own gym (the
 * smallest step their bar, dumbbells or stack can make), so the library sets none (0). Bodyweight
 * lifts count the lifter's body mass plus the added load; an assisted lift counts body mass minus
 * the help.
 */
type Row = [name: string, pattern: MovementPattern, primary: Muscle[], secondary: Muscle[], equipment: ExerciseEquipment, restSec: number]

/** Exercises whose machine helps the lifter up: the logged load is the assistance. */
const ASSISTED = new Set(['Assisted pull-up machine', 'Assisted dip machine'])

const rows: Row[] = [
  // horizontal push
  ['Barbell bench press', 'horizontal_push', ['chest'], ['front_delts', 'triceps'], 'barbell', 180],
  ['Incline barbell bench press', 'horizontal_push', ['chest', 'front_delts'], ['triceps'], 'barbell', 180],
  ['Close-grip bench press', 'horizontal_push', ['triceps', 'chest'], ['front_delts'], 'barbell', 180],
  ['Dumbbell bench press', 'horizontal_push', ['chest'], ['front_delts', 'triceps'], 'dumbbell', 120],
  ['Incline dumbbell press', 'horizontal_push', ['chest', 'front_delts'], ['triceps'], 'dumbbell', 120],
  ['Machine chest press', 'horizontal_push', ['chest'], ['front_delts', 'triceps'], 'machine', 120],
  ['Weighted dip', 'horizontal_push', ['chest', 'triceps'], ['front_delts'], 'bodyweight', 120],
  ['Assisted dip machine', 'horizontal_push', ['chest', 'triceps'], ['front_delts'], 'machine', 120],
  ['Push-up', 'horizontal_push', ['chest'], ['front_delts', 'triceps'], 'bodyweight', 90],
  // vertical push
  ['Standing overhead press', 'vertical_push', ['front_delts'], ['triceps', 'side_delts'], 'barbell', 180],
  ['Seated dumbbell shoulder press', 'vertical_push', ['front_delts'], ['triceps', 'side_delts'], 'dumbbell', 120],
  ['Machine shoulder press', 'vertical_push', ['front_delts'], ['triceps', 'side_delts'], 'machine', 120],
  // chest fly and raises
  ['Cable chest fly', 'chest_fly', ['chest'], ['front_delts'], 'cable', 90],
  ['Dumbbell chest fly', 'chest_fly', ['chest'], ['front_delts'], 'dumbbell', 90],
  ['Machine chest fly', 'chest_fly', ['chest'], ['front_delts'], 'machine', 90],
  ['Dumbbell lateral raise', 'lateral_raise', ['side_delts'], [], 'dumbbell', 90],
  ['Cable lateral raise', 'lateral_raise', ['side_delts'], [], 'cable', 90],
  ['Machine lateral raise', 'lateral_raise', ['side_delts'], [], 'machine', 90],
  ['Reverse cable fly', 'rear_delt', ['rear_delts'], ['upper_back'], 'cable', 90],
  ['Rear delt machine fly', 'rear_delt', ['rear_delts'], ['upper_back'], 'machine', 90],
  ['Face pull', 'rear_delt', ['rear_delts', 'upper_back'], [], 'cable', 90],
  // elbow extension
  ['Cable triceps pushdown', 'elbow_extension', ['triceps'], [], 'cable', 90],
  ['Overhead cable triceps extension', 'elbow_extension', ['triceps'], [], 'cable', 90],
  ['Lying barbell triceps extension', 'elbow_extension', ['triceps'], [], 'barbell', 90],
  ['Dumbbell overhead triceps extension', 'elbow_extension', ['triceps'], [], 'dumbbell', 90],
  // vertical pull
  ['Weighted pull-up', 'vertical_pull', ['lats'], ['biceps', 'upper_back'], 'bodyweight', 180],
  ['Chin-up', 'vertical_pull', ['lats', 'biceps'], ['upper_back'], 'bodyweight', 120],
  ['Wide-grip lat pulldown', 'vertical_pull', ['lats'], ['biceps', 'upper_back'], 'cable', 120],
  ['Close-grip lat pulldown', 'vertical_pull', ['lats'], ['biceps'], 'cable', 120],
  ['Assisted pull-up machine', 'vertical_pull', ['lats'], ['biceps', 'upper_back'], 'machine', 120],
  ['Single-arm cable pulldown', 'vertical_pull', ['lats'], ['biceps'], 'cable', 90],
  // horizontal pull
  ['Barbell bent-over row', 'horizontal_pull', ['upper_back', 'lats'], ['biceps', 'lower_back'], 'barbell', 180],
  ['Chest-supported dumbbell row', 'horizontal_pull', ['upper_back', 'lats'], ['biceps', 'rear_delts'], 'dumbbell', 120],
  ['Single-arm dumbbell row', 'horizontal_pull', ['lats', 'upper_back'], ['biceps'], 'dumbbell', 120],
  ['Seated cable row', 'horizontal_pull', ['upper_back', 'lats'], ['biceps'], 'cable', 120],
  ['Machine chest-supported row', 'horizontal_pull', ['upper_back', 'lats'], ['biceps', 'rear_delts'], 'machine', 120],
  // shrug
  ['Barbell shrug', 'shrug', ['traps'], ['forearms'], 'barbell', 90],
  ['Dumbbell shrug', 'shrug', ['traps'], ['forearms'], 'dumbbell', 90],
  // elbow flexion
  ['Barbell curl', 'elbow_flexion', ['biceps'], ['forearms'], 'barbell', 90],
  ['Incline dumbbell curl', 'elbow_flexion', ['biceps'], ['forearms'], 'dumbbell', 90],
  ['Hammer curl', 'elbow_flexion', ['biceps', 'forearms'], [], 'dumbbell', 90],
  ['Cable curl', 'elbow_flexion', ['biceps'], ['forearms'], 'cable', 90],
  ['Preacher machine curl', 'elbow_flexion', ['biceps'], [], 'machine', 90],
  // squat
  ['Back squat', 'squat', ['quads', 'glutes'], ['adductors', 'lower_back'], 'barbell', 180],
  ['Front squat', 'squat', ['quads'], ['glutes', 'upper_back'], 'barbell', 180],
  ['Hack squat machine', 'squat', ['quads'], ['glutes'], 'sled', 180],
  ['Leg press', 'squat', ['quads', 'glutes'], ['adductors'], 'sled', 120],
  ['Goblet squat', 'squat', ['quads'], ['glutes'], 'dumbbell', 120],
  // hinge
  ['Conventional deadlift', 'hinge', ['glutes', 'hamstrings', 'lower_back'], ['upper_back', 'forearms'], 'barbell', 180],
  ['Romanian deadlift', 'hinge', ['hamstrings', 'glutes'], ['lower_back'], 'barbell', 180],
  ['Dumbbell Romanian deadlift', 'hinge', ['hamstrings', 'glutes'], ['lower_back'], 'dumbbell', 120],
  ['Barbell hip thrust', 'hip_extension', ['glutes'], ['hamstrings'], 'barbell', 120],
  ['Back extension', 'hip_extension', ['glutes', 'lower_back'], ['hamstrings'], 'bodyweight', 90],
  // lunge
  ['Walking dumbbell lunge', 'lunge', ['quads', 'glutes'], ['adductors'], 'dumbbell', 120],
  ['Rear-foot-elevated split squat', 'lunge', ['quads', 'glutes'], ['adductors'], 'dumbbell', 120],
  ['Barbell reverse lunge', 'lunge', ['quads', 'glutes'], ['adductors'], 'barbell', 120],
  // knee flexion and extension
  ['Seated leg curl', 'knee_flexion', ['hamstrings'], [], 'machine', 90],
  ['Lying leg curl', 'knee_flexion', ['hamstrings'], [], 'machine', 90],
  ['Leg extension', 'knee_extension', ['quads'], [], 'machine', 90],
  // calf
  ['Standing calf raise', 'calf', ['calves'], [], 'machine', 90],
  ['Seated calf raise', 'calf', ['calves'], [], 'machine', 90],
  ['Leg press calf raise', 'calf', ['calves'], [], 'machine', 90],
  // core
  ['Cable crunch', 'core', ['abs'], [], 'cable', 90],
  ['Hanging knee raise', 'core', ['abs'], [], 'bodyweight', 90],
  ['Ab wheel rollout', 'core', ['abs'], ['lower_back'], 'bodyweight', 90],
]

export const exerciseLibrary: CreateExerciseInput[] = rows.map(
  ([name, pattern, primaryMuscles, secondaryMuscles, equipmentKind, defaultRestSec]) => ({
    name,
    pattern,
    primaryMuscles,
    secondaryMuscles,
    equipmentKind,
    loadMode: ASSISTED.has(name) ? 'assisted' : equipmentKind === 'bodyweight' ? 'bodyweight' : 'external',
    loadStepKg: 0,
    defaultRestSec,
  }),
)
