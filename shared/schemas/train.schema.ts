import { z } from './zod'
import { versionLabelSchema } from './version-label.schema'

export const slotRoleSchema = z.enum(['compound_primary', 'accessory', 'isolation'])
export type SlotRole = z.infer<typeof slotRoleSchema>

/** A line of the Train tab's preview: one exercise slot of today's day. */
export const todaySlotSchema = z.object({
  slotId: z.int(),
  exerciseName: z.string(),
  role: slotRoleSchema,
  /** Human summary of the set scheme, e.g. "top set 6-9 to failure + 1 back-off 9-12". */
  scheme: z.string(),
  /** Today's working-set targets from the engine (loads in kg; null until a first session has a starting load). */
  targets: z.array(
    z.object({
      kind: z.enum(['top', 'backoff', 'straight']),
      targetLoadKg: z.nullable(z.number()),
      repsMin: z.int(),
      repsMax: z.int(),
      targetReps: z.nullable(z.int()),
    }),
  ),
})
export type TodaySlot = z.infer<typeof todaySlotSchema>

/** What is next in the lifter's plan rotation. */
export const todaySchema = z.object({
  plan: z.nullable(z.object({ id: z.int(), name: z.string() })),
  day: z.nullable(z.object({
    id: z.int(),
    name: z.string(),
    isRest: z.boolean(),
    version: versionLabelSchema,
    slots: z.array(todaySlotSchema),
  })),
  /** The plan's days, for starting another day than today's. */
  planDays: z.array(z.object({ id: z.int(), name: z.string(), isRest: z.boolean() })),
  /** On a rest day: the training day that comes next, for a lifter who trains anyway. */
  nextTraining: z.nullable(z.object({ dayId: z.int(), name: z.string(), version: versionLabelSchema })),
  /** A session already started and not finished: the Train tab offers to resume it. */
  inProgressSessionId: z.nullable(z.int()),
  lastSession: z.nullable(z.object({
    id: z.int(),
    completedAt: z.nullable(z.string()),
    dayName: z.nullable(z.string()),
    version: z.nullable(versionLabelSchema),
  })),
})
export type Today = z.infer<typeof todaySchema>

/** The lifter's calendar day, so rest days pass by the lifter's clock, not the server's. */
export const todayQuerySchema = z.object({
  date: z.optional(z.string().check(z.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the form YYYY-MM-DD'))),
  /** Minutes to add to local time to get UTC, as Date.getTimezoneOffset() gives it. */
  tzOffset: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(-900), z.lte(900))), 0),
})
export type TodayQuery = z.infer<typeof todayQuerySchema>
