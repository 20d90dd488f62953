import type { Today } from '@shared/schemas/train.schema'

/**
 * The Train screen's last answer for today, kept on the phone so that opening the app shows
 * today's plan at once (and with no signal, as in a basement gym) while the fresh answer loads.
 * It belongs to one lifter and one calendar day; starting, resuming or finishing a session
 * forgets it, since those change what Train shows; signing out forgets it too.
 *
 * It was validated when it arrived and is read back without zod: the first paint must not wait
 * for the schema library. A copy of another format version is ignored.
 */
export const SAVED_TODAY_KEY = 'chalkline.today'
const FORMAT = 1

interface SavedToday {
  format: number
  userId: number
  date: string
  tzOffset: number
  today: Today
}

/** The text kept under SAVED_TODAY_KEY (the load benchmark writes it the same way). */
export function savedTodayEntry(userId: number, day: { date: string; tzOffset: number }, today: Today): string {
  const saved: SavedToday = { format: FORMAT, userId, date: day.date, tzOffset: day.tzOffset, today }
  return JSON.stringify(saved)
}

export function saveToday(userId: number, day: { date: string; tzOffset: number }, today: Today): void {
  try {
    localStorage.setItem(SAVED_TODAY_KEY, savedTodayEntry(userId, day, today))
  } catch {
    // Storage full or blocked (private mode): the screen simply loads as before.
  }
}

/** Today's saved answer for this lifter and day, or null. */
export function savedToday(userId: number, day: { date: string; tzOffset: number }): Today | null {
  let saved: Partial<SavedToday> | null = null
  try {
    saved = JSON.parse(localStorage.getItem(SAVED_TODAY_KEY) ?? 'null') as Partial<SavedToday> | null
  } catch {
    return null
  }
  if (!saved || saved.format !== FORMAT || saved.userId !== userId) return null
  if (saved.date !== day.date || saved.tzOffset !== day.tzOffset) return null
  const today = saved.today
  // The shape the screen reads first; anything else waits for the server's answer.
  if (!today || typeof today !== 'object' || !Array.isArray(today.planDays) || !('plan' in today) || !('day' in today)) return null
  return today
}

export function forgetSavedToday(): void {
  try {
    localStorage.removeItem(SAVED_TODAY_KEY)
  } catch {
    // nothing kept
  }
}
