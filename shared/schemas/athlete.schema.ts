import { z } from './zod'
import { isoDateSchema, unitSchema } from './common.schema'

export const trendPointSchema = z.object({ date: z.string(), e1rmKg: z.number() })

/** A row of the coach's Athletes table. */
export const athleteRowSchema = z.object({
  id: z.int(),
  name: z.string(),
  email: z.string(),
  unit: unitSchema,
  planId: z.nullable(z.int()),
  planName: z.nullable(z.string()),
  lastSessionAt: z.nullable(z.string()),
  /** Completed sessions in the last 28 days. */
  sessionsLast28Days: z.int(),
  /** Training days the plan asks for in the same 28 days (null without a plan). */
  plannedLast28Days: z.nullable(z.int()),
  /** sessionsLast28Days / plannedLast28Days in percent (null without a plan). */
  adherencePct: z.nullable(z.number()),
  /** Lifts whose latest session was flagged as a plateau. */
  plateauLifts: z.array(z.string()),
  /** Finished sessions not reviewed yet. */
  waitingReview: z.int(),
  /** Best estimated 1RM per session on the main lifts over the last 8 weeks, oldest first. */
  e1rmTrend: z.array(z.object({ exercise: z.string(), points: z.array(trendPointSchema) })),
})
export type AthleteRow = z.infer<typeof athleteRowSchema>

export const progressQuerySchema = z.object({
  /** A coach names the athlete; a lifter sees their own. */
  athleteId: z.optional(z.pipe(z.coerce.number(), z.int().check(z.positive()))),
  weeks: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(260))), 26),
})
export type ProgressQuery = z.infer<typeof progressQuerySchema>

/** Chart data: estimated 1RM per exercise, weekly hard sets per muscle against the plan, body weight. */
export const progressSchema = z.object({
  e1rm: z.array(z.object({ exerciseId: z.int(), exercise: z.string(), points: z.array(trendPointSchema) })),
  weeklySets: z.array(z.object({ weekStart: z.string(), muscle: z.string(), sets: z.number() })),
  /** What the current plan asks for per muscle per week (from the engine's plan checks). */
  planWeeklySets: z.array(z.object({ muscle: z.string(), sets: z.number() })),
  bodyWeight: z.array(z.object({ date: z.string(), weightKg: z.number() })),
})
export type Progress = z.infer<typeof progressSchema>

export const bodyWeightInputSchema = z.object({
  date: isoDateSchema,
  weightKg: z.number().check(z.gte(20, 'At least 20 kg'), z.lte(400, 'At most 400 kg')),
})
export type BodyWeightInput = z.infer<typeof bodyWeightInputSchema>
