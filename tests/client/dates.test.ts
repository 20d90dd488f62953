import { afterEach, describe, expect, it, vi } from 'vitest'
import { formatDay } from '@/utils/dates'

describe('utils/dates', () => {
  const RealDateTimeFormat = Intl.DateTimeFormat
  afterEach(() => {
    Intl.DateTimeFormat = RealDateTimeFormat
    vi.resetModules()
  })

  // Reference: Intl.DateTimeFormat for English (ECMA-402, with the runtime's ICU/CLDR data),
  // the formatter this function replaced, in the same (local) time zone.
  it("writes a day exactly as Intl's English formatter does, for every day of two years", () => {
    const intl = new RealDateTimeFormat('en', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' })
    const start = new Date(2025, 0, 1, 12, 0)
    for (let i = 0; i < 731; i++) {
      const day = new Date(start.getFullYear(), start.getMonth(), start.getDate() + i, 12, 0)
      expect(formatDay(day.toISOString())).toBe(intl.format(day))
    }
    // Around local midnight, the phone's own calendar day counts.
    const lateEvening = new Date(2026, 11, 1, 23, 59)
    const justAfter = new Date(2026, 11, 2, 0, 1)
    expect(formatDay(lateEvening.toISOString())).toBe(intl.format(lateEvening))
    expect(formatDay(justAfter.toISOString())).toBe(intl.format(justAfter))
  })

  it('gives an em dash for no date or an unreadable one', () => {
    expect(formatDay(null)).toBe('—')
    expect(formatDay(undefined)).toBe('—')
    expect(formatDay('not a date')).toBe('—')
  })

  // The first Intl.DateTimeFormat of a page loads the browser's locale data (70-110 ms measured in
  // Chromium on the bench machine): the Train screen formats a day on its first paint of today.
  it('never builds an Intl date formatter', async () => {
    let made = 0
    Intl.DateTimeFormat = class extends RealDateTimeFormat {
      constructor(...args: ConstructorParameters<typeof RealDateTimeFormat>) {
        super(...args)
        made++
      }
    } as typeof Intl.DateTimeFormat
    vi.resetModules()
    const dates = await import('@/utils/dates')
    dates.localDay(new Date(2026, 11, 1, 9, 30))
    dates.formatDay('2026-12-01T12:00:00Z')
    expect(made).toBe(0)
  })
})
