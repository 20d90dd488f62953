import { listAthletes } from '@/api/athletes'
import { useAsync } from './useAsync'

/** The signed-in coach's athletes. */
export function useAthletes() {
  return useAsync(listAthletes)
}
