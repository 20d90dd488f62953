import type { LoadRange } from '@shared/domain/gym'
import type { Unit } from '@shared/domain/units'

const massNumber = new Intl.NumberFormat('en', { maximumFractionDigits: 2 })

/** "2.5 kg", "1.25 lb": a mass in the equipment's own unit, as a gym labels it. */
export function formatMass(value: number, unit: Unit): string {
  return `${massNumber.format(value)} ${unit}`
}

/** Masses from `from` to `to` every `every`, kept to a millionth (0.1 + 0.2 is 0.3 here). */
export function massRange(from: number, to: number, every: number): number[] {
  const count = Math.floor((to - from) / every + 1e-9) + 1
  return Array.from({ length: count }, (_, i) => Math.round((from + i * every) * 1e6) / 1e6)
}

/** Reads a typed mass: a comma works as the decimal mark; blank or not a number gives NaN. */
export function parseMass(text: string): number {
  const trimmed = text.trim().replace(',', '.')
  return trimmed === '' ? Number.NaN : Number(trimmed)
}

/** The problems under one part of the gym, keyed by the rest of their path ("" for the part itself). */
export function issuesUnder(issues: Record<string, string>, prefix: string): Record<string, string> {
  const under: Record<string, string> = {}
  for (const [path, message] of Object.entries(issues)) {
    if (path === prefix) under[''] = message
    else if (path.startsWith(`${prefix}.`)) under[path.slice(prefix.length + 1)] = message
  }
  return under
}

export type GymPiece = 'barbell' | 'sled' | 'dumbbell' | 'stack'

/**
 * What a piece of the gym can load, in plain words: the lightest and heaviest loads and the
 * smallest step between two (from the engine's `loadRangeOf`).
 */
export function loadRangeWords(piece: GymPiece, range: LoadRange | null, options: { collarsCounted?: boolean } = {}): string[] {
  if (!range) return ['Fix the fields marked above to see what this loads.']
  const mass = (value: number) => formatMass(value, range.unit)
  const step = range.smallestStep
  switch (piece) {
    case 'barbell':
      return [
        `${options.collarsCounted ? 'Empty bar with collars' : 'Empty bar'}: ${mass(range.lightest)}`,
        step === null ? 'The bar takes no plates' : `Smallest step on the bar: ${mass(step)}`,
        `Heaviest bar load: ${mass(range.heaviest)}`,
      ]
    case 'sled':
      return [
        `Empty sled: ${mass(range.lightest)}`,
        step === null ? 'The sled takes no plates' : `Smallest step on the sled: ${mass(step)}`,
        `Heaviest sled load: ${mass(range.heaviest)}`,
      ]
    case 'dumbbell':
      return step === null
        ? [`One dumbbell size: ${mass(range.lightest)}`]
        : [`Dumbbells from ${mass(range.lightest)} to ${mass(range.heaviest)}`, `Smallest step between dumbbells: ${mass(step)}`]
    case 'stack':
      return step === null
        ? [`One machine load: ${mass(range.lightest)}`]
        : [`Machine loads from ${mass(range.lightest)} to ${mass(range.heaviest)}`, `Smallest step on a machine: ${mass(step)}`]
  }
}

/** Above the Save button: what is saved so far. */
export function gymSaveStatus(savedAt: string | null, presetUnit: Unit, changed: boolean, saidDay: (iso: string) => string): string {
  if (changed) return 'Changes not saved yet'
  if (savedAt === null) return `Not saved yet: the ${presetUnit === 'lb' ? 'pound' : 'kilogram'} gym preset`
  return `Saved ${saidDay(savedAt)}`
}
