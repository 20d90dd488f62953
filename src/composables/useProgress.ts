import { ref, toValue, watch, type MaybeRefOrGetter } from 'vue'
import { getProgress } from '@/api/progress'
import { useAsync } from './useAsync'

/** Progress chart data for a coach's athlete (or, without an id, the signed-in lifter). */
export function useProgress(athleteId: MaybeRefOrGetter<number | undefined>, initialWeeks = 26) {
  const weeks = ref(initialWeeks)
  const progress = useAsync(() => getProgress({ athleteId: toValue(athleteId), weeks: weeks.value }))
  watch([weeks, () => toValue(athleteId)], () => progress.refresh())
  return { ...progress, weeks }
}
