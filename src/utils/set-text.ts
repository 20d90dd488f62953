import type { LoadMode } from '@shared/domain/lift-progress'
import type { PlanWarning } from '@shared/domain/plan-checks'
import { displayLoad, formatLoad, type Unit } from '@shared/domain/units'
import type { PlateChange } from '@shared/domain/warmup'
import type { NextStepOptionView, RunExercise, RunSet } from '@shared/schemas/run.schema'

/** Words shown on the runner's set card and the set list. Display only: no training math here. */

const KIND_NAMES = { warmup: 'Warm-up', top: 'Top set', backoff: 'Back-off set', straight: 'Set' } as const

/**
 * "Warm-up 2 of 4", "Top set", "Back-off set 1 of 1", "Set 2 of 3": counted within the exercise;
 * a planned deload set says so first ("Deload · Top set").
 */
export function setLabel(set: RunSet, blockSets: readonly RunSet[]): string {
  const same = blockSets.filter((s) => s.kind === set.kind)
  const index = same.findIndex((s) => s.id === set.id) + 1
  const label = set.kind === 'top' && same.length === 1 ? KIND_NAMES.top : `${KIND_NAMES[set.kind]} ${index} of ${same.length}`
  return set.deload && set.kind !== 'warmup' ? `Deload · ${label}` : label
}

/**
 * A logged load as the lifter reads it, in parts for big numerals: "100 kg"; for a bodyweight
 * lift the added load, "Body + 10 kg" ("Body weight" with nothing added); for an assisted lift
 * the help, "Help 30 kg". `value` is null when the words say it all.
 */
export interface LoadParts {
  prefix: string
  value: string | null
  unit: Unit
}

export function loadParts(loadKg: number, unit: Unit, mode: LoadMode = 'external'): LoadParts {
  const value = String(displayLoad(loadKg, unit))
  if (mode === 'external') return { prefix: '', value, unit }
  if (displayLoad(loadKg, unit) === 0) return { prefix: 'Body weight', value: null, unit }
  return { prefix: mode === 'bodyweight' ? 'Body +' : 'Help', value, unit }
}

/** loadParts as one line: "100 kg", "Body + 10 kg", "Body weight", "Help 30 kg". */
export function loadText(loadKg: number, unit: Unit, mode: LoadMode = 'external'): string {
  if (mode === 'external') return formatLoad(loadKg, unit)
  const { prefix, value } = loadParts(loadKg, unit, mode)
  return value === null ? prefix : `${prefix} ${value} ${unit}`
}

/** Reps the As planned button logs: the rep to beat, else the top of a warm-up's range or the bottom of a working set's. */
export function plannedReps(set: RunSet): number | null {
  if (set.targetReps !== null) return set.targetReps
  return set.kind === 'warmup' ? (set.targetRepsMax ?? set.targetRepsMin) : (set.targetRepsMin ?? set.targetRepsMax)
}

/** "6–9 reps to technical failure", "8–12 reps · RIR 2", "5 reps". */
export function targetRepsText(set: RunSet): string {
  const { targetRepsMin: min, targetRepsMax: max } = set
  let reps: string
  if (set.kind === 'warmup') reps = `${plannedReps(set) ?? '?'} reps`
  else if (min !== null && max !== null && min !== max) reps = `${min}–${max} reps`
  else reps = `${min ?? max ?? '?'} reps`
  if (set.kind !== 'warmup' && set.targetReps !== null && min !== max) reps += `, aim for ${set.targetReps}`
  if (set.toFailure) return `${reps} to technical failure`
  // A deload is lighter on purpose: its effort is the reserve to keep, never failure.
  if (set.deload && set.targetRir !== null) return `${reps} · deload: stop with ${set.targetRir} in reserve`
  if (set.targetRir !== null) return `${reps} · RIR ${set.targetRir}`
  return reps
}

/** "100 kg × 8" ("Body + 10 kg × 8" for a bodyweight lift): a logged set's load and reps in the lifter's unit. */
export function loadTimesReps(loadKg: number | null, reps: number | null, unit: Unit, mode: LoadMode = 'external'): string {
  const load = loadKg === null ? 'No load' : loadText(loadKg, unit, mode)
  return `${load} × ${reps ?? '?'}`
}

/** Last time's result for the same working set (same kind, same place among that kind), or null. */
export function lastTimeFor(set: RunSet, blockSets: readonly RunSet[], exercise: RunExercise | undefined) {
  if (!exercise || set.kind === 'warmup') return null
  const index = blockSets.filter((s) => s.kind === set.kind).findIndex((s) => s.id === set.id)
  const matches = exercise.lastTime.filter((s) => s.kind === set.kind)
  return matches[index] ?? matches.at(-1) ?? null
}

