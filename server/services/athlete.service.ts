import { Op, fn, col, literal } from 'sequelize'
import { bestE1rm } from '@shared/domain/records'
import { defaultTrainingDaysPerWeek } from '@shared/domain/plan-checks'
import type { ReviewFlag } from '@shared/domain/review-flags'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import {
  AssignmentModel, CoachAthleteModel, ExerciseModel, PlanDayModel, PlanModel, SessionModel, SetLogModel, UserModel,
} from '../db'
import { isoFromStored } from '../db/stored-values'

const DAY_MS = 24 * 60 * 60 * 1000
const ADHERENCE_DAYS = 28
const TREND_DAYS = 56
const PLATEAU_DAYS = 14

/**
 * The coach's athletes with plan, activity, adherence, plateaus, review backlog and the
 * estimated-1RM trend of their main lifts, in a fixed number of queries whatever the number
 * of athletes.
 */
interface TrendRow {
  sessionId: number
  loadKg: number
  reps: number
  session: { athleteId: number; completedAt: string | Date }
  exercise: { name: string | null } | null
}

interface RecentRow {
  athleteId: number
  completedAt: string | Date
  /** JSON text in a raw row. */
  summary: string | { flags?: ReviewFlag[] } | null
}

function storedSummary(value: RecentRow['summary']): { flags?: ReviewFlag[] } | null {
  return typeof value === 'string' ? (JSON.parse(value) as { flags?: ReviewFlag[] } | null) : value
}

function groupBy<T>(rows: T[], key: (row: T) => number): Map<number, T[]> {
  const groups = new Map<number, T[]>()
  for (const row of rows) {
    const group = groups.get(key(row))
    if (group) group.push(row)
    else groups.set(key(row), [row])
  }
  return groups
}

