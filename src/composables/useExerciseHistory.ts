import { getLogbook } from '@/api/logbook'
import { getProgress } from '@/api/progress'
import { LOGBOOK_WEEKS } from '@/components/logbook/exercise-history'
import { useAsync } from './useAsync'

/**
 * One exercise over time: its estimated-1RM trend (from /progress) and every logged set of the
 * logbook (the JSON export), matched to the exercise by name.
 */
export function useExerciseHistory(exerciseId: number) {
  return useAsync(async () => {
    const [progress, logbook] = await Promise.all([getProgress({ weeks: LOGBOOK_WEEKS }), getLogbook()])
    const lift = progress.e1rm.find((entry) => entry.exerciseId === exerciseId) ?? null
    return { lift, logbook }
  })
}
