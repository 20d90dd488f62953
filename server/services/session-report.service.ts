import { Op, col, fn } from 'sequelize'
import { detectPlateau, nextSteps, type NextStepOption, type PerformedSet } from '@shared/domain/progression'
import { bestE1rm, sessionRecords, type LoadReps } from '@shared/domain/records'
import type { ExerciseReport, NextStepOptionView, SessionReport } from '@shared/schemas/run.schema'
import { NextStepModel, SessionModel, SetLogModel, type UserModel } from '../db'
import { toSessionSummary } from './presenters'
import { blockKey, equipmentOf, gymOf, historyFor, sessionBlocks } from './session-planning.service'

function optionView(option: NextStepOption | null | undefined): NextStepOptionView | null {
  if (!option) return null
  return {
    action: option.action,
    targetLoadKg: option.target.loadKg,
    targetReps: option.targetReps,
    repsMin: option.repsMin,
    repsMax: option.repsMax,
    workChangePct: option.workChangePct,
    reason: option.reason,
  }
}

/**
 * The finish screen and the coach's view of a session: per exercise the work done, records,
 * estimated-1RM change, the engine's next step (with a smaller alternative) and plateau options,
 * and what the lifter took. Computed from stored sets, so it reads the same every time.
 */
export async function buildReport(session: SessionModel, athlete: UserModel): Promise<SessionReport> {
  const blocks = await sessionBlocks(session.id)
  const exerciseIds = [...new Set(blocks.map((b) => b.exercise.id))]
  // The report reads as it did when the session was finished: only earlier sessions count.
  const before = session.completedAt ?? undefined
  const [gym, history, bestRows, taken] = await Promise.all([
    gymOf(athlete),
    historyFor(athlete.id, blocks.map((b) => ({ exerciseId: b.exercise.id, slotId: b.slotId })), session.id, before),
    // Best reps at each load before this session: enough to find every record (see records.ts).
    SetLogModel.findAll({
      attributes: ['exerciseId', 'loadKg', [fn('MAX', col('reps')), 'reps']],
      where: {
        exerciseId: exerciseIds, kind: { [Op.ne]: 'warmup' }, reps: { [Op.gt]: 0 }, loadKg: { [Op.gt]: 0 },
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
    NextStepModel.findAll({ where: { sessionId: session.id } }),
  ])

  const exercises: ExerciseReport[] = blocks.map(({ exercise, slotId, role, sets: blockSets }) => {
    const equipment = equipmentOf(gym, exercise)
    const done = blockSets.filter(
      (s) => s.kind !== 'warmup' && !s.skipped && s.loggedAt !== null && s.loadKg !== null && (s.reps ?? 0) > 0,
    )
    const working: PerformedSet[] = done.map((s) => ({
      kind: s.kind === 'warmup' ? 'straight' : s.kind,
      loadKg: s.loadKg!,
      reps: s.reps!,
      repsMin: s.targetRepsMin ?? s.reps!,
      repsMax: s.targetRepsMax ?? s.reps!,
      rir: s.failure ? 0 : s.rir,
    }))
    const past = history.get(blockKey(exercise.id, slotId))?.exposures ?? []
    const exposures = working.length > 0 ? [...past, { sets: working }] : past
    const step = working.length > 0 ? nextSteps(exposures, equipment)[0] : undefined
    const plateau = working.length > 0 ? detectPlateau(exposures, { role, equipment, version: session.versionLabel ?? undefined }) : null
    const loadReps: LoadReps[] = working.map((w) => ({ loadKg: w.loadKg, reps: w.reps }))
    const best = bestE1rm(loadReps)
    const lastBest = past.length > 0 ? bestE1rm(past.at(-1)!.sets) : null
    const tookStep = taken.find((t) => t.exerciseId === exercise.id && t.slotId === slotId)
    return {
      exerciseId: exercise.id,
      slotId,
      name: exercise.name,
      workingSets: working.length,
      volumeKg: working.reduce((sum, w) => sum + w.loadKg * w.reps, 0),
      bestE1rmKg: best?.e1rmKg ?? null,
      previousBestE1rmKg: lastBest?.e1rmKg ?? null,
      e1rmChangePct: best && lastBest ? (best.e1rmKg / lastBest.e1rmKg - 1) * 100 : null,
      records: sessionRecords(loadReps, bestRows.filter((r) => r.exerciseId === exercise.id).map((r) => ({ loadKg: r.loadKg, reps: Number(r.reps) }))),
      nextStep: optionView(step),
      alternative: optionView(step?.alternative),
      plateau: plateau?.plateau
        ? { exposuresWithoutImprovement: plateau.exposuresWithoutImprovement, options: plateau.options.map((o) => ({ kind: o.kind, reason: o.reason })) }
        : null,
      taken:
        tookStep && tookStep.targetLoadKg !== null && tookStep.targetReps !== null && tookStep.status !== 'proposed'
          ? {
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
