import { displayLoad } from '@shared/domain/units'
import type { Unit } from '@shared/schemas/common.schema'

export { formatLoad } from '@shared/domain/units'

const wholeNumber = new Intl.NumberFormat('en', { maximumFractionDigits: 0 })

/** "12,345 kg": a session's volume (load x reps summed) in the user's unit, to the whole unit. */
export function formatVolume(kg: number, unit: Unit): string {
  return `${wholeNumber.format(displayLoad(kg, unit, 0))} ${unit}`
}
