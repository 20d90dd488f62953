import { z } from 'zod'
import { unitSchema } from './common.schema'

export const exportQuerySchema = z.object({
  format: z.enum(['csv', 'json']).default('csv'),
  /** A coach exports one athlete's logbook; a lifter their own. */
  athleteId: z.coerce.number().int().positive().optional(),
})
export type ExportQuery = z.infer<typeof exportQuerySchema>

/** Which CSV column holds what; null for a column the file does not have. */
export const importMappingSchema = z.object({
  date: z.string().min(1),
  exercise: z.string().min(1),
  load: z.string().min(1),
  reps: z.string().min(1),
  unit: z.string().nullable().default(null),
  rir: z.string().nullable().default(null),
  note: z.string().nullable().default(null),
  kind: z.string().nullable().default(null),
})
export type ImportMapping = z.infer<typeof importMappingSchema>

/** The import form: the file's text, the column mapping, and what to do with unknown exercise names. */
export const importRequestSchema = z.object({
  csv: z.string().max(5_000_000, 'The file is larger than 5 MB'),
  mapping: importMappingSchema.optional(),
  /** The unit of loads when the file has no unit column. */
  unit: unitSchema,
  /** Unknown exercise name -> a library exercise id, or "new" to add it as your own. */
  exerciseMap: z.record(z.string(), z.union([z.number().int().positive(), z.literal('new')])).default({}),
})
export type ImportRequest = z.infer<typeof importRequestSchema>

export const importRowSchema = z.object({
  line: z.number().int(),
  date: z.string().nullable(),
  exercise: z.string(),
  loadKg: z.number().nullable(),
  reps: z.number().int().nullable(),
  rir: z.number().int().nullable(),
  note: z.string().nullable(),
  kind: z.enum(['warmup', 'top', 'backoff', 'straight']),
  errors: z.array(z.string()),
})
export type ImportRow = z.infer<typeof importRowSchema>

export const importPreviewSchema = z.object({
  headers: z.array(z.string()),
  mapping: importMappingSchema.nullable(),
  rows: z.array(importRowSchema),
  rowCount: z.number().int(),
  errorCount: z.number().int(),
  unknownExercises: z.array(z.string()),
})
export type ImportPreview = z.infer<typeof importPreviewSchema>

export const importResultSchema = z.object({
  sessionsCreated: z.number().int(),
  setsCreated: z.number().int(),
  setsAlreadyThere: z.number().int(),
  exercisesCreated: z.number().int(),
})
export type ImportResult = z.infer<typeof importResultSchema>
