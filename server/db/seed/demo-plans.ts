import { PLAN_TEMPLATES, type PlanTemplate } from '@shared/domain/plan-templates'
import type { SetScheme, SlotRole } from '@shared/domain/schemes'

/**
 * The demo club's two plans, built from the split templates: the coach uses the push / pull /
 * legs order that keeps the days heavy on the lower back apart, and upper / lower.
 */
export interface DemoSlot {
  role: SlotRole
  exercise: string
  scheme: SetScheme
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
        I: day.slots.map((s) => ({ role: s.role, exercise: s.I, scheme: s.scheme })),
        II: day.slots.map((s) => ({ role: s.role, exercise: s.II, scheme: s.scheme })),
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
  'Machine chest press': 80, 'Cable chest fly': 30, 'Machine chest fly': 45, 'Dumbbell lateral raise': 11, 'Cable lateral raise': 14,
  'Cable triceps pushdown': 45, 'Overhead cable triceps extension': 38,
  'Barbell bent-over row': 75, 'Conventional deadlift': 130, 'Machine chest-supported row': 80,
  'Wide-grip lat pulldown': 75, 'Close-grip lat pulldown': 78, 'Chest-supported dumbbell row': 30,
  'Seated cable row': 80, 'Face pull': 35, 'Reverse cable fly': 20, 'Barbell curl': 40, 'Hammer curl': 17,
  'Back squat': 105, 'Front squat': 85, 'Romanian deadlift': 100, 'Dumbbell Romanian deadlift': 36,
  'Leg press': 200, 'Hack squat machine': 140, 'Walking dumbbell lunge': 26, 'Seated leg curl': 65,
  'Lying leg curl': 55, 'Standing calf raise': 120, 'Seated calf raise': 80, 'Cable curl': 32,
  'Rear-foot-elevated split squat': 22,
}

/**
 * Bodyweight lifts: the estimated 1RM (body mass plus added load) of the intermediate lifter as a
 * multiple of their body mass. Invented values.
 */
export const INTERMEDIATE_E1RM_BODY_MASS: Record<string, number> = {
  'Chin-up': 1.3, 'Weighted pull-up': 1.3, 'Weighted dip': 1.4, 'Push-up': 0.9, 'Back extension': 0.9,
}

/** The invented intermediate lifter's estimated 1RM on an exercise (kg moved), at this body mass. */
export function demoE1rmKg(exercise: string, bodyMassKg: number): number {
  const relative = INTERMEDIATE_E1RM_BODY_MASS[exercise]
  return relative !== undefined ? relative * bodyMassKg : (INTERMEDIATE_E1RM_KG[exercise] ?? 50)
}
