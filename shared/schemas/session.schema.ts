import { z } from './zod'
import { versionLabelSchema } from './version-label.schema'

export { versionLabelSchema, type VersionLabel } from './version-label.schema'

export const setKindSchema = z.enum(['warmup', 'top', 'backoff', 'straight'])
export type SetKind = z.infer<typeof setKindSchema>

export const sessionStatusSchema = z.enum(['planned', 'in_progress', 'completed'])
export type SessionStatus = z.infer<typeof sessionStatusSchema>

/** One logged (or planned) set. Loads are stored in kilograms at full precision. */
export const setLogSchema = z.object({
  id: z.uuid(),
  sessionId: z.int(),
  exerciseId: z.int(),
  exerciseName: z.string(),
  position: z.int(),
  kind: setKindSchema,
  targetLoadKg: z.nullable(z.number()),
  targetRepsMin: z.nullable(z.int()),
  targetRepsMax: z.nullable(z.int()),
  toFailure: z.boolean(),
  loadKg: z.nullable(z.number()),
  reps: z.nullable(z.int()),
  rir: z.nullable(z.int()),
  failure: z.boolean(),
  note: z.nullable(z.string()),
  loggedAt: z.nullable(z.string()),
  /** The form-check video attached to this set, if any. */
  videoId: z.nullable(z.int()),
})
export type SetLog = z.infer<typeof setLogSchema>

export const sessionSummarySchema = z.object({
  id: z.int(),
  athleteId: z.int(),
  dayName: z.nullable(z.string()),
  version: z.nullable(versionLabelSchema),
  status: sessionStatusSchema,
  startedAt: z.nullable(z.string()),
  completedAt: z.nullable(z.string()),
  workingSets: z.int(),
  volumeKg: z.number(),
  /** Rep and estimated-1RM records set in the session. */
  records: z._default(z.int(), 0),
})
export type SessionSummary = z.infer<typeof sessionSummarySchema>

export const sessionDetailSchema = z.extend(sessionSummarySchema, {
  /** The lifter's note on the whole session. */
  note: z._default(z.nullable(z.string()), null),
  sets: z.array(setLogSchema),
})
export type SessionDetail = z.infer<typeof sessionDetailSchema>

export const listSessionsQuerySchema = z.object({
  /** A coach or admin names the athlete; a lifter sees their own. */
  athleteId: z.optional(z.pipe(z.coerce.number(), z.int().check(z.positive()))),
  limit: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(200))), 50),
})
export type ListSessionsQuery = z.infer<typeof listSessionsQuerySchema>
