import { getToday } from '@/api/train'
import { localDay } from '@/utils/dates'
import { useAsync } from './useAsync'

/** What is next in the signed-in lifter's plan rotation, by the lifter's own calendar day. */
export function useToday() {
  return useAsync(() => getToday(localDay()))
}