function plateList(masses: readonly number[], unit: Unit): string {
  const counts = new Map<number, number>()
  for (const m of masses) counts.set(m, (counts.get(m) ?? 0) + 1)
  return [...counts].map(([mass, n]) => `${n} × ${mass} ${unit}`).join(' + ')
}

/** What nothing loaded is called: the bar, or a plate-loaded machine's sled. */
export function emptyLoadWords(exercise: Pick<RunExercise, 'equipmentKind'> | undefined): string {
  return exercise?.equipmentKind === 'sled' ? 'Empty sled' : 'Empty bar'
}

/**
 * The plate moves between two barbell loads in words, per side: "Add 2 × 10 kg each side",
 * "Take off 1 × 5 kg, add 1 × 10 kg each side". From the empty bar (first set): "Load ... each side".
 */
export function plateChangeText(change: PlateChange, unit: Unit, fromEmptyBar = false, emptyWords = 'Empty bar'): string {
  if (change.count === 0) return fromEmptyBar ? emptyWords : 'No plate change'
  if (fromEmptyBar) return `Load ${plateList(change.add, unit)} each side`
  const parts: string[] = []
  if (change.remove.length) parts.push(`take off ${plateList(change.remove, unit)}`)
  if (change.add.length) parts.push(`add ${plateList(change.add, unit)}`)
  const text = parts.join(', ')
  return `${text.charAt(0).toUpperCase()}${text.slice(1)} each side`
}

/** "One more rep: 100 kg × 9", "Add load: 102.5 kg × 6", "Hold: 100 kg × 8". */
export function nextStepTitle(option: NextStepOptionView, unit: Unit): string {
  const what = { add_rep: 'One more rep', add_load: 'Add load', hold: 'Hold', cut_load: 'Lighter load' }[option.action]
  return `${what}: ${formatLoad(option.targetLoadKg, unit)} × ${option.targetReps}`
}

/** "+12.5 % work", "−3 % work"; empty when unknown. */
export function signedPercent(value: number | null, suffix = ''): string {
  if (value === null) return ''
  const rounded = Math.round(value * 10) / 10
  const sign = rounded > 0 ? '+' : rounded < 0 ? '−' : '±'
  return `${sign}${Math.abs(rounded)} %${suffix}`
}

/**
 * A Train preview line: "Top set 100 kg × 6–9", "Back-off set 90 kg × 9–12", "Set 20 kg × 10–15 · aim for 12";
 * with no starting load yet, the reps alone: "Top set 6–9 reps · aim for 7".
 */
export function targetLine(
  target: { kind: 'top' | 'backoff' | 'straight'; targetLoadKg: number | null; repsMin: number; repsMax: number; targetReps: number | null },
  unit: Unit,
): string {
  const reps = target.repsMin === target.repsMax ? `${target.repsMin}` : `${target.repsMin}–${target.repsMax}`
  const aim = target.targetReps !== null && target.repsMin !== target.repsMax ? ` · aim for ${target.targetReps}` : ''
  if (target.targetLoadKg === null) return `${KIND_NAMES[target.kind]} ${reps} reps${aim}`
  return `${KIND_NAMES[target.kind]} ${formatLoad(target.targetLoadKg, unit)} × ${reps}${aim}`
}

const capitalised = (text: string) => `${text.charAt(0).toUpperCase()}${text.slice(1)}`

/**
 * A cap an added set would pass, in the lifter's words: "Squat pattern: 5 hard sets in this
 * session, the usual cap is 4." The figures are the engine's (sessionCapWarnings, the slot caps).
 */
export function capWarningText(warning: PlanWarning): string {
  const { sets, cap } = warning.values
  switch (warning.code) {
    case 'PATTERN_OVER_SESSION_CAP':
      return `${capitalised(String(warning.values.pattern).replaceAll('_', ' '))} pattern: ${sets} hard sets in this session, the usual cap is ${cap}.`
    case 'EXERCISE_OVER_SESSION_CAP':
      return `${warning.values.exercise}: ${sets} hard sets in this session, the usual cap for a compound exercise is ${cap}.`
    case 'PRIMARY_COMPOUND_OVER_CAP':
      return `${warning.values.exercise}: ${sets} working sets, the usual cap for a main lift is ${cap}.`
    case 'MOVEMENT_OVER_CAP':
      return `${warning.values.exercise}: ${sets} working sets, the usual cap for one exercise is ${cap}.`
    default:
      return warning.message
  }
}
