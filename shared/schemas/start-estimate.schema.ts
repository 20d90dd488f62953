import { z } from './zod'

/**
 * Starting estimates: for a lift an athlete has never logged, the estimated 1RM its first
 * session is planned from. The coach enters a recent set (load x reps, as "she benches 60 for 8"),
 * the server works out the estimate; the lifter can do the same on the set card.
 */
export const startEstimateRowSchema = z.object({
  exerciseId: z.int(),
  exerciseName: z.string(),
  /** The athlete has logged working sets of this exercise: the engine plans from those instead. */
  hasHistory: z.boolean(),
  /** The kept estimate (kg, load moved), or null. */
  e1rmKg: z.nullable(z.number()),
  /** The set it came from, in logged kilograms. */
  loadKg: z.nullable(z.number()),
  reps: z.nullable(z.int()),
  setBy: z.nullable(z.enum(['coach', 'lifter'])),
})
export type StartEstimateRow = z.infer<typeof startEstimateRowSchema>

export const startEstimatesAnswerSchema = z.object({ estimates: z.array(startEstimateRowSchema) })
export type StartEstimatesAnswer = z.infer<typeof startEstimatesAnswerSchema>

export const setStartEstimatesSchema = z.object({
  estimates: z.array(z.object({
    exerciseId: z.int().check(z.positive()),
    loadKg: z.number().check(z.gte(0, 'A load cannot be negative'), z.lte(1000, 'At most 1000 kg')),
    reps: z.int().check(z.gte(1), z.lte(20, 'Use a set of 20 reps or fewer')),
  })).check(z.minLength(1), z.maxLength(60)),
})
export type SetStartEstimatesInput = z.infer<typeof setStartEstimatesSchema>
