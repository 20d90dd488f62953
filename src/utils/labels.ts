import type { VersionLabel } from '@shared/schemas/session.schema'
import type { SlotRole } from '@shared/schemas/train.schema'
import type { Role } from '@shared/schemas/common.schema'

/** "Push · version I"; just the name when the version is unknown. */
export function dayWithVersion(dayName: string | null, version: VersionLabel | null): string {
  const name = dayName ?? 'Session'
  return version ? `${name} · version ${version}` : name
}

export const SLOT_ROLE_LABELS: Record<SlotRole, string> = {
  compound_primary: 'Main lift',
  accessory: 'Accessory',
  isolation: 'Isolation',
}

export const ROLE_LABELS: Record<Role, string> = {
  lifter: 'Lifter',
  coach: 'Coach',
  admin: 'Admin',
}
