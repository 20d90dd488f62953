/**
 * Reading a logbook row from someone else's spreadsheet: guessing which column is which, and
 * checking each row with a clear message per problem. Pure: the server parses the CSV text and
 * the client can reuse these checks for a live preview.
 */
import { toKg, type Unit } from './units'

export interface ColumnMapping {
  date: string
  exercise: string
  load: string
  reps: string
  unit: string | null
  rir: string | null
  note: string | null
  kind: string | null
}

const GUESSES: Record<keyof ColumnMapping, RegExp> = {
  date: /^(date|day|when|time|datetime|session date)$/i,
  exercise: /^(exercise|lift|movement|exercise name)$/i,
  load: /^(load|weight|kg|lb|lbs|mass)$/i,
  reps: /^(reps|repetitions|rep)$/i,
  unit: /^(unit|units)$/i,
  rir: /^(rir|reps in reserve)$/i,
  note: /^(note|notes|comment|comments)$/i,
  kind: /^(set kind|set_kind|kind|set type|type)$/i,
}

/** Columns matched by their usual names; null when a required one is missing. */
export function guessMapping(headers: readonly string[]): ColumnMapping | null {
  const find = (key: keyof ColumnMapping) => headers.find((h) => GUESSES[key].test(h.trim())) ?? null
  const date = find('date')
  const exercise = find('exercise')
  const load = find('load')
  const reps = find('reps')
  if (!date || !exercise || !load || !reps) return null
  return { date, exercise, load, reps, unit: find('unit'), rir: find('rir'), note: find('note'), kind: find('kind') }
}

export interface CheckedRow {
  date: string | null
  exercise: string
  loadKg: number | null
  reps: number | null
  rir: number | null
  note: string | null
  kind: 'warmup' | 'top' | 'backoff' | 'straight'
  errors: string[]
}

const KINDS = ['warmup', 'top', 'backoff', 'straight'] as const
const MAX_LOAD_KG = 1000

/**
 * Accepts ISO dates and date-times (2026-11-30, 2026-11-30T18:05:00Z, 2026-11-30 18:05); a time
 * without a zone is read as UTC, a date alone as midday UTC so it stays on that calendar day.
 */
export function parseImportDate(text: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:[ T](\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(text.trim())
  if (!m) return null
  const [, y, mo, d, hh, mm, ss, zone] = m
  // Reject dates the calendar does not have (2026-02-30 would roll over to March).
  const day = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)))
  if (day.getUTCFullYear() !== Number(y) || day.getUTCMonth() !== Number(mo) - 1 || day.getUTCDate() !== Number(d)) return null
  if (hh === undefined) return `${y}-${mo}-${d}T12:00:00.000Z`
  const ms = Date.parse(`${y}-${mo}-${d}T${hh}:${mm}:${ss ?? '00'}${zone ?? 'Z'}`)
  return Number.isNaN(ms) ? null : new Date(ms).toISOString()
}

/** Checks one row; `defaultUnit` applies when the file has no unit column. */
export function checkImportRow(row: Record<string, string>, mapping: ColumnMapping, defaultUnit: Unit): CheckedRow {
  const errors: string[] = []
  const cell = (column: string | null) => (column ? (row[column] ?? '').trim() : '')

  const dateText = cell(mapping.date)
  const date = dateText ? parseImportDate(dateText) : null
  if (!dateText) errors.push('No date')
  else if (!date) errors.push(`"${dateText}" is not a date (use YYYY-MM-DD)`)

  const exercise = cell(mapping.exercise)
  if (!exercise) errors.push('No exercise')
  else if (exercise.length > 80) errors.push('Exercise name longer than 80 characters')

  const unitText = cell(mapping.unit).toLowerCase()
  const unit: Unit | null = !unitText ? defaultUnit : unitText === 'kg' || unitText === 'kgs' ? 'kg' : ['lb', 'lbs'].includes(unitText) ? 'lb' : null
  if (!unit) errors.push(`Unit "${unitText}" is neither kg nor lb`)

  const loadText = cell(mapping.load).replace(',', '.')
  const load = loadText === '' ? 0 : Number(loadText)
  let loadKg: number | null = null
  if (!Number.isFinite(load)) errors.push(`Load "${loadText}" is not a number`)
  else if (load < 0) errors.push('A load cannot be negative')
  else if (unit) {
    loadKg = toKg(load, unit)
    if (loadKg > MAX_LOAD_KG) errors.push('Load above 1000 kg')
  }

  const repsText = cell(mapping.reps)
  const reps = Number(repsText)
  if (!/^\d+$/.test(repsText)) errors.push(`Reps "${repsText}" is not a whole number`)
  else if (reps > 50) errors.push('More than 50 reps')

  const rirText = cell(mapping.rir)
  const rir = rirText === '' ? null : Number(rirText)
  if (rirText !== '' && !/^\d+$/.test(rirText)) errors.push(`RIR "${rirText}" is not a whole number`)
  else if (rir !== null && rir > 10) errors.push('RIR above 10')

  const kindText = cell(mapping.kind).toLowerCase().replace(/[-_ ]/g, '')
  const kind = (KINDS.find((k) => k === kindText) ?? (kindText === '' ? 'straight' : null)) as CheckedRow['kind'] | null
  if (!kind) errors.push(`Set kind "${kindText}" is not warmup, top, backoff or straight`)

  const note = cell(mapping.note)
  return {
    date,
    exercise,
    loadKg,
    reps: /^\d+$/.test(repsText) ? reps : null,
    rir: rir !== null && Number.isInteger(rir) ? rir : null,
    note: note ? note.slice(0, 500) : null,
    kind: kind ?? 'straight',
    errors,
  }
}
