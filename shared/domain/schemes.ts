/**
 * Slot roles, set schemes (what a plan prescribes for one exercise slot), set caps, default
 * rest, and the back-off set target computed from what the top set actually did.
 */
import { z } from 'zod/mini'
import { estimateOneRepMax, loadForReps, type E1rmFormula } from './e1rm'
import { EngineError, MAX_REPS, assertReps } from './errors'
import { atOrAboveGrid, atOrBelowGrid, compileEquipment, kgToGrid, optionFromGrid, type Equipment, type LoadOption } from './equipment'
import { movedLoadKg, type LoadReading } from './lift-progress'
import { reason, type Reason } from './reasons'

export const SLOT_ROLES = ['compound_primary', 'accessory', 'isolation'] as const
export type SlotRole = (typeof SLOT_ROLES)[number]
export const slotRoleSchema = z.enum(SLOT_ROLES)

export const WORKING_SET_KINDS = ['top', 'backoff', 'straight'] as const
export type WorkingSetKind = (typeof WORKING_SET_KINDS)[number]
export type SetKind = 'warmup' | WorkingSetKind

/**
 * Caps on working sets: at most 3 on a primary compound, at most 4 on any one movement.
 * Common practice, no published source.
 */
export const MAX_WORKING_SETS_PRIMARY = 3
export const MAX_WORKING_SETS_ANY = 4

export function maxWorkingSets(role: SlotRole): number {
  return role === 'compound_primary' ? MAX_WORKING_SETS_PRIMARY : MAX_WORKING_SETS_ANY
}

/**
 * Default rest between working sets, seconds. Schoenfeld et al., JSCR 30(7):1805-1812, 2016
 * (3 min beat 1 min for strength and thigh size in trained men); Grgic et al., Sports Med
 * 48(1):137-151, 2018 (trained lifters need more than 2 min on multi-joint lifts); ACSM 2009
 * position stand (2-3 min core lifts, 1-2 min assistance lifts; from memory / secondary copy).
 */
export const DEFAULT_REST_SECONDS: Readonly<Record<SlotRole, number>> = {
  compound_primary: 180,
  accessory: 120,
  isolation: 90,
}

export const schemeSetSchema = z.object({
  kind: z.enum(WORKING_SET_KINDS),
  repsMin: z.int().check(z.gte(1), z.lte(MAX_REPS)),
  repsMax: z.int().check(z.gte(1), z.lte(MAX_REPS)),
  /** Taken to technical failure (no further clean rep possible). */
  toFailure: z.boolean(),
  /** Reps in reserve to stop at when not to failure; null when to failure. */
  targetRir: z.nullable(z.int().check(z.gte(0), z.lte(6))),
  /** Straight sets after the first: load this many percent below the previous working set. */
  loadStepDownPct: z.nullable(z.number().check(z.gte(0), z.lte(50))),
}).check(
  z.refine((s) => s.repsMin <= s.repsMax, { message: 'repsMin must not exceed repsMax', path: ['repsMax'] }),
  z.refine((s) => (s.toFailure ? s.targetRir === null : s.targetRir !== null), {
    message: 'A set is either to failure or has a target RIR',
    path: ['targetRir'],
  }),
)
export type SchemeSet = z.infer<typeof schemeSetSchema>

export const setSchemeSchema = z.object({
  sets: z.array(schemeSetSchema).check(z.minLength(1), z.maxLength(MAX_WORKING_SETS_ANY)),
  /**
   * Warm-ups before the first working set: true lets the engine ramp up whenever the lift needs it
   * (a barbell or compound lift well above its lightest load); false turns them off for this slot.
   */
  warmup: z.boolean(),
  /** How many warm-ups; null = from the working load. */
  warmupSets: z.nullable(z.int().check(z.gte(1), z.lte(5))),
}).check(
  z.refine((s) => s.sets.every((set, i) => (set.kind === 'top' ? i === 0 : true)), {
    message: 'A top set can only be the first working set',
    path: ['sets'],
  }),
  z.refine((s) => s.sets.every((set) => set.kind !== 'backoff') || s.sets[0].kind === 'top', {
    message: 'Back-off sets need a top set first',
    path: ['sets'],
  }),
)
export type SetScheme = z.infer<typeof setSchemeSchema>

/** A slot's role and scheme, checked against the set caps for the role. */
export const slotSchemeSchema = z.object({ role: slotRoleSchema, scheme: setSchemeSchema }).check(
  z.refine((s) => s.scheme.sets.length <= maxWorkingSets(s.role), {
    message: `At most ${MAX_WORKING_SETS_PRIMARY} working sets on a primary compound and ${MAX_WORKING_SETS_ANY} on any movement`,
    path: ['scheme', 'sets'],
  }),
)
export type SlotScheme = z.infer<typeof slotSchemeSchema>

const straight = (repsMin: number, repsMax: number, loadStepDownPct: number | null, targetRir: number | null): SchemeSet => ({
  kind: 'straight',
  repsMin,
  repsMax,
  toFailure: targetRir === null,
  targetRir,
  loadStepDownPct,
})

/**
 * Default schemes (common practice, no published source): primary compound = one top set of
 * 6-9 to technical failure then one back-off set of 9-12; accessory = three sets of 8-10,
 * 10-12, 12-15 with the load stepped down 10 % each time; isolation = two sets of 12-20.
 */
