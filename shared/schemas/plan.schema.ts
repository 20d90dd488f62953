import { z } from 'zod'
import { setSchemeSchema, slotRoleSchema, maxWorkingSets, MAX_WORKING_SETS_ANY, MAX_WORKING_SETS_PRIMARY } from '../domain/schemes'
import { isoDateSchema } from './common.schema'

/**
 * Plans: a split of days in order (rest days included), each day in two versions (I and II)
 * built on the same skeleton of slots: the same roles in the same order, different exercises.
 */
export const slotInputSchema = z
  .object({
    /** Present when editing an existing slot: its history stays attached to it. */
    id: z.number().int().positive().optional(),
    exerciseId: z.number().int().positive(),
    role: slotRoleSchema,
    scheme: setSchemeSchema,
    restSec: z.number().int().min(15, 'At least 15 s').max(600, 'At most 10 min'),
  })
  .refine((s) => s.scheme.sets.length <= maxWorkingSets(s.role), {
    message: `At most ${MAX_WORKING_SETS_PRIMARY} working sets on a primary compound, ${MAX_WORKING_SETS_ANY} on any movement`,
    path: ['scheme', 'sets'],
  })
export type SlotInput = z.infer<typeof slotInputSchema>

export const dayInputSchema = z
  .object({
    id: z.number().int().positive().optional(),
    name: z.string().trim().min(1, 'Name the day').max(60),
    isRest: z.boolean(),
    versions: z.object({ I: z.array(slotInputSchema).max(12), II: z.array(slotInputSchema).max(12) }),
  })
  .refine((d) => !d.isRest || (d.versions.I.length === 0 && d.versions.II.length === 0), {
    message: 'A rest day has no exercises',
    path: ['versions'],
  })
  .refine(
    (d) => d.versions.I.length === d.versions.II.length && d.versions.I.every((s, i) => s.role === d.versions.II[i].role),
    { message: 'Version I and version II need the same slots (same roles in the same order)', path: ['versions', 'II'] },
  )
export type DayInput = z.infer<typeof dayInputSchema>

export const planInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the plan').max(80),
  splitKind: z.string().trim().min(1).max(30).default('custom'),
  days: z
    .array(dayInputSchema)
    .min(1, 'A plan needs at least one day')
    .max(14)
    .refine((days) => days.some((d) => !d.isRest), { message: 'A plan needs at least one training day' }),
})
export type PlanInput = z.infer<typeof planInputSchema>

export const planFromTemplateSchema = z.object({
  templateId: z.string().min(1).max(40),
  name: z.string().trim().min(1).max(80).optional(),
})
export type PlanFromTemplateInput = z.infer<typeof planFromTemplateSchema>

export const updatePlanSchema = z
  .object({ name: z.string().trim().min(1).max(80), archived: z.boolean() })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field')
export type UpdatePlanInput = z.infer<typeof updatePlanSchema>

export const assignPlanSchema = z.object({
  athleteIds: z.array(z.number().int().positive()).min(1).max(150),
  startDate: isoDateSchema,
})
export type AssignPlanInput = z.infer<typeof assignPlanSchema>

export const slotSchema = z.object({
  id: z.number().int(),
  exerciseId: z.number().int(),
  exerciseName: z.string(),
  pattern: z.string(),
  primaryMuscles: z.array(z.string()),
  secondaryMuscles: z.array(z.string()),
  role: slotRoleSchema,
  scheme: setSchemeSchema,
  restSec: z.number().int(),
})
export type Slot = z.infer<typeof slotSchema>

export const planSchema = z.object({
  id: z.number().int(),
  ownerId: z.number().int(),
  name: z.string(),
  splitKind: z.string(),
  archived: z.boolean(),
  updatedAt: z.string(),
  days: z.array(
    z.object({
      id: z.number().int(),
      position: z.number().int(),
      name: z.string(),
      isRest: z.boolean(),
      versions: z.object({ I: z.array(slotSchema), II: z.array(slotSchema) }),
    }),
  ),
})
export type Plan = z.infer<typeof planSchema>

export const planSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  splitKind: z.string(),
  archived: z.boolean(),
  dayCount: z.number().int(),
  /** Athletes on this plan now. */
  assignedCount: z.number().int(),
  updatedAt: z.string(),
})
export type PlanSummary = z.infer<typeof planSummarySchema>

export const listPlansQuerySchema = z.object({
  archived: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
})

/** Rotate one day's version to fresh exercises of the same patterns (after a plateau). */
export const rotateVersionSchema = z.object({
  dayId: z.number().int().positive(),
  version: z.enum(['I', 'II']),
})
export type RotateVersionInput = z.infer<typeof rotateVersionSchema>

export const rotationProposalSchema = z.object({
  dayId: z.number().int(),
  version: z.enum(['I', 'II']),
  swaps: z.array(
    z.object({
      slotId: z.number().int(),
      fromExerciseId: z.number().int(),
      fromName: z.string(),
      toExerciseId: z.number().int(),
      toName: z.string(),
    }),
  ),
})
export type RotationProposal = z.infer<typeof rotationProposalSchema>

export const applyRotationSchema = z.object({
  dayId: z.number().int().positive(),
  version: z.enum(['I', 'II']),
  swaps: z.array(z.object({ slotId: z.number().int().positive(), toExerciseId: z.number().int().positive() })).min(1).max(12),
})
export type ApplyRotationInput = z.infer<typeof applyRotationSchema>
