import { z } from 'zod'
import { versionLabelSchema } from './version-label.schema'

export { versionLabelSchema, type VersionLabel } from './version-label.schema'

export const setKindSchema = z.enum(['warmup', 'top', 'backoff', 'straight'])
export type SetKind = z.infer<typeof setKindSchema>

export const sessionStatusSchema = z.enum(['planned', 'in_progress', 'completed'])
export type SessionStatus = z.infer<typeof sessionStatusSchema>

/** One logged (or planned) set. Loads are stored in kilograms at full precision. */
export const setLogSchema = z.object({
  id: z.uuid(),
  sessionId: z.number().int(),
  exerciseId: z.number().int(),
  exerciseName: z.string(),
  position: z.number().int(),
  kind: setKindSchema,
  targetLoadKg: z.number().nullable(),
  targetRepsMin: z.number().int().nullable(),
  targetRepsMax: z.number().int().nullable(),
  toFailure: z.boolean(),
  loadKg: z.number().nullable(),
  reps: z.number().int().nullable(),
  rir: z.number().int().nullable(),
  failure: z.boolean(),
  note: z.string().nullable(),
  loggedAt: z.string().nullable(),
  /** The form-check video attached to this set, if any. */
  videoId: z.number().int().nullable(),
})
export type SetLog = z.infer<typeof setLogSchema>

export const sessionSummarySchema = z.object({
  id: z.number().int(),
  athleteId: z.number().int(),
  dayName: z.string().nullable(),
  version: versionLabelSchema.nullable(),
  status: sessionStatusSchema,
  startedAt: z.string().nullable(),
  completedAt: z.string().nullable(),
  workingSets: z.number().int(),
  volumeKg: z.number(),
  /** Rep and estimated-1RM records set in the session. */
  records: z.number().int().default(0),
})
export type SessionSummary = z.infer<typeof sessionSummarySchema>

export const sessionDetailSchema = sessionSummarySchema.extend({
  /** The lifter's note on the whole session. */
  note: z.string().nullable().default(null),
  sets: z.array(setLogSchema),
})
export type SessionDetail = z.infer<typeof sessionDetailSchema>

export const listSessionsQuerySchema = z.object({
  /** A coach or admin names the athlete; a lifter sees their own. */
  athleteId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
})
export type ListSessionsQuery = z.infer<typeof listSessionsQuerySchema>
