import { describe, expect, it } from 'vitest'
import { isoFromStored } from '../../server/db/stored-values'

// Dates as Sequelize's SQLite dialect stores them (text "YYYY-MM-DD HH:MM:SS.SSS +00:00"),
// read back as ISO 8601 instants (ISO 8601-1:2019, UTC designator Z).
describe('isoFromStored', () => {
  it('reads the stored text with its offset as the same instant in UTC', () => {
    expect(isoFromStored('2026-11-30 18:05:09.123 +00:00')).toBe('2026-11-30T18:05:09.123Z')
    expect(isoFromStored('2026-11-30 20:05:09.123 +02:00')).toBe('2026-11-30T18:05:09.123Z')
  })

  it('takes text without an offset as UTC, and passes a Date through', () => {
    expect(isoFromStored('2026-01-02 03:04:05')).toBe('2026-01-02T03:04:05.000Z')
    expect(isoFromStored(new Date(Date.UTC(2026, 0, 2, 3, 4, 5)))).toBe('2026-01-02T03:04:05.000Z')
  })

  it('refuses text that is not a date rather than inventing one', () => {
    expect(() => isoFromStored('not a date')).toThrow(/unreadable stored date/)
  })
})
