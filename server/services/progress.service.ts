import { Op } from 'sequelize'
import { checkPlan, type CheckDay } from '@shared/domain/plan-checks'
import { bestE1rm } from '@shared/domain/records'
import type { BodyWeightInput, Progress, ProgressQuery } from '@shared/schemas/athlete.schema'
import { AssignmentModel, BodyWeightModel, ExerciseModel, SessionModel, SetLogModel, type UserModel } from '../db'
import { AppError } from '../errors'
import { assertCanSeeAthlete } from './access.service'
import { getPlan } from './plan.service'

const DAY_MS = 86_400_000

/** Monday of the week (UTC) a time falls in, as YYYY-MM-DD. */
function weekStart(date: Date): string {
  const day = (date.getUTCDay() + 6) % 7
  return new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate() - day)).toISOString().slice(0, 10)
}

/**
 * Chart data for an athlete: best estimated 1RM per session and exercise, weekly hard sets per
 * muscle (primary 1, secondary 0.5, as the plan checks count them) against the current plan,
 * and body weight.
 */
export async function getProgress(viewer: UserModel, query: ProgressQuery, now = new Date()): Promise<Progress> {
  const athleteId = query.athleteId ?? viewer.id
  if (query.athleteId === undefined && viewer.role !== 'lifter') {
    throw AppError.badRequest('Name the athlete', [{ path: 'query.athleteId', message: 'Required for coaches and admins' }])
  }
  await assertCanSeeAthlete(viewer, athleteId)
  const from = new Date(now.getTime() - query.weeks * 7 * DAY_MS)
  const [sets, weights, assignment] = await Promise.all([
    SetLogModel.findAll({
      attributes: ['sessionId', 'exerciseId', 'loadKg', 'reps'],
      where: { kind: { [Op.ne]: 'warmup' }, reps: { [Op.gt]: 0 }, skipped: false },
      include: [
        { model: SessionModel, as: 'session', attributes: ['completedAt'], where: { athleteId, status: 'completed', completedAt: { [Op.gte]: from } } },
        { model: ExerciseModel, as: 'exercise', attributes: ['name', 'primaryMuscles', 'secondaryMuscles'] },
      ],
    }),
    BodyWeightModel.findAll({ where: { userId: athleteId, measuredOn: { [Op.gte]: from.toISOString().slice(0, 10) } }, order: [['measuredOn', 'ASC']] }),
    AssignmentModel.findOne({ where: { athleteId, active: true } }),
  ])

  const e1rm = new Map<number, { exercise: string; sessions: Map<number, { date: string; sets: Array<{ loadKg: number; reps: number }> }> }>()
  const weekly = new Map<string, number>()
  for (const s of sets) {
    const date = s.session!.completedAt!
    if (s.loadKg !== null && s.loadKg > 0) {
      const entry = e1rm.get(s.exerciseId) ?? { exercise: s.exercise!.name, sessions: new Map() }
      const session = entry.sessions.get(s.sessionId) ?? { date: date.toISOString(), sets: [] }
      session.sets.push({ loadKg: s.loadKg, reps: s.reps! })
      entry.sessions.set(s.sessionId, session)
      e1rm.set(s.exerciseId, entry)
    }
    const week = weekStart(date)
    for (const m of s.exercise!.primaryMuscles) weekly.set(`${week}|${m}`, (weekly.get(`${week}|${m}`) ?? 0) + 1)
    for (const m of s.exercise!.secondaryMuscles) weekly.set(`${week}|${m}`, (weekly.get(`${week}|${m}`) ?? 0) + 0.5)
  }

  let planWeeklySets: Progress['planWeeklySets'] = []
  if (assignment) {
    // The viewer may see the athlete (checked above) and so the plan they are on.
    const plan = await getPlan(viewer, assignment.planId).catch(() => null)
    if (plan) {
      const days: CheckDay[] = plan.days.map((d) => ({
        name: d.name,
        isRest: d.isRest,
        versions: {
          I: d.versions.I.map((s) => ({ role: s.role, exerciseName: s.exerciseName, workingSets: s.scheme.sets.length, primaryMuscles: s.primaryMuscles, secondaryMuscles: s.secondaryMuscles })),
          II: d.versions.II.map((s) => ({ role: s.role, exerciseName: s.exerciseName, workingSets: s.scheme.sets.length, primaryMuscles: s.primaryMuscles, secondaryMuscles: s.secondaryMuscles })),
        },
      }))
      planWeeklySets = checkPlan(days).muscles.map((m) => ({ muscle: m.muscle, sets: m.weeklySets }))
    }
  }

  return {
    e1rm: [...e1rm.entries()]
      .map(([exerciseId, entry]) => ({
        exerciseId,
        exercise: entry.exercise,
        points: [...entry.sessions.values()].sort((a, b) => a.date.localeCompare(b.date)).map((p) => ({ date: p.date, e1rmKg: bestE1rm(p.sets)!.e1rmKg })),
      }))
      .sort((a, b) => a.exercise.localeCompare(b.exercise)),
    weeklySets: [...weekly.entries()]
      .map(([key, n]) => ({ weekStart: key.split('|')[0], muscle: key.split('|')[1], sets: n }))
      .sort((a, b) => a.weekStart.localeCompare(b.weekStart) || a.muscle.localeCompare(b.muscle)),
    planWeeklySets,
    bodyWeight: weights.map((w) => ({ date: w.measuredOn, weightKg: w.weightKg })),
  }
}

/** One body-weight entry per day; logging the same day again replaces it. */
export async function logBodyWeight(lifter: UserModel, input: BodyWeightInput) {
  const existing = await BodyWeightModel.findOne({ where: { userId: lifter.id, measuredOn: input.date } })
  if (existing) await existing.update({ weightKg: input.weightKg })
  else await BodyWeightModel.create({ userId: lifter.id, measuredOn: input.date, weightKg: input.weightKg })
  return { date: input.date, weightKg: input.weightKg }
}
