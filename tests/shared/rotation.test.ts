import { describe, expect, it } from 'vitest'
import { rotationEntry, todayInRotation } from '../../shared/domain/rotation'

// The rotation rules are the product's own (common practice of alternating two versions of a
// split day; no published source).
describe('rotation through a plan', () => {
  it('runs the days in order with version I, then again with version II', () => {
    const seq = Array.from({ length: 7 }, (_, i) => rotationEntry(i, 3))
    expect(seq.map((e) => `${e.dayIndex}${e.version}`)).toEqual(['0I', '1I', '2I', '0II', '1II', '2II', '0I'])
  })

  it('keeps a missed day waiting: the entry only moves when the index does', () => {
    expect(todayInRotation(4, [false, false, false], 5)).toMatchObject({ dayIndex: 1, version: 'II', rotationIndex: 4 })
  })

  it('shows the rest day the day after training, and moves past it the day after that', () => {
    const restFlags = [false, false, false, true] // push, pull, legs, rest
    // Legs done yesterday (index now at the rest day, 3).
    expect(todayInRotation(3, restFlags, 1)).toMatchObject({ isRest: true, rotationIndex: 3, nextTraining: { dayIndex: 0, version: 'II', rotationIndex: 4 } })
    // Two days later the rest day has passed: push, version II (index 4 = second lap).
    expect(todayInRotation(3, restFlags, 2)).toMatchObject({ isRest: false, dayIndex: 0, version: 'II', rotationIndex: 4 })
  })

  it('lets a first-ever session skip a plan that opens with rest', () => {
    expect(todayInRotation(0, [true, false], null)).toMatchObject({ dayIndex: 1, isRest: false })
  })

  it('refuses plans with no training day', () => {
    expect(() => todayInRotation(0, [true, true], 0)).toThrow(RangeError)
    expect(() => rotationEntry(0, 0)).toThrow(RangeError)
  })
})
