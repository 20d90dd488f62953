import { randomUUID } from 'node:crypto'
import { ExerciseModel, SessionModel, SetLogModel } from '../../server/db'

/** A completed session with one top set, straight in the database. */
export async function buildCompletedSession(athleteId: number, completedAt = new Date()) {
  const exercise =
    (await ExerciseModel.findOne({ where: { name: 'Test squat' } })) ??
    (await ExerciseModel.create({
      ownerId: null, name: 'Test squat', pattern: 'squat', primaryMuscles: ['quads'], secondaryMuscles: [],
      equipmentKind: 'barbell', loadStepKg: 2.5, defaultRestSec: 180,
    }))
  const session = await SessionModel.create({
    athleteId, assignmentId: null, planDayId: null, dayName: 'Legs', versionLabel: 'I', status: 'completed',
    startedAt: completedAt, completedAt, summary: { workingSets: 1, volumeKg: 800 }, note: null,
  })
  await SetLogModel.create({
    id: randomUUID(), sessionId: session.id, exerciseId: exercise.id, slotId: null, position: 0, kind: 'top',
    targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, toFailure: true, targetRir: null,
    loadKg: 100, reps: 8, rir: 0, failure: true, note: null, loggedAt: completedAt,
  })
  return session
}
