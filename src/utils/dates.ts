// Written out rather than through Intl.DateTimeFormat: the app's text is English, and the first
// Intl formatter of a page loads the browser's locale data (70-110 ms measured in Chromium on the
// bench machine, four times that on a slow phone), which sat on the Train screen's first paint of
// today's card ("Last session: ..."). tests/client/dates.test.ts checks the text against Intl's.
const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat']
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']

/** "Tue, Dec 1, 2026" for an ISO timestamp, in the phone's time zone; an em dash for none. */
export function formatDay(iso: string | null | undefined): string {
  if (!iso) return '—'
  const date = new Date(iso)
  if (Number.isNaN(date.getTime())) return '—'
  return `${WEEKDAYS[date.getDay()]}, ${MONTHS[date.getMonth()]} ${date.getDate()}, ${date.getFullYear()}`
}

/** The lifter's local calendar day and Date.getTimezoneOffset(), as the API's date/tzOffset query wants them. */
export function localDay(now: Date = new Date()): { date: string; tzOffset: number } {
  const pad = (n: number) => String(n).padStart(2, '0')
  return { date: `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`, tzOffset: now.getTimezoneOffset() }
}

/** "52 min", "1 h 05 min" for a duration in seconds; an em dash for none. */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined) return '—'
  const minutes = Math.round(seconds / 60)
  if (minutes < 60) return `${minutes} min`
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`
}

/** "2:05" for a count of seconds (rest clock). */
export function formatClock(totalSeconds: number): string {
  const s = Math.max(0, Math.floor(totalSeconds))
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`
}
