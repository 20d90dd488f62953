import { describe, expect, it } from 'vitest'
import { DEFAULT_SCHEMES, ISOLATION_THREE_SETS_SCHEME } from '../../shared/domain/schemes'
import { describeScheme } from '../../shared/domain/scheme-summary'
import { sessionTotals } from '../../shared/domain/summary'
import { equipmentFor, gymProfileSchema, KG_GYM, LB_GYM } from '../../shared/domain/gym'
import { isLoadable } from '../../shared/domain/equipment'
import { lbToKg } from '../../shared/domain/units'

describe('scheme summaries', () => {
  it('reads the default schemes back in the trade words', () => {
    expect(describeScheme(DEFAULT_SCHEMES.compound_primary)).toBe('top set 6-9 to failure · 1 back-off 9-12 to failure')
    expect(describeScheme(DEFAULT_SCHEMES.accessory)).toBe('3 sets 8-10 / 10-12 / 12-15 RIR 1')
    expect(describeScheme(ISOLATION_THREE_SETS_SCHEME)).toBe('3 sets 10-15 / 10-15 / 10-15 to failure')
    expect(describeScheme({ nonsense: true })).toBe('custom sets')
  })
})

describe('session totals', () => {
  it('counts working sets and volume (load x reps), leaving warm-ups and skipped sets out', () => {
    const totals = sessionTotals([
      { kind: 'warmup', loadKg: 60, reps: 5 },
      { kind: 'top', loadKg: 100, reps: 8 },
      { kind: 'backoff', loadKg: 87.5, reps: 10 },
      { kind: 'straight', loadKg: 40, reps: null },
    ])
    expect(totals).toEqual({ workingSets: 2, volumeKg: 800 + 875 })
  })
})

describe('gym profiles', () => {
  it('are valid profiles that load each exercise kind from the right equipment', () => {
    for (const gym of [KG_GYM, LB_GYM]) {
      expect(gymProfileSchema.safeParse(gym).success).toBe(true)
      expect(equipmentFor(gym, 'cable')).toBe(gym.stack)
      expect(equipmentFor(gym, 'machine')).toBe(gym.stack)
    }
  })

  it('make the common pound gym loads (references.md §4, common practice): 225 and 185 lb on the bar, 50 lb dumbbells', () => {
    expect(isLoadable(lbToKg(225), LB_GYM.barbell)).toBe(true)
    expect(isLoadable(lbToKg(185), LB_GYM.barbell)).toBe(true)
    expect(isLoadable(lbToKg(50), LB_GYM.dumbbell)).toBe(true)
    expect(isLoadable(lbToKg(52), LB_GYM.dumbbell)).toBe(false)
  })
})
