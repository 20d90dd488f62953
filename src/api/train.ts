import type { Today } from '@shared/schemas/train.schema'
import { localDay } from '@/utils/dates'
import { request } from './client'
import type { LocalDay } from './run'

/** What is next in the plan, by the lifter's own calendar day and clock offset (default: now, here). */
export function getToday(day: LocalDay = localDay()): Promise<Today> {
  // The Train screen is the app's first screen: its schema loads beside the request (see client.ts).
  return request('GET', '/train/today', { query: { ...day }, schema: () => import('@shared/schemas/train.schema').then((m) => m.todaySchema) })
}

/** How long an early answer may wait for the Train screen before it counts as stale. */
export const EARLY_TODAY_MAX_AGE_MS = 10_000

let early: { day: string; tzOffset: number; startedAt: number; answer: Promise<Today> } | null = null

/**
 * Sends today's request as the app starts, before the Train screen has mounted, when the app
 * opens on it with a lifter kept on the phone: the request then overlaps the app's own start-up
 * work instead of following it. The Train screen takes the answer once (`takeEarlyToday`).
 */
export function startEarlyToday(now: Date = new Date()): void {
  const day = localDay(now)
  const answer = getToday(day)
  // Nobody may take it (the screen changed); its failure is then nobody's business.
  answer.catch(() => {})
  early = { day: day.date, tzOffset: day.tzOffset, startedAt: now.getTime(), answer }
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
