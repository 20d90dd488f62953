import { getSession } from '@/api/sessions'
import { useAsync } from './useAsync'

/** One session with every set, target beside actual. */
export function useSessionDetail(id: number) {
  return useAsync(() => getSession(id))
}
