import { CoachAthleteModel, type UserModel } from '../db'
import { AppError } from '../errors'

export async function isCoachOf(coachId: number, athleteId: number): Promise<boolean> {
  return (await CoachAthleteModel.count({ where: { coachId, athleteId } })) > 0
}

/**
 * Ownership rule for an athlete's data: the lifter themself, a coach linked to them, or an admin.
 * Answers 404 rather than 403 so that nobody learns which ids exist.
 */
export async function assertCanSeeAthlete(viewer: UserModel, athleteId: number, what = 'Athlete') {
  if (viewer.role === 'admin' || viewer.id === athleteId) return
  if (viewer.role === 'coach' && (await isCoachOf(viewer.id, athleteId))) return
  throw AppError.notFound(what)
}

/**
 * Stricter rule for what a coach changes for an athlete (their gym): only a coach linked to them.
 * Answers 404 like assertCanSeeAthlete, so nobody learns which ids exist.
 */
export async function assertCoachOf(viewer: UserModel, athleteId: number, what = 'Athlete') {
  if (viewer.role === 'coach' && (await isCoachOf(viewer.id, athleteId))) return
  throw AppError.notFound(what)
}

/**
 * May this user train with this exercise? The shared library, their own, or (a lifter) one of
 * their coaches'. Another coach's own exercises stay that coach's.
 */
export async function canUseExercise(user: UserModel, exercise: { ownerId: number | null }): Promise<boolean> {
  if (exercise.ownerId === null || exercise.ownerId === user.id) return true
  return user.role === 'lifter' && (await isCoachOf(exercise.ownerId, user.id))
}
