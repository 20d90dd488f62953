import { getToday, takeEarlyToday } from '@/api/train'
import { afterNextPaint } from '@/offline/after-paint'
import { saveToday, savedToday } from '@/offline/saved-today'
import { useSessionStore } from '@/stores/session'
import { localDay } from '@/utils/dates'
import { useAsync } from './useAsync'

/**
 * What is next in the signed-in lifter's plan rotation, by the lifter's own calendar day.
 * Shows the answer kept on the phone for today at once and asks the server once that is painted
 * (the plan on screen first, the network after); without one, the first load uses the request
 * the app sent at start-up, if there is one. A refresh asks again.
 */
export function useToday() {
  const userId = useSessionStore().user?.id
  const initial = userId === undefined ? null : savedToday(userId, localDay())
  let first = true
  return useAsync(
    async () => {
      const early = first ? takeEarlyToday() : null
      if (first && !early && initial) await afterNextPaint()
      first = false
      const day = localDay()
      const today = await (early ?? getToday(day))
      if (userId !== undefined) saveToday(userId, day, today)
      return today
    },
    { initial: initial ?? undefined },
  )
}
