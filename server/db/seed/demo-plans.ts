import type { SlotRole } from '@shared/domain/schemes'

/**
 * The demo club's two plans. Each day has two versions built on the same skeleton of slot
 * roles with different exercises (version I / version II).
 */
export interface DemoSlot {
  role: SlotRole
  exercise: string
}
export interface DemoDay {
  name: string
  isRest?: boolean
  versions?: { I: DemoSlot[]; II: DemoSlot[] }
}
export interface DemoPlan {
  name: string
  splitKind: string
  days: DemoDay[]
}

const p = (exercise: string): DemoSlot => ({ role: 'compound_primary', exercise })
const a = (exercise: string): DemoSlot => ({ role: 'accessory', exercise })
const i = (exercise: string): DemoSlot => ({ role: 'isolation', exercise })

export const PUSH_PULL_LEGS: DemoPlan = {
  name: 'Push / Pull / Legs',
  splitKind: 'push_pull_legs',
  days: [
    {
      name: 'Push',
      versions: {
        I: [p('Barbell bench press'), a('Seated dumbbell shoulder press'), a('Incline dumbbell press'), i('Dumbbell lateral raise'), i('Cable triceps pushdown')],
        II: [p('Incline barbell bench press'), a('Machine shoulder press'), a('Machine chest press'), i('Cable lateral raise'), i('Overhead cable triceps extension')],
      },
    },
    {
      name: 'Pull',
      versions: {
        I: [p('Barbell bent-over row'), a('Wide-grip lat pulldown'), a('Chest-supported dumbbell row'), i('Face pull'), i('Barbell curl')],
        II: [p('Conventional deadlift'), a('Close-grip lat pulldown'), a('Seated cable row'), i('Reverse cable fly'), i('Hammer curl')],
      },
    },
    {
      name: 'Legs',
      versions: {
        I: [p('Back squat'), a('Romanian deadlift'), a('Leg press'), i('Seated leg curl'), i('Standing calf raise')],
        II: [p('Front squat'), a('Dumbbell Romanian deadlift'), a('Hack squat machine'), i('Lying leg curl'), i('Seated calf raise')],
      },
    },
    { name: 'Rest', isRest: true },
  ],
}

export const UPPER_LOWER: DemoPlan = {
  name: 'Upper / Lower',
  splitKind: 'upper_lower',
  days: [
    {
      name: 'Upper',
      versions: {
        I: [p('Barbell bench press'), p('Barbell bent-over row'), a('Seated dumbbell shoulder press'), a('Wide-grip lat pulldown'), i('Dumbbell lateral raise'), i('Barbell curl')],
        II: [p('Standing overhead press'), p('Machine chest-supported row'), a('Incline dumbbell press'), a('Close-grip lat pulldown'), i('Cable lateral raise'), i('Cable triceps pushdown')],
      },
    },
    {
      name: 'Lower',
      versions: {
        I: [p('Back squat'), a('Romanian deadlift'), a('Leg press'), i('Seated leg curl'), i('Standing calf raise')],
        II: [p('Conventional deadlift'), a('Hack squat machine'), a('Walking dumbbell lunge'), i('Lying leg curl'), i('Seated calf raise')],
      },
    },
    { name: 'Rest', isRest: true },
  ],
}

/**
 * Estimated 1RM (kg) of an invented intermediate lifter on each exercise at the start of the
 * demo history; other demo lifters scale it. Dumbbell loads are per dumbbell. Invented values.
 */
export const INTERMEDIATE_E1RM_KG: Record<string, number> = {
  'Barbell bench press': 72, 'Incline barbell bench press': 62, 'Standing overhead press': 45,
  'Seated dumbbell shoulder press': 20, 'Incline dumbbell press': 24, 'Machine shoulder press': 55,
  'Machine chest press': 80, 'Dumbbell lateral raise': 11, 'Cable lateral raise': 14,
  'Cable triceps pushdown': 45, 'Overhead cable triceps extension': 38,
  'Barbell bent-over row': 75, 'Conventional deadlift': 130, 'Machine chest-supported row': 80,
  'Wide-grip lat pulldown': 75, 'Close-grip lat pulldown': 78, 'Chest-supported dumbbell row': 30,
  'Seated cable row': 80, 'Face pull': 35, 'Reverse cable fly': 20, 'Barbell curl': 40, 'Hammer curl': 17,
  'Back squat': 105, 'Front squat': 85, 'Romanian deadlift': 100, 'Dumbbell Romanian deadlift': 36,
  'Leg press': 200, 'Hack squat machine': 140, 'Walking dumbbell lunge': 26, 'Seated leg curl': 65,
  'Lying leg curl': 55, 'Standing calf raise': 120, 'Seated calf raise': 80,
}
