/**
 * Planned sets for one exercise slot: warm-ups plus working sets with target load and rep
 * range. The server uses this to create a session's planned sets; the demo seed uses it to
 * generate history. Deterministic: everything it needs is passed in.
 */
import { roundDownToLoadable, type Equipment, type LoadOption } from './equipment'
import { EngineError, assertLoad } from './errors'
import { POLICIES, type Exposure, type NextStep, type ProgressionPolicy } from './progression'
import type { Reason } from './reasons'
import {
  DEFAULT_REST_SECONDS,
  DEFAULT_SCHEMES,
  backoffTarget,
  checkScheme,
  type SetKind,
  type SetScheme,
  type SlotRole,
} from './schemes'
import { warmupRamp, type PlateChange } from './warmup'

/** Rest after a warm-up set: short, warm-ups build no fatigue (common practice). */
export const WARMUP_REST_SECONDS = 60

/** The next step the lifter took (or edited) for one working set position. */
export interface TakenTarget {
  loadKg: number
  /** Reps to beat; defaults to the bottom of the set's range. */
  targetReps?: number
}

export interface SlotPlanInput {
  role: SlotRole
  /** The plan's scheme; the role's default when omitted. */
  scheme?: SetScheme
  equipment: Equipment
  /** The slot's latest exposure (working sets as done). */
  last?: Exposure
  /** The exposure before it (the NSCA 2-for-2 rule needs two). */
  previous?: Exposure
  /** Taken next steps by working-set position; they win over steps derived from `last`. */
  taken?: readonly (TakenTarget | null | undefined)[]
  /** First working load when there is no history and nothing taken. */
  startLoadKg?: number
  policy?: ProgressionPolicy
  /** Rest after each working set; the role's default (DEFAULT_REST_SECONDS) when omitted. */
  restSeconds?: number
}

export type PlannedSetSource =
  | 'warmup_ramp'
  | 'taken_next_step'
  | 'next_step'
  | 'backoff_from_top_set'
  | 'step_down'
  | 'start_load'

export interface PlannedSet {
  /** 0-based order within the slot, warm-ups first. */
  position: number
  kind: SetKind
  target: LoadOption
  /** = target.loadKg, the stored field. */
  targetLoadKg: number
  targetRepsMin: number
  targetRepsMax: number
  /** The rep count to beat inside the range (next step), or null for a fresh range. */
  targetReps: number | null
  toFailure: boolean
  targetRir: number | null
  restSeconds: number
  source: PlannedSetSource
  /** Warm-ups on a barbell: plate changes per side from the previous set. */
  plateChange?: PlateChange
  /** Why this target (next step or back-off computation). */
  reason?: Reason
}

/** The ordered planned sets (warm-ups, then working sets) for one slot. */
export function planSlotSets(input: SlotPlanInput): PlannedSet[] {
  const { role, equipment } = input
  const scheme = checkScheme(role, input.scheme ?? DEFAULT_SCHEMES[role])
  const rest = input.restSeconds ?? DEFAULT_REST_SECONDS[role]
  const derived: NextStep[] = input.last?.sets.length
    ? POLICIES[input.policy ?? 'double_progression'](input.last, input.previous, equipment, {})
    : []

  const working: PlannedSet[] = []
  scheme.sets.forEach((s, i) => {
    const common = {
      kind: s.kind,
      targetRepsMin: s.repsMin,
      targetRepsMax: s.repsMax,
      toFailure: s.toFailure,
      targetRir: s.targetRir,
      restSeconds: rest,
    }
    const push = (target: LoadOption, targetReps: number | null, source: PlannedSetSource, why?: Reason): void => {
      const set: PlannedSet = { position: 0, ...common, target, targetLoadKg: target.loadKg, targetReps, source }
      if (why) set.reason = why
      working.push(set)
    }
    const prev = working[i - 1]
    if (s.kind === 'backoff') {
      const b = backoffTarget({
        topLoadKg: working[0].targetLoadKg,
        topReps: working[0].targetReps ?? working[0].targetRepsMin,
        repsMin: s.repsMin,
        repsMax: s.repsMax,
        equipment,
      })
      push(b.target, null, 'backoff_from_top_set', b.reason)
      return
    }
    const taken = input.taken?.[i]
    if (taken) {
      assertLoad(taken.loadKg, 'taken load')
      push(roundDownToLoadable(taken.loadKg, equipment), taken.targetReps ?? s.repsMin, 'taken_next_step')
      return
    }
    const step = derived[i]
    if (step) {
      push(step.target, Math.min(Math.max(step.targetReps, 1), s.repsMax + 1), 'next_step', step.reason)
      return
    }
    if (prev) {
      const pct = s.loadStepDownPct ?? 0
      push(roundDownToLoadable(prev.targetLoadKg * (1 - pct / 100), equipment), null, 'step_down')
      return
    }
    if (input.startLoadKg === undefined) {
      throw new EngineError('NO_START_LOAD', 'No history, no taken next step and no start load for this slot', { role })
    }
    assertLoad(input.startLoadKg, 'start load')
    push(roundDownToLoadable(input.startLoadKg, equipment), null, 'start_load')
  })

  const warmups: PlannedSet[] = []
  if (scheme.warmup) {
    const heaviest = Math.max(...working.map((w) => w.targetLoadKg))
    const sets = scheme.warmupSets ?? (role === 'compound_primary' ? undefined : 1)
    for (const w of warmupRamp(heaviest, equipment, { sets }).sets) {
      warmups.push({
        position: 0,
        kind: 'warmup',
        target: w.target,
        targetLoadKg: w.target.loadKg,
        targetRepsMin: w.reps,
        targetRepsMax: w.reps,
        targetReps: w.reps,
        toFailure: false,
        targetRir: null,
        restSeconds: WARMUP_REST_SECONDS,
        source: 'warmup_ramp',
        ...(w.change ? { plateChange: w.change } : {}),
      })
    }
  }
  return [...warmups, ...working].map((set, position) => ({ ...set, position }))
}
