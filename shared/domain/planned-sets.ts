/**
 * Planned sets for one exercise slot: warm-ups plus working sets with a target load, a rep range
 * and a rep count to beat inside it. The server uses this to create a session's planned sets and
 * the demo seed to generate history. Deterministic: everything it needs is passed in.
 *
 * Every working target lies inside its range. Loads are planned from the lifter's estimate and
 * the rep target, never reps from a load: a first session from a starting estimate aims at the
 * middle of the range; a stepped-down set takes the load its scheme says (or less) and the reps
 * the estimate gives there, clamped to its range.
 */
import { loadForReps } from './e1rm'
import { assertLoad } from './errors'
import { compileEquipment, type Equipment, type LoadOption } from './equipment'
import { loadOrderKey, movedLoadKg, setE1rmKg, type LoadMode, type LoadReading } from './lift-progress'
import {
  ADDED_SET_RIR,
  DELOAD,
  nextSteps,
  progressHistory,
  type Exposure,
  type NextStep,
  type ProgressionPolicy,
} from './progression'
import type { Reason } from './reasons'
import {
  DEFAULT_REST_SECONDS,
  DEFAULT_SCHEMES,
  backoffTarget,
  checkScheme,
  loadableAtMostMoved,
  maxWorkingSets,
  type SchemeSet,
  type SetKind,
  type SetScheme,
  type SlotRole,
} from './schemes'
import { warmupRamp, warmupSetsFor, type PlateChange } from './warmup'

/** Rest after a warm-up set: short, warm-ups build no fatigue (common practice). */
export const WARMUP_REST_SECONDS = 60

/** The next step the lifter (or their coach) took for the slot's first working set. */
export interface TakenTarget {
  loadKg: number
  /** Reps to beat; the bottom of the set's range when absent. */
  targetReps?: number
}

export interface SlotPlanInput {
  role: SlotRole
  /** The plan's scheme; the role's default when omitted. */
  scheme?: SetScheme
  equipment: Equipment
  /** How the logged load relates to the load moved; as logged by default. */
  mode?: LoadMode
  /** The lifter's body mass today (bodyweight and assisted lifts). */
  bodyMassKg?: number | null
  /** The exercise's own smallest load step in kg; null: the equipment's. */
  loadStepKg?: number | null
  /** The slot's exposures, oldest first (planned deloads marked). */
  history?: readonly Exposure[]
  /** The next step taken for this slot after its latest exposure; it wins over the derived one. */
  taken?: TakenTarget | null
  /** A one-off deload session for this slot (a plateau option the lifter or coach took). */
  deload?: boolean
  /** Working sets added on top of the scheme (a plateau option), kept within the caps. */
  extraSets?: number
  /** An estimated 1RM (kg, load moved) to plan a first session from: the coach's or a recent set's. */
  startE1rmKg?: number | null
  policy?: ProgressionPolicy
  /** Rest after each working set; the role's default (DEFAULT_REST_SECONDS) when omitted. */
  restSeconds?: number
  /** A multi-joint movement: gets a warm-up ramp like a barbell lift. */
  compound?: boolean
  /** The same movement pattern was warmed up earlier in this session: a shorter ramp. */
  patternWarmedUp?: boolean
}

export type PlannedSetSource =
  | 'warmup_ramp'
  | 'taken_next_step'
  | 'next_step'
  | 'backoff_from_top_set'
  | 'step_down'
  | 'start_estimate'
  | 'added_set'
  | 'deload'
  | 'needs_start'

export interface PlannedSet {
  /** 0-based order within the slot, warm-ups first. */
  position: number
  kind: SetKind
  /** null when the lift has no history and no starting estimate yet: the set card asks for one. */
  target: LoadOption | null
  /** = target.loadKg, the stored field. */
  targetLoadKg: number | null
  targetRepsMin: number
  targetRepsMax: number
  /** The rep count to beat, inside the range. */
  targetReps: number
  toFailure: boolean
  targetRir: number | null
  restSeconds: number
  source: PlannedSetSource
  /** Warm-ups on a barbell: plate changes per side from the previous set. */
  plateChange?: PlateChange
  /** Why this target (next step or back-off computation). */
  reason?: Reason
}

const clamp = (n: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, n))
const middleOf = (s: SchemeSet) => Math.floor((s.repsMin + s.repsMax) / 2)
const reserveOf = (s: SchemeSet) => (s.toFailure ? 0 : (s.targetRir ?? 0))

/** The scheme's working sets for this session: extra sets added within the caps, halved on a deload. */
function workingScheme(role: SlotRole, scheme: SetScheme, extraSets: number, deload: boolean): SchemeSet[] {
  const sets = [...scheme.sets]
  const room = Math.max(0, maxWorkingSets(role) - sets.length)
  for (let i = 0; i < Math.min(extraSets, room); i++) {
    const last = sets[sets.length - 1]
    sets.push({ ...last, kind: last.kind === 'top' ? 'backoff' : last.kind, toFailure: false, targetRir: ADDED_SET_RIR, loadStepDownPct: last.kind === 'straight' ? 0 : null })
  }
  if (!deload) return sets
  const kept = Math.max(1, Math.ceil((sets.length * DELOAD.setsPct) / 100))
  return sets.slice(0, kept).map((s) => ({ ...s, toFailure: false, targetRir: DELOAD.targetRir }))
}

