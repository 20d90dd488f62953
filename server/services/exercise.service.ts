import { Op, type Transaction } from 'sequelize'
import type { CreateExerciseInput, Exercise, ListExercisesQuery } from '@shared/schemas/exercise.schema'
import {
  CoachAthleteModel, DayVersionModel, ExerciseModel, NextStepModel, PlanDayModel, PlanModel, SessionModel, SetLogModel, SlotModel,
  type UserModel,
} from '../db'
import { AppError } from '../errors'

export function toExercise(e: ExerciseModel): Exercise {
  return {
    id: e.id,
    name: e.name,
    pattern: e.pattern as Exercise['pattern'],
    primaryMuscles: e.primaryMuscles as Exercise['primaryMuscles'],
    secondaryMuscles: e.secondaryMuscles as Exercise['secondaryMuscles'],
    equipmentKind: e.equipmentKind as Exercise['equipmentKind'],
    loadMode: (e.loadMode ?? 'external') as Exercise['loadMode'],
    loadStepKg: e.loadStepKg,
    defaultRestSec: e.defaultRestSec,
    custom: e.ownerId !== null,
  }
}

/** Whose own exercises a user may use besides the shared library: their own, and a lifter's coaches'. */
async function ownersFor(viewer: UserModel, transaction?: Transaction): Promise<number[]> {
  const owners = [viewer.id]
  if (viewer.role === 'lifter') {
    owners.push(...(await CoachAthleteModel.findAll({ where: { athleteId: viewer.id }, transaction })).map((l) => l.coachId))
  }
  return owners
}

/** Every exercise a user may use, in library order (by name). */
export async function usableExercises(viewer: UserModel, transaction?: Transaction): Promise<ExerciseModel[]> {
  const owners = await ownersFor(viewer, transaction)
  return ExerciseModel.findAll({ where: { [Op.or]: [{ ownerId: null }, { ownerId: owners }] }, order: [['name', 'ASC']], transaction })
}

/** The shared library plus the viewer's own exercises (a coach's) or their coaches' (a lifter's). */
export async function listExercises(viewer: UserModel, query: ListExercisesQuery): Promise<Exercise[]> {
  const owners = await ownersFor(viewer)
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
  const loadMode = input.loadMode ?? (input.equipmentKind === 'bodyweight' ? 'bodyweight' : 'external')
  return toExercise(await ExerciseModel.create({ ...input, loadMode, ownerId: owner.id }))
}

/**
 * Before a user's account goes: an exercise they made lives on for everyone who trained with it.
 * Each other user whose sessions, next steps or own plans use it gets a private copy, and their
 * rows point to the copy, so their logbook is unchanged and nobody else sees it.
 */
export async function handOverExercisesOf(user: UserModel, transaction: Transaction) {
  const owned = await ExerciseModel.findAll({ where: { ownerId: user.id }, transaction })
  for (const exercise of owned) {
    const loggedIn = await SetLogModel.findAll({ attributes: ['sessionId'], where: { exerciseId: exercise.id }, group: ['sessionId'], transaction })
    const setUsers = await SessionModel.findAll({
      attributes: ['athleteId'],
      where: { id: loggedIn.map((s) => s.sessionId), athleteId: { [Op.ne]: user.id } },
      transaction,
    })
    const stepUsers = await NextStepModel.findAll({ attributes: ['athleteId'], where: { exerciseId: exercise.id, athleteId: { [Op.ne]: user.id } }, transaction })
    // Slots of other people's own plans (the user's plans go with the account).
    const slots = await SlotModel.findAll({
      attributes: ['id'],
      where: { exerciseId: exercise.id },
      include: [{ model: DayVersionModel, as: 'version', attributes: ['id'], required: true,
        include: [{ model: PlanDayModel, as: 'day', attributes: ['id'], required: true,
          include: [{ model: PlanModel, as: 'plan', attributes: ['ownerId'], required: true, where: { ownerId: { [Op.ne]: user.id } } }] }] }],
      transaction,
    })
    const slotOwner = (slot: SlotModel) => (slot as unknown as { version: { day: { plan: { ownerId: number } } } }).version.day.plan.ownerId
    const heirs = new Set<number>([...setUsers.map((s) => s.athleteId), ...stepUsers.map((s) => s.athleteId), ...slots.map(slotOwner)])
    for (const heirId of heirs) {
      const { id: _id, ownerId: _owner, createdAt: _c, updatedAt: _u, ...fields } = exercise.get({ plain: true })
      const copy = await ExerciseModel.create({ ...fields, ownerId: heirId }, { transaction })
      const sessionIds = (await SessionModel.findAll({ attributes: ['id'], where: { athleteId: heirId }, transaction })).map((s) => s.id)
      await SetLogModel.update({ exerciseId: copy.id }, { where: { exerciseId: exercise.id, sessionId: sessionIds }, transaction })
      await NextStepModel.update({ exerciseId: copy.id }, { where: { exerciseId: exercise.id, athleteId: heirId }, transaction })
      const heirSlots = slots.filter((s) => slotOwner(s) === heirId).map((s) => s.id)
      if (heirSlots.length > 0) await SlotModel.update({ exerciseId: copy.id }, { where: { id: heirSlots }, transaction })
    }
  }
}
