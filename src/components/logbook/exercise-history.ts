import { bestE1rm, type LoadReps } from '@shared/domain/records'
import type { SetKind } from '@shared/schemas/session.schema'

/* One exercise's working sets across the logbook, and its records (computed by the shared engine). */

/** Weeks of progress the logbook asks for: the API's maximum (five years), so all of it in practice. */
export const LOGBOOK_WEEKS = 260

export interface HistorySet {
  kind: SetKind
  loadKg: number | null
  reps: number | null
  rir: number | null
  failure: boolean
}

export interface HistorySession {
  date: string
  day: string | null
  version: string | null
  sets: Array<HistorySet & { exercise: string }>
}

export interface HistoryGroup {
  date: string
  day: string | null
  version: string | null
  sets: HistorySet[]
}

export interface RepRecord {
  loadKg: number
  reps: number
  /** The first session that reached these reps at this load. */
  date: string
}

export interface DatedSet extends LoadReps {
  date: string
}

export interface ExerciseRecords {
  /** Best reps at each load lifted, heaviest load first. */
  repRecords: RepRecord[]
  /** The best estimated 1RM (Epley) and the set it came from. */
  e1rm: { e1rmKg: number; set: DatedSet } | null
  /** The heaviest load lifted for at least one rep (most reps at it). */
  heaviest: DatedSet | null
}

/** Working sets (no warm-ups) of one exercise, newest session first; names match case-insensitively. */
export function exerciseWorkingSets(sessions: readonly HistorySession[], exercise: string): HistoryGroup[] {
  const name = exercise.trim().toLowerCase()
  const groups: HistoryGroup[] = []
  for (const session of sessions) {
    const sets = session.sets
      .filter((set) => set.exercise.trim().toLowerCase() === name && set.kind !== 'warmup' && set.reps !== null)
      .map(({ kind, loadKg, reps, rir, failure }) => ({ kind, loadKg, reps, rir, failure }))
    if (sets.length) groups.push({ date: session.date, day: session.day, version: session.version, sets })
  }
  return groups.sort((a, b) => b.date.localeCompare(a.date))
}

const LOAD_KEY_DECIMALS = 6

/** Rep records per load, the estimated-1RM record and the heaviest set over the given sessions. */
export function exerciseRecords(groups: readonly HistoryGroup[]): ExerciseRecords {
  const dated: DatedSet[] = []
  // Oldest first, so the first session to reach a record keeps it.
  for (const group of [...groups].sort((a, b) => a.date.localeCompare(b.date))) {
    for (const set of group.sets) {
      if (set.loadKg !== null && set.loadKg > 0 && set.reps !== null && set.reps > 0) {
        dated.push({ loadKg: set.loadKg, reps: set.reps, date: group.date })
      }
    }
  }
  const byLoad = new Map<string, RepRecord>()
  for (const set of dated) {
    const key = set.loadKg.toFixed(LOAD_KEY_DECIMALS)
    const best = byLoad.get(key)
    if (!best || set.reps > best.reps) byLoad.set(key, { loadKg: set.loadKg, reps: set.reps, date: set.date })
  }
  const best = bestE1rm(dated)
  let heaviest: DatedSet | null = null
  for (const set of dated) {
    if (!heaviest || set.loadKg > heaviest.loadKg || (set.loadKg === heaviest.loadKg && set.reps > heaviest.reps)) heaviest = set
  }
  return {
    repRecords: [...byLoad.values()].sort((a, b) => b.loadKg - a.loadKg),
    e1rm: best ? { e1rmKg: best.e1rmKg, set: best.set as DatedSet } : null,
    heaviest,
  }
}
