import { randomUUID } from 'node:crypto'
import { Op, QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { estimateOneRepMax } from '@shared/domain/e1rm'
import { isLoadable, roundDownToLoadable } from '@shared/domain/equipment'
import { movedLoadKg } from '@shared/domain/lift-progress'
import type { PlannedSet } from '@shared/domain/planned-sets'
import { freshExercisesFor } from '@shared/domain/rotation'
import { backoffTarget, DEFAULT_REST_SECONDS, type SlotRole } from '@shared/domain/schemes'
import { sessionTotals } from '@shared/domain/summary'
import type {
  AddExerciseInput, CompleteSessionInput, LogSetInput, RunSession, RunSet, StartFromRecentSetInput, StartSessionInput,
  SwapExerciseInput, TakeNextStepsInput,
} from '@shared/schemas/run.schema'
import type { ExerciseEquipment } from '@shared/schemas/exercise.schema'
import type { TodayQuery } from '@shared/schemas/train.schema'
import {
  AssignmentModel, CommentModel, DayVersionModel, ExerciseModel, NextStepModel, PlanDayModel, SessionModel, SetLogModel,
  SlotAdjustmentModel, SlotModel, StartEstimateModel, UserModel,
} from '../db'
import { upsertOwnSetLog } from '../db/set-log-upsert'
import { AppError } from '../errors'
import { canUseExercise } from './access.service'
import { toSessionSummary } from './presenters'
import { computeSessionFlags } from './review-flags.service'
import { sessionForViewer } from './session.service'
import { buildReport, sessionLifts } from './session-report.service'
import {
  blockKey, bodyMassAt, bodyMassEntries, gymOf, historyFor, liftOf, loadModeOf, parseScheme, planBlocks, planningContext,
  planDay, type BlockToPlan, type PlanningContext,
} from './session-planning.service'
import { usableExercises } from './exercise.service'
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
    deload: set.deload ?? false,
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
    deload: false,
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

/** One block's planned sets as rows to insert, block i at positions i*100.. */
function rowsOf(sessionId: number, block: BlockToPlan & { slotId: number | null }, planned: PlannedSet[], blockIndex: number) {
  return planned.map((p) => ({
    id: randomUUID(),
    sessionId,
    exerciseId: block.exercise.id,
    slotId: block.slotId,
    role: block.role,
    position: blockIndex * BLOCK_STRIDE + p.position,
    kind: p.kind,
    targetLoadKg: p.targetLoadKg,
    targetRepsMin: p.targetRepsMin,
    targetRepsMax: p.targetRepsMax,
    targetReps: p.targetReps,
    toFailure: p.toFailure,
    targetRir: p.targetRir,
    deload: p.source === 'deload',
    loadKg: null,
    reps: null,
    rir: null,
    note: null,
    loggedAt: null,
  }))
}

/** Planned rows for these blocks in session order (block i at positions i*100..). */
function plannedRows(
  sessionId: number,
  blocks: Array<BlockToPlan & { slotId: number | null }>,
  context: PlanningContext,
  firstBlockIndex: number,
  patternsBefore: Iterable<string>,
) {
  return planBlocks(blocks, context, patternsBefore).flatMap((planned, i) => rowsOf(sessionId, blocks[i], planned, firstBlockIndex + i))
}

/** Movement patterns of the session's blocks before `position` (their lifts are warm). */
async function patternsBefore(sessionId: number, position: number): Promise<string[]> {
  const sets = await SetLogModel.findAll({
    where: { sessionId, position: { [Op.lt]: position } },
    attributes: ['exerciseId'],
    include: [{ model: ExerciseModel, as: 'exercise', attributes: ['pattern'] }],
  })
  return [...new Set(sets.map((s) => s.exercise!.pattern))]
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
  const masses = await bodyMassEntries(athlete.id)
  const [gym, history] = await Promise.all([
    gymOf(athlete),
    historyFor(athlete.id, blocks.map((b) => ({ exerciseId: b.exercise.id, slotId: b.slotId })), session.id, undefined, masses),
  ])
  const bodyMassKg = bodyMassAt(masses, null)
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
        equipment: liftOf(gym, exercise).equipment,
        equipmentKind: exercise.equipmentKind as ExerciseEquipment,
        loadMode: loadModeOf(exercise),
        bodyMassKg: loadModeOf(exercise) === 'external' ? null : bodyMassKg,
        lastTime: (blockHistory?.exposures.filter((e) => !e.deload).at(-1)?.sets ?? last?.sets ?? []).map((s) => ({ kind: s.kind, loadKg: s.loadKg, reps: s.reps, rir: s.rir ?? null })),
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

  const day_ = day && version ? await planDay(lifter, await slotsOf(day.id, version)) : []
  const sequelize = SessionModel.sequelize!
  const session = await sequelize.transaction(async (transaction) => {
    const created = await SessionModel.create(
      {
        athleteId: lifter.id, assignmentId, planDayId: day?.id ?? null, dayName: day?.name ?? null, versionLabel: version,
        status: 'in_progress', startedAt: now, completedAt: null, summary: null, note: null, rotationIndex,
      },
      { transaction },
    )
    const rows = day_.flatMap(({ block, planned }, blockIndex) => rowsOf(created.id, block, planned, blockIndex))
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
      const [gym, masses] = await Promise.all([gymOf(lifter), bodyMassEntries(lifter.id)])
      const lift = liftOf(gym, exercise)
      const reading = { mode: lift.mode ?? 'external' as const, bodyMassKg: bodyMassAt(masses, null) }
      const backoffs = await openBackoffsOf(sequelize, set, transaction)
      for (const backoff of backoffs) {
        if (backoff.targetRepsMin === null || backoff.targetRepsMax === null) continue
        const target = backoffTarget({
          topLoadKg: set.loadKg, topReps: set.reps, topRir: set.failure ? 0 : (set.rir ?? 0),
          repsMin: backoff.targetRepsMin, repsMax: backoff.targetRepsMax, equipment: lift.equipment, reading,
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
  const block = { exercise: to, slotId: input.slotId, role, scheme: parseScheme(slot?.scheme), restSec: slot?.restSec ?? to.defaultRestSec }
  const context = await planningContext(lifter, [{ exerciseId: to.id, slotId: input.slotId }], sessionId)
  let rows = plannedRows(sessionId, [block], context, 0, await patternsBefore(sessionId, blockSets[0].position))
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
  const block = { exercise, slotId: null, role: input.role, restSec: exercise.defaultRestSec }
  const context = await planningContext(lifter, [{ exerciseId: exercise.id, slotId: null }], sessionId)
  await SetLogModel.bulkCreate(plannedRows(sessionId, [block], context, blockIndex, await patternsBefore(sessionId, blockIndex * BLOCK_STRIDE)))
  return runSessionView(session, lifter)
}

/**
 * Stores a finished session's totals, the review desk's flags and its number of records, all from
 * one set of lift reports (the summary reads the same reports, so the figures agree).
 */
export async function storeReviewSummary(session: SessionModel, athlete: UserModel) {
  const lifts = await sessionLifts(session, athlete)
  const flags = await computeSessionFlags(session, athlete, lifts)
  const doneSets = await SetLogModel.findAll({ where: { sessionId: session.id, skipped: false, loggedAt: { [Op.ne]: null } }, attributes: ['kind', 'loadKg', 'reps'] })
  const { workingSets } = sessionTotals(doneSets.map((s) => ({ kind: s.kind, loadKg: s.loadKg, reps: s.reps })))
  const volumeKg = lifts.reduce((sum, l) => sum + l.report.volumeKg, 0)
  const records = lifts.reduce((n, l) => n + l.report.records.length, 0)
  await session.update({ summary: { workingSets, volumeKg, flags, records } })
}

/**
 * Finishes the session: the server recomputes and stores the totals and the review desk's
 * flags, and moves the rotation on. `justCompleted` is false when it was already finished.
 */
export async function completeSession(lifter: UserModel, sessionId: number, input: CompleteSessionInput) {
  const session = await ownSession(lifter, sessionId)
  const justCompleted = session.status !== 'completed'
  if (justCompleted) {
    const completedAt = new Date(Math.max(new Date(input.completedAt).getTime(), session.startedAt?.getTime() ?? 0))
    await SessionModel.sequelize!.transaction(async (transaction) => {
      await session.update({ status: 'completed', completedAt, note: input.note }, { transaction })
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

/** Options whose target (load and reps) goes into the next session's first working set. */
const TARGET_OPTIONS = new Set(['next_step', 'alternative', 'edited', 'microload', 'add_set'])

/**
 * Takes (or edits) next steps, or a plateau option: each changes what the next session plans for
 * that exercise. The lifter takes them; their coach may too (always recorded as edited by the
 * coach). A plateau option is taken only when the engine offers it for this session, so the
 * caps and the "strictly smaller step" rule hold whoever asks:
 * - microload: the smaller load step becomes the target;
 * - add_set: one more working set in that slot from now on (the lifter's own slot adjustment),
 *   with the next step as the target;
 * - deload: the next session of that slot is a deload (lighter, half the sets), then progress
 *   continues from before it;
 * - rotate_version: every slot of that day's version gets a fresh exercise of the same movement
 *   pattern for this lifter (the coach's plan is left as written).
 */
export async function takeNextSteps(viewer: UserModel, sessionId: number, input: TakeNextStepsInput) {
  const { session, athlete } = await sessionForViewer(viewer, sessionId)
  if (viewer.role === 'lifter' && session.athleteId !== viewer.id) throw AppError.notFound('Session')
  if (session.status !== 'completed') throw AppError.conflict('session_running', 'Finish the session first')
  const byCoach = viewer.role === 'coach'
  const [gym, lifts] = await Promise.all([gymOf(athlete), sessionLifts(session, athlete)])
  const refuse = (message: string) => AppError.badRequest(message, [{ path: 'steps', message }])
  await SessionModel.sequelize!.transaction(async (transaction) => {
    for (const step of input.steps) {
      const lift = lifts.find((l) => l.block.exercise.id === step.exerciseId && l.block.slotId === step.slotId)
      if (!lift) throw refuse('That exercise is not in this session')
      const { exercise } = lift.block
      const plateauOption = (kind: string) => lift.report.plateau?.options.find((o) => o.kind === kind)
      let target: { loadKg: number; reps: number } | null = null
      switch (step.option) {
        case 'microload': {
          const offered = plateauOption('microload')
          if (!offered?.target || offered.targetReps === undefined) throw refuse('A smaller load step is not offered for this exercise')
          target = { loadKg: offered.target.loadKg, reps: offered.targetReps }
          break
        }
        case 'add_set':
        case 'deload':
        case 'rotate_version':
          if (!plateauOption(step.option)) throw refuse(`That option is not offered for ${exercise.name}`)
          if (step.option !== 'deload' && step.slotId === null) throw refuse('Only an exercise of the plan can be changed this way')
          break
        default:
          break
      }
      if (step.option === 'add_set' && lift.report.nextStep) {
        target = { loadKg: lift.report.nextStep.target.loadKg, reps: lift.report.nextStep.targetReps }
      }
      if (target === null && TARGET_OPTIONS.has(step.option) && step.targetLoadKg !== undefined && step.targetReps !== undefined) {
        const equipment = liftOf(gym, exercise).equipment
        const loadKg = isLoadable(step.targetLoadKg, equipment) ? step.targetLoadKg : roundDownToLoadable(step.targetLoadKg, equipment).loadKg
        target = { loadKg, reps: step.targetReps }
      }
      const working = lift.block.sets.find((s) => s.kind !== 'warmup')
      const values = {
        status: step.option === 'edited' || byCoach ? ('edited' as const) : ('taken' as const),
        option: step.option,
        targetLoadKg: target?.loadKg ?? null,
        targetReps: target?.reps ?? null,
        targetRepsMin: working?.targetRepsMin ?? null,
        targetRepsMax: working?.targetRepsMax ?? null,
        reason: byCoach ? { by: 'coach' } : null,
      }
      const existing = await NextStepModel.findOne({ where: { sessionId, exerciseId: step.exerciseId, slotId: step.slotId }, transaction })
      const previousOption = existing?.option ?? null
      if (existing) await existing.update(values, { transaction })
      else await NextStepModel.create({ athleteId: athlete.id, exerciseId: step.exerciseId, slotId: step.slotId, sessionId, ...values }, { transaction })
      // Lasting changes to the lifter's own slot, made once however often the option is taken.
      if (step.option === 'add_set' && previousOption !== 'add_set') {
        const [adjustment] = await SlotAdjustmentModel.findOrCreate({
          where: { athleteId: athlete.id, slotId: step.slotId! },
          defaults: { athleteId: athlete.id, slotId: step.slotId!, exerciseId: null, extraSets: 0, changedBy: viewer.id },
          transaction,
        })
        await adjustment.update({ extraSets: adjustment.extraSets + 1, changedBy: viewer.id }, { transaction })
      }
      // One rotation per session: taking it on a second lift of the same day's version changes nothing more.
      if (step.option === 'rotate_version' && previousOption !== 'rotate_version') {
        const rotatedAlready = await NextStepModel.count({
          where: { sessionId, option: 'rotate_version', exerciseId: { [Op.ne]: step.exerciseId } },
          transaction,
        })
        if (rotatedAlready === 0) await rotateVersionFor(athlete, session, viewer, transaction)
      }
    }
  })
  return buildReport(session, athlete)
}

/**
 * Fresh exercises for every slot of the session's day version, for this lifter only: the same
 * choice the coach's rotation makes (shared/domain/rotation.ts), over the exercises they may use,
 * avoiding the ones their plan and their earlier swaps already use.
 */
async function rotateVersionFor(athlete: UserModel, session: SessionModel, viewer: UserModel, transaction: Transaction) {
  if (!session.planDayId || !session.versionLabel) throw AppError.badRequest('This session has no plan day to rotate', [])
  const other = session.versionLabel === 'I' ? 'II' : 'I'
  const [mine, theirs] = await Promise.all([slotsOf(session.planDayId, session.versionLabel), slotsOf(session.planDayId, other)])
  const adjustments = await SlotAdjustmentModel.findAll({ where: { athleteId: athlete.id }, transaction })
  const current = new Map(adjustments.filter((a) => a.exerciseId !== null).map((a) => [a.slotId, a.exerciseId!]))
  const exerciseIn = (slot: SlotModel) => current.get(slot.id) ?? slot.exerciseId
  const assignment = session.assignmentId ? await AssignmentModel.findByPk(session.assignmentId, { transaction }) : null
  const planSlots = assignment
    ? await SlotModel.findAll({
        include: [{ model: DayVersionModel, as: 'version', attributes: [], include: [{ model: PlanDayModel, as: 'day', attributes: [], where: { planId: assignment.planId } }] }],
        attributes: ['id', 'exerciseId'],
        transaction,
      })
    : []
  const usedInPlan = new Set([...planSlots.map((s) => s.exerciseId), ...current.values()])
  const library = await usableExercises(athlete, transaction)
  const patternOf = new Map(library.map((e) => [e.id, e.pattern]))
  const asRotation = (slot: SlotModel) => ({ slotId: slot.id, pattern: patternOf.get(exerciseIn(slot)) ?? slot.exercise!.pattern, exerciseId: exerciseIn(slot) })
  const chosen = freshExercisesFor(mine.map(asRotation), theirs.map(asRotation), usedInPlan, library)
  for (const swap of chosen) {
    const [adjustment] = await SlotAdjustmentModel.findOrCreate({
      where: { athleteId: athlete.id, slotId: swap.slotId },
      defaults: { athleteId: athlete.id, slotId: swap.slotId, exerciseId: swap.toExerciseId, extraSets: 0, changedBy: viewer.id },
      transaction,
    })
    // A fresh exercise starts from its own history: sets added to the old one do not carry over.
    await adjustment.update({ exerciseId: swap.toExerciseId, extraSets: 0, changedBy: viewer.id }, { transaction })
  }
}

/**
 * A recent set for a lift with no history, entered on the set card (or the last set of a
 * find-your-load ramp): kept as the lifter's starting estimate for that exercise, and the block's
 * open sets in this session are planned again from it.
 */
export async function startFromRecentSet(lifter: UserModel, sessionId: number, input: StartFromRecentSetInput) {
  const session = await ownSession(lifter, sessionId)
  assertRunning(session)
  const blockSets = await SetLogModel.findAll({ where: { sessionId, exerciseId: input.exerciseId, slotId: input.slotId }, order: [['position', 'ASC']] })
  if (blockSets.length === 0) throw AppError.notFound('Exercise in this session')
  const exercise = (await ExerciseModel.findByPk(input.exerciseId))!
  const masses = await bodyMassEntries(lifter.id)
  const moved = movedLoadKg(input.loadKg, { mode: loadModeOf(exercise), bodyMassKg: bodyMassAt(masses, null) }) ?? input.loadKg
  if (!(moved > 0)) throw AppError.badRequest('Enter a set with a load', [{ path: 'loadKg', message: 'The load moved must be above zero' }])
  const e1rmKg = estimateOneRepMax(moved, input.reps, { rir: input.rir }).e1rm
  const [estimate] = await StartEstimateModel.findOrCreate({
    where: { athleteId: lifter.id, exerciseId: exercise.id },
    defaults: { athleteId: lifter.id, exerciseId: exercise.id, e1rmKg, loadKg: input.loadKg, reps: input.reps, source: input.source, setBy: lifter.id },
  })
  await estimate.update({ e1rmKg, loadKg: input.loadKg, reps: input.reps, source: input.source, setBy: lifter.id })

  const open = blockSets.filter((s) => s.loggedAt === null && !s.skipped)
  const doneWorking = blockSets.filter((s) => s.kind !== 'warmup' && !open.includes(s)).length
  const slot = input.slotId !== null ? await SlotModel.findByPk(input.slotId, { include: [{ model: ExerciseModel, as: 'exercise' }] }) : null
  const role = (blockSets[0].role ?? 'accessory') as SlotRole
  const adjustment = slot ? (await SlotAdjustmentModel.findOne({ where: { athleteId: lifter.id, slotId: slot.id } })) : null
  const block = {
    exercise, slotId: input.slotId, role, scheme: parseScheme(slot?.scheme), restSec: slot?.restSec ?? exercise.defaultRestSec,
    extraSets: adjustment?.extraSets ?? 0,
  }
  const context = await planningContext(lifter, [{ exerciseId: exercise.id, slotId: input.slotId }], sessionId)
  let rows = plannedRows(sessionId, [block], context, 0, await patternsBefore(sessionId, blockSets[0].position))
  if (doneWorking > 0) rows = rows.filter((r) => r.kind !== 'warmup').slice(doneWorking)
  const start = blockSets.length - open.length > 0 ? Math.max(...blockSets.filter((s) => !open.includes(s)).map((s) => s.position)) + 1 : blockSets[0].position
  await SessionModel.sequelize!.transaction(async (transaction) => {
    await SetLogModel.destroy({ where: { id: open.map((s) => s.id) }, transaction })
    await SetLogModel.bulkCreate(rows.map((r, i) => ({ ...r, position: start + i })), { transaction })
  })
  return runSessionView(session, lifter)
}
