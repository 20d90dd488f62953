import { Op, col, fn, literal } from 'sequelize'
import type { ReviewFlag } from '@shared/domain/review-flags'
import type { Comment, CreateCommentInput, ReviewDeskQuery, ReviewDeskRow, SessionReview } from '@shared/schemas/review.schema'
import type { AppConfig } from '../config'
import { CoachAthleteModel, CommentModel, ReviewModel, SessionModel, SetLogModel, UserModel } from '../db'
import { AppError } from '../errors'
import type { Mailer } from '../mail/mailer'
import { dailyDigestMail, sessionCompletedMail, sessionReviewedMail } from '../mail/templates'
import { toSessionSummary } from './presenters'
import { sessionForViewer } from './session.service'

const flagsOf = (session: SessionModel): ReviewFlag[] => ((session.summary as { flags?: ReviewFlag[] } | null)?.flags ?? [])
const describe = (s: SessionModel) => (s.dayName ? `${s.dayName} · version ${s.versionLabel}` : 'a session')

/** The coach's queue: their athletes' completed sessions, newest first, with the engine's flags. */
export async function listReviewDesk(coach: UserModel, query: ReviewDeskQuery): Promise<ReviewDeskRow[]> {
  const links = await CoachAthleteModel.findAll({ where: { coachId: coach.id } })
  let athleteIds = links.map((l) => l.athleteId)
  if (query.athleteId !== undefined) {
    if (!athleteIds.includes(query.athleteId)) throw AppError.notFound('Athlete')
    athleteIds = [query.athleteId]
  }
  if (athleteIds.length === 0) return []
  // Reviewed or not is decided in the database (reviews has an index on session_id), so only the
  // page's own reviews are read, whatever the size of the history.
  const reviewedIds = literal('(SELECT session_id FROM reviews)')
  const sessions = await SessionModel.findAll({
    where: {
      athleteId: athleteIds,
      status: 'completed',
      ...(query.status === 'waiting' ? { id: { [Op.notIn]: reviewedIds } } : {}),
      ...(query.status === 'reviewed' ? { id: { [Op.in]: reviewedIds } } : {}),
    },
    include: [{ model: UserModel, as: 'athlete', attributes: ['id', 'name'] }],
    order: [['completedAt', 'DESC'], ['id', 'DESC']],
    limit: query.limit,
  })
  const reviewed = await ReviewModel.findAll({ attributes: ['sessionId', 'reviewedAt'], where: { sessionId: sessions.map((s) => s.id) } })
  const counts = (await CommentModel.findAll({
    attributes: ['sessionId', [fn('COUNT', col('id')), 'count']],
    where: { sessionId: sessions.map((s) => s.id) },
    group: ['sessionId'],
    raw: true,
  })) as unknown as Array<{ sessionId: number; count: number }>
  return sessions.map((s) => {
    const athlete = (s as SessionModel & { athlete?: UserModel }).athlete
    return {
      session: toSessionSummary(s),
      athlete: { id: s.athleteId, name: athlete?.name ?? '' },
      flags: flagsOf(s),
      reviewedAt: reviewed.find((r) => r.sessionId === s.id)?.reviewedAt.toISOString() ?? null,
      commentCount: Number(counts.find((c) => c.sessionId === s.id)?.count ?? 0),
    }
  })
}

