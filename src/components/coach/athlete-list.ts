import type { AthleteRow } from '@shared/schemas/athlete.schema'

/** Below this share of the plan's sessions in the last 4 weeks an athlete needs attention. */
export const LOW_ADHERENCE_PCT = 75

export type AthleteSort = 'name' | 'lastSession' | 'adherence' | 'waiting'

export const ATHLETE_SORT_LABELS: Record<AthleteSort, string> = {
  name: 'Name',
  lastSession: 'Last session',
  adherence: 'Adherence',
  waiting: 'Waiting',
}

export interface AthleteFilter {
  /** Part of the athlete's name, any case. */
  search: string
  needsAttention: boolean
}

/** A lift on a plateau, a session waiting for review, or adherence under 75 %. */
export function needsAttention(athlete: AthleteRow): boolean {
  return (
    athlete.plateauLifts.length > 0 ||
    athlete.waitingReview > 0 ||
    (athlete.adherencePct !== null && athlete.adherencePct < LOW_ADHERENCE_PCT)
  )
}

const byName = (a: AthleteRow, b: AthleteRow) => a.name.localeCompare(b.name, 'en', { sensitivity: 'base' })
const time = (iso: string | null) => (iso ? Date.parse(iso) : -Infinity)

/**
 * Name A to Z; last session newest first (never trained last); adherence lowest first (no plan
 * last), so the athletes who slip come first; waiting most first. Ties fall back to the name.
 */
export function sortAthletes(athletes: readonly AthleteRow[], sort: AthleteSort): AthleteRow[] {
  const compare: Record<AthleteSort, (a: AthleteRow, b: AthleteRow) => number> = {
    name: () => 0,
    lastSession: (a, b) => time(b.lastSessionAt) - time(a.lastSessionAt),
    adherence: (a, b) => (a.adherencePct ?? Infinity) - (b.adherencePct ?? Infinity),
    waiting: (a, b) => b.waitingReview - a.waitingReview,
  }
  return [...athletes].sort((a, b) => compare[sort](a, b) || byName(a, b))
}

export function filterAthletes(athletes: readonly AthleteRow[], filter: AthleteFilter): AthleteRow[] {
  const search = filter.search.trim().toLocaleLowerCase('en')
  return athletes.filter(
    (a) => (!search || a.name.toLocaleLowerCase('en').includes(search)) && (!filter.needsAttention || needsAttention(a)),
  )
}

/** "7 of 8 · 88 %"; without a plan only the count of sessions. */
export function adherenceText(athlete: AthleteRow): string {
  if (athlete.plannedLast28Days === null || athlete.adherencePct === null) {
    return athlete.sessionsLast28Days === 1 ? '1 session · no plan' : `${athlete.sessionsLast28Days} sessions · no plan`
  }
  return `${athlete.sessionsLast28Days} of ${athlete.plannedLast28Days} · ${Math.round(athlete.adherencePct)} %`
}
