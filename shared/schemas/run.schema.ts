import { z } from 'zod'
import { equipmentSchema } from '../domain/equipment'
import { slotRoleSchema } from './train.schema'
import { sessionSummarySchema, setKindSchema, versionLabelSchema } from './session.schema'

/**
 * The session runner's payloads: starting a session, logging sets (idempotent by the set's
 * client-made UUID), swapping an exercise, finishing, and taking next steps.
 */

/** Start today's session (no body fields), another day of the plan, or an empty session. */
export const startSessionSchema = z
  .object({
    dayId: z.number().int().positive().optional(),
    version: versionLabelSchema.optional(),
    empty: z.boolean().default(false),
  })
  .refine((v) => !(v.empty && v.dayId !== undefined), { message: 'An empty session has no plan day', path: ['dayId'] })
  .refine((v) => (v.dayId === undefined) === (v.version === undefined), {
    message: 'Pick a day and its version together',
    path: ['version'],
  })
export type StartSessionInput = z.infer<typeof startSessionSchema>

/** One set of a running session (planned, done or skipped). Loads in kilograms. */
export const runSetSchema = z.object({
  id: z.uuid(),
  exerciseId: z.number().int(),
  slotId: z.number().int().nullable(),
  position: z.number().int(),
  kind: setKindSchema,
  targetLoadKg: z.number().nullable(),
  targetRepsMin: z.number().int().nullable(),
  targetRepsMax: z.number().int().nullable(),
  /** The rep count to beat inside the range (from the next step), or null. */
  targetReps: z.number().int().nullable(),
  toFailure: z.boolean(),
  targetRir: z.number().int().nullable(),
  loadKg: z.number().nullable(),
  reps: z.number().int().nullable(),
  rir: z.number().int().nullable(),
  failure: z.boolean(),
  skipped: z.boolean(),
  note: z.string().nullable(),
  loggedAt: z.string().nullable(),
  /** The client's time of the last edit: the later edit wins when two devices disagree. */
  editedAt: z.string().nullable(),
})
export type RunSet = z.infer<typeof runSetSchema>

/** What the lifter did on the same slot (or exercise) last time, working sets in order. */
export const lastTimeSetSchema = z.object({
  kind: setKindSchema,
  loadKg: z.number(),
  reps: z.number().int(),
  rir: z.number().int().nullable(),
})

export const runExerciseSchema = z.object({
  exerciseId: z.number().int(),
  slotId: z.number().int().nullable(),
  name: z.string(),
  pattern: z.string(),
  role: slotRoleSchema,
  restSec: z.number().int(),
  /** The equipment that loads this exercise in the lifter's gym. */
  equipment: equipmentSchema,
  lastTime: z.array(lastTimeSetSchema),
  lastTimeAt: z.string().nullable(),
  /** The coach's comments on this exercise's sets last time, for the set card. */
  coachComments: z.array(z.object({ body: z.string(), author: z.string(), createdAt: z.string() })),
  /** Who set today's first target: the coach edited the next step, or the lifter took it. */
  nextStepBy: z.enum(['coach', 'lifter']).nullable(),
})
export type RunExercise = z.infer<typeof runExerciseSchema>

export const runSessionSchema = sessionSummarySchema.extend({
  exercises: z.array(runExerciseSchema),
  sets: z.array(runSetSchema),
})
export type RunSession = z.infer<typeof runSessionSchema>

const load = z.number().min(0, 'A load cannot be negative').max(1000, 'At most 1000 kg')
const reps = z.number().int().min(0).max(50, 'At most 50 reps')

/** PUT /api/sessions/:id/sets/:setId — creates or updates one set; the same request twice is safe. */
export const logSetSchema = z.object({
  exerciseId: z.number().int().positive(),
  slotId: z.number().int().positive().nullable(),
  // Exercise blocks are 100 positions apart (block i at i*100), so a long session runs past 500.
  position: z.number().int().min(0).max(1_000_000),
  kind: setKindSchema,
  targetLoadKg: load.nullable(),
  targetRepsMin: reps.nullable(),
  targetRepsMax: reps.nullable(),
  targetReps: reps.nullable().default(null),
  toFailure: z.boolean(),
  targetRir: z.number().int().min(0).max(10).nullable(),
  loadKg: load.nullable(),
  reps: reps.nullable(),
  rir: z.number().int().min(0).max(10).nullable(),
  failure: z.boolean(),
  skipped: z.boolean().default(false),
  note: z.string().trim().max(500).nullable(),
  loggedAt: z.iso.datetime().nullable(),
  editedAt: z.iso.datetime(),
})
export type LogSetInput = z.infer<typeof logSetSchema>

