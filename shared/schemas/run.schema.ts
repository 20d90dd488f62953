import { z } from './zod'
import { equipmentSchema } from '../domain/equipment'
import { exerciseEquipmentSchema } from './exercise.schema'
import { slotRoleSchema } from './train.schema'
import { sessionSummarySchema, setKindSchema, versionLabelSchema } from './session.schema'

/**
 * The session runner's payloads: starting a session, logging sets (idempotent by the set's
 * client-made UUID), swapping an exercise, finishing, and taking next steps.
 */

/** Start today's session (no body fields), another day of the plan, or an empty session. */
export const startSessionSchema = z.object({
  dayId: z.optional(z.int().check(z.positive())),
  version: z.optional(versionLabelSchema),
  empty: z._default(z.boolean(), false),
}).check(
  z.refine((v) => !(v.empty && v.dayId !== undefined), { message: 'An empty session has no plan day', path: ['dayId'] }),
  z.refine((v) => (v.dayId === undefined) === (v.version === undefined), {
    message: 'Pick a day and its version together',
    path: ['version'],
  }),
)
export type StartSessionInput = z.infer<typeof startSessionSchema>

/** One set of a running session (planned, done or skipped). Loads in kilograms. */
export const runSetSchema = z.object({
  id: z.uuid(),
  exerciseId: z.int(),
  slotId: z.nullable(z.int()),
  position: z.int(),
  kind: setKindSchema,
  targetLoadKg: z.nullable(z.number()),
  targetRepsMin: z.nullable(z.int()),
  targetRepsMax: z.nullable(z.int()),
  /** The rep count to beat inside the range (from the next step), or null. */
  targetReps: z.nullable(z.int()),
  toFailure: z.boolean(),
  targetRir: z.nullable(z.int()),
  loadKg: z.nullable(z.number()),
  reps: z.nullable(z.int()),
  rir: z.nullable(z.int()),
  failure: z.boolean(),
  skipped: z.boolean(),
  note: z.nullable(z.string()),
  loggedAt: z.nullable(z.string()),
  /** The client's time of the last edit: the later edit wins when two devices disagree. */
  editedAt: z.nullable(z.string()),
  /** Planned as a deload (lighter on purpose, short of failure). */
  deload: z._default(z.boolean(), false),
})
export type RunSet = z.infer<typeof runSetSchema>

/** What the lifter did on the same slot (or exercise) last time, working sets in order. */
export const lastTimeSetSchema = z.object({
  kind: setKindSchema,
  loadKg: z.number(),
  reps: z.int(),
  rir: z.nullable(z.int()),
})

export const runExerciseSchema = z.object({
  exerciseId: z.int(),
  slotId: z.nullable(z.int()),
  name: z.string(),
  pattern: z.string(),
  role: slotRoleSchema,
  restSec: z.int(),
  /** The equipment that loads this exercise in the lifter's gym. */
  equipment: equipmentSchema,
  /**
   * How the exercise is loaded (the library's field): tells a plate-loaded sled from a barbell,
   * which the engine loads alike. Optional: copies kept on a phone before it was sent lack it.
   */
  equipmentKind: z.optional(exerciseEquipmentSchema),
  /** How the logged load reads: as is, added to body mass (bodyweight lifts), or help taken from it. */
  loadMode: z.enum(['external', 'bodyweight', 'assisted']),
  /** The lifter's latest body mass (kg) for a bodyweight or assisted lift, or null. */
  bodyMassKg: z.nullable(z.number()),
  lastTime: z.array(lastTimeSetSchema),
  lastTimeAt: z.nullable(z.string()),
  /** The coach's comments on this exercise's sets last time, for the set card. */
  coachComments: z.array(z.object({ body: z.string(), author: z.string(), createdAt: z.string() })),
  /** Who set today's first target: the coach edited the next step, or the lifter took it. */
  nextStepBy: z.nullable(z.enum(['coach', 'lifter'])),
})
export type RunExercise = z.infer<typeof runExerciseSchema>

export const runSessionSchema = z.extend(sessionSummarySchema, {
  exercises: z.array(runExerciseSchema),
  sets: z.array(runSetSchema),
})
export type RunSession = z.infer<typeof runSessionSchema>

const load = z.number().check(z.gte(0, 'A load cannot be negative'), z.lte(1000, 'At most 1000 kg'))
const reps = z.int().check(z.gte(0), z.lte(50, 'At most 50 reps'))

