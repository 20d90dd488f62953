/**
 * Values of raw rows (`raw: true`), which skip Sequelize's per-row type parsing: SQLite keeps
 * Sequelize's dates as text ("YYYY-MM-DD HH:MM:SS.SSS +00:00") and booleans as 0 or 1.
 */

/** An ISO 8601 instant from a stored date (a Date passes through). */
export function isoFromStored(value: string | Date): string {
  if (value instanceof Date) return value.toISOString()
  const m = /^(\d{4}-\d{2}-\d{2}) (\d{2}:\d{2}:\d{2}(?:\.\d+)?) ?([+-]\d{2}:\d{2}|Z)?$/.exec(value)
  const date = new Date(m ? `${m[1]}T${m[2]}${m[3] ?? 'Z'}` : value)
  if (Number.isNaN(date.getTime())) throw new Error(`unreadable stored date: ${value}`)
  return date.toISOString()
}
