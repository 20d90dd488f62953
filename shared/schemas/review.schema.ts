import { z } from './zod'
import { roleSchema } from './common.schema'
import { sessionSummarySchema } from './session.schema'

export const reviewFlagSchema = z.object({
  code: z.enum(['plateau', 'regression', 'top_set_far_short', 'cut_short', 'missed_days', 'rest_skipped']),
  exercise: z.optional(z.string()),
  values: z.record(z.string(), z.number()),
})
export type ReviewFlagView = z.infer<typeof reviewFlagSchema>

export const reviewDeskQuerySchema = z.object({
  status: z._default(z.enum(['waiting', 'reviewed', 'all']), 'waiting'),
  athleteId: z.optional(z.pipe(z.coerce.number(), z.int().check(z.positive()))),
  limit: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(200))), 100),
})
export type ReviewDeskQuery = z.infer<typeof reviewDeskQuerySchema>

/** One completed session on the coach's review desk. */
export const reviewDeskRowSchema = z.object({
  session: sessionSummarySchema,
  athlete: z.object({ id: z.int(), name: z.string() }),
  flags: z.array(reviewFlagSchema),
  reviewedAt: z.nullable(z.string()),
  commentCount: z.int(),
})
export type ReviewDeskRow = z.infer<typeof reviewDeskRowSchema>

export const commentSchema = z.object({
  id: z.int(),
  sessionId: z.int(),
  /** A comment on one set, or null for the whole session. */
  setLogId: z.nullable(z.string()),
  author: z.object({ id: z.int(), name: z.string(), role: roleSchema }),
  body: z.string(),
  createdAt: z.string(),
})
export type Comment = z.infer<typeof commentSchema>

export const createCommentSchema = z.object({
  body: z.string().check(z.trim(), z.minLength(1, 'Write something'), z.maxLength(2000, 'At most 2000 characters')),
  setLogId: z._default(z.nullable(z.uuid()), null),
})
export type CreateCommentInput = z.infer<typeof createCommentSchema>

export const sessionReviewSchema = z.object({
  reviewedAt: z.nullable(z.string()),
  reviewedBy: z.nullable(z.string()),
  flags: z.array(reviewFlagSchema),
  comments: z.array(commentSchema),
})
export type SessionReview = z.infer<typeof sessionReviewSchema>
