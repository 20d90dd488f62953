import { Op } from 'sequelize'
import type { Equipment } from '@shared/domain/equipment'
import { defaultGym, equipmentFor, gymProfileSchema, type ExerciseEquipmentKind, type GymProfile } from '@shared/domain/gym'
import type { LoadMode } from '@shared/domain/lift-progress'
import { COMPOUND_PATTERNS } from '@shared/domain/plan-checks'
import { planSlotSets, type PlannedSet, type TakenTarget } from '@shared/domain/planned-sets'
import type { Exposure, LiftContext, PerformedSet } from '@shared/domain/progression'
import { setSchemeSchema, type SetScheme, type SlotRole } from '@shared/domain/schemes'
import type { TakenOption } from '@shared/schemas/run.schema'
import {
  BodyWeightModel, EquipmentProfileModel, ExerciseModel, NextStepModel, SessionModel, SetLogModel, SlotAdjustmentModel,
  StartEstimateModel, type SlotModel, type UserModel,
} from '../db'
import { isoFromStored } from '../db/stored-values'

/**
 * Reads what the engine needs from the database (the lifter's gym, body mass, recent exposures,
 * taken next steps, their own slot adjustments and starting estimates) and asks the engine for
 * planned sets. A fixed number of queries per call, whatever the number of exercises.
 */

export async function gymOf(athlete: UserModel): Promise<GymProfile> {
  const profile = await EquipmentProfileModel.findOne({ where: { userId: athlete.id, isDefault: true } })
  const parsed = profile ? gymProfileSchema.safeParse(profile.spec) : null
  if (parsed?.success) return parsed.data
  return defaultGym(athlete.unit)
}

export function equipmentOf(gym: GymProfile, exercise: ExerciseModel): Equipment {
  return equipmentFor(gym, exercise.equipmentKind as ExerciseEquipmentKind)
}

export const loadModeOf = (exercise: ExerciseModel): LoadMode => (exercise.loadMode ?? 'external') as LoadMode

/** What the engine knows of an exercise in this lifter's gym, besides its history. */
export function liftOf(gym: GymProfile, exercise: ExerciseModel): LiftContext {
  return { equipment: equipmentOf(gym, exercise), mode: loadModeOf(exercise), loadStepKg: exercise.loadStepKg > 0 ? exercise.loadStepKg : null }
}

/** A multi-joint exercise: it gets a warm-up ramp like a barbell lift, and the compound caps. */
export const isCompound = (exercise: ExerciseModel, role: SlotRole) => role === 'compound_primary' || COMPOUND_PATTERNS.has(exercise.pattern)

// ---------------------------------------------------------------------------------------------
// Body mass

export interface BodyMassEntry {
  /** YYYY-MM-DD */
  on: string
  kg: number
}

/** The lifter's body-weight entries, oldest first. */
export async function bodyMassEntries(athleteId: number): Promise<BodyMassEntry[]> {
  const rows = await BodyWeightModel.findAll({ where: { userId: athleteId }, order: [['measuredOn', 'ASC']], attributes: ['measuredOn', 'weightKg'] })
  return rows.map((r) => ({ on: String(r.measuredOn), kg: Number(r.weightKg) }))
}

/** The body mass on a day: the latest entry on or before it, else the first one after, else null. */
export function bodyMassAt(entries: readonly BodyMassEntry[], at: Date | string | null | undefined): number | null {
  if (entries.length === 0) return null
  const day = at ? new Date(at).toISOString().slice(0, 10) : '9999-12-31'
  let found: BodyMassEntry | null = null
  for (const e of entries) {
    if (e.on <= day) found = e
    else break
  }
  return (found ?? entries[0]).kg
}

// ---------------------------------------------------------------------------------------------
// History

/** Key for an exercise block: a plan slot, or an exercise added by hand. */
export const blockKey = (exerciseId: number, slotId: number | null) => `${exerciseId}:${slotId ?? '-'}`

export interface BlockHistory {
  /** Completed exposures, oldest first (only the most recent few are kept), deloads marked. */
  exposures: Array<Exposure & { sessionId: number }>
  /** The target taken after the latest exposure (the next step, its alternative, an edit or a smaller step). */
  taken: TakenTarget | null
  /** The option taken after the latest exposure, if any. */
  takenOption: TakenOption | null
  /** Who took it: the lifter, or their coach. */
  takenBy: 'lifter' | 'coach' | null
}

