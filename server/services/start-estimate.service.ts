import { Op } from 'sequelize'
import { estimateOneRepMax } from '@shared/domain/e1rm'
import { movedLoadKg } from '@shared/domain/lift-progress'
import type { SetStartEstimatesInput, StartEstimatesAnswer } from '@shared/schemas/start-estimate.schema'
import {
  AssignmentModel, DayVersionModel, ExerciseModel, PlanDayModel, SessionModel, SetLogModel, SlotModel, StartEstimateModel,
  UserModel,
} from '../db'
import { AppError } from '../errors'
import { assertCoachOf } from './access.service'
import { bodyMassAt, bodyMassEntries, loadModeOf, slotsForAthlete } from './session-planning.service'

/**
 * A coach's starting estimates for an athlete: every exercise of the athlete's plan (as they train
 * it, with their own swaps), whether they already have history on it, and the kept estimate.
 */
async function athleteOf(coach: UserModel, athleteId: number): Promise<UserModel> {
  await assertCoachOf(coach, athleteId)
  const athlete = await UserModel.findByPk(athleteId)
  if (!athlete) throw AppError.notFound('Athlete')
  return athlete
}

async function planExercises(athlete: UserModel): Promise<ExerciseModel[]> {
  const assignment = await AssignmentModel.findOne({ where: { athleteId: athlete.id, active: true }, order: [['createdAt', 'DESC']] })
  if (!assignment) return []
  const slots = await SlotModel.findAll({
    include: [
      { model: ExerciseModel, as: 'exercise' },
      { model: DayVersionModel, as: 'version', attributes: [], include: [{ model: PlanDayModel, as: 'day', attributes: [], where: { planId: assignment.planId } }] },
    ],
    order: [['id', 'ASC']],
  })
  const seen = new Map<number, ExerciseModel>()
  for (const { exercise } of await slotsForAthlete(athlete.id, slots)) if (!seen.has(exercise.id)) seen.set(exercise.id, exercise)
  return [...seen.values()]
}

async function answerFor(athlete: UserModel): Promise<StartEstimatesAnswer> {
  const exercises = await planExercises(athlete)
  const ids = exercises.map((e) => e.id)
  const [estimates, logged] = await Promise.all([
    StartEstimateModel.findAll({ where: { athleteId: athlete.id, exerciseId: ids } }),
    ids.length === 0 ? Promise.resolve([]) : SetLogModel.findAll({
      attributes: ['exerciseId'],
      where: { exerciseId: ids, kind: { [Op.ne]: 'warmup' }, reps: { [Op.gt]: 0 }, skipped: false },
      include: [{ model: SessionModel, as: 'session', attributes: [], where: { athleteId: athlete.id, status: 'completed' } }],
      group: ['exerciseId'],
    }),
  ])
  const withHistory = new Set(logged.map((r) => r.exerciseId))
  return {
    estimates: exercises.map((e) => {
      const kept = estimates.find((s) => s.exerciseId === e.id)
      return {
        exerciseId: e.id,
        exerciseName: e.name,
        hasHistory: withHistory.has(e.id),
        e1rmKg: kept?.e1rmKg ?? null,
        loadKg: kept?.loadKg ?? null,
        reps: kept?.reps ?? null,
        setBy: kept ? (kept.source === 'coach' ? 'coach' : 'lifter') : null,
      }
    }),
  }
}

export async function startEstimatesFor(coach: UserModel, athleteId: number): Promise<StartEstimatesAnswer> {
  return answerFor(await athleteOf(coach, athleteId))
}

/** Keeps the coach's recent sets as the athlete's starting estimates (Epley's estimate of the load moved). */
export async function setStartEstimates(coach: UserModel, athleteId: number, input: SetStartEstimatesInput): Promise<StartEstimatesAnswer> {
  const athlete = await athleteOf(coach, athleteId)
  const inPlan = new Map((await planExercises(athlete)).map((e) => [e.id, e]))
  const bodyMassKg = bodyMassAt(await bodyMassEntries(athlete.id), null)
  await StartEstimateModel.sequelize!.transaction(async (transaction) => {
    for (const entry of input.estimates) {
      const exercise = inPlan.get(entry.exerciseId)
      if (!exercise) throw AppError.badRequest('That exercise is not in the athlete\'s plan', [{ path: 'estimates', message: 'Not in the plan' }])
      const moved = movedLoadKg(entry.loadKg, { mode: loadModeOf(exercise), bodyMassKg }) ?? entry.loadKg
      if (!(moved > 0)) {
        throw AppError.badRequest('A starting set needs a load', [{ path: 'estimates', message: `${exercise.name}: the load moved must be above zero` }])
      }
      const e1rmKg = estimateOneRepMax(moved, entry.reps).e1rm
      const values = { e1rmKg, loadKg: entry.loadKg, reps: entry.reps, source: 'coach' as const, setBy: coach.id }
      const [row, created] = await StartEstimateModel.findOrCreate({
        where: { athleteId: athlete.id, exerciseId: exercise.id },
        defaults: { athleteId: athlete.id, exerciseId: exercise.id, ...values },
        transaction,
      })
      if (!created) await row.update(values, { transaction })
    }
  })
  return answerFor(athlete)
}