export const DEFAULT_SCHEMES: Readonly<Record<SlotRole, SetScheme>> = {
  compound_primary: {
    sets: [
      { kind: 'top', repsMin: 6, repsMax: 9, toFailure: true, targetRir: null, loadStepDownPct: null },
      { kind: 'backoff', repsMin: 9, repsMax: 12, toFailure: true, targetRir: null, loadStepDownPct: null },
    ],
    warmup: true,
    warmupSets: null,
  },
  accessory: {
    sets: [straight(8, 10, null, 1), straight(10, 12, 10, 1), straight(12, 15, 10, 1)],
    warmup: true,
    warmupSets: null,
  },
  isolation: {
    sets: [straight(12, 20, null, null), straight(12, 20, 0, null)],
    warmup: true,
    warmupSets: null,
  },
}

/**
 * An accessory that shares its movement pattern with the day's main lift: two sets of 8-10 and
 * 10-12, so the pattern stays within MAX_HARD_SETS_PER_PATTERN hard sets in the session (common
 * practice, no published source).
 */
export const ACCESSORY_TWO_SETS_SCHEME: SetScheme = {
  sets: [straight(8, 10, null, 1), straight(10, 12, 10, 1)],
  warmup: true,
  warmupSets: null,
}

/** The other isolation default a plan may pick: three sets of 10-15. */
export const ISOLATION_THREE_SETS_SCHEME: SetScheme = {
  sets: [straight(10, 15, null, null), straight(10, 15, 0, null), straight(10, 15, 0, null)],
  warmup: true,
  warmupSets: null,
}

/** Validates a scheme and the caps for its role; throws INVALID_SCHEME or SET_CAP_EXCEEDED. */
export function checkScheme(role: SlotRole, scheme: SetScheme): SetScheme {
  const parsed = setSchemeSchema.safeParse(scheme)
  if (!parsed.success) {
    throw new EngineError('INVALID_SCHEME', 'Invalid set scheme', {
      issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    })
  }
  const cap = maxWorkingSets(role)
  if (scheme.sets.length > cap) {
    throw new EngineError('SET_CAP_EXCEEDED', `At most ${cap} working sets for a ${role} slot`, {
      role,
      sets: scheme.sets.length,
      cap,
    })
  }
  return parsed.data
}

// ---------------------------------------------------------------------------------------------
// Back-off set

export interface BackoffInput {
  /** What the top set actually did. */
  topLoadKg: number
  topReps: number
  /** Reps in reserve on the top set; 0 (default) when taken to failure. */
  topRir?: number
  /** The back-off set's rep range. */
  repsMin: number
  repsMax: number
  equipment: Equipment
  /** How the logged load relates to the load moved (bodyweight and assisted lifts); as logged by default. */
  reading?: LoadReading
  formula?: E1rmFormula
}

export interface BackoffTarget {
  target: LoadOption
  /** The rep count the load is computed for: the top of the back-off range. */
  targetReps: number
  e1rmKg: number
  /** Percent below the top set's load (positive = lighter). */
  dropPct: number
  reason: Reason
}

/**
 * Back-off load from what the top set actually did: estimated 1RM of the top set, then the load
 * a fresh lifter could do for the TOP of the back-off range, rounded down to a loadable value.
 * Aiming at the top of the range is deliberate: the top set's fatigue costs reps, so the lifter
 * lands inside the range (common practice, no published source).
 */
export function backoffTarget(input: BackoffInput): BackoffTarget {
  const { topLoadKg, topReps, repsMin, repsMax, equipment } = input
  assertReps(repsMin, 'back-off repsMin')
  assertReps(repsMax, 'back-off repsMax')
  if (repsMin > repsMax) {
    throw new EngineError('INVALID_SCHEME', 'Back-off repsMin must not exceed repsMax', { repsMin, repsMax })
  }
  const formula = input.formula ?? 'epley'
  const reading = input.reading ?? { mode: 'external' }
  const topMoved = movedLoadKg(topLoadKg, reading) ?? topLoadKg
  const { e1rm } = estimateOneRepMax(topMoved, topReps, { formula, rir: input.topRir ?? 0 })
  const raw = Math.min(loadForReps(e1rm, repsMax, formula), topMoved)
  const target = loadableAtMostMoved(raw, reading, equipment)
  const targetMoved = movedLoadKg(target.loadKg, reading) ?? target.loadKg
  const dropPct = topMoved > 0 ? (1 - targetMoved / topMoved) * 100 : 0
  return {
    target,
    targetReps: repsMax,
    e1rmKg: e1rm,
    dropPct,
    reason: reason(
      'BACKOFF_FROM_TOP_SET',
      {
        topLoadKg,
        topReps,
        e1rmKg: e1rm,
        backoffReps: repsMax,
        rawLoadKg: raw,
        loadKg: target.loadKg,
        dropPct,
        formula,
      },
      () => `Top set ${topReps} reps -> estimated 1RM ${e1rm.toFixed(1)}; load for ${repsMax} reps, ${dropPct.toFixed(1)} % lighter`,
    ),
  }
}

/**
 * The loadable load that moves at most `movedKg`: rounded down for a load, and for an assisted
 * lift the least help that keeps the load moved at or under it; the equipment's lightest (or its
 * most help) when nothing is light enough.
 */
export function loadableAtMostMoved(movedKg: number, reading: LoadReading, equipment: Equipment): LoadOption {
  const c = compileEquipment(equipment)
  const body = reading.bodyMassKg ?? 0
  const known = reading.mode === 'external' || (reading.bodyMassKg ?? 0) > 0
  const logged = !known || reading.mode === 'external' ? movedKg : reading.mode === 'bodyweight' ? movedKg - body : body - movedKg
  if (reading.mode === 'assisted' && known) {
    return optionFromGrid(c, atOrAboveGrid(c, Math.max(kgToGrid(c, logged), c.minGrid)) ?? c.maxGrid)
  }
  return optionFromGrid(c, atOrBelowGrid(c, Math.min(kgToGrid(c, Math.max(0, logged)), c.maxGrid)) ?? c.minGrid)
}