const HISTORY_ROWS = 800
/** Enough for the plateau window and the sessions before it. */
const EXPOSURES_KEPT = 8

/** A working set of the history query, as a plain row (booleans are 0 or 1, the date is text). */
interface HistoryRow {
  sessionId: number
  exerciseId: number
  slotId: number | null
  kind: SetLogModel['kind']
  loadKg: number
  reps: number
  targetLoadKg: number | null
  targetRepsMin: number | null
  targetRepsMax: number | null
  targetReps: number | null
  toFailure: number | boolean
  targetRir: number | null
  rir: number | null
  failure: number | boolean
  deload: number | boolean
  session: { completedAt: string | Date }
}

const TARGET_OPTIONS: readonly TakenOption[] = ['next_step', 'alternative', 'edited', 'microload', 'add_set']

/**
 * Recent completed working sets for these exercises, grouped into exposures per block, with the
 * body mass of each day. A slot's history is its own sets of that exercise; an exercise added by
 * hand (no slot), or new to a slot, uses every earlier set of the exercise.
 */
export async function historyFor(
  athleteId: number,
  blocks: Array<{ exerciseId: number; slotId: number | null }>,
  excludeSessionId?: number,
  /** Only sessions completed before this time (to look at an older session as it was then). */
  before?: Date,
  bodyMass?: readonly BodyMassEntry[],
): Promise<Map<string, BlockHistory>> {
  const result = new Map<string, BlockHistory>()
  if (blocks.length === 0) return result
  const exerciseIds = [...new Set(blocks.map((b) => b.exerciseId))]
  // Plain rows with only what the engine reads: model instances cost most of the request.
  const [rows, steps, masses] = await Promise.all([
    SetLogModel.findAll({
      attributes: [
        'sessionId', 'exerciseId', 'slotId', 'kind', 'loadKg', 'reps', 'targetLoadKg', 'targetRepsMin', 'targetRepsMax',
        'targetReps', 'toFailure', 'targetRir', 'rir', 'failure', 'deload',
      ],
      where: {
        exerciseId: exerciseIds,
        kind: { [Op.ne]: 'warmup' },
        reps: { [Op.gt]: 0 },
        loadKg: { [Op.ne]: null },
        skipped: false,
        ...(excludeSessionId ? { sessionId: { [Op.ne]: excludeSessionId } } : {}),
      },
      include: [
        {
          model: SessionModel,
          as: 'session',
          attributes: ['completedAt'],
          where: { athleteId, status: 'completed', ...(before ? { completedAt: { [Op.lt]: before } } : {}) },
        },
      ],
      order: [[{ model: SessionModel, as: 'session' }, 'completedAt', 'DESC'], ['position', 'ASC']],
      limit: HISTORY_ROWS,
      raw: true,
      nest: true,
    }) as unknown as Promise<HistoryRow[]>,
    NextStepModel.findAll({
      where: { athleteId, exerciseId: exerciseIds, status: ['taken', 'edited'] },
      order: [['createdAt', 'DESC']],
      limit: 200,
    }),
    bodyMass ? Promise.resolve(bodyMass) : bodyMassEntries(athleteId),
  ])

  for (const block of blocks) {
    const key = blockKey(block.exerciseId, block.slotId)
    if (result.has(key)) continue
    const mine = rows.filter((r) => r.exerciseId === block.exerciseId && (block.slotId === null || r.slotId === block.slotId))
    // Fall back to any earlier sets of the exercise when the slot itself has none (a new plan, a rotation).
    const source = mine.length > 0 ? mine : rows.filter((r) => r.exerciseId === block.exerciseId)
    const bySession = new Map<number, { at: string; deload: boolean; sets: PerformedSet[] }>()
    for (const r of source) {
      const entry = bySession.get(r.sessionId) ?? { at: isoFromStored(r.session.completedAt), deload: false, sets: [] }
      entry.deload ||= Boolean(r.deload)
      entry.sets.push({
        kind: r.kind === 'warmup' ? 'straight' : r.kind,
        loadKg: r.loadKg,
        reps: r.reps,
        repsMin: r.targetRepsMin ?? r.reps,
        repsMax: r.targetRepsMax ?? r.reps,
        rir: r.failure ? 0 : r.rir,
        targetLoadKg: r.targetLoadKg,
        targetReps: r.targetReps,
        targetRir: r.toFailure ? null : r.targetRir,
      })
      bySession.set(r.sessionId, entry)
    }
    const exposures = [...bySession.entries()]
      .slice(0, EXPOSURES_KEPT)
      .reverse()
      .map(([sessionId, e]) => ({ sessionId, at: e.at, sets: e.sets, deload: e.deload, bodyMassKg: bodyMassAt(masses, e.at) }))
    const latest = exposures.at(-1)
    const step = steps.find(
      (s) =>
        s.exerciseId === block.exerciseId &&
        (block.slotId === null || s.slotId === block.slotId) &&
        (!latest || s.sessionId === latest.sessionId),
    )
    const option = step ? ((step.option ?? 'next_step') as TakenOption) : null
    const taken = step && option && TARGET_OPTIONS.includes(option) && step.targetLoadKg !== null
      ? { loadKg: step.targetLoadKg, targetReps: step.targetReps ?? undefined }
      : null
    const takenBy = !step ? null : (step.reason as { by?: string } | null)?.by === 'coach' ? 'coach' : 'lifter'
    result.set(key, { exposures, taken, takenOption: option, takenBy })
  }
  return result
}

