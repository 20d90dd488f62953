/**
 * Records a session sets against the lifter's history on one exercise:
 * - a rep record: more reps at a load than any earlier set at that load or heavier (a load
 *   never lifted before is not a rep record: there is no earlier number to beat at it);
 * - an estimated-1RM record: the session's best estimate above every earlier one.
 * A first session on an exercise sets no records: there is nothing to beat yet.
 */
import { estimateOneRepMax, type E1rmFormula } from './e1rm'

export interface LoadReps {
  loadKg: number
  reps: number
}

export interface RecordFound {
  kind: 'rep_record' | 'e1rm_record'
  loadKg: number
  reps: number
  e1rmKg: number
  /** Best reps earlier at this load or heavier (rep record), or the best earlier estimate (estimated-1RM record). */
  previous: number
}

const EPS = 1e-9

/** Best estimated 1RM over sets (reps > 0); null for none. */
export function bestE1rm(sets: readonly LoadReps[], formula: E1rmFormula = 'epley'): { e1rmKg: number; set: LoadReps } | null {
  let best: { e1rmKg: number; set: LoadReps } | null = null
  for (const set of sets) {
    if (set.reps <= 0 || set.loadKg <= 0) continue
    const { e1rm } = estimateOneRepMax(set.loadKg, set.reps, { formula })
    if (!best || e1rm > best.e1rmKg) best = { e1rmKg: e1rm, set }
  }
  return best
}

/**
 * `history` can be every earlier working set, or just the best reps per load (the same
 * answer, far fewer rows): a set is only ever beaten by a set at least as heavy with at least
 * as many reps.
 */
export function sessionRecords(done: readonly LoadReps[], history: readonly LoadReps[], formula: E1rmFormula = 'epley'): RecordFound[] {
  const earlier = history.filter((h) => h.reps > 0)
  if (earlier.length === 0) return []
  const records: RecordFound[] = []
  const counted: LoadReps[] = []
  for (const set of done) {
    if (set.reps <= 0 || set.loadKg <= 0) continue
    const dominated = (other: LoadReps) => other.loadKg >= set.loadKg - EPS && other.reps >= set.reps
    const atOrAbove = earlier.filter((h) => h.loadKg >= set.loadKg - EPS)
    if (atOrAbove.length === 0 || earlier.some(dominated) || counted.some(dominated)) continue
    // Drop records of this session that this set beats outright, so each is listed once.
    for (let i = records.length - 1; i >= 0; i--) {
      const r = records[i]
      if (r.kind === 'rep_record' && set.loadKg >= r.loadKg - EPS && set.reps >= r.reps) records.splice(i, 1)
    }
    records.push({
      kind: 'rep_record',
      loadKg: set.loadKg,
      reps: set.reps,
      e1rmKg: estimateOneRepMax(set.loadKg, set.reps, { formula }).e1rm,
      previous: Math.max(...atOrAbove.map((h) => h.reps)),
    })
    counted.push(set)
  }
  const now = bestE1rm(done, formula)
  const before = bestE1rm(earlier, formula)
  if (now && before && now.e1rmKg > before.e1rmKg * (1 + EPS)) {
    records.push({ kind: 'e1rm_record', loadKg: now.set.loadKg, reps: now.set.reps, e1rmKg: now.e1rmKg, previous: before.e1rmKg })
  }
  return records
}
