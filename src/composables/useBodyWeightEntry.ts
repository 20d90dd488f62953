import { ref } from 'vue'
import { formatLoad, toKg } from '@shared/domain/units'
import { bodyWeightInputSchema } from '@shared/schemas/athlete.schema'
import type { Unit } from '@shared/schemas/common.schema'
import { addBodyWeight } from '@/api/progress'
import { localDay } from '@/utils/dates'

/**
 * The body-weight entry form: a day (today unless changed) and a weight in the lifter's unit,
 * sent in kilograms. `onSaved` runs after the server took it (to reload the trend).
 */
export function useBodyWeightEntry(unit: () => Unit, onSaved: () => unknown = () => undefined) {
  const date = ref(localDay().date)
  const weight = ref('')
  const saving = ref(false)
  const error = ref<string | null>(null)

  async function save(): Promise<boolean> {
    error.value = null
    const value = Number(weight.value.replace(',', '.'))
    if (weight.value.trim() === '' || !Number.isFinite(value)) {
      error.value = `Enter your body weight in ${unit()}.`
      return false
    }
    const parsed = bodyWeightInputSchema.safeParse({ date: date.value, weightKg: toKg(value, unit()) })
    if (!parsed.success) {
      const issue = parsed.error.issues[0]
      error.value =
        issue.path[0] === 'weightKg' ? `Enter a body weight between ${formatLoad(20, unit())} and ${formatLoad(400, unit())}.` : issue.message
      return false
    }
    saving.value = true
    try {
      await addBodyWeight(parsed.data)
      weight.value = ''
      await onSaved()
      return true
    } catch (e) {
      error.value = e instanceof Error && e.message ? e.message : 'Could not save the body weight.'
      return false
    } finally {
      saving.value = false
    }
  }

  return { date, weight, saving, error, save }
}
