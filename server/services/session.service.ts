import type { ListSessionsQuery, SessionDetail } from '@shared/schemas/session.schema'
import { ExerciseModel, SessionModel, SetLogModel, UploadModel, UserModel } from '../db'
import { AppError } from '../errors'
import { assertCanSeeAthlete } from './access.service'
import { toSessionSummary, toSetLog } from './presenters'

export async function listSessions(viewer: UserModel, query: ListSessionsQuery) {
  const athleteId = query.athleteId ?? viewer.id
  if (query.athleteId === undefined && viewer.role !== 'lifter') {
    throw AppError.badRequest('Name the athlete', [{ path: 'query.athleteId', message: 'Required for coaches and admins' }])
  }
  await assertCanSeeAthlete(viewer, athleteId)
  const sessions = await SessionModel.findAll({
    where: { athleteId },
    order: [['completedAt', 'DESC'], ['id', 'DESC']],
    limit: query.limit,
  })
  return sessions.map(toSessionSummary)
}

export async function getSession(viewer: UserModel, sessionId: number): Promise<SessionDetail> {
  const session = await SessionModel.findByPk(sessionId, {
    include: [
      {
        model: SetLogModel,
        as: 'sets',
        include: [
          { model: ExerciseModel, as: 'exercise' },
          { model: UploadModel, as: 'video', attributes: ['id'] },
        ],
      },
    ],
    order: [[{ model: SetLogModel, as: 'sets' }, 'position', 'ASC']],
  })
  if (!session) throw AppError.notFound('Session')
  await assertCanSeeAthlete(viewer, session.athleteId, 'Session')
  return { ...toSessionSummary(session), note: session.note, sets: (session.sets ?? []).map(toSetLog) }
}

/** A session and its athlete, for a viewer allowed to see them (the lifter, their coach, an admin). */
export async function sessionForViewer(viewer: UserModel, sessionId: number) {
  const session = await SessionModel.findByPk(sessionId)
  if (!session) throw AppError.notFound('Session')
  await assertCanSeeAthlete(viewer, session.athleteId, 'Session')
  const athlete = session.athleteId === viewer.id ? viewer : await UserModel.findByPk(session.athleteId)
  if (!athlete) throw AppError.notFound('Session')
  return { session, athlete }
}
