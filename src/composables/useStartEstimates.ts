import { computed, ref, toValue, watch, type MaybeRefOrGetter } from 'vue'
import { displayLoad, toKg, type Unit } from '@shared/domain/units'
import { setStartEstimatesSchema, type StartEstimateRow, type StartEstimatesAnswer } from '@shared/schemas/start-estimate.schema'
import { getStartEstimates, saveStartEstimates } from '@/api/start-estimates'
import { ApiError } from '@/api/client'
import { useAsync } from './useAsync'

/** What the coach typed for one exercise, in the athlete's unit, as text. */
export interface StartLoadDraft {
  load: string
  reps: string
}

/** Problems by exercise id. */
export type StartLoadIssues = Record<number, string>

const parseNumber = (text: string) => {
  const trimmed = text.trim().replace(',', '.')
  return trimmed === '' ? Number.NaN : Number(trimmed)
}

/**
 * A coach's starting loads for an athlete: for every plan exercise the athlete has not logged, a
 * recent set (load × reps) typed in the athlete's unit and saved in kilograms. Only rows the
 * coach changed are sent, so a set the lifter entered is not re-marked as the coach's.
 */
export function useStartEstimates(athleteId: number, unit: MaybeRefOrGetter<Unit>) {
  const loaded = useAsync<StartEstimatesAnswer>(() => getStartEstimates(athleteId))
  const draft = ref<Record<number, StartLoadDraft>>({})
  const issues = ref<StartLoadIssues>({})
  const saving = ref(false)
  const saveError = ref<string | null>(null)

  const savedDraft = (row: StartEstimateRow): StartLoadDraft => ({
    load: row.loadKg === null ? '' : String(displayLoad(row.loadKg, toValue(unit))),
    reps: row.reps === null ? '' : String(row.reps),
  })

  function resetDraft() {
    const rows = loaded.data.value?.estimates ?? []
    draft.value = Object.fromEntries(rows.filter((r) => !r.hasHistory).map((r) => [r.exerciseId, savedDraft(r)]))
  }
  watch([loaded.data, () => toValue(unit)], resetDraft, { immediate: true })

  /** Plan exercises with no history: the ones a starting load is for. */
  const rows = computed(() => loaded.data.value?.estimates.filter((r) => !r.hasHistory) ?? [])
  /** Plan exercises already logged: planned from the logbook, nothing to enter. */
  const withHistory = computed(() => loaded.data.value?.estimates.filter((r) => r.hasHistory) ?? [])

  const changedRows = computed(() =>
    rows.value.filter((row) => {
      const typed = draft.value[row.exerciseId]
      const saved = savedDraft(row)
      return typed && (typed.load.trim() !== saved.load || typed.reps.trim() !== saved.reps)
    }),
  )

  /** True when saved (or nothing changed); otherwise `issues` or `saveError` says why. */
  async function save(): Promise<boolean> {
    saveError.value = null
    const found: StartLoadIssues = {}
    const entries: Array<{ exerciseId: number; loadKg: number; reps: number }> = []
    for (const row of changedRows.value) {
      const typed = draft.value[row.exerciseId]
      const load = parseNumber(typed.load)
      const reps = parseNumber(typed.reps)
      if (typed.load.trim() === '' && typed.reps.trim() === '') continue
      if (!Number.isFinite(load) || !Number.isInteger(reps)) {
        found[row.exerciseId] = 'Enter a load and a whole number of reps'
        continue
      }
      entries.push({ exerciseId: row.exerciseId, loadKg: toKg(load, toValue(unit)), reps })
    }
    if (entries.length) {
      const parsed = setStartEstimatesSchema.safeParse({ estimates: entries })
      for (const issue of parsed.error?.issues ?? []) {
        const index = issue.path[1]
        if (typeof index === 'number') found[entries[index].exerciseId] ??= issue.message
      }
    }
    issues.value = found
    if (Object.keys(found).length) return false
    if (!entries.length) return true
    saving.value = true
    try {
      loaded.data.value = await saveStartEstimates(athleteId, { estimates: entries })
      return true
    } catch (e) {
      saveError.value = e instanceof ApiError && e.message ? e.message : 'Could not save the starting loads. Try again.'
      return false
    } finally {
      saving.value = false
    }
  }

  return { ...loaded, rows, withHistory, draft, issues, saving, saveError, changedRows, save, resetDraft }
}
