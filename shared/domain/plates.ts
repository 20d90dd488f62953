/** How to draw a plate: colour and height. Drawing data only; no load math here. */
import type { Unit } from './units'

export type PlateColourName = 'red' | 'blue' | 'yellow' | 'green' | 'white' | 'grey'

/**
 * IWF colour code for kilogram discs (IWF Technical and Competition Rules, sport equipment):
 * 25 and 2.5 red; 20 and 2 blue; 15 and 1.5 yellow; 10 and 1 green; 5 and 0.5 white.
 * The IPF agrees for 25/20/15 kg (red/blue/yellow).
 */
export const IWF_PLATE_COLOURS: Readonly<Record<number, PlateColourName>> = {
  25: 'red',
  20: 'blue',
  15: 'yellow',
  10: 'green',
  5: 'white',
  2.5: 'red',
  2: 'blue',
  1.5: 'yellow',
  1: 'green',
  0.5: 'white',
}

/** Screen colours for the names above (our palette choice; the standard names colours, not codes). */
export const PLATE_COLOUR_HEX: Readonly<Record<PlateColourName, string>> = {
  red: '#C62828',
  blue: '#1565C0',
  yellow: '#F9A825',
  green: '#2E7D32',
  white: '#F5F5F5',
  grey: '#8A8D91',
}

/** Kilogram plates outside the IWF code and all pound plates are neutral grey. */
export function plateColour(mass: number, unit: Unit): PlateColourName {
  return unit === 'kg' ? (IWF_PLATE_COLOURS[mass] ?? 'grey') : 'grey'
}

/**
 * Plate diameter in millimetres, for drawing heights. IWF: discs of 10 kg and more are 450 mm
 * across. Every smaller size below is APPROXIMATE (typical catalogue sizes, no standard).
 */
export function plateDiameterMm(mass: number, unit: Unit): { mm: number; approximate: boolean } {
  if (unit === 'kg' && mass >= 10) return { mm: 450, approximate: false }
  // Approximate sizes: [smallest mass in the band, diameter]. A 45 lb plate is full size.
  const bands: [number, number][] =
    unit === 'kg'
      ? [[5, 230], [2.5, 210], [2, 190], [1.5, 175], [1, 160], [0, 135]]
      : [[45, 450], [35, 400], [25, 330], [10, 260], [5, 210], [0, 160]]
  const mm = bands.find(([min]) => mass >= min)![1]
  return { mm, approximate: true }
}