/** The ordered planned sets (warm-ups, then working sets) for one slot. */
export function planSlotSets(input: SlotPlanInput): PlannedSet[] {
  const { role, equipment } = input
  const scheme = checkScheme(role, input.scheme ?? DEFAULT_SCHEMES[role])
  const rest = input.restSeconds ?? DEFAULT_REST_SECONDS[role]
  const mode = input.mode ?? 'external'
  const today: LoadReading = { mode, bodyMassKg: input.bodyMassKg ?? null }
  const history = progressHistory(input.history ?? [])
  const latest = history.at(-1)
  const lift = { equipment, mode, loadStepKg: input.loadStepKg ?? null }
  const derived: NextStep[] = latest ? nextSteps(history, lift, { policy: input.policy }) : []
  const setsToPlan = workingScheme(role, scheme, input.extraSets ?? 0, input.deload ?? false)
  const loadable = (movedKg: number) => loadableAtMostMoved(movedKg, today, equipment)
  const moved = (o: LoadOption) => movedLoadKg(o.loadKg, today) ?? o.loadKg
  // The lifter's estimate today (load moved): from the latest exposure, else the starting estimate.
  const latestE1rm = latest
    ? Math.max(0, ...latest.sets.map((s) => setE1rmKg(s, { mode, bodyMassKg: latest.bodyMassKg ?? input.bodyMassKg ?? null }) ?? 0))
    : 0
  const estimate = latestE1rm > 0 ? latestE1rm : (input.startE1rmKg ?? null)

  const working: PlannedSet[] = []
  setsToPlan.forEach((s, i) => {
    const common = {
      kind: s.kind,
      targetRepsMin: s.repsMin,
      targetRepsMax: s.repsMax,
      toFailure: s.toFailure,
      targetRir: s.toFailure ? null : s.targetRir,
      restSeconds: rest,
    }
    const push = (target: LoadOption | null, targetReps: number, source: PlannedSetSource, why?: Reason): void => {
      const set: PlannedSet = {
        position: 0, ...common, target, targetLoadKg: target?.loadKg ?? null,
        targetReps: clamp(targetReps, s.repsMin, s.repsMax), source,
      }
      if (why) set.reason = why
      working.push(set)
    }
    const prev = working[i - 1]
    const first = working[0]

    if (s.kind === 'backoff') {
      if (!first?.target) return push(null, s.repsMin, 'needs_start')
      const b = backoffTarget({
        topLoadKg: first.target.loadKg,
        topReps: first.targetReps + reserveOf(setsToPlan[0]),
        repsMin: s.repsMin,
        repsMax: s.repsMax,
        equipment,
        reading: today,
      })
      return push(b.target, s.repsMin, 'backoff_from_top_set', b.reason)
    }
    if (i === 0 && input.taken) {
      assertLoad(input.taken.loadKg, 'taken load')
      const taken = loadable(movedLoadKg(input.taken.loadKg, today) ?? input.taken.loadKg)
      return push(taken, input.taken.targetReps ?? s.repsMin, 'taken_next_step')
    }
    const step = derived[i]
    const stepFits = step && step.repsMin === s.repsMin && step.repsMax === s.repsMax
    const stepOk = stepFits && (!prev?.target || loadOrderKey(step.target.loadKg, today) <= loadOrderKey(prev.target.loadKg, today) + 1e-9 || s.loadStepDownPct === null)
    if (stepOk && step && !input.deload) return push(step.target, step.targetReps, 'next_step', step.reason)
    if (step && input.deload) {
      const lighter = loadable(moved(step.target) * (DELOAD.loadPct / 100))
      return push(lighter, step.targetReps, 'deload', step.reason)
    }
    if (i > 0 && prev?.target) {
      // A stepped-down or added set: at most the load its scheme says below the set before, and
      // the reps the estimate gives at that load (before the planned reserve), inside its range.
      const below = moved(prev.target) * (1 - (s.loadStepDownPct ?? 0) / 100)
      const prevEstimate = setE1rmKg({ loadKg: prev.target.loadKg, reps: prev.targetReps, rir: prev.targetRir ?? 0 }, today) ?? estimate
      const target = loadable(Math.min(below, prevEstimate ? loadForReps(prevEstimate, s.repsMin + reserveOf(s)) : below))
      // Epley inverted; the small epsilon keeps 15.999... (float noise) from losing a whole rep.
      const reps = prevEstimate ? Math.floor(30 * (prevEstimate / Math.max(moved(target), 1e-9) - 1) + 1e-9) - reserveOf(s) : s.repsMin
      return push(target, reps, s.kind === 'straight' && i >= scheme.sets.length ? 'added_set' : 'step_down')
    }
    if (estimate !== null && estimate > 0) {
      const reps = middleOf(s)
      let target = loadable(loadForReps(estimate, reps + reserveOf(s)))
      if (input.deload) target = loadable(moved(target) * (DELOAD.loadPct / 100))
      return push(target, reps, input.deload ? 'deload' : 'start_estimate')
    }
    push(null, middleOf(s), 'needs_start')
  })

  const warmups: PlannedSet[] = []
  const heaviest = working.reduce<LoadOption | null>((m, w) => (w.target && (!m || moved(w.target) > moved(m)) ? w.target : m), null)
  if (scheme.warmup && heaviest && !input.deload) {
    const sets = warmupSetsFor({
      workingKg: heaviest.loadKg,
      equipment,
      compound: (input.compound ?? role === 'compound_primary') || compileEquipment(equipment).equipment.kind === 'barbell',
      shortened: input.patternWarmedUp ?? false,
      fixedSets: scheme.warmupSets,
    })
    if (sets > 0) {
      for (const w of warmupRamp(heaviest.loadKg, equipment, { sets, shortened: input.patternWarmedUp ?? false }).sets) {
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
  }
  return [...warmups, ...working].map((set, position) => ({ ...set, position }))
}
