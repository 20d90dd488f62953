/**
 * Split templates a plan starts from. Each day has one skeleton of slots (role + movement
 * pattern) filled with different exercises in version I and version II. Exercise names refer
 * to the shared exercise library; a server maps them to ids (and falls back to any exercise
 * of the same pattern). The splits are common practice, no published source.
 */
import { ACCESSORY_TWO_SETS_SCHEME, DEFAULT_SCHEMES, type SetScheme, type SlotRole } from './schemes'

export interface TemplateSlot {
  role: SlotRole
  pattern: string
  I: string
  II: string
  /** The slot's set scheme in both versions. */
  scheme: SetScheme
}

export interface TemplateDay {
  name: string
  isRest: boolean
  slots: TemplateSlot[]
}

export interface PlanTemplate {
  id: string
  name: string
  splitKind: string
  description: string
  days: TemplateDay[]
}

const slot = (role: SlotRole, pattern: string, I: string, II: string): TemplateSlot => ({ role, pattern, I, II, scheme: DEFAULT_SCHEMES[role] })

/**
 * A training day of slots: an accessory that repeats a movement pattern already trained earlier
 * in the day gets two working sets instead of three, so no pattern passes the cap of hard sets
 * per session (plan-checks.ts).
 */
function day(name: string, slots: TemplateSlot[]): TemplateDay {
  const seen = new Set<string>()
  return {
    name,
    isRest: false,
    slots: slots.map((s) => {
      const repeat = seen.has(s.pattern)
      seen.add(s.pattern)
      return repeat && s.role === 'accessory' ? { ...s, scheme: ACCESSORY_TWO_SETS_SCHEME } : s
    }),
  }
}
const rest: TemplateDay = { name: 'Rest', isRest: true, slots: [] }

const PUSH: TemplateDay = day('Push', [
  slot('compound_primary', 'horizontal_push', 'Barbell bench press', 'Incline barbell bench press'),
  slot('accessory', 'vertical_push', 'Seated dumbbell shoulder press', 'Machine shoulder press'),
  slot('accessory', 'horizontal_push', 'Incline dumbbell press', 'Machine chest press'),
  // Chest gets its weekly volume from a fly, a pattern of its own, since the pressing pattern is capped per session.
  slot('isolation', 'chest_fly', 'Cable chest fly', 'Machine chest fly'),
  slot('isolation', 'lateral_raise', 'Dumbbell lateral raise', 'Cable lateral raise'),
  slot('isolation', 'elbow_extension', 'Cable triceps pushdown', 'Overhead cable triceps extension'),
])
const PULL: TemplateDay = day('Pull', [
  slot('compound_primary', 'horizontal_pull', 'Barbell bent-over row', 'Machine chest-supported row'),
  slot('accessory', 'vertical_pull', 'Wide-grip lat pulldown', 'Chin-up'),
  slot('accessory', 'horizontal_pull', 'Chest-supported dumbbell row', 'Seated cable row'),
  slot('isolation', 'rear_delt', 'Face pull', 'Reverse cable fly'),
  slot('isolation', 'elbow_flexion', 'Barbell curl', 'Hammer curl'),
])
const LEGS: TemplateDay = day('Legs', [
  slot('compound_primary', 'squat', 'Back squat', 'Front squat'),
  slot('accessory', 'hinge', 'Romanian deadlift', 'Dumbbell Romanian deadlift'),
  slot('accessory', 'squat', 'Leg press', 'Hack squat machine'),
  slot('isolation', 'knee_flexion', 'Seated leg curl', 'Lying leg curl'),
  slot('isolation', 'calf', 'Standing calf raise', 'Seated calf raise'),
])
const UPPER: TemplateDay = day('Upper', [
  slot('compound_primary', 'horizontal_push', 'Barbell bench press', 'Incline barbell bench press'),
  slot('compound_primary', 'horizontal_pull', 'Barbell bent-over row', 'Machine chest-supported row'),
  slot('accessory', 'vertical_push', 'Seated dumbbell shoulder press', 'Machine shoulder press'),
  slot('accessory', 'vertical_pull', 'Wide-grip lat pulldown', 'Close-grip lat pulldown'),
  slot('isolation', 'lateral_raise', 'Dumbbell lateral raise', 'Cable lateral raise'),
  slot('isolation', 'elbow_flexion', 'Barbell curl', 'Cable curl'),
])
const LOWER: TemplateDay = day('Lower', [
  slot('compound_primary', 'squat', 'Back squat', 'Hack squat machine'),
  slot('accessory', 'hinge', 'Romanian deadlift', 'Conventional deadlift'),
  slot('accessory', 'lunge', 'Walking dumbbell lunge', 'Rear-foot-elevated split squat'),
  slot('isolation', 'knee_flexion', 'Seated leg curl', 'Lying leg curl'),
  slot('isolation', 'calf', 'Standing calf raise', 'Seated calf raise'),
])
const FULL_BODY: TemplateDay = day('Full body', [
  slot('compound_primary', 'squat', 'Back squat', 'Front squat'),
  slot('compound_primary', 'horizontal_push', 'Barbell bench press', 'Incline barbell bench press'),
  slot('accessory', 'horizontal_pull', 'Chest-supported dumbbell row', 'Seated cable row'),
  slot('accessory', 'hinge', 'Romanian deadlift', 'Dumbbell Romanian deadlift'),
  slot('accessory', 'vertical_pull', 'Wide-grip lat pulldown', 'Chin-up'),
  slot('isolation', 'lateral_raise', 'Dumbbell lateral raise', 'Cable lateral raise'),
])

export const PLAN_TEMPLATES: readonly PlanTemplate[] = [
  {
    id: 'ppl_twice',
    name: 'Push / Pull / Legs, twice a week',
    splitKind: 'push_pull_legs',
    description: 'Six sessions a week: each day once in version I and once in version II.',
    days: [PUSH, PULL, LEGS],
  },
  {
    id: 'ppl_spaced',
    name: 'Legs / Push / Pull with a rest day',
    splitKind: 'push_pull_legs',
    description: 'Push sits between legs and pull, and a rest day follows pull, so the two days heavy on the lower back never fall back to back.',
    days: [LEGS, PUSH, PULL, rest],
  },
  {
    id: 'upper_lower',
    name: 'Upper / Lower',
    splitKind: 'upper_lower',
    description: 'Upper, lower, rest: about four sessions a week.',
    days: [UPPER, LOWER, rest],
  },
  {
    id: 'full_body_3',
    name: 'Full body, three days',
    splitKind: 'full_body',
    description: 'Full body on alternate days: version I and version II take turns.',
    days: [FULL_BODY, rest],
  },
  {
    id: 'blank',
    name: 'Blank',
    splitKind: 'custom',
    description: 'One empty day to build on.',
    days: [{ name: 'Day 1', isRest: false, slots: [] }],
  },
]

/** Days heavy on the lower back (a hinge or a barbell row or squat as a main lift). */
export function isLowerBackHeavy(day: TemplateDay): boolean {
  return day.slots.some((s) => s.pattern === 'hinge' || (s.role === 'compound_primary' && ['squat', 'horizontal_pull'].includes(s.pattern)))
}

/** Whether two lower-back-heavy training days follow each other anywhere in the repeating rotation. */
export function lowerBackDaysBackToBack(days: readonly TemplateDay[]): boolean {
  return days.some((day, i) => {
    const next = days[(i + 1) % days.length]
    return days.length > 1 && !day.isRest && !next.isRest && isLowerBackHeavy(day) && isLowerBackHeavy(next)
  })
}
