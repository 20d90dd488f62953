import { Op, fn, col } from 'sequelize'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import { AssignmentModel, CoachAthleteModel, PlanModel, SessionModel, UserModel } from '../db'

const DAY_MS = 24 * 60 * 60 * 1000

/** The coach's athletes with their plan and recent activity, in a fixed number of queries. */
export async function listAthletes(coach: UserModel, now = new Date()): Promise<AthleteRow[]> {
  const links = await CoachAthleteModel.findAll({ where: { coachId: coach.id } })
  const athleteIds = links.map((l) => l.athleteId)
  if (athleteIds.length === 0) return []

  const [athletes, assignments, lastSessions, recentCounts] = await Promise.all([
    UserModel.findAll({ where: { id: athleteIds }, order: [['name', 'ASC']] }),
    AssignmentModel.findAll({
      where: { athleteId: athleteIds, active: true },
      include: [{ model: PlanModel, as: 'plan', attributes: ['name'] }],
    }),
    SessionModel.findAll({
      attributes: ['athleteId', [fn('MAX', col('completed_at')), 'lastCompletedAt']],
      where: { athleteId: athleteIds, status: 'completed' },
      group: ['athleteId'],
      raw: true,
    }) as unknown as Promise<Array<{ athleteId: number; lastCompletedAt: string | Date | null }>>,
    SessionModel.findAll({
      attributes: ['athleteId', [fn('COUNT', col('id')), 'count']],
      where: { athleteId: athleteIds, status: 'completed', completedAt: { [Op.gte]: new Date(now.getTime() - 28 * DAY_MS) } },
      group: ['athleteId'],
      raw: true,
    }) as unknown as Promise<Array<{ athleteId: number; count: number | string }>>,
  ])

  const planByAthlete = new Map(assignments.map((a) => [a.athleteId, a.plan?.name ?? null]))
  const lastByAthlete = new Map(lastSessions.map((s) => [s.athleteId, s.lastCompletedAt]))
  const countByAthlete = new Map(recentCounts.map((c) => [c.athleteId, Number(c.count)]))
  return athletes.map((a) => {
    const last = lastByAthlete.get(a.id)
    return {
      id: a.id,
      name: a.name,
      email: a.email,
      unit: a.unit,
      planName: planByAthlete.get(a.id) ?? null,
      lastSessionAt: last ? new Date(last).toISOString() : null,
      sessionsLast28Days: countByAthlete.get(a.id) ?? 0,
    }
  })
}
