import type { SetKind, SetLog } from '@shared/schemas/session.schema'
import type { Unit } from '@shared/schemas/common.schema'
import { formatLoad } from '@/utils/units'

/* Words for a logged set, target beside actual: the logbook and the coach's review desk. */

export const SET_KIND_LABELS: Record<SetKind, string> = {
  warmup: 'Warm-up',
  top: 'Top set',
  backoff: 'Back-off set',
  straight: 'Working set',
}

/** "100 kg × 6–9 to failure", "load open × 10". */
export function setTargetText(set: SetLog, unit: Unit): string {
  const load = set.targetLoadKg === null ? 'load open' : formatLoad(set.targetLoadKg, unit)
  const { targetRepsMin: min, targetRepsMax: max } = set
  const reps = min === null ? '' : max !== null && max !== min ? ` × ${min}–${max}` : ` × ${min}`
  return `${load}${reps}${set.toFailure ? ' to failure' : ''}`
}

/** "97.5 kg × 8, 1 RIR", "bodyweight × 12, failure", "not logged". */
export function setActualText(set: SetLog, unit: Unit): string {
  if (set.reps === null) return 'not logged'
  const load = set.loadKg === null ? 'bodyweight' : formatLoad(set.loadKg, unit)
  const effort = set.failure ? ', failure' : set.rir !== null ? `, ${set.rir} RIR` : ''
  return `${load} × ${set.reps}${effort}`
}

export type RepStanding = 'below' | 'above' | 'within' | 'none'

/** Where a working set's reps fell against its target range (warm-ups and unlogged sets: 'none'). */
export function repStanding(set: SetLog): RepStanding {
  if (set.kind === 'warmup' || set.reps === null) return 'none'
  if (set.targetRepsMin !== null && set.reps < set.targetRepsMin) return 'below'
  if (set.targetRepsMax !== null && set.reps > set.targetRepsMax) return 'above'
  return 'within'
}

/** Sets grouped by exercise in session order, warm-ups apart from working sets. */
export interface SetLogGroup {
  exerciseId: number
  name: string
  warmups: SetLog[]
  working: SetLog[]
}

export function groupSetLogs(sets: readonly SetLog[]): SetLogGroup[] {
  const byExercise = new Map<number, SetLogGroup>()
  for (const set of [...sets].sort((a, b) => a.position - b.position)) {
    let group = byExercise.get(set.exerciseId)
    if (!group) {
      group = { exerciseId: set.exerciseId, name: set.exerciseName, warmups: [], working: [] }
      byExercise.set(set.exerciseId, group)
    }
    ;(set.kind === 'warmup' ? group.warmups : group.working).push(set)
  }
  return [...byExercise.values()]
}
