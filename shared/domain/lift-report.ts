/**
 * Everything the summary and the review desk say about one lift in one session, computed once
 * so the two screens always agree: the estimated-1RM change against last time, the records, the
 * next step and the plateau check.
 */
import { compareWithLastTime, movedLoadKg, volumeKg, type LiftChange, type LoadReading } from './lift-progress'
import { detectPlateau, nextSteps, progressHistory, type Exposure, type LiftContext, type NextStep, type PlateauReport } from './progression'
import { sessionRecords, type LoadReps, type RecordFound } from './records'
import type { SlotRole } from './schemes'

export interface LiftReportInput {
  role: SlotRole
  /** The version of the day (I or II), for the rotation option. */
  version?: 'I' | 'II'
  lift: LiftContext
  /** Earlier exposures of this slot, oldest first. */
  history: readonly Exposure[]
  /** This session's working sets as done. */
  current: Exposure
  /** Earlier working sets of the exercise (every one, or the best reps per logged load), for records. */
  recordHistory: readonly LoadReps[]
  /** Hard sets of this lift's movement pattern in this session (caps across a session). */
  patternSetsInSession?: number
}

export interface LiftReport {
  change: LiftChange
  records: RecordFound[]
  /** The next step for the first working set, with its alternative; null when nothing was done. */
  nextStep: NextStep | null
  /** Null when nothing was done. */
  plateau: PlateauReport | null
  /** Load moved x reps over the working sets done. */
  volumeKg: number
  /** This session was a planned deload of the lift (lighter on purpose). */
  deload: boolean
}

export function reportLift(input: LiftReportInput): LiftReport {
  const { lift, current } = input
  const reading: LoadReading = { mode: lift.mode ?? 'external', bodyMassKg: current.bodyMassKg ?? null }
  const earlier = progressHistory(input.history)
  const last = earlier.at(-1)
  const lastReading: LoadReading = { mode: reading.mode, bodyMassKg: last?.bodyMassKg ?? reading.bodyMassKg }
  const change = compareWithLastTime(current.sets, last?.sets, reading, lastReading, lift.formula)
  // Records compare loads moved, earlier sets read with today's body mass: a bodyweight record is
  // "more reps at this added load or more" or a higher estimate, not a change of body mass.
  const moved = (s: LoadReps): LoadReps => ({ loadKg: movedLoadKg(s.loadKg, reading) ?? s.loadKg, reps: s.reps })
  const records = current.sets.length ? sessionRecords(current.sets.map(moved), input.recordHistory.map(moved), lift.formula) : []
  if (current.sets.length === 0) return { change, records, nextStep: null, plateau: null, volumeKg: 0, deload: current.deload ?? false }
  // A deload session is judged as a deload: its next step continues from before it.
  const exposures = [...input.history, current]
  const nextStep = nextSteps(exposures, lift)[0] ?? null
  const plateau = detectPlateau(exposures, {
    ...lift,
    role: input.role,
    version: input.version,
    recordToday: records.length > 0,
    patternSetsInSession: input.patternSetsInSession,
  })
  return { change, records, nextStep, plateau, volumeKg: volumeKg(current.sets, reading), deload: current.deload ?? false }
}
