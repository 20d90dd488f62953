import type { User } from '@shared/schemas/auth.schema'
import type { SessionSummary, SetLog } from '@shared/schemas/session.schema'
import type { SessionModel, SetLogModel, UserModel } from '../db'

export function toUser(user: UserModel): User {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    unit: user.unit,
    active: user.active,
    cautionsAcknowledgedAt: user.cautionsAcknowledgedAt?.toISOString() ?? null,
    notifyCompleted: user.notifyCompleted,
    createdAt: user.createdAt.toISOString(),
  }
}

export function toSetLog(set: SetLogModel): SetLog {
  return {
    id: set.id,
    sessionId: set.sessionId,
    exerciseId: set.exerciseId,
    exerciseName: set.exercise?.name ?? '',
    position: set.position,
    kind: set.kind,
    targetLoadKg: set.targetLoadKg,
    targetRepsMin: set.targetRepsMin,
    targetRepsMax: set.targetRepsMax,
    toFailure: set.toFailure,
    loadKg: set.loadKg,
    reps: set.reps,
    rir: set.rir,
    failure: set.failure,
    note: set.note,
    loggedAt: set.loggedAt?.toISOString() ?? null,
    videoId: set.video?.id ?? null,
  }
}

/** Summary numbers stored on the session when it is completed. */
export interface StoredSessionSummary {
  workingSets: number
  volumeKg: number
  /** Rep and estimated-1RM records set in the session (stored when it is finished). */
  records?: number
}

export function toSessionSummary(session: SessionModel): SessionSummary {
  const summary = (session.summary ?? { workingSets: 0, volumeKg: 0 }) as StoredSessionSummary
  return {
    id: session.id,
    athleteId: session.athleteId,
    dayName: session.dayName,
    version: session.versionLabel,
    status: session.status,
    startedAt: session.startedAt?.toISOString() ?? null,
    completedAt: session.completedAt?.toISOString() ?? null,
    workingSets: summary.workingSets,
    volumeKg: summary.volumeKg,
    records: summary.records ?? 0,
  }
}
