import { z } from './zod'
import { setSchemeSchema, slotRoleSchema, maxWorkingSets, MAX_WORKING_SETS_ANY, MAX_WORKING_SETS_PRIMARY } from '../domain/schemes'
import { isoDateSchema } from './common.schema'

/**
 * Plans: a split of days in order (rest days included), each day in two versions (I and II)
 * built on the same skeleton of slots: the same roles in the same order, different exercises.
 */
export const slotInputSchema = z.object({
  /** Present when editing an existing slot: its history stays attached to it. */
  id: z.optional(z.int().check(z.positive())),
  exerciseId: z.int().check(z.positive()),
  role: slotRoleSchema,
  scheme: setSchemeSchema,
  restSec: z.int().check(z.gte(15, 'At least 15 s'), z.lte(600, 'At most 10 min')),
}).check(
  z.refine((s) => s.scheme.sets.length <= maxWorkingSets(s.role), {
    message: `At most ${MAX_WORKING_SETS_PRIMARY} working sets on a primary compound, ${MAX_WORKING_SETS_ANY} on any movement`,
    path: ['scheme', 'sets'],
  }),
)
export type SlotInput = z.infer<typeof slotInputSchema>

export const dayInputSchema = z.object({
  id: z.optional(z.int().check(z.positive())),
  name: z.string().check(z.trim(), z.minLength(1, 'Name the day'), z.maxLength(60)),
  isRest: z.boolean(),
  versions: z.object({ I: z.array(slotInputSchema).check(z.maxLength(12)), II: z.array(slotInputSchema).check(z.maxLength(12)) }),
}).check(
  z.refine((d) => !d.isRest || (d.versions.I.length === 0 && d.versions.II.length === 0), {
    message: 'A rest day has no exercises',
    path: ['versions'],
  }),
  z.refine(
    (d) => d.versions.I.length === d.versions.II.length && d.versions.I.every((s, i) => s.role === d.versions.II[i].role),
    { message: 'Version I and version II need the same slots (same roles in the same order)', path: ['versions', 'II'] },
  ),
)
export type DayInput = z.infer<typeof dayInputSchema>

export const planInputSchema = z.object({
  name: z.string().check(z.trim(), z.minLength(1, 'Name the plan'), z.maxLength(80)),
  splitKind: z._default(z.string().check(z.trim(), z.minLength(1), z.maxLength(30)), 'custom'),
  days: z.array(dayInputSchema).check(
    z.minLength(1, 'A plan needs at least one day'),
    z.maxLength(14),
    z.refine((days) => days.some((d) => !d.isRest), { message: 'A plan needs at least one training day' }),
  ),
})
export type PlanInput = z.infer<typeof planInputSchema>

export const planFromTemplateSchema = z.object({
  templateId: z.string().check(z.minLength(1), z.maxLength(40)),
  name: z.optional(z.string().check(z.trim(), z.minLength(1), z.maxLength(80))),
})
export type PlanFromTemplateInput = z.infer<typeof planFromTemplateSchema>

export const updatePlanSchema = z
  .partial(z.object({ name: z.string().check(z.trim(), z.minLength(1), z.maxLength(80)), archived: z.boolean() }))
  .check(z.refine((v) => Object.keys(v).length > 0, 'Send at least one field'))
export type UpdatePlanInput = z.infer<typeof updatePlanSchema>

export const assignPlanSchema = z.object({
  athleteIds: z.array(z.int().check(z.positive())).check(z.minLength(1), z.maxLength(150)),
  startDate: isoDateSchema,
})
export type AssignPlanInput = z.infer<typeof assignPlanSchema>

export const slotSchema = z.object({
  id: z.int(),
  exerciseId: z.int(),
  exerciseName: z.string(),
  pattern: z.string(),
  primaryMuscles: z.array(z.string()),
  secondaryMuscles: z.array(z.string()),
  role: slotRoleSchema,
  scheme: setSchemeSchema,
  restSec: z.int(),
})
export type Slot = z.infer<typeof slotSchema>

export const planSchema = z.object({
  id: z.int(),
  ownerId: z.int(),
  name: z.string(),
  splitKind: z.string(),
  archived: z.boolean(),
  updatedAt: z.string(),
  days: z.array(
    z.object({
      id: z.int(),
      position: z.int(),
      name: z.string(),
      isRest: z.boolean(),
      versions: z.object({ I: z.array(slotSchema), II: z.array(slotSchema) }),
    }),
  ),
})
export type Plan = z.infer<typeof planSchema>

export const planSummarySchema = z.object({
  id: z.int(),
  name: z.string(),
  splitKind: z.string(),
  archived: z.boolean(),
  dayCount: z.int(),
  /** Athletes on this plan now. */
  assignedCount: z.int(),
  updatedAt: z.string(),
})
export type PlanSummary = z.infer<typeof planSummarySchema>

export const listPlansQuerySchema = z.object({
  archived: z.optional(z.pipe(z.enum(['true', 'false']), z.transform((v) => v === 'true'))),
})

/** Rotate one day's version to fresh exercises of the same patterns (after a plateau). */
export const rotateVersionSchema = z.object({
  dayId: z.int().check(z.positive()),
  version: z.enum(['I', 'II']),
})
export type RotateVersionInput = z.infer<typeof rotateVersionSchema>

export const rotationProposalSchema = z.object({
  dayId: z.int(),
  version: z.enum(['I', 'II']),
  swaps: z.array(
    z.object({
      slotId: z.int(),
      fromExerciseId: z.int(),
      fromName: z.string(),
      toExerciseId: z.int(),
      toName: z.string(),
    }),
  ),
})
export type RotationProposal = z.infer<typeof rotationProposalSchema>

export const applyRotationSchema = z.object({
  dayId: z.int().check(z.positive()),
  version: z.enum(['I', 'II']),
  swaps: z.array(z.object({ slotId: z.int().check(z.positive()), toExerciseId: z.int().check(z.positive()) })).check(z.minLength(1), z.maxLength(12)),
})
export type ApplyRotationInput = z.infer<typeof applyRotationSchema>