export const setParamsSchema = z.object({ id: z.coerce.number().int().positive(), setId: z.uuid() })

/** Swap every set of one exercise that is not yet done for another exercise. */
export const swapExerciseSchema = z.object({
  exerciseId: z.number().int().positive(),
  slotId: z.number().int().positive().nullable(),
  toExerciseId: z.number().int().positive(),
})
export type SwapExerciseInput = z.infer<typeof swapExerciseSchema>

/** Add an exercise (with its default sets for a role) to the running session. */
export const addExerciseSchema = z.object({
  exerciseId: z.number().int().positive(),
  role: slotRoleSchema,
})
export type AddExerciseInput = z.infer<typeof addExerciseSchema>

export const completeSessionSchema = z.object({
  completedAt: z.iso.datetime(),
  note: z.string().trim().max(2000).nullable().default(null),
})
export type CompleteSessionInput = z.infer<typeof completeSessionSchema>

export const recordSchema = z.object({
  kind: z.enum(['rep_record', 'e1rm_record']),
  loadKg: z.number(),
  reps: z.number().int(),
  e1rmKg: z.number(),
  /** The previous best it beats: reps at this load or more (rep record), or the best estimated 1RM. */
  previous: z.number().nullable(),
})
export type SessionRecord = z.infer<typeof recordSchema>

const reasonSchema = z.object({ code: z.string(), values: z.record(z.string(), z.unknown()), message: z.string() })

export const nextStepOptionSchema = z.object({
  action: z.enum(['add_rep', 'add_load', 'hold']),
  targetLoadKg: z.number(),
  targetReps: z.number().int(),
  repsMin: z.number().int(),
  repsMax: z.number().int(),
  workChangePct: z.number().nullable(),
  reason: reasonSchema,
})
export type NextStepOptionView = z.infer<typeof nextStepOptionSchema>

export const plateauOptionSchema = z.object({
  kind: z.enum(['microload', 'rotate_version', 'add_set', 'deload']),
  reason: reasonSchema,
})

export const exerciseReportSchema = z.object({
  exerciseId: z.number().int(),
  slotId: z.number().int().nullable(),
  name: z.string(),
  workingSets: z.number().int(),
  volumeKg: z.number(),
  bestE1rmKg: z.number().nullable(),
  previousBestE1rmKg: z.number().nullable(),
  /** Change of this session's best estimated 1RM against last time's, in percent. */
  e1rmChangePct: z.number().nullable(),
  records: z.array(recordSchema),
  nextStep: nextStepOptionSchema.nullable(),
  alternative: nextStepOptionSchema.nullable(),
  plateau: z.object({ exposuresWithoutImprovement: z.number().int(), options: z.array(plateauOptionSchema) }).nullable(),
  /** What the lifter took for next time, once taken. */
  taken: z
    .object({
      targetLoadKg: z.number(),
      targetReps: z.number().int(),
      status: z.enum(['taken', 'edited']),
      /** Who chose it: the lifter, or their coach editing it. */
      by: z.enum(['lifter', 'coach']).default('lifter'),
    })
    .nullable(),
})
export type ExerciseReport = z.infer<typeof exerciseReportSchema>

export const sessionReportSchema = z.object({
  session: sessionSummarySchema,
  durationSec: z.number().int().nullable(),
  exercises: z.array(exerciseReportSchema),
})
export type SessionReport = z.infer<typeof sessionReportSchema>

/** Take (or edit) the next step of one or more exercises. */
export const takeNextStepsSchema = z.object({
  steps: z
    .array(
      z.object({
        exerciseId: z.number().int().positive(),
        slotId: z.number().int().positive().nullable(),
        targetLoadKg: load,
        targetReps: reps.min(1),
        edited: z.boolean(),
      }),
    )
    .min(1)
    .max(30),
})
export type TakeNextStepsInput = z.infer<typeof takeNextStepsSchema>
