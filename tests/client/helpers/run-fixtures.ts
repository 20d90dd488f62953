import { KG_COMPETITION_SET } from '@shared/domain/equipment'
import type { RunExercise, RunSession, RunSet } from '@shared/schemas/run.schema'

/** Builders for the runner's payloads: invented data, loads in kg. */

let counter = 0
/** A stable, valid UUID per call (the schema checks the version and variant digits). */
export function uuid(): string {
  counter += 1
  return `00000000-0000-4000-8000-${String(counter).padStart(12, '0')}`
}

export function buildSet(overrides: Partial<RunSet> = {}): RunSet {
  return {
    id: uuid(),
    exerciseId: 1,
    slotId: 10,
    position: 0,
    kind: 'straight',
    targetLoadKg: 60,
    targetRepsMin: 8,
    targetRepsMax: 12,
    targetReps: null,
    toFailure: false,
    targetRir: null,
    loadKg: null,
    reps: null,
    rir: null,
    failure: false,
    skipped: false,
    note: null,
    loggedAt: null,
    editedAt: null,
    deload: false,
    ...overrides,
  }
}

export const benchPress: RunExercise = {
  exerciseId: 1,
  slotId: 10,
  name: 'Bench press',
  pattern: 'horizontal_push',
  role: 'compound_primary',
  restSec: 180,
  equipment: KG_COMPETITION_SET,
  equipmentKind: 'barbell',
  loadMode: 'external',
  bodyMassKg: null,
  lastTime: [
    { kind: 'top', loadKg: 97.5, reps: 8, rir: 0 },
    { kind: 'backoff', loadKg: 85, reps: 11, rir: 1 },
  ],
  lastTimeAt: '2026-11-26T18:00:00.000Z',
  coachComments: [],
  nextStepBy: null,
}

export const cableFly: RunExercise = {
  exerciseId: 2,
  slotId: 11,
  name: 'Cable fly',
  pattern: 'chest_fly',
  role: 'isolation',
  restSec: 90,
  equipment: { kind: 'stack', unit: 'kg', steps: [5, 10, 15, 20, 25, 30], addOns: [] },
  equipmentKind: 'cable',
  loadMode: 'external',
  bodyMassKg: null,
  lastTime: [],
  lastTimeAt: null,
  coachComments: [],
  nextStepBy: null,
}

/** Push day: bench press (2 warm-ups, a top set, a back-off set) and cable fly (2 sets). */
export function buildRunSession(): RunSession {
  const bench = { exerciseId: 1, slotId: 10 }
  const fly = { exerciseId: 2, slotId: 11 }
  return {
    id: 41,
    athleteId: 7,
    dayName: 'Push',
    version: 'I',
    status: 'in_progress',
    startedAt: '2026-12-01T17:00:00.000Z',
    completedAt: null,
    workingSets: 0,
    volumeKg: 0, records: 0,
    exercises: [benchPress, cableFly],
    sets: [
      buildSet({ ...bench, position: 0, kind: 'warmup', targetLoadKg: 25, targetRepsMin: 6, targetRepsMax: 6 }),
      buildSet({ ...bench, position: 1, kind: 'warmup', targetLoadKg: 80, targetRepsMin: 3, targetRepsMax: 3 }),
      buildSet({ ...bench, position: 2, kind: 'top', targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, targetReps: 8, toFailure: true }),
      buildSet({ ...bench, position: 3, kind: 'backoff', targetLoadKg: 85, targetRepsMin: 9, targetRepsMax: 12 }),
      buildSet({ ...fly, position: 100, kind: 'straight', targetLoadKg: 20, targetRepsMin: 10, targetRepsMax: 15, targetRir: 2 }),
      buildSet({ ...fly, position: 101, kind: 'straight', targetLoadKg: 20, targetRepsMin: 10, targetRepsMax: 15, targetRir: 2 }),
    ],
  }
}

/** The same push day with bench press new to the lifter: no warm-ups and no loads (no history, no estimate). */
export function buildUnplannedSession(): RunSession {
  const session = buildRunSession()
  session.sets = session.sets
    .filter((s) => !(s.exerciseId === 1 && s.kind === 'warmup'))
    .map((s) => (s.exerciseId === 1 ? { ...s, targetLoadKg: null, targetReps: s.kind === 'top' ? 7 : 9 } : s))
  return session
}

/** The server's answer to a start: bench press planned again from it with new set ids, its warm-up first. */
export function plannedFromStart(session: RunSession): RunSession {
  const bench = { exerciseId: 1, slotId: 10 }
  return {
    ...session,
    sets: [
      buildSet({ ...bench, position: 0, kind: 'warmup', targetLoadKg: 25, targetRepsMin: 6, targetRepsMax: 6 }),
      buildSet({ ...bench, position: 1, kind: 'top', targetLoadKg: 70, targetRepsMin: 6, targetRepsMax: 9, targetReps: 7, toFailure: true }),
      buildSet({ ...bench, position: 2, kind: 'backoff', targetLoadKg: 60, targetRepsMin: 9, targetRepsMax: 12, targetReps: 9, toFailure: true }),
      ...session.sets.filter((s) => s.exerciseId === 2),
    ],
  }
}

/** The push day with both bench warm-ups already logged: the top set is on the card. */
export function buildSessionAtTopSet(): RunSession {
  const session = buildRunSession()
  session.sets[0] = { ...session.sets[0], loadKg: 25, reps: 6, loggedAt: '2026-12-01T17:50:00.000Z', editedAt: '2026-12-01T17:50:00.000Z' }
  session.sets[1] = { ...session.sets[1], loadKg: 80, reps: 3, loggedAt: '2026-12-01T17:53:00.000Z', editedAt: '2026-12-01T17:53:00.000Z' }
  return session
}

