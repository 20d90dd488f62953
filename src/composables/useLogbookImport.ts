import { computed, ref, shallowRef } from 'vue'
import type { ImportMapping, ImportPreview, ImportRequest, ImportResult } from '@shared/schemas/logbook.schema'
import type { Unit } from '@shared/schemas/common.schema'
import { ApiError, type ApiIssue } from '@/api/client'
import { importLogbook, previewLogbookImport } from '@/api/logbook'

export type MappingField = keyof ImportMapping
export type ExerciseChoice = number | 'new'

const REQUIRED_FIELDS: readonly MappingField[] = ['date', 'exercise', 'load', 'reps']

const EMPTY_MAPPING = { date: '', exercise: '', load: '', reps: '', unit: null, rir: null, note: null, kind: null }

/** The column names of a CSV file's first line (quoted names allowed), for mapping by hand. */
function csvHeaderNames(csv: string): string[] {
  const line = csv.replace(/^\uFEFF/, '').split(/\r?\n/, 1)[0] ?? ''
  const names: string[] = []
  let current = ''
  let quoted = false
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        current += '"'
        i++
      } else if (ch === '"') quoted = false
      else current += ch
    } else if (ch === '"') quoted = true
    else if (ch === ',') {
      names.push(current.trim())
      current = ''
    } else current += ch
  }
  names.push(current.trim())
  return names.filter((name) => name !== '')
}

export interface ImportProblem {
  message: string
  issues: ApiIssue[]
}

function problemOf(error: unknown, fallback: string): ImportProblem {
  if (error instanceof ApiError) return { message: error.message || fallback, issues: error.issues }
  return { message: fallback, issues: [] }
}

/**
 * Importing a logbook file: read the CSV in the browser, preview it on the server (again after
 * every change of unit, column mapping or exercise choice; only the latest answer counts), then
 * import every row at once.
 */
export function useLogbookImport(initialUnit: Unit) {
  const csv = ref<string | null>(null)
  const fileName = ref<string | null>(null)
  const unit = ref<Unit>(initialUnit)
  const mapping = ref<ImportMapping | null>(null)
  const headers = ref<string[]>([])
  const exerciseMap = ref<Record<string, ExerciseChoice>>({})
  const preview = shallowRef<ImportPreview | null>(null)
  const previewing = ref(false)
  const problem = shallowRef<ImportProblem | null>(null)
  const importing = ref(false)
  const result = shallowRef<ImportResult | null>(null)
  let ticket = 0

  const mappingComplete = computed(() => mapping.value !== null && REQUIRED_FIELDS.every((f) => mapping.value?.[f]))
  const canImport = computed(
    () =>
      preview.value !== null &&
      preview.value.errorCount === 0 &&
      preview.value.rowCount > 0 &&
      !previewing.value &&
      !importing.value &&
      problem.value === null,
  )

  function body(): ImportRequest {
    return {
      csv: csv.value ?? '',
      unit: unit.value,
      ...(mapping.value && mappingComplete.value ? { mapping: mapping.value } : {}),
      exerciseMap: { ...exerciseMap.value },
    }
  }

  async function runPreview(): Promise<void> {
    if (csv.value === null) return
    // Wait for the four required columns when the user is mapping by hand.
    if (mapping.value !== null && !mappingComplete.value) {
      preview.value = null
      return
    }
    const mine = ++ticket
    previewing.value = true
    problem.value = null
    result.value = null
    try {
      const answer = await previewLogbookImport(body())
      if (mine !== ticket) return
      preview.value = answer
      headers.value = answer.headers
      if (mapping.value === null && answer.mapping) mapping.value = { ...answer.mapping }
    } catch (e) {
      if (mine !== ticket) return
      preview.value = null
      problem.value = problemOf(e, 'Could not read this file.')
      // No guess from the server: offer the file's columns to map by hand.
      if (mapping.value === null && e instanceof ApiError && e.issues.some((i) => i.path === 'mapping')) {
        headers.value = csvHeaderNames(csv.value ?? '')
        mapping.value = { ...EMPTY_MAPPING }
      }
    } finally {
      if (mine === ticket) previewing.value = false
    }
  }

  async function pickFile(file: File): Promise<void> {
    fileName.value = file.name
    csv.value = await file.text()
    mapping.value = null
    headers.value = []
    exerciseMap.value = {}
    preview.value = null
    await runPreview()
  }

  async function setUnit(next: Unit): Promise<void> {
    unit.value = next
    await runPreview()
  }

  async function setColumn(field: MappingField, column: string | null): Promise<void> {
    const base = mapping.value ?? { ...EMPTY_MAPPING }
    mapping.value = { ...base, [field]: REQUIRED_FIELDS.includes(field) ? (column ?? '') : column }
    await runPreview()
  }

  async function setExercise(name: string, choice: ExerciseChoice | null): Promise<void> {
    const { [name]: _old, ...rest } = exerciseMap.value
    exerciseMap.value = choice === null ? rest : { ...rest, [name]: choice }
    await runPreview()
  }

  async function confirm(): Promise<void> {
    if (!canImport.value) return
    importing.value = true
    problem.value = null
    try {
      result.value = await importLogbook(body())
    } catch (e) {
      problem.value = problemOf(e, 'Nothing was imported.')
    } finally {
      importing.value = false
    }
  }

  return {
    csv, fileName, unit, mapping, headers, exerciseMap, preview, previewing, problem, importing, result,
    mappingComplete, canImport, pickFile, setUnit, setColumn, setExercise, confirm,
  }
}
