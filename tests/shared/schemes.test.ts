import { describe, expect, it } from 'vitest'
import { KG_COMPETITION_SET, LB_GYM_SET, isLoadable } from '../../shared/domain/equipment'
import { epley } from '../../shared/domain/e1rm'
import {
  DEFAULT_REST_SECONDS,
  DEFAULT_SCHEMES,
  ISOLATION_THREE_SETS_SCHEME,
  MAX_WORKING_SETS_ANY,
  MAX_WORKING_SETS_PRIMARY,
  backoffTarget,
  checkScheme,
  setSchemeSchema,
  slotSchemeSchema,
  type SetScheme,
} from '../../shared/domain/schemes'
import { lbToKg } from '../../shared/domain/units'
import { engineErrorCode } from '../helpers/engine-error'

const codeOf = engineErrorCode

describe('default set schemes (common practice, no published source)', () => {
  it('gives a primary compound one top set of 6-9 to failure and one back-off of 9-12', () => {
    const s = DEFAULT_SCHEMES.compound_primary
    expect(s.sets.map((x) => [x.kind, x.repsMin, x.repsMax])).toEqual([
      ['top', 6, 9],
      ['backoff', 9, 12],
    ])
    expect(s.sets[0].toFailure).toBe(true)
    expect(s.warmup).toBe(true)
  })

  it('gives an accessory three sets of 8-10, 10-12, 12-15 with the load stepped down', () => {
    const s = DEFAULT_SCHEMES.accessory
    expect(s.sets.map((x) => [x.repsMin, x.repsMax])).toEqual([
      [8, 10],
      [10, 12],
      [12, 15],
    ])
    expect(s.sets.slice(1).every((x) => (x.loadStepDownPct ?? 0) > 0)).toBe(true)
    // Warm-ups are left to the engine: a barbell or compound accessory well above its lightest load gets a ramp.
    expect(s.warmup).toBe(true)
  })

  it('gives isolation two sets of 12-20 (or three of 10-15), warm-ups left to the engine', () => {
    expect(DEFAULT_SCHEMES.isolation.sets.map((x) => [x.repsMin, x.repsMax])).toEqual([
      [12, 20],
      [12, 20],
    ])
    expect(ISOLATION_THREE_SETS_SCHEME.sets).toHaveLength(3)
    expect(DEFAULT_SCHEMES.isolation.warmup).toBe(true)
  })

  it('validates every default with the exported zod schema', () => {
    for (const s of Object.values(DEFAULT_SCHEMES)) expect(setSchemeSchema.safeParse(s).success).toBe(true)
  })
})

describe('set caps (common practice, no published source)', () => {
  const sets = (n: number): SetScheme => ({ ...DEFAULT_SCHEMES.accessory, sets: Array(n).fill(DEFAULT_SCHEMES.accessory.sets[1]) })
  it('allows at most 3 working sets on a primary compound and 4 on any movement', () => {
    expect(MAX_WORKING_SETS_PRIMARY).toBe(3)
    expect(MAX_WORKING_SETS_ANY).toBe(4)
    expect(codeOf(() => checkScheme('compound_primary', sets(4)))).toBe('SET_CAP_EXCEEDED')
    expect(codeOf(() => checkScheme('accessory', sets(4)))).toBeUndefined()
    expect(setSchemeSchema.safeParse(sets(5)).success).toBe(false)
    expect(slotSchemeSchema.safeParse({ role: 'compound_primary', scheme: sets(4) }).success).toBe(false)
    expect(slotSchemeSchema.safeParse({ role: 'isolation', scheme: sets(4) }).success).toBe(true)
  })

  it('rejects a scheme with an inverted rep range or a back-off without a top set', () => {
    const bad = { ...DEFAULT_SCHEMES.isolation, sets: [{ ...DEFAULT_SCHEMES.isolation.sets[0], repsMin: 15, repsMax: 10 }] }
    expect(codeOf(() => checkScheme('isolation', bad))).toBe('INVALID_SCHEME')
    const orphan = { ...DEFAULT_SCHEMES.compound_primary, sets: [DEFAULT_SCHEMES.compound_primary.sets[1]] }
    expect(setSchemeSchema.safeParse(orphan).success).toBe(false)
  })
})

describe('default rest', () => {
  // Schoenfeld et al., JSCR 30(7):1805-1812, 2016; Grgic et al., Sports Med 48(1):137-151, 2018;
  // ACSM 2009 position stand (2-3 min core lifts, 1-2 min assistance lifts; from memory / secondary copy).
  it('rests 3 min after primary compounds, 2 min after accessories, 90 s after isolation', () => {
    expect(DEFAULT_REST_SECONDS).toEqual({ compound_primary: 180, accessory: 120, isolation: 90 })
    expect(DEFAULT_REST_SECONDS.compound_primary).toBeGreaterThan(120) // Grgic et al. 2018: more than 2 min
  })
})

describe('back-off set target', () => {
  it('computes the back-off load from what the top set did, via the estimated 1RM', () => {
    // 100 kg x 8 to failure -> Epley 1RM 126.67 (Epley 1985); load for 12 reps = 126.67 / 1.4 = 90.48 -> 90 kg loadable.
    const b = backoffTarget({ topLoadKg: 100, topReps: 8, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(b.e1rmKg).toBeCloseTo(epley(100, 8), 9)
    expect(b.target.loadKg).toBe(90)
    expect(b.dropPct).toBeCloseTo(10, 9)
    expect(b.reason.code).toBe('BACKOFF_FROM_TOP_SET')
    expect(b.reason.values.rawLoadKg).toBeCloseTo(90.476, 3)
  })

  it('drops less after a weaker top set and more after a stronger one', () => {
    const weak = backoffTarget({ topLoadKg: 100, topReps: 6, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    const strong = backoffTarget({ topLoadKg: 100, topReps: 9, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(weak.target.loadKg).toBeLessThan(strong.target.loadKg)
  })

  it('rounds to a load the pound gym can make and reports the percent drop', () => {
    const b = backoffTarget({ topLoadKg: lbToKg(315), topReps: 7, repsMin: 9, repsMax: 12, equipment: LB_GYM_SET })
    expect(isLoadable(b.target.loadKg, LB_GYM_SET)).toBe(true)
    expect(b.target.unit).toBe('lb')
    expect(b.dropPct).toBeCloseTo((1 - b.target.load / 315) * 100, 9)
    expect(b.dropPct).toBeGreaterThan(0)
  })

  it('counts reps in reserve on a top set that stopped short of failure', () => {
    const fail = backoffTarget({ topLoadKg: 100, topReps: 6, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    const rir2 = backoffTarget({ topLoadKg: 100, topReps: 6, topRir: 2, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(rir2.e1rmKg).toBeCloseTo(epley(100, 8), 9)
    expect(rir2.target.loadKg).toBeGreaterThan(fail.target.loadKg)
  })

  it('refuses zero reps on the top set', () => {
    expect(codeOf(() => backoffTarget({ topLoadKg: 100, topReps: 0, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET }))).toBe('INVALID_REPS')
  })
})
