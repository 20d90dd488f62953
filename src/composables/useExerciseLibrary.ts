import { ref, shallowRef } from 'vue'
import { watchDebounced } from '@vueuse/core'
import type { CreateExerciseInput, Exercise, ExerciseEquipment, Muscle, MovementPattern } from '@shared/schemas/exercise.schema'
import { createExercise, searchExercises } from '@/api/exercises'

export interface ExerciseFilters {
  q: string
  pattern: MovementPattern | ''
  muscle: Muscle | ''
  equipment: ExerciseEquipment | ''
}

export const NO_EXERCISE_FILTERS: ExerciseFilters = { q: '', pattern: '', muscle: '', equipment: '' }

/**
 * The exercise library for the plan builder's picker: searched by name and filtered by movement
 * pattern, muscle and equipment; a filter change reloads after a short pause, and only the answer
 * to the latest search is kept. Coaches can add their own exercises to it.
 */
export function useExerciseLibrary() {
  const filters = ref<ExerciseFilters>({ ...NO_EXERCISE_FILTERS })
  const exercises = shallowRef<Exercise[] | null>(null)
  const loading = ref(false)
  const error = shallowRef<unknown>(null)
  let latest = 0
  let loadedFor = ''

  async function load() {
    const ticket = ++latest
    loadedFor = JSON.stringify(filters.value)
    loading.value = true
    error.value = null
    const { q, pattern, muscle, equipment } = filters.value
    try {
      const found = await searchExercises({
        q: q.trim() || undefined,
        pattern: pattern || undefined,
        muscle: muscle || undefined,
        equipment: equipment || undefined,
      })
      if (ticket === latest) exercises.value = found
    } catch (e) {
      if (ticket === latest) error.value = e
    } finally {
      if (ticket === latest) loading.value = false
    }
  }

  watchDebounced(
    filters,
    () => {
      if (JSON.stringify(filters.value) !== loadedFor) void load()
    },
    { debounce: 250, deep: true },
  )

  /** Shows the library with these filters, loading at once unless it already shows them. */
  async function open(preset: Partial<ExerciseFilters> = {}) {
    filters.value = { ...NO_EXERCISE_FILTERS, ...preset }
    if (exercises.value === null || JSON.stringify(filters.value) !== loadedFor) await load()
  }

  async function create(input: CreateExerciseInput): Promise<Exercise> {
    const exercise = await createExercise(input)
    exercises.value = [exercise, ...(exercises.value ?? [])]
    return exercise
  }

  return { filters, exercises, loading, error, load, open, create }
}
