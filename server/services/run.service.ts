import { randomUUID } from 'node:crypto'
import { Op, QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { isLoadable, roundDownToLoadable } from '@shared/domain/equipment'
import { backoffTarget, DEFAULT_REST_SECONDS, type SlotRole } from '@shared/domain/schemes'
import { sessionTotals } from '@shared/domain/summary'
import type {
  AddExerciseInput, CompleteSessionInput, LogSetInput, RunSession, RunSet, StartSessionInput, SwapExerciseInput,
  TakeNextStepsInput,
} from '@shared/schemas/run.schema'
import type { TodayQuery } from '@shared/schemas/train.schema'
import {
  AssignmentModel, CommentModel, ExerciseModel, NextStepModel, PlanDayModel, SessionModel, SetLogModel, SlotModel, UserModel,
} from '../db'
import { upsertOwnSetLog } from '../db/set-log-upsert'
import { AppError } from '../errors'
import { canUseExercise } from './access.service'
import { toSessionSummary } from './presenters'
import { computeSessionFlags } from './review-flags.service'
import { sessionForViewer } from './session.service'
import { buildReport } from './session-report.service'
import {
  blockKey, equipmentOf, gymOf, historyFor, parseScheme, planBlock,
} from './session-planning.service'
import { resolveToday, slotsOf } from './train.service'

/** Sets of block i sit at positions i*100 .. i*100+99, so adding or swapping never renumbers others. */
const BLOCK_STRIDE = 100

export function toRunSet(set: SetLogModel): RunSet {
  return {
    id: set.id,
    exerciseId: set.exerciseId,
    slotId: set.slotId,
    position: set.position,
    kind: set.kind,
    targetLoadKg: set.targetLoadKg,
    targetRepsMin: set.targetRepsMin,
    targetRepsMax: set.targetRepsMax,
    targetReps: set.targetReps ?? null,
    toFailure: set.toFailure,
    targetRir: set.targetRir,
    loadKg: set.loadKg,
    reps: set.reps,
    rir: set.rir,
    failure: set.failure,
    skipped: set.skipped,
    note: set.note,
    loggedAt: set.loggedAt?.toISOString() ?? null,
    editedAt: set.editedAt?.toISOString() ?? null,
  }
}

/** The set as `toRunSet` would read it back after storing `input` (dates to the millisecond). */
function storedSet(id: string, input: LogSetInput): RunSet {
  return {
    id, exerciseId: input.exerciseId, slotId: input.slotId, position: input.position, kind: input.kind,
    targetLoadKg: input.targetLoadKg, targetRepsMin: input.targetRepsMin, targetRepsMax: input.targetRepsMax,
    targetReps: input.targetReps, toFailure: input.toFailure, targetRir: input.targetRir, loadKg: input.loadKg,
    reps: input.reps, rir: input.rir, failure: input.failure, skipped: input.skipped, note: input.note,
    loggedAt: input.loggedAt ? new Date(input.loggedAt).toISOString() : null,
    editedAt: new Date(input.editedAt).toISOString(),
  }
}

async function ownSession(lifter: UserModel, sessionId: number, transaction?: Transaction) {
  const session = await SessionModel.findByPk(sessionId, { transaction })
  // Only the lifter runs their own session; anyone else is told it does not exist.
  if (!session || session.athleteId !== lifter.id) throw AppError.notFound('Session')
  return session
}

function assertRunning(session: SessionModel) {
  if (session.status === 'completed') throw AppError.conflict('session_completed', 'This session is already finished')
}

/** Planned sets for one block, as rows to insert. */
function plannedRows(input: {
  sessionId: number
  exercise: ExerciseModel
  slotId: number | null
  role: SlotRole
  scheme: unknown
  restSec: number
  blockIndex: number
  gym: Awaited<ReturnType<typeof gymOf>>
  history: Awaited<ReturnType<typeof historyFor>>
}) {
  const planned = planBlock({
    role: input.role,
    scheme: parseScheme(input.scheme),
    equipment: equipmentOf(input.gym, input.exercise),
    history: input.history.get(blockKey(input.exercise.id, input.slotId)),
    restSec: input.restSec,
  })
  return planned.map((p) => ({
    id: randomUUID(),
    sessionId: input.sessionId,
    exerciseId: input.exercise.id,
    slotId: input.slotId,
    role: input.role,
    position: input.blockIndex * BLOCK_STRIDE + p.position,
    kind: p.kind,
    targetLoadKg: p.targetLoadKg,
    targetRepsMin: p.targetRepsMin,
    targetRepsMax: p.targetRepsMax,
    targetReps: p.targetReps,
    toFailure: p.toFailure,
    targetRir: p.targetRir,
    loadKg: null,
    reps: null,
    rir: null,
    note: null,
    loggedAt: null,
  }))
}

/** The runner's whole view of a session: sets, and per exercise its equipment and last time. */
export async function runSessionView(session: SessionModel, athlete: UserModel): Promise<RunSession> {
  const sets = await SetLogModel.findAll({
    where: { sessionId: session.id },
    include: [{ model: ExerciseModel, as: 'exercise' }],
    order: [['position', 'ASC']],
  })
  const blocks: Array<{ exercise: ExerciseModel; slotId: number | null; role: SlotRole }> = []
  for (const set of sets) {
    if (!blocks.some((b) => b.exercise.id === set.exerciseId && b.slotId === set.slotId)) {
      blocks.push({ exercise: set.exercise!, slotId: set.slotId, role: (set.role ?? 'accessory') as SlotRole })
    }
  }
  const slotRest = new Map<number, number>()
  if (session.planDayId && session.versionLabel) {
    for (const slot of await slotsOf(session.planDayId, session.versionLabel)) slotRest.set(slot.id, slot.restSec)
  }
  const [gym, history] = await Promise.all([
    gymOf(athlete),
    historyFor(athlete.id, blocks.map((b) => ({ exerciseId: b.exercise.id, slotId: b.slotId })), session.id),
  ])
  // The coach's comments on each exercise's sets last time, shown on the set card.
  const lastSessionIds = [...new Set([...history.values()].map((h) => h.exposures.at(-1)?.sessionId).filter((id): id is number => id !== undefined))]
  const comments = lastSessionIds.length
    ? await CommentModel.findAll({
        where: { sessionId: lastSessionIds, setLogId: { [Op.ne]: null } },
        include: [
          { model: UserModel, as: 'author', attributes: ['name', 'role'], where: { role: 'coach' } },
          { model: SetLogModel, as: 'setLog', attributes: ['exerciseId'] },
        ],
        order: [['createdAt', 'ASC']],
      })
    : []
  return {
    ...toSessionSummary(session),
    exercises: blocks.map(({ exercise, slotId, role }) => {
      const blockHistory = history.get(blockKey(exercise.id, slotId))
      const last = blockHistory?.exposures.at(-1)
      return {
        exerciseId: exercise.id,
        slotId,
        name: exercise.name,
        pattern: exercise.pattern,
        role,
        restSec: (slotId !== null ? slotRest.get(slotId) : undefined) ?? DEFAULT_REST_SECONDS[role],
        equipment: equipmentOf(gym, exercise),
        lastTime: (last?.sets ?? []).map((s) => ({ kind: s.kind, loadKg: s.loadKg, reps: s.reps, rir: s.rir ?? null })),
        lastTimeAt: last?.at ?? null,
        coachComments: comments
          .filter((c) => c.sessionId === last?.sessionId && (c as CommentModel & { setLog?: SetLogModel }).setLog?.exerciseId === exercise.id)
          .map((c) => ({ body: c.body, author: (c as CommentModel & { author?: UserModel }).author?.name ?? '', createdAt: c.createdAt.toISOString() })),
        nextStepBy: blockHistory?.takenBy ?? null,
      }
    }),
    sets: sets.map(toRunSet),
  }
}

export async function currentSession(lifter: UserModel): Promise<RunSession | null> {
  const session = await SessionModel.findOne({ where: { athleteId: lifter.id, status: 'in_progress' }, order: [['id', 'DESC']] })
  return session ? runSessionView(session, lifter) : null
}

export async function getRunSession(lifter: UserModel, sessionId: number): Promise<RunSession> {
  return runSessionView(await ownSession(lifter, sessionId), lifter)
}

/**
 * Starts today's session (or another day of the plan, or an empty one) with its planned sets,
 * so that a reload, another device or the coach sees the same plan. A session already in
 * progress is returned instead of starting a second one.
 */
export async function startSession(lifter: UserModel, input: StartSessionInput, query: TodayQuery, now = new Date()) {
  const existing = await SessionModel.findOne({ where: { athleteId: lifter.id, status: 'in_progress' } })
  if (existing) return { created: false, session: await runSessionView(existing, lifter) }

  let day: PlanDayModel | null = null
  let version: 'I' | 'II' | null = null
  let rotationIndex: number | null = null
  let assignmentId: number | null = null
  if (!input.empty) {
    const resolved = await resolveToday(lifter, query)
    if (!resolved.assignment || !resolved.today) {
      throw AppError.conflict('no_plan', 'You have no plan yet: start an empty session or ask your coach for a plan')
    }
    assignmentId = resolved.assignment.id
    if (input.dayId !== undefined) {
      day = resolved.days.find((d) => d.id === input.dayId) ?? null
      if (!day) throw AppError.badRequest('That day is not in your plan', [{ path: 'dayId', message: 'Not a day of your plan' }])
      if (day.isRest) throw AppError.badRequest('That is a rest day', [{ path: 'dayId', message: 'Pick a training day' }])
      version = input.version!
      const todays = resolved.days[resolved.today.dayIndex]
      if (todays.id === day.id && resolved.today.version === version) rotationIndex = resolved.today.rotationIndex
    } else {
      // Training on a rest day means doing the next training day now.
      const entry = resolved.today.isRest ? resolved.today.nextTraining! : resolved.today
      day = resolved.days[entry.dayIndex]
      version = entry.version
      rotationIndex = entry.rotationIndex
    }
  }

  const slots = day && version ? await slotsOf(day.id, version) : []
  const [gym, history] = await Promise.all([
    gymOf(lifter),
    historyFor(lifter.id, slots.map((s) => ({ exerciseId: s.exerciseId, slotId: s.id }))),
  ])
  const sequelize = SessionModel.sequelize!
  const session = await sequelize.transaction(async (transaction) => {
    const created = await SessionModel.create(
      {
        athleteId: lifter.id, assignmentId, planDayId: day?.id ?? null, dayName: day?.name ?? null, versionLabel: version,
        status: 'in_progress', startedAt: now, completedAt: null, summary: null, note: null, rotationIndex,
      },
      { transaction },
    )
    const rows = slots.flatMap((slot, blockIndex) =>
      plannedRows({
        sessionId: created.id, exercise: slot.exercise!, slotId: slot.id, role: slot.role as SlotRole,
        scheme: slot.scheme, restSec: slot.restSec, blockIndex, gym, history,
      }),
    )
    await SetLogModel.bulkCreate(rows, { transaction })
    return created
  })
  return { created: true, session: await runSessionView(session, lifter) }
}

/**
 * Creates or updates one set, keyed by the client's UUID: the same request twice changes
 * nothing. When two edits disagree, the later `editedAt` wins. Logging a top set recomputes the
 * back-off targets of the same exercise from what the top set actually did.
 */
export async function logSet(lifter: UserModel, sessionId: number, setId: string, input: LogSetInput) {
  const sequelize = SessionModel.sequelize!
  // Nearly every tap: one statement. A top set re-targets its back-offs, and the cases the
  // statement leaves alone (refusals, late edits, new exercises) are told apart below.
  if (input.kind !== 'top' && (await upsertOwnSetLog(sequelize, { lifterId: lifter.id, sessionId, setId }, input))) {
    return { set: storedSet(setId, input), updated: [] }
  }
  return sequelize.transaction(async (transaction) => {
    const session = await ownSession(lifter, sessionId, transaction)
    const exercise = await ExerciseModel.findByPk(input.exerciseId, { transaction })
    // One the lifter may use, or one already in this session (a queued set still syncs after its coach left).
    const usable = exercise && ((await canUseExercise(lifter, exercise)) || (await SetLogModel.count({ where: { sessionId: session.id, exerciseId: exercise.id }, transaction })) > 0)
    if (!exercise || !usable) throw AppError.badRequest('Unknown exercise', [{ path: 'exerciseId', message: 'No such exercise' }])
    const editedAt = new Date(input.editedAt)
    let set = await SetLogModel.findByPk(setId, { transaction })
    if (set && set.sessionId !== session.id) throw AppError.conflict('set_elsewhere', 'This set belongs to another session')
    const values = {
      exerciseId: input.exerciseId, slotId: input.slotId, position: input.position, kind: input.kind,
      targetLoadKg: input.targetLoadKg, targetRepsMin: input.targetRepsMin, targetRepsMax: input.targetRepsMax,
      targetReps: input.targetReps, toFailure: input.toFailure, targetRir: input.targetRir, loadKg: input.loadKg,
      reps: input.reps, rir: input.rir, failure: input.failure, skipped: input.skipped, note: input.note,
      loggedAt: input.loggedAt ? new Date(input.loggedAt) : null, editedAt,
    }
    const updated: SetLogModel[] = []
    if (!set) {
      set = await SetLogModel.create({ id: setId, sessionId: session.id, role: null, ...values }, { transaction })
    } else if (!set.editedAt || set.editedAt.getTime() <= editedAt.getTime()) {
      await set.update(values, { transaction })
    } else {
      return { set: toRunSet(set), updated: [] } // an older edit arriving late: the newer one stays
    }

    if (set.kind === 'top' && set.loadKg !== null && set.reps !== null && set.reps > 0 && !set.skipped) {
      const gym = await gymOf(lifter)
      const equipment = equipmentOf(gym, exercise)
      const backoffs = await openBackoffsOf(sequelize, set, transaction)
      for (const backoff of backoffs) {
        if (backoff.targetRepsMin === null || backoff.targetRepsMax === null) continue
        const target = backoffTarget({
          topLoadKg: set.loadKg, topReps: set.reps, topRir: set.failure ? 0 : (set.rir ?? 0),
          repsMin: backoff.targetRepsMin, repsMax: backoff.targetRepsMax, equipment,
        })
        await backoff.update({ targetLoadKg: target.target.loadKg }, { transaction })
        updated.push(backoff)
      }
    }
    return { set: toRunSet(set), updated: updated.map(toRunSet) }
  })
}

/**
 * The back-offs a top set re-targets: its slot's unlogged, unskipped back-offs in its session.
 * The unary `+` keeps SQLite's planner (no ANALYZE statistics) on the session index, a few
 * dozen rows: offered the slot or exercise index, it took the slot's, which walks every set ever
 * logged in that plan slot (45 ms a top set on the large demo club). `IS` matches a null slot.
 * tests/server/set-log-upsert.test.ts checks the plan.
 */
function openBackoffsOf(sequelize: Sequelize, top: SetLogModel, transaction: Transaction) {
  return sequelize.query<SetLogModel>(
    `SELECT * FROM set_logs
     WHERE session_id = $sessionId AND +exercise_id = $exerciseId AND +slot_id IS $slotId
       AND kind = 'backoff' AND logged_at IS NULL AND skipped = 0
     ORDER BY position`,
    {
      bind: { sessionId: top.sessionId, exerciseId: top.exerciseId, slotId: top.slotId },
      model: SetLogModel,
      mapToModel: true,
      type: QueryTypes.SELECT,
      transaction,
    },
  )
}

/** An exercise the lifter may use (not another coach's own), or with `sessionId` one already in that session. */
async function exerciseForSession(lifter: UserModel, exerciseId: number, sessionId?: number) {
  const exercise = await ExerciseModel.findByPk(exerciseId)
  const usable = exercise && ((await canUseExercise(lifter, exercise)) || (sessionId !== undefined && (await SetLogModel.count({ where: { sessionId, exerciseId } })) > 0))
  if (!exercise || !usable) throw AppError.badRequest('Unknown exercise', [{ path: 'toExerciseId', message: 'No such exercise' }])
  return exercise
}

/** Replaces the not-yet-done sets of one exercise with planned sets of another of the same pattern. */
export async function swapExercise(lifter: UserModel, sessionId: number, input: SwapExerciseInput) {
  const session = await ownSession(lifter, sessionId)
  assertRunning(session)
  const [from, to] = await Promise.all([exerciseForSession(lifter, input.exerciseId, sessionId), exerciseForSession(lifter, input.toExerciseId)])
  if (from.pattern !== to.pattern) {
    throw AppError.badRequest('Swap for an exercise of the same movement pattern', [
      { path: 'toExerciseId', message: `Pick a ${from.pattern.replaceAll('_', ' ')} exercise` },
    ])
  }
  const blockSets = await SetLogModel.findAll({ where: { sessionId, exerciseId: from.id, slotId: input.slotId }, order: [['position', 'ASC']] })
  if (blockSets.length === 0) throw AppError.notFound('Exercise in this session')
  const finished = blockSets.filter((s) => s.loggedAt !== null || s.skipped)
  const open = blockSets.filter((s) => !finished.includes(s))
  const workingDone = finished.filter((s) => s.kind !== 'warmup').length
  const role = (blockSets[0].role ?? 'accessory') as SlotRole
  const slot = input.slotId !== null ? await SlotModel.findByPk(input.slotId) : null
  const [gym, history] = await Promise.all([gymOf(lifter), historyFor(lifter.id, [{ exerciseId: to.id, slotId: input.slotId }], sessionId)])
  let rows = plannedRows({
    sessionId, exercise: to, slotId: input.slotId, role, scheme: slot?.scheme,
    restSec: slot?.restSec ?? to.defaultRestSec, blockIndex: 0, gym, history,
  })
  // Working sets already done on the old exercise count: plan only the rest, with no warm-up.
  if (workingDone > 0) rows = rows.filter((r) => r.kind !== 'warmup').slice(workingDone)
  const start = finished.length > 0 ? Math.max(...finished.map((s) => s.position)) + 1 : blockSets[0].position
  await SessionModel.sequelize!.transaction(async (transaction) => {
    await SetLogModel.destroy({ where: { id: open.map((s) => s.id) }, transaction })
    await SetLogModel.bulkCreate(rows.map((r, i) => ({ ...r, position: start + i })), { transaction })
  })
  return runSessionView(session, lifter)
}

/** Adds an exercise at the end of the session with the default sets for its role. */
export async function addExercise(lifter: UserModel, sessionId: number, input: AddExerciseInput) {
  const session = await ownSession(lifter, sessionId)
  assertRunning(session)
  const exercise = await exerciseForSession(lifter, input.exerciseId)
  const last = await SetLogModel.max<number, SetLogModel>('position', { where: { sessionId } })
  const blockIndex = last === null ? 0 : Math.floor(last / BLOCK_STRIDE) + 1
  const [gym, history] = await Promise.all([gymOf(lifter), historyFor(lifter.id, [{ exerciseId: exercise.id, slotId: null }], sessionId)])
  await SetLogModel.bulkCreate(
    plannedRows({
      sessionId, exercise, slotId: null, role: input.role, scheme: undefined,
      restSec: exercise.defaultRestSec, blockIndex, gym, history,
    }),
  )
  return runSessionView(session, lifter)
}

/** Adds the review desk's flags and the number of records to a finished session's stored totals. */
export async function storeReviewSummary(session: SessionModel, athlete: UserModel) {
  const flags = await computeSessionFlags(session, athlete)
  const report = await buildReport(session, athlete)
  const records = report.exercises.reduce((n, e) => n + e.records.length, 0)
  await session.update({ summary: { ...(session.summary as object), flags, records } })
}

/**
 * Finishes the session: the server recomputes and stores the totals and the review desk's
 * flags, and moves the rotation on. `justCompleted` is false when it was already finished.
 */
export async function completeSession(lifter: UserModel, sessionId: number, input: CompleteSessionInput) {
  const session = await ownSession(lifter, sessionId)
  const justCompleted = session.status !== 'completed'
  if (justCompleted) {
    const sets = await SetLogModel.findAll({ where: { sessionId, skipped: false, loggedAt: { [Op.ne]: null } } })
    const totals = sessionTotals(sets.map((s) => ({ kind: s.kind, loadKg: s.loadKg, reps: s.reps })))
    const completedAt = new Date(Math.max(new Date(input.completedAt).getTime(), session.startedAt?.getTime() ?? 0))
    await SessionModel.sequelize!.transaction(async (transaction) => {
      await session.update({ status: 'completed', completedAt, summary: totals, note: input.note }, { transaction })
      if (session.assignmentId !== null && session.rotationIndex !== null) {
        const assignment = await AssignmentModel.findByPk(session.assignmentId, { transaction })
        if (assignment && assignment.rotationIndex <= session.rotationIndex) {
          await assignment.update({ rotationIndex: session.rotationIndex + 1 }, { transaction })
        }
      }
    })
    await storeReviewSummary(session, lifter)
  }
  return { justCompleted, session, report: await buildReport(session, lifter) }
}

/**
 * Takes (or edits) next steps: they become the next session's targets for those exercises.
 * The lifter takes them; their coach may edit them (always recorded as edited).
 */
export async function takeNextSteps(viewer: UserModel, sessionId: number, input: TakeNextStepsInput) {
  const { session, athlete } = await sessionForViewer(viewer, sessionId)
  if (viewer.role === 'lifter' && session.athleteId !== viewer.id) throw AppError.notFound('Session')
  if (session.status !== 'completed') throw AppError.conflict('session_running', 'Finish the session first')
  const byCoach = viewer.role === 'coach'
  const gym = await gymOf(athlete)
  await SessionModel.sequelize!.transaction(async (transaction) => {
    for (const step of input.steps) {
      const exercise = await ExerciseModel.findByPk(step.exerciseId, { transaction })
      const inSession = await SetLogModel.findOne({ where: { sessionId, exerciseId: step.exerciseId, slotId: step.slotId }, transaction })
      if (!exercise || !inSession) throw AppError.badRequest('That exercise is not in this session', [{ path: 'steps', message: 'Unknown exercise' }])
      const equipment = equipmentOf(gym, exercise)
      const loadKg = isLoadable(step.targetLoadKg, equipment)
        ? step.targetLoadKg
        : roundDownToLoadable(step.targetLoadKg, equipment).loadKg
      const values = {
        status: step.edited || byCoach ? ('edited' as const) : ('taken' as const),
        targetLoadKg: loadKg, targetReps: step.targetReps,
        targetRepsMin: inSession.targetRepsMin, targetRepsMax: inSession.targetRepsMax,
        reason: byCoach ? { by: 'coach' } : null,
      }
      const existing = await NextStepModel.findOne({ where: { sessionId, exerciseId: step.exerciseId, slotId: step.slotId }, transaction })
      if (existing) await existing.update(values, { transaction })
      else await NextStepModel.create({ athleteId: athlete.id, exerciseId: step.exerciseId, slotId: step.slotId, sessionId, ...values }, { transaction })
    }
  })
  return buildReport(session, athlete)
}
