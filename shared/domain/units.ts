/**
 * Mass units. Loads are stored in kilograms at full precision (`loadKg`, `targetLoadKg`);
 * pounds exist only at the edges: a pound gym's plates and the lifter's display preference.
 */
export type Unit = 'kg' | 'lb'
export const UNITS: readonly Unit[] = ['kg', 'lb']

/**
 * 1 lb = 0.45359237 kg exactly: International Yard and Pound Agreement, 1959; NIST SP 811,
 * Appendix B. Never use a rounded factor (0.4536, 2.2046...).
 */
export const KG_PER_LB = 0.45359237

export function lbToKg(lb: number): number {
  return lb * KG_PER_LB
}

export function kgToLb(kg: number): number {
  return kg / KG_PER_LB
}

/** Converts a value in `unit` to kilograms. */
export function toKg(value: number, unit: Unit): number {
  return unit === 'kg' ? value : lbToKg(value)
}

/**
 * Converts kilograms to `unit`, snapped to 1e-9 of the unit so that a pound load stored in kg
 * (225 lb = 102.05828325 kg) comes back as 225, not 225.00000000000003.
 */
export function fromKg(kg: number, unit: Unit): number {
  const value = unit === 'kg' ? kg : kgToLb(kg)
  return snap(value)
}

/** Removes binary floating-point noise below 1e-9. */
export function snap(value: number): number {
  return Math.round(value * 1e9) / 1e9
}

/** Decimals shown on screen. Display rounding never feeds back into stored values. */
export const DISPLAY_DECIMALS: Readonly<Record<Unit, number>> = { kg: 2, lb: 1 }

/** A stored kilogram value rounded for display in `unit`. */
export function displayLoad(kg: number, unit: Unit, decimals = DISPLAY_DECIMALS[unit]): number {
  const factor = 10 ** decimals
  return Math.round(fromKg(kg, unit) * factor) / factor
}

/** "102.5 kg", "225 lb": display value without trailing zeros. */
export function formatLoad(kg: number, unit: Unit, decimals = DISPLAY_DECIMALS[unit]): string {
  return `${displayLoad(kg, unit, decimals)} ${unit}`
}
