import Papa from 'papaparse'
import { Op } from 'sequelize'
import { v5 as uuidv5 } from 'uuid'
import { checkImportRow, guessMapping, type CheckedRow, type ColumnMapping } from '@shared/domain/logbook-import'
import { sessionTotals } from '@shared/domain/summary'
import { fromKg } from '@shared/domain/units'
import type { ExportQuery, ImportPreview, ImportRequest, ImportResult } from '@shared/schemas/logbook.schema'
import { ExerciseModel, SessionModel, SetLogModel, UserModel } from '../db'
import { AppError } from '../errors'
import { assertCanSeeAthlete } from './access.service'

/** Rows one import may hold: larger logbooks are imported in parts (one file per year, say). */
export const MAX_IMPORT_ROWS = 5000
/** Namespace for the ids of imported sets, so the same row imported twice is the same set. */
const IMPORT_NAMESPACE = 'a3b5f0c2-6d1e-4f7a-9c3b-2e8d4f6a1b90'
export const EXPORT_COLUMNS = ['date', 'exercise', 'set_kind', 'load', 'unit', 'reps', 'rir', 'failure', 'note', 'day', 'version'] as const

async function athleteFor(viewer: UserModel, athleteId?: number) {
  const id = athleteId ?? viewer.id
  if (athleteId === undefined && viewer.role !== 'lifter') {
    throw AppError.badRequest('Name the athlete', [{ path: 'query.athleteId', message: 'Required for coaches and admins' }])
  }
  await assertCanSeeAthlete(viewer, id)
  return id
}

/** The whole logbook, one row per logged set, loads in the athlete's own unit at full precision. */
export async function exportLogbook(viewer: UserModel, query: ExportQuery) {
  const athleteId = await athleteFor(viewer, query.athleteId)
  const athlete = athleteId === viewer.id ? viewer : await UserModel.findByPk(athleteId)
  const unit = athlete?.unit ?? 'kg'
  const sessions = await SessionModel.findAll({
    where: { athleteId, status: 'completed' },
    include: [{ model: SetLogModel, as: 'sets', where: { loggedAt: { [Op.ne]: null }, skipped: false }, required: false, include: [{ model: ExerciseModel, as: 'exercise', attributes: ['name'] }] }],
    order: [['startedAt', 'ASC'], [{ model: SetLogModel, as: 'sets' }, 'position', 'ASC']],
  })
  if (query.format === 'json') {
    return {
      type: 'application/json',
      filename: 'chalkline-logbook.json',
      body: JSON.stringify(
        {
          unit,
          sessions: sessions.map((s) => ({
            date: (s.startedAt ?? s.completedAt)!.toISOString(),
            completedAt: s.completedAt?.toISOString() ?? null,
            day: s.dayName,
            version: s.versionLabel,
            note: s.note,
            sets: (s.sets ?? []).map((set) => ({
              exercise: set.exercise?.name ?? '',
              kind: set.kind,
              loadKg: set.loadKg,
              reps: set.reps,
              rir: set.rir,
              failure: set.failure,
              note: set.note,
            })),
          })),
        },
        null,
        2,
      ),
    }
  }
  const rows = sessions.flatMap((s) =>
    (s.sets ?? []).map((set) => ({
      date: (s.startedAt ?? s.completedAt)!.toISOString(),
      exercise: set.exercise?.name ?? '',
      set_kind: set.kind,
      load: set.loadKg === null ? '' : String(fromKg(set.loadKg, unit)),
      unit,
      reps: set.reps ?? '',
      rir: set.rir ?? '',
      failure: set.failure ? 'yes' : '',
      note: set.note ?? '',
      day: s.dayName ?? '',
      version: s.versionLabel ?? '',
    })),
  )
  return { type: 'text/csv; charset=utf-8', filename: 'chalkline-logbook.csv', body: Papa.unparse({ fields: [...EXPORT_COLUMNS], data: rows.map((r) => EXPORT_COLUMNS.map((c) => r[c])) }) }
}

/** Parses the file and checks every row; nothing is written. */
export async function previewImport(
  lifter: UserModel,
  input: ImportRequest,
): Promise<ImportPreview & { checked: Array<CheckedRow & { line: number }>; mapping: ColumnMapping | null }> {
  if (input.csv.trim() === '') throw AppError.badRequest('The file is empty', [{ path: 'csv', message: 'The file is empty' }])
  // Text files have no NUL bytes; a picture or a spreadsheet saved as .csv has many.
  if (input.csv.includes('\u0000') || (input.csv.match(/\uFFFD/g)?.length ?? 0) > 3) {
    throw AppError.badRequest('This is not a CSV text file', [{ path: 'csv', message: 'This is not a CSV text file' }])
  }
  const parsed = Papa.parse<Record<string, string>>(input.csv, { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim() })
  const headers = parsed.meta.fields ?? []
  if (parsed.data.length === 0) throw AppError.badRequest('The file has a header but no rows', [{ path: 'csv', message: 'No rows to import' }])
  if (parsed.data.length > MAX_IMPORT_ROWS) {
    throw AppError.badRequest(`The file has ${parsed.data.length} rows; import at most ${MAX_IMPORT_ROWS} at a time`, [
      { path: 'csv', message: `At most ${MAX_IMPORT_ROWS} rows per file: split it (one file per year, for example)` },
    ])
  }
  const mapping = input.mapping ?? guessMapping(headers)
  if (!mapping) {
    throw AppError.badRequest('Could not find the date, exercise, load and reps columns', [
      { path: 'mapping', message: `Columns found: ${headers.join(', ') || 'none'}. Map date, exercise, load and reps.` },
    ])
  }
  const missing = Object.entries(mapping).filter(([, column]) => column !== null && !headers.includes(column))
  if (missing.length > 0) {
    throw AppError.badRequest('Some mapped columns are not in the file', missing.map(([key, column]) => ({ path: `mapping.${key}`, message: `No column "${column}"` })))
  }
  const checked = parsed.data.map((row) => checkImportRow(row, mapping, input.unit))
  const library = await ExerciseModel.findAll({ where: { [Op.or]: [{ ownerId: null }, { ownerId: lifter.id }] }, attributes: ['id', 'name'] })
  const known = new Set(library.map((e) => e.name.toLowerCase()))
  const unknownExercises = [...new Set(checked.map((r) => r.exercise).filter((name) => name && !known.has(name.toLowerCase())))]
  const unmapped = new Set(unknownExercises.filter((name) => input.exerciseMap[name] === undefined))
  const rows = checked.map((r, i) => ({
    line: i + 2, // line 1 is the header
    ...r,
    errors: unmapped.has(r.exercise) ? [...r.errors, `Unknown exercise "${r.exercise}": map it or add it`] : r.errors,
  }))
  return {
    headers,
    mapping,
    rows: rows.slice(0, 200),
    rowCount: rows.length,
    errorCount: rows.filter((r) => r.errors.length > 0).length,
    unknownExercises,
    checked: rows,
  }
}