/** A slot's stored scheme; undefined (the role's default) when it does not parse. */
export function parseScheme(raw: unknown): SetScheme | undefined {
  const parsed = setSchemeSchema.safeParse(raw)
  return parsed.success ? parsed.data : undefined
}

// ---------------------------------------------------------------------------------------------
// The lifter's own slot adjustments and starting estimates

/** The lifter's adjustments to these plan slots, by slot id. */
export async function adjustmentsFor(athleteId: number, slotIds: number[]): Promise<Map<number, SlotAdjustmentModel>> {
  if (slotIds.length === 0) return new Map()
  const rows = await SlotAdjustmentModel.findAll({ where: { athleteId, slotId: slotIds } })
  return new Map(rows.map((r) => [r.slotId, r]))
}

/** Starting estimates (estimated 1RM, kg moved) for these exercises, by exercise id. */
export async function startEstimatesFor(athleteId: number, exerciseIds: number[]): Promise<Map<number, number>> {
  if (exerciseIds.length === 0) return new Map()
  const rows = await StartEstimateModel.findAll({ where: { athleteId, exerciseId: [...new Set(exerciseIds)] } })
  return new Map(rows.map((r) => [r.exerciseId, r.e1rmKg]))
}

/**
 * A plan slot with the lifter's own adjustment applied: the exercise they train in it (a fresh
 * one after a rotation) and the sets added on a plateau.
 */
export interface PlannedSlot {
  slot: SlotModel
  exercise: ExerciseModel
  extraSets: number
}

export async function slotsForAthlete(athleteId: number, slots: SlotModel[]): Promise<PlannedSlot[]> {
  const adjustments = await adjustmentsFor(athleteId, slots.map((s) => s.id))
  const swapIds = [...adjustments.values()].map((a) => a.exerciseId).filter((id): id is number => id !== null)
  const swaps = swapIds.length ? new Map((await ExerciseModel.findAll({ where: { id: swapIds } })).map((e) => [e.id, e])) : new Map<number, ExerciseModel>()
  return slots.map((slot) => {
    const adjustment = adjustments.get(slot.id)
    const swapped = adjustment?.exerciseId ? swaps.get(adjustment.exerciseId) : undefined
    return { slot, exercise: swapped ?? slot.exercise!, extraSets: adjustment?.extraSets ?? 0 }
  })
}

// ---------------------------------------------------------------------------------------------
// Planning

export interface BlockToPlan {
  exercise: ExerciseModel
  role: SlotRole
  scheme?: SetScheme
  restSec: number
  extraSets?: number
}

export interface PlanningContext {
  gym: GymProfile
  history: Map<string, BlockHistory>
  startEstimates: Map<number, number>
  bodyMassKg: number | null
}

