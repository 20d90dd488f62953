import { describe, expect, it } from 'vitest'
import { formatLoad, formatVolume } from '@/utils/units'

describe('load and volume display', () => {
  it('shows a stored kilogram load without losing microplate precision', () => {
    expect(formatLoad(101.25, 'kg')).toBe('101.25 kg')
  })

  it('shows pounds converted with 1 lb = 0.45359237 kg exactly (NIST SP 811, App. B; 1959 agreement)', () => {
    // 102.05828325 kg = 225 lb exactly [C]
    expect(formatLoad(102.05828325, 'lb')).toBe('225 lb')
  })

  it('prints a volume with thousands separators, rounded to the whole unit', () => {
    expect(formatVolume(12345.3, 'kg')).toBe('12,345 kg')
    // 1000 kg / 0.45359237 = 2204.62 lb [C]
    expect(formatVolume(1000, 'lb')).toBe('2,205 lb')
  })
})
