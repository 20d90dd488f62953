import { getToday, takeEarlyToday } from '@/api/train'
import { localDay } from '@/utils/dates'
import { useAsync } from './useAsync'

/**
 * What is next in the signed-in lifter's plan rotation, by the lifter's own calendar day. The
 * first load uses the request the app sent at start-up, if there is one; a refresh asks again.
 */
export function useToday() {
  let first = true
  return useAsync(() => {
    const early = first ? takeEarlyToday() : null
    first = false
    return early ?? getToday(localDay())
  })
}
