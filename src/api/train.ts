import type { Today } from '@shared/schemas/train.schema'
import { takePageTodayRequest } from '@/early/today-request'
import { localDay } from '@/utils/dates'
import { adoptRequest, request } from './client'
import type { LocalDay } from './run'

/** What is next in the plan, by the lifter's own calendar day and clock offset (default: now, here). */
export function getToday(day: LocalDay = localDay()): Promise<Today> {
  return request('GET', '/train/today', { query: { ...day }, schema: loadTodaySchema })
}

// The Train screen is the app's first screen: its schema loads beside the request (see client.ts).
const loadTodaySchema = () => import('@shared/schemas/train.schema').then((m) => m.todaySchema)

/** How long an early answer may wait for the Train screen before it counts as stale. */
export const EARLY_TODAY_MAX_AGE_MS = 10_000

let early: { day: string; tzOffset: number; startedAt: number; answer: Promise<Today> } | null = null

/**
 * Today's answer as the app starts, before the Train screen has mounted, when the app opens on
 * it with a lifter kept on the phone. It adopts the request the page itself sent while the app
 * was downloading (src/early/), or sends one now, overlapping the app's own start-up work.
 * The Train screen takes the answer once (`takeEarlyToday`).
 */
export function startEarlyToday(now: Date = new Date()): void {
  const day = localDay(now)
  const page = takePageTodayRequest()
  const adopted = page !== null && page.date === day.date && page.tzOffset === day.tzOffset
  const answer = adopted ? adoptRequest(page.sent, loadTodaySchema) : getToday(day)
  // Nobody may take it (the screen changed); its failure is then nobody's business.
  answer.catch(() => {})
  early = { day: day.date, tzOffset: day.tzOffset, startedAt: adopted ? page.startedAt : now.getTime(), answer }
}

/** The early answer for this day, once, if it was started in the last few seconds. */
export function takeEarlyToday(now: Date = new Date()): Promise<Today> | null {
  const taken = early
  early = null
  if (!taken) return null
  const day = localDay(now)
  const fresh = now.getTime() - taken.startedAt <= EARLY_TODAY_MAX_AGE_MS
  return fresh && taken.day === day.date && taken.tzOffset === day.tzOffset ? taken.answer : null
}
