import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { unit } from 'mathjs'
import { DISPLAY_DECIMALS, KG_PER_LB, displayLoad, formatLoad, fromKg, kgToLb, lbToKg, toKg } from '../../shared/domain/units'

describe('pound and kilogram', () => {
  // International Yard and Pound Agreement, 1959; NIST SP 811 (2008), Appendix B
  // (printed there rounded to 0.4535924, with the exact value in a footnote, from memory).
  it('defines the pound as exactly 0.45359237 kg', () => {
    expect(KG_PER_LB).toBe(0.45359237)
    expect(lbToKg(1)).toBe(0.45359237)
  })

  // Cross-check with an independent implementation: mathjs unit conversion (npm "mathjs").
  it('agrees with mathjs for pounds to kilograms and back', () => {
    for (const lb of [1, 2.5, 45, 135, 225, 315, 405, 1000]) {
      expect(lbToKg(lb)).toBeCloseTo(unit(lb, 'lb').toNumber('kg'), 12)
    }
    for (const kg of [0.5, 1, 20, 60, 102.5, 250]) {
      expect(kgToLb(kg)).toBeCloseTo(unit(kg, 'kg').toNumber('lb'), 10)
    }
  })

  // Derived values from the exact definition (references.md §5, computed):
  // 1 kg = 2.2046226218 lb; 45 lb = 20.41165665 kg; 20 kg = 44.09245244 lb.
  it('gives the derived values of the exact definition, not of a rounded factor', () => {
    expect(kgToLb(1)).toBeCloseTo(2.2046226218, 10)
    expect(lbToKg(45)).toBeCloseTo(20.41165665, 10)
    expect(kgToLb(20)).toBeCloseTo(44.09245244, 8)
  })

  it('returns a pound load stored in kilograms as the round number it was', () => {
    expect(fromKg(lbToKg(225), 'lb')).toBe(225)
    expect(fromKg(lbToKg(137.5), 'lb')).toBe(137.5)
    expect(toKg(100, 'kg')).toBe(100)
  })

  it('rounds only for display, leaving the stored value untouched', () => {
    const stored = lbToKg(225)
    expect(displayLoad(stored, 'kg')).toBe(102.06)
    expect(formatLoad(stored, 'lb')).toBe('225 lb')
    expect(formatLoad(100, 'kg')).toBe('100 kg')
    expect(stored).toBe(225 * 0.45359237)
  })

  // Property: kg -> lb -> kg round-trips within display precision (and far tighter in storage).
  it('round-trips kg -> lb -> kg within display precision', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), (kg) => {
        expect(Math.abs(toKg(fromKg(kg, 'lb'), 'lb') - kg)).toBeLessThan(1e-6)
        // Through the rounded display value: off by at most half a display step in lb.
        const shownLb = displayLoad(kg, 'lb')
        const halfStepKg = lbToKg(0.5 * 10 ** -DISPLAY_DECIMALS.lb)
        expect(Math.abs(lbToKg(shownLb) - kg)).toBeLessThanOrEqual(halfStepKg + 1e-9)
      }),
    )
  })
})
