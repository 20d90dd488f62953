import { getToday } from '@/api/train'
import { useAsync } from './useAsync'

/** What is next in the signed-in lifter's plan rotation. */
export function useToday() {
  return useAsync(getToday)
}