export async function listAthletes(coach: UserModel, now = new Date()): Promise<AthleteRow[]> {
  const links = await CoachAthleteModel.findAll({ where: { coachId: coach.id } })
  const athleteIds = links.map((l) => l.athleteId)
  if (athleteIds.length === 0) return []
  const since = (days: number) => new Date(now.getTime() - days * DAY_MS)

  const [athletes, assignments, lastSessions, recent, waiting, trendSets] = await Promise.all([
    UserModel.findAll({ where: { id: athleteIds }, order: [['name', 'ASC']] }),
    AssignmentModel.findAll({
      where: { athleteId: athleteIds, active: true },
      include: [{ model: PlanModel, as: 'plan', attributes: ['name'], include: [{ model: PlanDayModel, as: 'days', attributes: ['isRest'] }] }],
    }),
    SessionModel.findAll({
      attributes: ['athleteId', [fn('MAX', col('completed_at')), 'lastCompletedAt']],
      where: { athleteId: athleteIds, status: 'completed' },
      group: ['athleteId'],
      raw: true,
    }) as unknown as Promise<Array<{ athleteId: number; lastCompletedAt: string | Date | null }>>,
    // Plain rows: about ten per athlete, and each model instance's getters cost more than the query.
    SessionModel.findAll({
      attributes: ['athleteId', 'completedAt', 'summary'],
      where: { athleteId: athleteIds, status: 'completed', completedAt: { [Op.gte]: since(ADHERENCE_DAYS) } },
      raw: true,
    }) as unknown as Promise<RecentRow[]>,
    // Completed sessions nobody has reviewed, counted in the database (reviews has an index on session_id).
    SessionModel.findAll({
      attributes: ['athleteId', [fn('COUNT', col('id')), 'count']],
      where: { athleteId: athleteIds, status: 'completed', id: { [Op.notIn]: literal('(SELECT session_id FROM reviews)') } },
      group: ['athleteId'],
      raw: true,
    }) as unknown as Promise<Array<{ athleteId: number; count: number }>>,
    // Thousands of rows for a big team: plain rows, not model instances (building those cost most of the time).
    SetLogModel.findAll({
      attributes: ['sessionId', 'exerciseId', 'loadKg', 'reps'],
      where: { role: 'compound_primary', kind: { [Op.ne]: 'warmup' }, reps: { [Op.gt]: 0 }, loadKg: { [Op.gt]: 0 }, skipped: false },
      include: [
        { model: SessionModel, as: 'session', attributes: ['athleteId', 'completedAt'], where: { athleteId: athleteIds, status: 'completed', completedAt: { [Op.gte]: since(TREND_DAYS) } } },
        { model: ExerciseModel, as: 'exercise', attributes: ['name'] },
      ],
      raw: true,
      nest: true,
    }) as unknown as Promise<TrendRow[]>,
  ])
  // Each list grouped by athlete once, so building a row does not search every list (153 × 1,600).
  const trendByAthlete = groupBy(trendSets, (row) => row.session.athleteId)
  const recentByAthlete = groupBy(recent, (row) => row.athleteId)
  const assignmentByAthlete = new Map(assignments.map((x) => [x.athleteId, x]))
  const lastByAthlete = new Map(lastSessions.map((x) => [x.athleteId, x.lastCompletedAt]))
  const waitingByAthlete = new Map(waiting.map((x) => [x.athleteId, Number(x.count)]))
  const plateauSince = since(PLATEAU_DAYS).getTime()

  return athletes.map((a) => {
    const assignment = assignmentByAthlete.get(a.id)
    const last = lastByAthlete.get(a.id)
    const mine = recentByAthlete.get(a.id) ?? []
    let planned: number | null = null
    if (assignment?.plan) {
      const days = (assignment.plan.days ?? []).map((d) => ({ name: '', isRest: d.isRest, versions: { I: [], II: [] } }))
      const activeDays = Math.min(ADHERENCE_DAYS, Math.max(0, (now.getTime() - Date.parse(`${assignment.startDate}T00:00:00Z`)) / DAY_MS))
      planned = Math.round((defaultTrainingDaysPerWeek(days) * activeDays) / 7)
    }
    const plateauLifts = [
      ...new Set(
        mine
          .filter((s) => Date.parse(isoFromStored(s.completedAt)) >= plateauSince)
          .flatMap((s) => (storedSummary(s.summary)?.flags ?? []).filter((f) => f.code === 'plateau').map((f) => f.exercise ?? '')),
      ),
    ].filter(Boolean)
    // Best estimated 1RM per session on each main lift, oldest first.
    const byLift = new Map<string, Map<number, { date: string; sets: Array<{ loadKg: number; reps: number }> }>>()
    for (const s of trendByAthlete.get(a.id) ?? []) {
      const lift = s.exercise?.name ?? ''
      const sessions = byLift.get(lift) ?? new Map()
      const entry = sessions.get(s.sessionId) ?? { date: isoFromStored(s.session.completedAt), sets: [] }
      entry.sets.push({ loadKg: Number(s.loadKg), reps: Number(s.reps) })
      sessions.set(s.sessionId, entry)
      byLift.set(lift, sessions)
    }
    const e1rmTrend = [...byLift.entries()].map(([exercise, sessions]) => ({
      exercise,
      points: [...sessions.values()]
        .sort((x, y) => x.date.localeCompare(y.date))
        .map((e) => ({ date: e.date, e1rmKg: bestE1rm(e.sets)!.e1rmKg })),
    }))
    return {
      id: a.id,
      name: a.name,
      email: a.email,
      unit: a.unit,
      planId: assignment?.planId ?? null,
      planName: assignment?.plan?.name ?? null,
      lastSessionAt: last ? new Date(last).toISOString() : null,
      sessionsLast28Days: mine.length,
      plannedLast28Days: planned,
      adherencePct: planned ? Math.round((mine.length / planned) * 100) : null,
      plateauLifts,
      waitingReview: waitingByAthlete.get(a.id) ?? 0,
      e1rmTrend,
    }
  })
}