/** PUT /api/sessions/:id/sets/:setId — creates or updates one set; the same request twice is safe. */
export const logSetSchema = z.object({
  exerciseId: z.int().check(z.positive()),
  slotId: z.nullable(z.int().check(z.positive())),
  // Exercise blocks are 100 positions apart (block i at i*100), so a long session runs past 500.
  position: z.int().check(z.gte(0), z.lte(1_000_000)),
  kind: setKindSchema,
  targetLoadKg: z.nullable(load),
  targetRepsMin: z.nullable(reps),
  targetRepsMax: z.nullable(reps),
  targetReps: z._default(z.nullable(reps), null),
  toFailure: z.boolean(),
  targetRir: z.nullable(z.int().check(z.gte(0), z.lte(10))),
  loadKg: z.nullable(load),
  reps: z.nullable(reps),
  rir: z.nullable(z.int().check(z.gte(0), z.lte(10))),
  failure: z.boolean(),
  skipped: z._default(z.boolean(), false),
  note: z.nullable(z.string().check(z.trim(), z.maxLength(500))),
  loggedAt: z.nullable(z.iso.datetime()),
  editedAt: z.iso.datetime(),
})
export type LogSetInput = z.infer<typeof logSetSchema>

export const setParamsSchema = z.object({ id: z.pipe(z.coerce.number(), z.int().check(z.positive())), setId: z.uuid() })

/** Swap every set of one exercise that is not yet done for another exercise. */
export const swapExerciseSchema = z.object({
  exerciseId: z.int().check(z.positive()),
  slotId: z.nullable(z.int().check(z.positive())),
  toExerciseId: z.int().check(z.positive()),
})
export type SwapExerciseInput = z.infer<typeof swapExerciseSchema>

/** Add an exercise (with its default sets for a role) to the running session. */
export const addExerciseSchema = z.object({
  exerciseId: z.int().check(z.positive()),
  role: slotRoleSchema,
})
export type AddExerciseInput = z.infer<typeof addExerciseSchema>

export const completeSessionSchema = z.object({
  completedAt: z.iso.datetime(),
  note: z._default(z.nullable(z.string().check(z.trim(), z.maxLength(2000))), null),
})
export type CompleteSessionInput = z.infer<typeof completeSessionSchema>

export const recordSchema = z.object({
  kind: z.enum(['rep_record', 'e1rm_record']),
  loadKg: z.number(),
  reps: z.int(),
  e1rmKg: z.number(),
  /** The previous best it beats: reps at this load or more (rep record), or the best estimated 1RM. */
  previous: z.nullable(z.number()),
})
export type SessionRecord = z.infer<typeof recordSchema>

const reasonSchema = z.object({ code: z.string(), values: z.record(z.string(), z.unknown()), message: z.string() })

/** What a step adds, as the lifter reads it: more reps, more work or more load, in percent (never negative). */
export const stepGainSchema = z.object({ kind: z.enum(['reps', 'work', 'load']), pct: z.number().check(z.gte(0)) })

export const nextStepOptionSchema = z.object({
  action: z.enum(['add_rep', 'add_load', 'hold', 'cut_load']),
  targetLoadKg: z.number(),
  targetReps: z.int(),
  repsMin: z.int(),
  repsMax: z.int(),
  workChangePct: z.nullable(z.number()),
  gain: stepGainSchema,
  reason: reasonSchema,
})
export type NextStepOptionView = z.infer<typeof nextStepOptionSchema>

export const PLATEAU_OPTION_KINDS = ['microload', 'rotate_version', 'add_set', 'deload'] as const
export const plateauOptionKindSchema = z.enum(PLATEAU_OPTION_KINDS)
export type PlateauOptionKind = z.infer<typeof plateauOptionKindSchema>

export const plateauOptionSchema = z.object({
  kind: plateauOptionKindSchema,
  reason: reasonSchema,
  /** microload: the smaller load step and the reps to keep. */
  targetLoadKg: z.nullable(z.number()),
  targetReps: z.nullable(z.int()),
  /** add_set: the working-set count after adding one. */
  sets: z.nullable(z.int()),
  /** rotate_version: the version that gets fresh exercises. */
  rotate: z.nullable(versionLabelSchema),
})
export type PlateauOptionView = z.infer<typeof plateauOptionSchema>

