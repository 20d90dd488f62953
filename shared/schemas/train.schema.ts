import { z } from 'zod'
import { versionLabelSchema } from './version-label.schema'

export const slotRoleSchema = z.enum(['compound_primary', 'accessory', 'isolation'])
export type SlotRole = z.infer<typeof slotRoleSchema>

/** A line of the Train tab's preview: one exercise slot of today's day. */
export const todaySlotSchema = z.object({
  slotId: z.number().int(),
  exerciseName: z.string(),
  role: slotRoleSchema,
  /** Human summary of the set scheme, e.g. "top set 6-9 to failure + 1 back-off 9-12". */
  scheme: z.string(),
  /** Today's working-set targets from the engine (loads in kg). */
  targets: z.array(
    z.object({
      kind: z.enum(['top', 'backoff', 'straight']),
      targetLoadKg: z.number(),
      repsMin: z.number().int(),
      repsMax: z.number().int(),
      targetReps: z.number().int().nullable(),
    }),
  ),
})
export type TodaySlot = z.infer<typeof todaySlotSchema>

/** What is next in the lifter's plan rotation. */
export const todaySchema = z.object({
  plan: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  day: z
    .object({
      id: z.number().int(),
      name: z.string(),
      isRest: z.boolean(),
      version: versionLabelSchema,
      slots: z.array(todaySlotSchema),
    })
    .nullable(),
  /** The plan's days, for starting another day than today's. */
  planDays: z.array(z.object({ id: z.number().int(), name: z.string(), isRest: z.boolean() })),
  /** On a rest day: the training day that comes next, for a lifter who trains anyway. */
  nextTraining: z.object({ dayId: z.number().int(), name: z.string(), version: versionLabelSchema }).nullable(),
  /** A session already started and not finished: the Train tab offers to resume it. */
  inProgressSessionId: z.number().int().nullable(),
  lastSession: z
    .object({
      id: z.number().int(),
      completedAt: z.string().nullable(),
      dayName: z.string().nullable(),
      version: versionLabelSchema.nullable(),
    })
    .nullable(),
})
export type Today = z.infer<typeof todaySchema>

/** The lifter's calendar day, so rest days pass by the lifter's clock, not the server's. */
export const todayQuerySchema = z.object({
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the form YYYY-MM-DD').optional(),
  /** Minutes to add to local time to get UTC, as Date.getTimezoneOffset() gives it. */
  tzOffset: z.coerce.number().int().min(-900).max(900).default(0),
})
export type TodayQuery = z.infer<typeof todayQuerySchema>
