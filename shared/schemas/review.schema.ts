import { z } from 'zod'
import { roleSchema } from './common.schema'
import { sessionSummarySchema } from './session.schema'

export const reviewFlagSchema = z.object({
  code: z.enum(['plateau', 'regression', 'top_set_far_short', 'cut_short', 'missed_days', 'rest_skipped']),
  exercise: z.string().optional(),
  values: z.record(z.string(), z.number()),
})
export type ReviewFlagView = z.infer<typeof reviewFlagSchema>

export const reviewDeskQuerySchema = z.object({
  status: z.enum(['waiting', 'reviewed', 'all']).default('waiting'),
  athleteId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(100),
})
export type ReviewDeskQuery = z.infer<typeof reviewDeskQuerySchema>

/** One completed session on the coach's review desk. */
export const reviewDeskRowSchema = z.object({
  session: sessionSummarySchema,
  athlete: z.object({ id: z.number().int(), name: z.string() }),
  flags: z.array(reviewFlagSchema),
  reviewedAt: z.string().nullable(),
  commentCount: z.number().int(),
})
export type ReviewDeskRow = z.infer<typeof reviewDeskRowSchema>

export const commentSchema = z.object({
  id: z.number().int(),
  sessionId: z.number().int(),
  /** A comment on one set, or null for the whole session. */
  setLogId: z.string().nullable(),
  author: z.object({ id: z.number().int(), name: z.string(), role: roleSchema }),
  body: z.string(),
  createdAt: z.string(),
})
export type Comment = z.infer<typeof commentSchema>

export const createCommentSchema = z.object({
  body: z.string().trim().min(1, 'Write something').max(2000, 'At most 2000 characters'),
  setLogId: z.uuid().nullable().default(null),
})
export type CreateCommentInput = z.infer<typeof createCommentSchema>

export const sessionReviewSchema = z.object({
  reviewedAt: z.string().nullable(),
  reviewedBy: z.string().nullable(),
  flags: z.array(reviewFlagSchema),
  comments: z.array(commentSchema),
})
export type SessionReview = z.infer<typeof sessionReviewSchema>
