import { formatLoad, type Unit } from '@shared/domain/units'
import type {
  ExerciseReport,
  NextStepOptionView,
  PlateauOptionKind,
  TakeNextStepInput,
  TakenOption,
} from '@shared/schemas/run.schema'

/*
 * Words for a finished lift and what to do next time: the estimated-1RM change, the next step and
 * its choices, what was taken. The lifter's summary and the coach's session review both read
 * these, so one lift reads the same on both. Display only: every figure comes from the server's
 * report (shared/domain/lift-report.ts).
 */

/** What a lifter (or their coach) can pick for next time; an edited target is sent apart. */
export type NextStepChoiceOption = Exclude<TakenOption, 'edited'>

export interface NextStepChoice {
  option: NextStepChoiceOption
  /** "One more rep", "Smaller load step", "Deload next time". */
  label: string
  /** "57.5 kg × 8"; null for a choice without a load of its own (deload, fresh exercises). */
  target: string | null
  /** "+12.5 % work"; null where the report gives no figure. */
  gain: string | null
  /** Why, in plain English (from the engine's reason). */
  why: string
}

/** One decimal, as the review desk's flags carry it. */
const oneDecimal = (value: number) => Math.round(value * 10) / 10

/** "+2.6 %", "−7.9 %", "±0 %": a change that may go either way (the estimated-1RM change). */
export function signedPercentText(value: number): string {
  const rounded = oneDecimal(value)
  const sign = rounded > 0 ? '+' : rounded < 0 ? '−' : '±'
  return `${sign}${Math.abs(rounded)} %`
}

/** "+12.5 % work", "+2.7 % load", "+14.3 % reps": what a step adds, never shown below zero. */
export function gainText(gain: NextStepOptionView['gain']): string {
  return `+${Math.max(0, oneDecimal(gain.pct))} % ${gain.kind}`
}

/**
 * The summary's and the review's one figure for a lift: "Deload" for a planned deload (lighter on
 * purpose, not a drop), else the estimated-1RM change; null when there is nothing to compare.
 */
export function e1rmChangeText(exercise: Pick<ExerciseReport, 'deload' | 'e1rmChangePct'>): string | null {
  if (exercise.deload) return 'Deload'
  return exercise.e1rmChangePct === null ? null : signedPercentText(exercise.e1rmChangePct)
}

/** "incl. 63 kg body mass" for a bodyweight or assisted lift whose body mass was counted. */
export function bodyMassText(exercise: Pick<ExerciseReport, 'loadMode' | 'bodyMassKg'>, unit: Unit): string | null {
  if (exercise.loadMode === 'external' || exercise.bodyMassKg === null) return null
  return `incl. ${formatLoad(exercise.bodyMassKg, unit)} body mass`
}

/**
 * A target as the lifter loads it: "57.5 kg × 8"; for a bodyweight lift the added load
 * ("Body mass + 10 kg × 6", "Body mass × 8"), for an assisted one the help ("Body mass − 20 kg × 8").
 */
export function targetText(loadKg: number, reps: number, loadMode: ExerciseReport['loadMode'], unit: Unit): string {
  if (loadMode === 'external') return `${formatLoad(loadKg, unit)} × ${reps}`
  if (loadKg <= 0) return `Body mass × ${reps}`
  return `Body mass ${loadMode === 'bodyweight' ? '+' : '−'} ${formatLoad(loadKg, unit)} × ${reps}`
}

export const STEP_ACTION_LABELS: Record<NextStepOptionView['action'], string> = {
  add_rep: 'One more rep',
  add_load: 'Add load',
  hold: 'Same load again',
  cut_load: 'Lighter load',
}

const PLATEAU_LABELS: Record<PlateauOptionKind, string> = {
  microload: 'Smaller load step',
  rotate_version: 'Fresh exercises',
  add_set: 'One more set',
  deload: 'Deload next time',
}

/** "No progress for 3 sessions". */
export function plateauText(plateau: NonNullable<ExerciseReport['plateau']>): string {
  const n = plateau.exposuresWithoutProgress
  return `No progress for ${n} ${n === 1 ? 'session' : 'sessions'}`
}

