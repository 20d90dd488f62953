import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { flagText } from '@/components/review/review-labels'
import { bodyMassText, e1rmChangeText, gainText, targetText } from '@/utils/next-step-text'

describe('next-step words', () => {
  it('a gain never reads as a negative figure, whatever its size', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 500, noNaN: true }), fc.constantFrom('reps', 'work', 'load' as const), (pct, kind) => {
        const text = gainText({ kind, pct })
        expect(text).toMatch(new RegExp(`^\\+\\d+(\\.\\d)? % ${kind}$`))
      }),
    )
    // Rounding a tiny figure gives "+0", never "−0".
    expect(gainText({ kind: 'work', pct: 0.04 })).toBe('+0 % work')
  })

  it('the summary\'s estimated-1RM change and the review desk\'s regression flag show one figure for a lift', () => {
    // The server puts the change on the flag rounded to one decimal (shared/domain/review-flags.ts).
    fc.assert(
      fc.property(fc.double({ min: -60, max: -5.0001, noNaN: true }), (changePct) => {
        const onFlag = Math.round(changePct * 10) / 10
        const summary = e1rmChangeText({ deload: false, e1rmChangePct: changePct })
        expect(flagText({ code: 'regression', exercise: 'Row', values: { e1rmChangePct: onFlag } })).toBe(`Regression: Row estimated 1RM ${summary}`)
      }),
    )
  })

  it('a deload reads "Deload", not the drop', () => {
    expect(e1rmChangeText({ deload: true, e1rmChangePct: -11.2 })).toBe('Deload')
    expect(e1rmChangeText({ deload: false, e1rmChangePct: null })).toBeNull()
  })

  it('bodyweight and assisted targets say what is added to or taken from the body', () => {
    expect(targetText(5, 8, 'bodyweight', 'kg')).toBe('Body mass + 5 kg × 8')
    expect(targetText(0, 8, 'bodyweight', 'kg')).toBe('Body mass × 8')
    expect(targetText(20, 6, 'assisted', 'kg')).toBe('Body mass − 20 kg × 6')
    expect(targetText(57.5, 8, 'external', 'kg')).toBe('57.5 kg × 8')
    expect(bodyMassText({ loadMode: 'bodyweight', bodyMassKg: 63 }, 'kg')).toBe('incl. 63 kg body mass')
    expect(bodyMassText({ loadMode: 'external', bodyMassKg: 63 }, 'kg')).toBeNull()
  })
})
