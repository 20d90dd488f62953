/** Session totals: working sets and volume (load x reps summed over working sets, kg). */
export interface SummarisableSet {
  kind: 'warmup' | 'top' | 'backoff' | 'straight'
  loadKg: number | null
  reps: number | null
}

export interface SessionTotals {
  workingSets: number
  volumeKg: number
}

/** Warm-ups are left out: they are meant to build no fatigue, so they do not count as work. */
export function sessionTotals(sets: readonly SummarisableSet[]): SessionTotals {
  let workingSets = 0
  let volumeKg = 0
  for (const set of sets) {
    if (set.kind === 'warmup' || set.reps === null || set.reps <= 0) continue
    workingSets += 1
    volumeKg += (set.loadKg ?? 0) * set.reps
  }
  return { workingSets, volumeKg }
}
