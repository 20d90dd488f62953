import { z } from '@shared/schemas/zod'
import {
  commentSchema,
  reviewDeskRowSchema,
  sessionReviewSchema,
  type Comment,
  type CreateCommentInput,
  type ReviewDeskQuery,
  type ReviewDeskRow,
  type SessionReview,
} from '@shared/schemas/review.schema'
import { request } from './client'

/** The review desk: the coach's queue, one session's review and comments, marking it reviewed. */

const deskEnvelope = z.object({ sessions: z.array(reviewDeskRowSchema) })
const reviewEnvelope = z.object({ review: sessionReviewSchema })
const commentEnvelope = z.object({ comment: commentSchema })

export type ReviewDeskParams = Pick<ReviewDeskQuery, 'status'> & Partial<Pick<ReviewDeskQuery, 'athleteId' | 'limit'>>

/** Completed sessions of the coach's athletes, newest first. */
export async function listReviewDesk(params: ReviewDeskParams): Promise<ReviewDeskRow[]> {
  const query = { status: params.status, athleteId: params.athleteId, limit: params.limit }
  return (await request('GET', '/review-desk', { query, schema: deskEnvelope })).sessions
}

/** Review state, flags and comments of one session (its lifter or their coach). */
export async function getSessionReview(sessionId: number): Promise<SessionReview> {
  return (await request('GET', `/sessions/${sessionId}/review`, { schema: reviewEnvelope })).review
}

/** A comment on the whole session (setLogId null) or on one of its sets. */
export async function addComment(sessionId: number, input: CreateCommentInput): Promise<Comment> {
  return (await request('POST', `/sessions/${sessionId}/comments`, { body: input, schema: commentEnvelope })).comment
}

/** The coach marks the session reviewed; the server tells the lifter. Marking again changes nothing. */
export async function markSessionReviewed(sessionId: number): Promise<SessionReview> {
  return (await request('POST', `/sessions/${sessionId}/reviewed`, { schema: reviewEnvelope })).review
}
