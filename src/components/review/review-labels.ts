import type { ReviewFlagView } from '@shared/schemas/review.schema'
import { signedPercentText } from '@/utils/next-step-text'

/* The review desk's flags in words, for chips on the desk and at the top of a session review. */

export type ReviewFlagCode = ReviewFlagView['code']

/** Chip colour: a lift going the wrong way is brick, attendance and effort amber. */
export const FLAG_TONE: Record<ReviewFlagCode, 'danger' | 'warning'> = {
  plateau: 'warning',
  regression: 'danger',
  top_set_far_short: 'danger',
  cut_short: 'warning',
  missed_days: 'warning',
  rest_skipped: 'warning',
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`

/**
 * "Plateau: Barbell bench press (3 sessions)", "Regression: Back squat estimated 1RM −7.9 %",
 * "Top set far short: Bench press, 4 of 6–9", "Cut short: 8 of 12 sets", "Missed 3 training days".
 * The flag carries the bottom of the top set's range; pass the top of it when known.
 */
export function flagText(flag: ReviewFlagView, repsMax: number | null = null): string {
  const v = flag.values
  const name = flag.exercise ?? 'a lift'
  switch (flag.code) {
    case 'plateau':
      return `Plateau: ${name} (${plural(v.exposures ?? 0, 'session', 'sessions')})`
    case 'regression':
      // The same figure, formatted the same way, as the summary's estimated-1RM change for the lift.
      return `Regression: ${name} estimated 1RM ${v.e1rmChangePct === undefined ? 'down' : signedPercentText(v.e1rmChangePct)}`
    case 'top_set_far_short': {
      const max = repsMax ?? v.repsMax ?? null
      const range = max !== null && max !== v.repsMin ? `${v.repsMin}–${max}` : `${v.repsMin}+`
      return `Top set far short: ${name}, ${v.reps} of ${range}`
    }
    case 'cut_short':
      return `Cut short: ${v.done} of ${plural(v.planned ?? 0, 'set', 'sets')}`
    case 'missed_days':
      return `Missed ${plural(v.missed ?? 0, 'training day', 'training days')}`
    case 'rest_skipped':
      return `Rest cut short ${v.shortRests} of ${v.rests} times`
  }
}