/**
 * What can be taken for next time: the next step, its alternative, an edited target, or one of
 * the plateau options (each changes what the next session plans).
 */
export const takenOptionSchema = z.enum(['next_step', 'alternative', 'edited', ...PLATEAU_OPTION_KINDS])
export type TakenOption = z.infer<typeof takenOptionSchema>

export const exerciseReportSchema = z.object({
  exerciseId: z.int(),
  slotId: z.nullable(z.int()),
  name: z.string(),
  /** How the logged load reads: as is, added to body mass, or help taken from it. */
  loadMode: z.enum(['external', 'bodyweight', 'assisted']),
  /** The body mass counted for a bodyweight or assisted lift (kg), or null. */
  bodyMassKg: z.nullable(z.number()),
  workingSets: z.int(),
  /** Load moved x reps over the working sets (body mass included for a bodyweight lift). */
  volumeKg: z.number(),
  bestE1rmKg: z.nullable(z.number()),
  previousBestE1rmKg: z.nullable(z.number()),
  /** Change of this session's best estimated 1RM against last time's, in percent: the one figure every screen shows. */
  e1rmChangePct: z.nullable(z.number()),
  /** Every planned set met its plan. */
  asPlanned: z.boolean(),
  /** The review desk's regression flag for this lift (never on a session done as planned). */
  regression: z.boolean(),
  /** This session was a planned deload of the lift. */
  deload: z.boolean(),
  records: z.array(recordSchema),
  nextStep: z.nullable(nextStepOptionSchema),
  alternative: z.nullable(nextStepOptionSchema),
  plateau: z.nullable(z.object({ exposuresWithoutProgress: z.int(), window: z.int(), options: z.array(plateauOptionSchema) })),
  /** What the lifter (or coach) took for next time, once taken. */
  taken: z.nullable(z.object({
    option: takenOptionSchema,
    targetLoadKg: z.nullable(z.number()),
    targetReps: z.nullable(z.int()),
    status: z.enum(['taken', 'edited']),
    /** Who chose it: the lifter, or their coach editing it. */
    by: z._default(z.enum(['lifter', 'coach']), 'lifter'),
  })),
})
export type ExerciseReport = z.infer<typeof exerciseReportSchema>

export const sessionReportSchema = z.object({
  session: sessionSummarySchema,
  durationSec: z.nullable(z.int()),
  exercises: z.array(exerciseReportSchema),
})
export type SessionReport = z.infer<typeof sessionReportSchema>

/** Take (or edit) the next step of one or more exercises, or a plateau option. */
export const takeNextStepSchema = z.object({
  exerciseId: z.int().check(z.positive()),
  slotId: z.nullable(z.int().check(z.positive())),
  option: z._default(takenOptionSchema, 'next_step'),
  /** The target for next time: required for a next step, its alternative and an edit (a plateau option's target is the server's). */
  targetLoadKg: z.optional(load),
  targetReps: z.optional(reps.check(z.gte(1))),
}).check(
  z.refine((s) => !['next_step', 'alternative', 'edited'].includes(s.option) || (s.targetLoadKg !== undefined && s.targetReps !== undefined), {
    message: 'Give the load and reps to take',
    path: ['targetLoadKg'],
  }),
)
export type TakeNextStepInput = z.infer<typeof takeNextStepSchema>

export const takeNextStepsSchema = z.object({
  steps: z.array(takeNextStepSchema).check(z.minLength(1), z.maxLength(30)),
})
export type TakeNextStepsInput = z.infer<typeof takeNextStepsSchema>

/**
 * A recent set the lifter enters on the set card when a lift has no history: the first session's
 * targets are planned from its estimated 1RM. `rir`: reps left in reserve (the last set of a
 * find-your-load ramp stops short of failure).
 */
export const startFromRecentSetSchema = z.object({
  exerciseId: z.int().check(z.positive()),
  slotId: z.nullable(z.int().check(z.positive())),
  loadKg: load,
  reps: reps.check(z.gte(1), z.lte(20, 'Use a set of 20 reps or fewer')),
  rir: z._default(z.int().check(z.gte(0), z.lte(5)), 0),
  source: z._default(z.enum(['recent_set', 'ramp']), 'recent_set'),
})
export type StartFromRecentSetInput = z.infer<typeof startFromRecentSetSchema>
