/**
 * Where a lifter is in a plan's rotation. A plan's days run in order; every day has two
 * versions, used alternately: with days A, B, C the rotation is A-I, B-I, C-I, A-II, B-II,
 * C-II, then again. The rotation moves only when a day is trained or a rest day has passed,
 * so a missed day is never skipped: it waits for the next visit.
 */
export type VersionLabel = 'I' | 'II'

export interface RotationEntry {
  /** Index into the plan's days, in their order. */
  dayIndex: number
  version: VersionLabel
}

export function rotationEntry(rotationIndex: number, dayCount: number): RotationEntry {
  if (!Number.isInteger(dayCount) || dayCount < 1) throw new RangeError('A plan needs at least one day')
  if (!Number.isInteger(rotationIndex) || rotationIndex < 0) throw new RangeError('Rotation index must be a whole number >= 0')
  return {
    dayIndex: rotationIndex % dayCount,
    version: Math.floor(rotationIndex / dayCount) % 2 === 0 ? 'I' : 'II',
  }
}

export interface TodayInRotation extends RotationEntry {
  /** The rotation index of today's entry (rest days that have passed are stepped over). */
  rotationIndex: number
  isRest: boolean
  /** For a rest day: the next training day, for a lifter who trains anyway. */
  nextTraining: (RotationEntry & { rotationIndex: number }) | null
}

/**
 * Today's entry. `restFlags[i]` says whether day i is a rest day. `daysSinceLastSession` is
 * whole calendar days since the last completed session (null: none yet). Each calendar day
 * strictly between the last session and today lets one rest day pass; so after training on
 * Wednesday, Thursday is the plan's rest day and Friday moves on to the next training day.
 */
export function todayInRotation(
  rotationIndex: number,
  restFlags: readonly boolean[],
  daysSinceLastSession: number | null,
): TodayInRotation {
  const dayCount = restFlags.length
  if (restFlags.every(Boolean)) throw new RangeError('A plan needs at least one training day')
  let index = rotationIndex
  let restDaysPassed = daysSinceLastSession === null ? Infinity : Math.max(0, daysSinceLastSession - 1)
  while (restFlags[rotationEntry(index, dayCount).dayIndex] && restDaysPassed > 0) {
    index += 1
    restDaysPassed -= 1
  }
  const entry = rotationEntry(index, dayCount)
  const isRest = restFlags[entry.dayIndex]
  let nextTraining: TodayInRotation['nextTraining'] = null
  if (isRest) {
    let next = index + 1
    while (restFlags[rotationEntry(next, dayCount).dayIndex]) next += 1
    nextTraining = { ...rotationEntry(next, dayCount), rotationIndex: next }
  }
  return { ...entry, rotationIndex: index, isRest, nextTraining }
}

export interface RotationSlot {
  slotId: number
  pattern: string
  exerciseId: number
}

export interface RotationCandidate {
  id: number
  pattern: string
}

/**
 * Fresh exercises for one day's version after a plateau: for each slot, an exercise of the same
 * movement pattern that neither version of that day uses (nor an earlier slot of this rotation),
 * preferring one the plan does not use at all; library order breaks ties. Slots with no
 * candidate keep their exercise (they are left out of the answer).
 */
export function freshExercisesFor(
  slots: readonly RotationSlot[],
  otherVersion: readonly (RotationSlot | undefined)[],
  usedInPlan: ReadonlySet<number>,
  library: readonly RotationCandidate[],
): Array<{ slotId: number; fromExerciseId: number; toExerciseId: number }> {
  const takenHere = new Set<number>()
  return slots.flatMap((slot, i) => {
    const avoid = new Set([slot.exerciseId, otherVersion[i]?.exerciseId, ...takenHere])
    const candidates = library.filter((e) => e.pattern === slot.pattern && !avoid.has(e.id))
    const fresh = candidates.find((e) => !usedInPlan.has(e.id)) ?? candidates[0]
    if (!fresh) return []
    takenHere.add(fresh.id)
    return [{ slotId: slot.slotId, fromExerciseId: slot.exerciseId, toExerciseId: fresh.id }]
  })
}
