import { Op, col, fn } from 'sequelize'
import { reportLift, type LiftReport } from '@shared/domain/lift-report'
import type { NextStepOption, PerformedSet, PlateauOption } from '@shared/domain/progression'
import type { ExerciseReport, NextStepOptionView, PlateauOptionView, SessionReport, TakenOption } from '@shared/schemas/run.schema'
import { NextStepModel, SessionModel, SetLogModel, type UserModel } from '../db'
import { toSessionSummary } from './presenters'
import {
  blockKey, bodyMassAt, bodyMassEntries, gymOf, historyFor, liftOf, sessionBlocks, type BlockHistory, type SessionBlock,
} from './session-planning.service'

function optionView(option: NextStepOption | null | undefined): NextStepOptionView | null {
  if (!option) return null
  return {
    action: option.action,
    targetLoadKg: option.target.loadKg,
    targetReps: option.targetReps,
    repsMin: option.repsMin,
    repsMax: option.repsMax,
    workChangePct: option.workChangePct,
    gain: option.gain,
    reason: option.reason,
  }
}

function plateauOptionView(option: PlateauOption): PlateauOptionView {
  return {
    kind: option.kind,
    reason: option.reason,
    targetLoadKg: option.target?.loadKg ?? null,
    targetReps: option.targetReps ?? null,
    sets: option.sets ?? null,
    rotate: option.rotate ?? null,
  }
}

const isDone = (s: SetLogModel) => !s.skipped && s.loggedAt !== null && s.loadKg !== null && (s.reps ?? 0) > 0

/** A block's working sets as done, with what was planned for them. */
export function performedSets(sets: readonly SetLogModel[]): PerformedSet[] {
  return sets.filter((s) => s.kind !== 'warmup' && isDone(s)).map((s) => ({
    kind: s.kind === 'warmup' ? 'straight' : s.kind,
    loadKg: s.loadKg!,
    reps: s.reps!,
    repsMin: s.targetRepsMin ?? s.reps!,
    repsMax: s.targetRepsMax ?? s.reps!,
    rir: s.failure ? 0 : s.rir,
    targetLoadKg: s.targetLoadKg,
    targetReps: s.targetReps,
    targetRir: s.toFailure ? null : s.targetRir,
  }))
}

export interface SessionLift {
  block: SessionBlock
  report: LiftReport
  history: BlockHistory | undefined
  bodyMassKg: number | null
}

/**
 * Each exercise block of a finished (or running) session with its lift report, as it read when
 * the session was done: only earlier sessions count. The summary and the review desk both read
 * this, so they show the same figures.
 */