/**
 * Imports the whole file in one transaction, or nothing: any row with an error refuses it all.
 * Each set's id is derived from the athlete and the row, so importing the same file again adds
 * nothing.
 */
export async function commitImport(lifter: UserModel, input: ImportRequest): Promise<ImportResult> {
  const preview = await previewImport(lifter, input)
  const bad = preview.checked.filter((r) => r.errors.length > 0)
  if (bad.length > 0) {
    throw AppError.badRequest(
      `${bad.length} of ${preview.rowCount} rows have problems: nothing was imported`,
      bad.slice(0, 50).map((r) => ({ path: `rows.${r.line}`, message: r.errors.join('; ') })),
    )
  }
  const sequelize = SessionModel.sequelize!
  return sequelize.transaction(async (transaction) => {
    const library = await ExerciseModel.findAll({ where: { [Op.or]: [{ ownerId: null }, { ownerId: lifter.id }] }, transaction })
    const byName = new Map(library.map((e) => [e.name.toLowerCase(), e.id]))
    let exercisesCreated = 0
    for (const name of preview.unknownExercises) {
      const target = input.exerciseMap[name]
      if (target === 'new') {
        const created = await ExerciseModel.create(
          { ownerId: lifter.id, name, pattern: 'core', primaryMuscles: [], secondaryMuscles: [], equipmentKind: 'barbell', loadMode: 'external', loadStepKg: 0, defaultRestSec: 120 },
          { transaction },
        )
        byName.set(name.toLowerCase(), created.id)
        exercisesCreated += 1
      } else {
        const mapped = library.find((e) => e.id === target)
        if (!mapped) throw AppError.badRequest('Map unknown exercises to exercises of your library', [{ path: `exerciseMap.${name}`, message: 'Not in your library' }])
        byName.set(name.toLowerCase(), mapped.id)
      }
    }
    // One session per distinct date value in the file.
    const groups = new Map<string, typeof preview.checked>()
    for (const row of preview.checked) groups.set(row.date!, [...(groups.get(row.date!) ?? []), row])
    let sessionsCreated = 0
    let setsCreated = 0
    let setsAlreadyThere = 0
    for (const [date, rows] of groups) {
      const startedAt = new Date(date)
      let session = await SessionModel.findOne({ where: { athleteId: lifter.id, startedAt, dayName: 'Imported' }, transaction })
      if (!session) {
        session = await SessionModel.create(
          { athleteId: lifter.id, assignmentId: null, planDayId: null, dayName: 'Imported', versionLabel: null, status: 'completed', startedAt, completedAt: startedAt, summary: null, note: null },
          { transaction },
        )
        sessionsCreated += 1
      }
      const seen = new Map<string, number>()
      const sets = rows.map((row, position) => {
        const exerciseId = byName.get(row.exercise.toLowerCase())!
        const base = `${lifter.id}|${date}|${exerciseId}|${row.kind}|${row.loadKg}|${row.reps}|${row.rir ?? ''}`
        const nth = (seen.get(base) ?? 0) + 1 // identical sets in a row stay distinct
        seen.set(base, nth)
        return {
          id: uuidv5(`${base}|${nth}`, IMPORT_NAMESPACE), sessionId: session!.id, exerciseId, slotId: null, position, kind: row.kind,
          targetLoadKg: null, targetRepsMin: null, targetRepsMax: null, toFailure: false, targetRir: null,
          loadKg: row.loadKg, reps: row.reps, rir: row.rir, failure: row.rir === 0, note: row.note, loggedAt: startedAt,
        }
      })
      const existing = new Set((await SetLogModel.findAll({ where: { id: sets.map((s) => s.id) }, attributes: ['id'], transaction })).map((s) => s.id))
      const fresh = sets.filter((s) => !existing.has(s.id))
      setsAlreadyThere += sets.length - fresh.length
      if (fresh.length > 0) {
        await SetLogModel.bulkCreate(fresh.map((s) => ({ ...s, position: s.position + (existing.size > 0 ? 1000 : 0) })), { transaction })
        setsCreated += fresh.length
        const all = await SetLogModel.findAll({ where: { sessionId: session.id }, transaction })
        await session.update({ summary: sessionTotals(all.map((s) => ({ kind: s.kind, loadKg: s.loadKg, reps: s.reps }))) }, { transaction })
      }
    }
    return { sessionsCreated, setsCreated, setsAlreadyThere, exercisesCreated }
  })
}