/** Everything the planner reads for a lifter's blocks, in a fixed number of queries. */
export async function planningContext(athlete: UserModel, blocks: Array<{ exerciseId: number; slotId: number | null }>, excludeSessionId?: number): Promise<PlanningContext> {
  const masses = await bodyMassEntries(athlete.id)
  const [gym, history, startEstimates] = await Promise.all([
    gymOf(athlete),
    historyFor(athlete.id, blocks, excludeSessionId, undefined, masses),
    startEstimatesFor(athlete.id, blocks.map((b) => b.exerciseId)),
  ])
  return { gym, history, startEstimates, bodyMassKg: bodyMassAt(masses, null) }
}

/**
 * Planned sets for a session's blocks in order: each block from its history, the taken step, the
 * lifter's adjustments and starting estimates; a block whose movement pattern an earlier block
 * already warmed up gets a shorter ramp.
 */
export function planBlocks(
  blocks: Array<BlockToPlan & { slotId: number | null }>,
  context: PlanningContext,
  /** Movement patterns already worked earlier in the session (a block added or swapped mid-session). */
  patternsBefore: Iterable<string> = [],
): PlannedSet[][] {
  const warmedPatterns = new Set<string>(patternsBefore)
  return blocks.map((block) => {
    const history = context.history.get(blockKey(block.exercise.id, block.slotId))
    const lift = liftOf(context.gym, block.exercise)
    const planned = planSlotSets({
      role: block.role,
      scheme: block.scheme,
      equipment: lift.equipment,
      mode: lift.mode,
      loadStepKg: lift.loadStepKg,
      bodyMassKg: context.bodyMassKg,
      history: history?.exposures ?? [],
      taken: history?.taken ?? null,
      deload: history?.takenOption === 'deload',
      extraSets: block.extraSets ?? 0,
      startE1rmKg: context.startEstimates.get(block.exercise.id) ?? null,
      restSeconds: block.restSec,
      compound: isCompound(block.exercise, block.role),
      patternWarmedUp: warmedPatterns.has(block.exercise.pattern),
    })
    if (planned.some((p) => p.kind === 'warmup') || planned.some((p) => p.kind !== 'warmup' && p.targetLoadKg !== null)) {
      warmedPatterns.add(block.exercise.pattern)
    }
    return planned
  })
}

export interface SessionBlock {
  exercise: ExerciseModel
  slotId: number | null
  role: SlotRole
  /** The block's sets in session order. */
  sets: SetLogModel[]
}

/** A session's sets with their exercises, grouped into exercise blocks in session order. */
export async function sessionBlocks(sessionId: number): Promise<SessionBlock[]> {
  const sets = await SetLogModel.findAll({
    where: { sessionId },
    include: [{ model: ExerciseModel, as: 'exercise' }],
    order: [['position', 'ASC']],
  })
  const blocks: SessionBlock[] = []
  for (const set of sets) {
    let block = blocks.find((b) => b.exercise.id === set.exerciseId && b.slotId === set.slotId)
    if (!block) {
      block = { exercise: set.exercise!, slotId: set.slotId, role: (set.role ?? 'accessory') as SlotRole, sets: [] }
      blocks.push(block)
    }
    block.sets.push(set)
  }
  return blocks
}

export interface PlannedBlock {
  block: BlockToPlan & { slotId: number | null }
  planned: PlannedSet[]
  history: BlockHistory | undefined
}

/**
 * A day's slots planned for this lifter: their own exercise swaps and added sets applied, each
 * block planned from its history, taken step and starting estimate.
 */
export async function planDay(athlete: UserModel, slots: SlotModel[]): Promise<PlannedBlock[]> {
  const forAthlete = await slotsForAthlete(athlete.id, slots)
  const blocks = forAthlete.map(({ slot, exercise, extraSets }) => ({
    exercise,
    slotId: slot.id,
    role: slot.role as SlotRole,
    scheme: parseScheme(slot.scheme),
    restSec: slot.restSec,
    extraSets,
  }))
  const context = await planningContext(athlete, blocks.map((b) => ({ exerciseId: b.exercise.id, slotId: b.slotId })))
  return planBlocks(blocks, context).map((planned, i) => ({
    block: blocks[i],
    planned,
    history: context.history.get(blockKey(blocks[i].exercise.id, blocks[i].slotId)),
  }))
}
