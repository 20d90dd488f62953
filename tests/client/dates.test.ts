import { afterEach, describe, expect, it, vi } from 'vitest'

describe('utils/dates', () => {
  const RealDateTimeFormat = Intl.DateTimeFormat
  let made = 0
  afterEach(() => {
    Intl.DateTimeFormat = RealDateTimeFormat
    vi.resetModules()
  })

  // The first Intl.DateTimeFormat of a page loads the browser's locale data (70-110 ms measured in
  // Chromium on the bench machine): importing the module, as the start-up code does for localDay,
  // must not pay for it.
  it('builds its date formatter on the first formatDay, not on import', async () => {
    made = 0
    // Counts constructions and otherwise is Intl's own formatter.
    Intl.DateTimeFormat = class extends RealDateTimeFormat {
      constructor(...args: ConstructorParameters<typeof RealDateTimeFormat>) {
        super(...args)
        made++
      }
    } as typeof Intl.DateTimeFormat
    vi.resetModules()
    const dates = await import('@/utils/dates')
    dates.localDay(new Date(2026, 11, 1, 9, 30))
    expect(made).toBe(0)
    // The same text Intl gives for English (ECMA-402 via the runtime's ICU data).
    const expected = new RealDateTimeFormat('en', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' }).format(
      new Date('2026-12-01T12:00:00Z'),
    )
    expect(dates.formatDay('2026-12-01T12:00:00Z')).toBe(expected)
    expect(dates.formatDay('2026-11-30T12:00:00Z')).not.toBe(expected)
    expect(made).toBe(1)
    expect(dates.formatDay(null)).toBe('—')
    expect(dates.formatDay('not a date')).toBe('—')
  })
})
