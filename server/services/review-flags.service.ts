import { Op } from 'sequelize'
import { reviewFlags, type ReviewBlock, type ReviewFlag } from '@shared/domain/review-flags'
import { rotationEntry } from '@shared/domain/rotation'
import { AssignmentModel, PlanDayModel, SessionModel, type SetLogModel, type UserModel } from '../db'
import { sessionLifts, type SessionLift } from './session-report.service'
import { slotsOf } from './train.service'

const DAY_MS = 86_400_000
const utcDay = (d: Date) => Math.floor(d.getTime() / DAY_MS)

/** Plan rest days the rotation passed between two sessions of the same assignment. */
async function restDaysBetween(previous: SessionModel, session: SessionModel): Promise<number> {
  if (previous.assignmentId === null || previous.assignmentId !== session.assignmentId) return 0
  if (previous.rotationIndex === null || session.rotationIndex === null) return 0
  const assignment = await AssignmentModel.findByPk(session.assignmentId)
  if (!assignment) return 0
  const days = await PlanDayModel.findAll({ where: { planId: assignment.planId }, order: [['position', 'ASC']], attributes: ['isRest'] })
  let rest = 0
  for (let i = previous.rotationIndex + 1; i < session.rotationIndex; i++) {
    if (days[rotationEntry(i, days.length).dayIndex]?.isRest) rest += 1
  }
  return rest
}

/**
 * The review desk's flags for a completed session, as it looked when it was done: its sets
 * against the lifter's earlier sessions. Computed once when the session is finished.
 */
export async function computeSessionFlags(session: SessionModel, athlete: UserModel, lifts?: SessionLift[]): Promise<ReviewFlag[]> {
  const completedAt = session.completedAt ?? new Date()
  const [all, previous] = await Promise.all([
    lifts ? Promise.resolve(lifts) : sessionLifts(session, athlete),
    SessionModel.findOne({
      where: { athleteId: athlete.id, status: 'completed', id: { [Op.ne]: session.id }, completedAt: { [Op.lt]: completedAt } },
      order: [['completedAt', 'DESC']],
    }),
  ])
  const isDone = (s: SetLogModel) => !s.skipped && s.loggedAt !== null && s.loadKg !== null && (s.reps ?? 0) > 0
  const blocks: ReviewBlock[] = all.map(({ block, report }) => ({
    exercise: block.exercise.name,
    planned: block.sets.filter((s) => s.kind !== 'warmup').map((s) => ({
      kind: s.kind as 'top' | 'backoff' | 'straight',
      repsMin: s.targetRepsMin,
      repsMax: s.targetRepsMax,
      done: isDone(s) ? { loadKg: s.loadKg!, reps: s.reps! } : null,
    })),
    lift: report,
  }))
  const groups = all.map((l) => l.block)
  // Time between consecutive working sets of an exercise against its planned rest: the log
  // times tell whether the lifter waited for the rest clock.
  const slotRests = session.planDayId && session.versionLabel
    ? new Map((await slotsOf(session.planDayId, session.versionLabel)).map((slot) => [slot.id, slot.restSec]))
    : new Map<number, number>()
  const rests = groups.flatMap((g) => {
    const done = g.sets.filter((s) => s.kind !== 'warmup' && !s.skipped && s.loggedAt !== null)
    const planned = (g.slotId !== null ? slotRests.get(g.slotId) : undefined) ?? g.exercise.defaultRestSec
    return done.slice(1).map((s, i) => ({ plannedSec: planned, actualSec: (s.loggedAt!.getTime() - done[i].loggedAt!.getTime()) / 1000 }))
  })
  return reviewFlags({
    blocks,
    rests,
    daysSincePrevious: previous?.completedAt ? utcDay(completedAt) - utcDay(previous.completedAt) : null,
    restDaysBetween: previous ? await restDaysBetween(previous, session) : 0,
  })
}
