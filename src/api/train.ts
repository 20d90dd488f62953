import type { Today } from '@shared/schemas/train.schema'
import { localDay } from '@/utils/dates'
import { request } from './client'
import type { LocalDay } from './run'

/** What is next in the plan, by the lifter's own calendar day and clock offset (default: now, here). */
export function getToday(day: LocalDay = localDay()): Promise<Today> {
  // The Train screen is the app's first screen: its schema loads beside the request (see client.ts).
  return request('GET', '/train/today', { query: { ...day }, schema: () => import('@shared/schemas/train.schema').then((m) => m.todaySchema) })
}
