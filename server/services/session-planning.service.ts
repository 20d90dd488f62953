import { Op } from 'sequelize'
import { minimumLoad, type Equipment } from '@shared/domain/equipment'
import { equipmentFor, gymProfileSchema, KG_GYM, LB_GYM, type ExerciseEquipmentKind, type GymProfile } from '@shared/domain/gym'
import { planSlotSets, type PlannedSet, type TakenTarget } from '@shared/domain/planned-sets'
import type { Exposure, PerformedSet } from '@shared/domain/progression'
import { setSchemeSchema, type SetScheme, type SlotRole } from '@shared/domain/schemes'
import {
  EquipmentProfileModel, ExerciseModel, NextStepModel, SessionModel, SetLogModel, type UserModel,
} from '../db'
import { isoFromStored } from '../db/stored-values'

/**
 * Reads what the engine needs from the database (the lifter's gym, their recent exposures and
 * taken next steps) and asks the engine for planned sets. A fixed number of queries per call,
 * whatever the number of exercises.
 */

export async function gymOf(athlete: UserModel): Promise<GymProfile> {
  const profile = await EquipmentProfileModel.findOne({ where: { userId: athlete.id, isDefault: true } })
  const parsed = profile ? gymProfileSchema.safeParse(profile.spec) : null
  if (parsed?.success) return parsed.data
  return athlete.unit === 'lb' ? LB_GYM : KG_GYM
}

export function equipmentOf(gym: GymProfile, exercise: ExerciseModel): Equipment {
  return equipmentFor(gym, exercise.equipmentKind as ExerciseEquipmentKind)
}

/** Key for an exercise block: a plan slot, or an exercise added by hand. */
export const blockKey = (exerciseId: number, slotId: number | null) => `${exerciseId}:${slotId ?? '-'}`

export interface BlockHistory {
  /** Completed exposures, oldest first (only the most recent few are kept). */
  exposures: Array<Exposure & { sessionId: number }>
  /** The lifter's latest taken or edited next step, if it came after the latest exposure. */
  taken: TakenTarget | null
  /** Who set that next step: the lifter, or their coach editing it. */
  takenBy: 'lifter' | 'coach' | null
}

const HISTORY_ROWS = 800
const EXPOSURES_KEPT = 6

/** A working set of the history query, as a plain row (`failure` is 0 or 1, the date is text). */
interface HistoryRow {
  sessionId: number
  exerciseId: number
  slotId: number | null
  kind: SetLogModel['kind']
  loadKg: number
  reps: number
  targetRepsMin: number | null
  targetRepsMax: number | null
  rir: number | null
  failure: number | boolean
  session: { completedAt: string | Date }
}

/**
 * Recent completed working sets for these exercises, grouped into exposures per block.
 * A slot's history is its own sets of that exercise; an exercise added by hand (no slot) uses
 * every earlier set of the exercise.
 */
export async function historyFor(
  athleteId: number,
  blocks: Array<{ exerciseId: number; slotId: number | null }>,
  excludeSessionId?: number,
  /** Only sessions completed before this time (to look at an older session as it was then). */
  before?: Date,
): Promise<Map<string, BlockHistory>> {
  const result = new Map<string, BlockHistory>()
  if (blocks.length === 0) return result
  const exerciseIds = [...new Set(blocks.map((b) => b.exerciseId))]
  // Plain rows with only what the engine reads: building up to HISTORY_ROWS model instances
  // (Sequelize maps every column of every row through its parsers) cost most of the request.
  const rows = (await SetLogModel.findAll({
    attributes: ['sessionId', 'exerciseId', 'slotId', 'kind', 'loadKg', 'reps', 'targetRepsMin', 'targetRepsMax', 'rir', 'failure'],
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
  })) as unknown as HistoryRow[]
  const steps = await NextStepModel.findAll({
    where: { athleteId, exerciseId: exerciseIds, status: ['taken', 'edited'] },
    order: [['createdAt', 'DESC']],
    limit: 200,
  })

  for (const block of blocks) {
    const key = blockKey(block.exerciseId, block.slotId)
    if (result.has(key)) continue
    const mine = rows.filter(
      (r) => r.exerciseId === block.exerciseId && (block.slotId === null || r.slotId === block.slotId),
    )
    // Fall back to any earlier sets of the exercise when the slot itself has none (a new plan).
    const source = mine.length > 0 ? mine : rows.filter((r) => r.exerciseId === block.exerciseId)
    const bySession = new Map<number, { at: string; sets: PerformedSet[] }>()
    for (const r of source) {
      const entry = bySession.get(r.sessionId) ?? { at: isoFromStored(r.session.completedAt), sets: [] }
      entry.sets.push({
        kind: r.kind === 'warmup' ? 'straight' : r.kind,
        loadKg: r.loadKg,
        reps: r.reps,
        repsMin: r.targetRepsMin ?? r.reps,
        repsMax: r.targetRepsMax ?? r.reps,
        rir: r.failure ? 0 : r.rir,
      })
      bySession.set(r.sessionId, entry)
    }
    const exposures = [...bySession.entries()]
      .slice(0, EXPOSURES_KEPT)
      .reverse()
      .map(([sessionId, e]) => ({ sessionId, at: e.at, sets: e.sets }))
    const latest = exposures.at(-1)
    const step = steps.find(
      (s) =>
        s.exerciseId === block.exerciseId &&
        (block.slotId === null || s.slotId === block.slotId) &&
        (!latest || s.sessionId === latest.sessionId),
    )
    const taken = step && step.targetLoadKg !== null ? { loadKg: step.targetLoadKg, targetReps: step.targetReps ?? undefined } : null
    const takenBy = !taken ? null : (step?.reason as { by?: string } | null)?.by === 'coach' ? 'coach' : 'lifter'
    result.set(key, { exposures, taken, takenBy })
  }
  return result
}

/** A slot's stored scheme; undefined (the role's default) when it does not parse. */
export function parseScheme(raw: unknown): SetScheme | undefined {
  const parsed = setSchemeSchema.safeParse(raw)
  return parsed.success ? parsed.data : undefined
}

/** The engine's planned sets for one block, from its history; a first time starts at the lightest load. */
export function planBlock(input: {
  role: SlotRole
  scheme?: SetScheme
  equipment: Equipment
  history: BlockHistory | undefined
  restSec: number
}): PlannedSet[] {
  const exposures = input.history?.exposures ?? []
  return planSlotSets({
    role: input.role,
    scheme: input.scheme,
    equipment: input.equipment,
    last: exposures.at(-1),
    previous: exposures.at(-2),
    taken: input.history?.taken ? [input.history.taken] : undefined,
    startLoadKg: minimumLoad(input.equipment).loadKg,
    restSeconds: input.restSec,
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