async function commentsOf(sessionId: number): Promise<Comment[]> {
  const comments = await CommentModel.findAll({
    where: { sessionId },
    include: [{ model: UserModel, as: 'author', attributes: ['id', 'name', 'role'] }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
  })
  return comments.map((c) => {
    const author = (c as CommentModel & { author?: UserModel }).author
    return {
      id: c.id,
      sessionId: c.sessionId,
      setLogId: c.setLogId,
      author: { id: c.authorId, name: author?.name ?? '', role: author?.role ?? 'lifter' },
      body: c.body,
      createdAt: c.createdAt.toISOString(),
    }
  })
}

/** Review state, flags and comments of one session (the lifter, their coach, an admin). */
export async function getSessionReview(viewer: UserModel, sessionId: number): Promise<SessionReview> {
  const { session } = await sessionForViewer(viewer, sessionId)
  const review = await ReviewModel.findOne({ where: { sessionId }, include: [{ model: UserModel, as: 'coach', attributes: ['name'] }] })
  return {
    reviewedAt: review?.reviewedAt.toISOString() ?? null,
    reviewedBy: (review as ReviewModel & { coach?: UserModel } | null)?.coach?.name ?? null,
    flags: flagsOf(session),
    comments: await commentsOf(sessionId),
  }
}

/** A comment on the session or one of its sets, by the lifter or their coach. */
export async function addComment(viewer: UserModel, sessionId: number, input: CreateCommentInput): Promise<Comment> {
  const { session } = await sessionForViewer(viewer, sessionId)
  if (viewer.role === 'admin') throw AppError.forbidden('Admins do not comment on training')
  if (input.setLogId !== null && (await SetLogModel.count({ where: { id: input.setLogId, sessionId } })) === 0) {
    throw AppError.badRequest('That set is not in this session', [{ path: 'setLogId', message: 'Not a set of this session' }])
  }
  const comment = await CommentModel.create({ sessionId: session.id, setLogId: input.setLogId, authorId: viewer.id, body: input.body })
  return (await commentsOf(sessionId)).find((c) => c.id === comment.id)!
}

/** The coach marks a session reviewed; the lifter gets an e-mail. Marking it again changes nothing. */
export async function markReviewed(config: AppConfig, mailer: Mailer, coach: UserModel, sessionId: number, now = new Date()) {
  const { session, athlete } = await sessionForViewer(coach, sessionId)
  if (coach.role !== 'coach') throw AppError.forbidden('Only the athlete\'s coach reviews sessions')
  if (session.status !== 'completed') throw AppError.conflict('session_running', 'The session is not finished yet')
  const [, created] = await ReviewModel.findOrCreate({ where: { sessionId }, defaults: { sessionId, coachId: coach.id, reviewedAt: now } })
  if (created) {
    const comments = await CommentModel.count({ where: { sessionId, authorId: coach.id } })
    await mailer.send(sessionReviewedMail(athlete.email, athlete.name, coach.name, describe(session), comments, `${config.appUrl}/logbook/${sessionId}`))
  }
  return getSessionReview(coach, sessionId)
}

/** E-mails each coach who wants one message per finished session. */
export async function notifyCoachesOfCompletion(config: AppConfig, mailer: Mailer, session: SessionModel, athlete: UserModel) {
  const links = await CoachAthleteModel.findAll({ where: { athleteId: athlete.id } })
  if (links.length === 0) return
  const coaches = await UserModel.findAll({ where: { id: links.map((l) => l.coachId), notifyCompleted: 'each', active: true } })
  for (const coach of coaches) {
    await mailer.send(sessionCompletedMail(coach.email, coach.name, athlete.name, describe(session), `${config.appUrl}/review`))
  }
}

/** One e-mail per coach on the daily digest, listing sessions finished since the last one. */
export async function sendDailyDigests(config: AppConfig, mailer: Mailer, now = new Date()) {
  const dayAgo = new Date(now.getTime() - 86_400_000)
  const coaches = await UserModel.findAll({
    where: { role: 'coach', active: true, notifyCompleted: 'daily', [Op.or]: [{ lastDigestAt: null }, { lastDigestAt: { [Op.lte]: dayAgo } }] },
  })
  let sent = 0
  for (const coach of coaches) {
    const since = coach.lastDigestAt ?? dayAgo
    const athleteIds = (await CoachAthleteModel.findAll({ where: { coachId: coach.id } })).map((l) => l.athleteId)
    const sessions = await SessionModel.findAll({
      where: { athleteId: athleteIds, status: 'completed', completedAt: { [Op.gt]: since, [Op.lte]: now } },
      include: [{ model: UserModel, as: 'athlete', attributes: ['name'] }],
      order: [['completedAt', 'ASC']],
    })
    if (sessions.length > 0) {
      const lines = sessions.map((s) => `${(s as SessionModel & { athlete?: UserModel }).athlete?.name ?? ''}: ${describe(s)}`)
      await mailer.send(dailyDigestMail(coach.email, coach.name, lines, `${config.appUrl}/review`))
      sent += 1
    }
    await coach.update({ lastDigestAt: now })
  }
  return sent
}
