import { z } from './zod'
import { unitSchema } from './common.schema'

export const exportQuerySchema = z.object({
  format: z._default(z.enum(['csv', 'json']), 'csv'),
  /** A coach exports one athlete's logbook; a lifter their own. */
  athleteId: z.optional(z.pipe(z.coerce.number(), z.int().check(z.positive()))),
})
export type ExportQuery = z.infer<typeof exportQuerySchema>

/** Which CSV column holds what; null for a column the file does not have. */
export const importMappingSchema = z.object({
  date: z.string().check(z.minLength(1)),
  exercise: z.string().check(z.minLength(1)),
  load: z.string().check(z.minLength(1)),
  reps: z.string().check(z.minLength(1)),
  unit: z._default(z.nullable(z.string()), null),
  rir: z._default(z.nullable(z.string()), null),
  note: z._default(z.nullable(z.string()), null),
  kind: z._default(z.nullable(z.string()), null),
})
export type ImportMapping = z.infer<typeof importMappingSchema>

/** The import form: the file's text, the column mapping, and what to do with unknown exercise names. */
export const importRequestSchema = z.object({
  csv: z.string().check(z.maxLength(5_000_000, 'The file is larger than 5 MB')),
  mapping: z.optional(importMappingSchema),
  /** The unit of loads when the file has no unit column. */
  unit: unitSchema,
  /** Unknown exercise name -> a library exercise id, or "new" to add it as your own. */
  exerciseMap: z._default(z.record(z.string(), z.union([z.int().check(z.positive()), z.literal('new')])), {}),
})
export type ImportRequest = z.infer<typeof importRequestSchema>

export const importRowSchema = z.object({
  line: z.int(),
  date: z.nullable(z.string()),
  exercise: z.string(),
  loadKg: z.nullable(z.number()),
  reps: z.nullable(z.int()),
  rir: z.nullable(z.int()),
  note: z.nullable(z.string()),
  kind: z.enum(['warmup', 'top', 'backoff', 'straight']),
  errors: z.array(z.string()),
})
export type ImportRow = z.infer<typeof importRowSchema>

export const importPreviewSchema = z.object({
  headers: z.array(z.string()),
  mapping: z.nullable(importMappingSchema),
  rows: z.array(importRowSchema),
  rowCount: z.int(),
  errorCount: z.int(),
  unknownExercises: z.array(z.string()),
})
export type ImportPreview = z.infer<typeof importPreviewSchema>

export const importResultSchema = z.object({
  sessionsCreated: z.int(),
  setsCreated: z.int(),
  setsAlreadyThere: z.int(),
  exercisesCreated: z.int(),
})
export type ImportResult = z.infer<typeof importResultSchema>