export async function sessionLifts(session: SessionModel, athlete: UserModel): Promise<SessionLift[]> {
  const blocks = await sessionBlocks(session.id)
  const exerciseIds = [...new Set(blocks.map((b) => b.exercise.id))]
  const before = session.completedAt ?? undefined
  const masses = await bodyMassEntries(athlete.id)
  const [gym, history, bestRows] = await Promise.all([
    gymOf(athlete),
    historyFor(athlete.id, blocks.map((b) => ({ exerciseId: b.exercise.id, slotId: b.slotId })), session.id, before, masses),
    // Best reps at each load before this session: enough to find every record (see records.ts).
    exerciseIds.length === 0 ? Promise.resolve([]) : SetLogModel.findAll({
      attributes: ['exerciseId', 'loadKg', [fn('MAX', col('reps')), 'reps']],
      where: {
        exerciseId: exerciseIds, kind: { [Op.ne]: 'warmup' }, reps: { [Op.gt]: 0 }, loadKg: { [Op.ne]: null },
        skipped: false, sessionId: { [Op.ne]: session.id },
      },
      include: [
        {
          model: SessionModel,
          as: 'session',
          attributes: [],
          where: { athleteId: athlete.id, status: 'completed', ...(before ? { completedAt: { [Op.lt]: before } } : {}) },
        },
      ],
      group: ['exerciseId', 'loadKg'],
      raw: true,
    }) as unknown as Promise<Array<{ exerciseId: number; loadKg: number; reps: number }>>,
  ])
  const bodyMassKg = bodyMassAt(masses, session.completedAt ?? session.startedAt ?? null)
  // Hard sets per movement pattern in this session, for the caps across a session.
  const patternSets = new Map<string, number>()
  for (const b of blocks) {
    patternSets.set(b.exercise.pattern, (patternSets.get(b.exercise.pattern) ?? 0) + b.sets.filter((s) => s.kind !== 'warmup' && isDone(s)).length)
  }
  return blocks.map((block) => {
    const blockHistory = history.get(blockKey(block.exercise.id, block.slotId))
    const sets = performedSets(block.sets)
    const report = reportLift({
      role: block.role,
      version: session.versionLabel ?? undefined,
      lift: liftOf(gym, block.exercise),
      history: blockHistory?.exposures ?? [],
      current: { sets, bodyMassKg, deload: block.sets.some((s) => s.deload) },
      recordHistory: bestRows.filter((r) => r.exerciseId === block.exercise.id).map((r) => ({ loadKg: r.loadKg, reps: Number(r.reps) })),
      patternSetsInSession: patternSets.get(block.exercise.pattern) ?? 0,
    })
    return { block, report, history: blockHistory, bodyMassKg }
  })
}

/**
 * The finish screen and the coach's view of a session: per exercise the work done, records,
 * estimated-1RM change, the engine's next step (with the other kind of step) and plateau options,
 * and what the lifter took. Computed from stored sets, so it reads the same every time.
 */
export async function buildReport(session: SessionModel, athlete: UserModel, lifts?: SessionLift[]): Promise<SessionReport> {
  const [all, taken] = await Promise.all([
    lifts ? Promise.resolve(lifts) : sessionLifts(session, athlete),
    NextStepModel.findAll({ where: { sessionId: session.id } }),
  ])
  const exercises: ExerciseReport[] = all.map(({ block, report, bodyMassKg }) => {
    const { exercise, slotId } = block
    const tookStep = taken.find((t) => t.exerciseId === exercise.id && t.slotId === slotId)
    const mode = (exercise.loadMode ?? 'external') as ExerciseReport['loadMode']
    return {
      exerciseId: exercise.id,
      slotId,
      name: exercise.name,
      loadMode: mode,
      bodyMassKg: mode === 'external' ? null : bodyMassKg,
      workingSets: block.sets.filter((s) => s.kind !== 'warmup' && isDone(s)).length,
      volumeKg: report.volumeKg,
      bestE1rmKg: report.change.e1rmKg,
      previousBestE1rmKg: report.change.previousE1rmKg,
      e1rmChangePct: report.change.e1rmChangePct,
      asPlanned: report.change.asPlanned,
      regression: report.change.regression,
      deload: report.deload,
      records: report.records,
      nextStep: optionView(report.nextStep),
      alternative: optionView(report.nextStep?.alternative),
      plateau: report.plateau?.plateau
        ? {
            exposuresWithoutProgress: report.plateau.exposuresWithoutProgress,
            window: report.plateau.window,
            options: report.plateau.options.map(plateauOptionView),
          }
        : null,
      taken: tookStep && tookStep.status !== 'proposed'
        ? {
            option: (tookStep.option ?? 'next_step') as TakenOption,
            targetLoadKg: tookStep.targetLoadKg,
            targetReps: tookStep.targetReps,
            status: tookStep.status,
            by: (tookStep.reason as { by?: string } | null)?.by === 'coach' ? ('coach' as const) : ('lifter' as const),
          }
        : null,
    }
  })
  const start = session.startedAt?.getTime()
  const end = session.completedAt?.getTime()
  return {
    session: toSessionSummary(session),
    durationSec: start && end ? Math.round((end - start) / 1000) : null,
    exercises,
  }
}
