import { z } from 'zod'
import { unitSchema } from './common.schema'

/** A row of the coach's Athletes table. */
export const athleteRowSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string(),
  unit: unitSchema,
  planName: z.string().nullable(),
  lastSessionAt: z.string().nullable(),
  /** Completed sessions in the last 28 days. */
  sessionsLast28Days: z.number().int(),
})
export type AthleteRow = z.infer<typeof athleteRowSchema>
