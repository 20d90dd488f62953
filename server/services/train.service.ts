import type { Today, TodayQuery, TodaySlot } from '@shared/schemas/train.schema'
import { todayInRotation, type TodayInRotation } from '@shared/domain/rotation'
import { describeScheme } from '@shared/domain/scheme-summary'
import {
  AssignmentModel, DayVersionModel, ExerciseModel, PlanDayModel, PlanModel, SessionModel, SlotModel,
  type UserModel,
} from '../db'
import { planDay } from './session-planning.service'

const DAY_MS = 86_400_000

/** Whole calendar days between the last session and the lifter's today, on the lifter's clock. */
export function calendarDaysSince(last: Date | null, query: TodayQuery, now = new Date()): number | null {
  if (!last) return null
  const localDay = (d: Date) => Math.floor((d.getTime() - query.tzOffset * 60_000) / DAY_MS)
  const today = query.date ? Math.floor(Date.parse(`${query.date}T00:00:00Z`) / DAY_MS) : localDay(now)
  return today - localDay(last)
}

export interface ResolvedToday {
  assignment: AssignmentModel | null
  days: PlanDayModel[]
  today: TodayInRotation | null
  lastSession: SessionModel | null
}

/** The lifter's active assignment and where today falls in its rotation. */
export async function resolveToday(lifter: UserModel, query: TodayQuery): Promise<ResolvedToday> {
  const [lastSession, assignment] = await Promise.all([
    SessionModel.findOne({ where: { athleteId: lifter.id, status: 'completed' }, order: [['completedAt', 'DESC']] }),
    AssignmentModel.findOne({
      where: { athleteId: lifter.id, active: true },
      include: [{ model: PlanModel, as: 'plan' }],
      order: [['createdAt', 'DESC']],
    }),
  ])
  if (!assignment?.plan) return { assignment: null, days: [], today: null, lastSession }
  const days = await PlanDayModel.findAll({ where: { planId: assignment.planId }, order: [['position', 'ASC']] })
  if (days.length === 0 || days.every((d) => d.isRest)) return { assignment, days, today: null, lastSession }
  const today = todayInRotation(
    assignment.rotationIndex,
    days.map((d) => d.isRest),
    calendarDaysSince(lastSession?.completedAt ?? null, query),
  )
  return { assignment, days, today, lastSession }
}

/** A day version's slots with their exercises, in order. */
export async function slotsOf(planDayId: number, label: 'I' | 'II') {
  const version = await DayVersionModel.findOne({
    where: { planDayId, label },
    include: [{ model: SlotModel, as: 'slots', include: [{ model: ExerciseModel, as: 'exercise' }] }],
    order: [[{ model: SlotModel, as: 'slots' }, 'position', 'ASC']],
  })
  return version?.slots ?? []
}

/** What is next in the lifter's plan rotation, with a preview of its exercises and targets. */
export async function getToday(lifter: UserModel, query: TodayQuery): Promise<Today> {
  const { assignment, days, today, lastSession } = await resolveToday(lifter, query)
  const inProgress = await SessionModel.findOne({ where: { athleteId: lifter.id, status: 'in_progress' }, attributes: ['id'] })
  const base = {
    planDays: days.map((d) => ({ id: d.id, name: d.name, isRest: d.isRest })),
    inProgressSessionId: inProgress?.id ?? null,
    lastSession: lastSession
      ? {
          id: lastSession.id,
          completedAt: lastSession.completedAt?.toISOString() ?? null,
          dayName: lastSession.dayName,
          version: lastSession.versionLabel,
        }
      : null,
  }
  if (!assignment?.plan) return { plan: null, day: null, nextTraining: null, ...base }
  const plan = { id: assignment.plan.id, name: assignment.plan.name }
  if (!today) return { plan, day: null, nextTraining: null, ...base }

  const day = days[today.dayIndex]
  const nextTraining = today.nextTraining
    ? { dayId: days[today.nextTraining.dayIndex].id, name: days[today.nextTraining.dayIndex].name, version: today.nextTraining.version }
    : null
  const slots = day.isRest ? [] : await slotsOf(day.id, today.version)
  const planned = await planDay(lifter, slots)
  const preview: TodaySlot[] = planned.map(({ block, planned: sets }) => ({
    slotId: block.slotId!,
    exerciseName: block.exercise.name,
    role: block.role,
    scheme: describeScheme(slots.find((s) => s.id === block.slotId)?.scheme),
    targets: sets
      .filter((p) => p.kind !== 'warmup')
      .map((p) => ({
        kind: p.kind as 'top' | 'backoff' | 'straight',
        targetLoadKg: p.targetLoadKg,
        repsMin: p.targetRepsMin,
        repsMax: p.targetRepsMax,
        targetReps: p.targetReps,
      })),
  }))
  return {
    plan,
    day: { id: day.id, name: day.name, isRest: day.isRest, version: today.version, slots: preview },
    nextTraining,
    ...base,
  }
}