/** Every choice for next time, the next step first, then its alternative, then the plateau options. */
export function nextStepChoices(exercise: ExerciseReport, unit: Unit): NextStepChoice[] {
  const { nextStep, alternative, plateau, loadMode } = exercise
  if (!nextStep) return []
  const step = (option: 'next_step' | 'alternative', view: NextStepOptionView): NextStepChoice => ({
    option,
    label: STEP_ACTION_LABELS[view.action],
    target: targetText(view.targetLoadKg, view.targetReps, loadMode, unit),
    gain: gainText(view.gain),
    why: view.reason.message,
  })
  const choices = [step('next_step', nextStep)]
  if (alternative) choices.push(step('alternative', alternative))
  for (const offered of plateau?.options ?? []) {
    let label = PLATEAU_LABELS[offered.kind]
    let target: string | null = null
    if (offered.kind === 'microload' && offered.targetLoadKg !== null && offered.targetReps !== null) {
      target = targetText(offered.targetLoadKg, offered.targetReps, loadMode, unit)
    } else if (offered.kind === 'rotate_version' && offered.rotate) {
      label = `Fresh exercises for version ${offered.rotate}`
    } else if (offered.kind === 'add_set') {
      // The added set keeps the next step as its target.
      target = targetText(nextStep.targetLoadKg, nextStep.targetReps, loadMode, unit)
      if (offered.sets !== null) label = `One more set: ${offered.sets} sets`
    }
    choices.push({ option: offered.kind, label, target, gain: null, why: offered.reason.message })
  }
  return choices
}

/** The choice a card starts on: what was taken (when it is still offered), else the next step. */
export function defaultChoice(exercise: ExerciseReport): NextStepChoiceOption {
  const taken = exercise.taken?.option
  if (taken && taken !== 'edited' && isOffered(exercise, taken)) return taken
  return 'next_step'
}

export function isOffered(exercise: ExerciseReport, option: NextStepChoiceOption): boolean {
  if (!exercise.nextStep) return false
  if (option === 'next_step') return true
  if (option === 'alternative') return exercise.alternative !== null
  return exercise.plateau?.options.some((o) => o.kind === option) ?? false
}

/**
 * The request for one choice: the next step and its alternative send their own target, the
 * smaller load step the one the server offered; a deload, an added set and fresh exercises send
 * the option alone (the server plans them). Null when the report does not offer the choice.
 */
export function stepFor(exercise: ExerciseReport, option: NextStepChoiceOption): TakeNextStepInput | null {
  if (!isOffered(exercise, option)) return null
  const block = { exerciseId: exercise.exerciseId, slotId: exercise.slotId }
  if (option === 'next_step' || option === 'alternative') {
    const view = option === 'next_step' ? exercise.nextStep! : exercise.alternative!
    return { ...block, option, targetLoadKg: view.targetLoadKg, targetReps: view.targetReps }
  }
  if (option === 'microload') {
    const offered = exercise.plateau!.options.find((o) => o.kind === 'microload')!
    if (offered.targetLoadKg === null || offered.targetReps === null) return null
    return { ...block, option, targetLoadKg: offered.targetLoadKg, targetReps: offered.targetReps }
  }
  return { ...block, option }
}

/** An edited target: the load and reps the lifter (or coach) set with the steppers. */
export function editedStep(exercise: ExerciseReport, target: { targetLoadKg: number; targetReps: number }): TakeNextStepInput {
  return { exerciseId: exercise.exerciseId, slotId: exercise.slotId, option: 'edited', ...target }
}

/**
 * What was taken, after "Taken: ": "57.5 kg × 8", "deload next time", "fresh exercises for
 * version I", "one more set from now on, 57.5 kg × 8", "smaller load step, 58.75 kg × 8".
 */
export function takenText(exercise: ExerciseReport, unit: Unit): string | null {
  const { taken, loadMode } = exercise
  if (!taken) return null
  const target = taken.targetLoadKg !== null && taken.targetReps !== null
    ? targetText(taken.targetLoadKg, taken.targetReps, loadMode, unit)
    : null
  switch (taken.option) {
    case 'deload':
      return 'deload next time'
    case 'rotate_version': {
      const version = exercise.plateau?.options.find((o) => o.kind === 'rotate_version')?.rotate
      return version ? `fresh exercises for version ${version}` : 'fresh exercises for this day'
    }
    case 'add_set':
      return target ? `one more set from now on, ${target}` : 'one more set from now on'
    case 'microload':
      return target ? `smaller load step, ${target}` : 'smaller load step'
    default:
      return target ?? 'the next step'
  }
}
