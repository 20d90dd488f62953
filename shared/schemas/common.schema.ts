import { z } from './zod'

/** Database ids are positive integers; route params arrive as strings. */
export const idSchema = z.pipe(z.coerce.number(), z.int().check(z.positive()))
export const idParamsSchema = z.object({ id: idSchema })
export type IdParams = z.infer<typeof idParamsSchema>

export const unitSchema = z.enum(['kg', 'lb'])
export type Unit = z.infer<typeof unitSchema>

export const roleSchema = z.enum(['lifter', 'coach', 'admin'])
export type Role = z.infer<typeof roleSchema>

/** ISO calendar date, e.g. 2026-12-01. */
export const isoDateSchema = z.string().check(z.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the form YYYY-MM-DD'))

/** The JSON body of every error response. */
export const apiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** One entry per bad field, for validation errors (HTTP 400). */
    issues: z.optional(z.array(z.object({ path: z.string(), message: z.string() }))),
  }),
})
export type ApiErrorBody = z.infer<typeof apiErrorBodySchema>
