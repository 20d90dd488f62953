import { shallowRef, ref } from 'vue'
import type { Exercise, MovementPattern } from '@shared/schemas/exercise.schema'
import { listExercises } from '@/api/exercises'

/** Exercises to pick from in the runner, loaded on demand (a pattern for a swap, all to add one). */
export function useExerciseChoices() {
  const exercises = shallowRef<Exercise[] | null>(null)
  const loading = ref(false)
  const failed = ref(false)

  async function load(pattern?: MovementPattern, exceptId?: number) {
    loading.value = true
    failed.value = false
    exercises.value = null
    try {
      exercises.value = (await listExercises({ pattern })).filter((e) => e.id !== exceptId)
    } catch {
      failed.value = true
    } finally {
      loading.value = false
    }
  }

  return { exercises, loading, failed, load }
}
