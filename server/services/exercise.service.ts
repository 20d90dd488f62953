import { Op } from 'sequelize'
import type { CreateExerciseInput, Exercise, ListExercisesQuery } from '@shared/schemas/exercise.schema'
import { CoachAthleteModel, ExerciseModel, type UserModel } from '../db'
import { AppError } from '../errors'

export function toExercise(e: ExerciseModel): Exercise {
  return {
    id: e.id,
    name: e.name,
    pattern: e.pattern as Exercise['pattern'],
    primaryMuscles: e.primaryMuscles as Exercise['primaryMuscles'],
    secondaryMuscles: e.secondaryMuscles as Exercise['secondaryMuscles'],
    equipmentKind: e.equipmentKind as Exercise['equipmentKind'],
    loadStepKg: e.loadStepKg,
    defaultRestSec: e.defaultRestSec,
    custom: e.ownerId !== null,
  }
}

/** The shared library plus the viewer's own exercises (a coach's) or their coaches' (a lifter's). */
export async function listExercises(viewer: UserModel, query: ListExercisesQuery): Promise<Exercise[]> {
  const owners = [viewer.id]
  if (viewer.role === 'lifter') {
    owners.push(...(await CoachAthleteModel.findAll({ where: { athleteId: viewer.id } })).map((l) => l.coachId))
  }
  const rows = await ExerciseModel.findAll({
    where: {
      [Op.or]: [{ ownerId: null }, { ownerId: owners }],
      ...(query.pattern ? { pattern: query.pattern } : {}),
      ...(query.equipment ? { equipmentKind: query.equipment } : {}),
      ...(query.q ? { name: { [Op.like]: `%${query.q.replace(/[%_\\]/g, '')}%` } } : {}),
    },
    order: [['name', 'ASC']],
  })
  const exercises = rows.map(toExercise)
  return query.muscle
    ? exercises.filter((e) => e.primaryMuscles.includes(query.muscle!) || e.secondaryMuscles.includes(query.muscle!))
    : exercises
}

/** A coach's own exercise, visible to them and their athletes. */
export async function createExercise(owner: UserModel, input: CreateExerciseInput): Promise<Exercise> {
  const clash = await ExerciseModel.findOne({ where: { name: input.name, [Op.or]: [{ ownerId: null }, { ownerId: owner.id }] } })
  if (clash) throw AppError.conflict('exercise_exists', 'An exercise with this name is already in your library')
  return toExercise(await ExerciseModel.create({ ...input, ownerId: owner.id }))
}
