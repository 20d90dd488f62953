import { PLAN_TEMPLATES, type PlanTemplate } from '@shared/domain/plan-templates'
import type { SlotRole } from '@shared/domain/schemes'

/**
 * The demo club's two plans, built from the split templates: the coach uses the push / pull /
 * legs order that keeps the days heavy on the lower back apart, and upper / lower.
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

function fromTemplate(id: string, name: string): DemoPlan {
  const template: PlanTemplate = PLAN_TEMPLATES.find((t) => t.id === id)!
  return {
    name,
    splitKind: template.splitKind,
    days: template.days.map((day) => ({
      name: day.name,
      isRest: day.isRest,
      versions: {
        I: day.slots.map((s) => ({ role: s.role, exercise: s.I })),
        II: day.slots.map((s) => ({ role: s.role, exercise: s.II })),
      },
    })),
  }
}

export const PUSH_PULL_LEGS = fromTemplate('ppl_spaced', 'Legs / Push / Pull')
export const UPPER_LOWER = fromTemplate('upper_lower', 'Upper / Lower')

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
  'Lying leg curl': 55, 'Standing calf raise': 120, 'Seated calf raise': 80, 'Cable curl': 32,
  'Rear-foot-elevated split squat': 22,
}
