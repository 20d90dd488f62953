import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { KG_GYM_SET, LB_GYM_SET } from '@shared/domain/equipment'
import { KG_GYM } from '@shared/domain/gym'
import { PLATE_COLOUR_HEX } from '@shared/domain/plates'
import { plateChange } from '@shared/domain/warmup'
import SetCard from '@/components/session/SetCard.vue'
import { plateChangeText } from '@/utils/set-text'
import type { RunExercise } from '@shared/schemas/run.schema'
import { benchPress, buildRunSession, buildSet, cableFly } from './helpers/run-fixtures'

const session = buildRunSession()
const benchSets = session.sets.filter((s) => s.exerciseId === 1)
const [warmup1, warmup2, topSet, backoffSet] = benchSets
const flySets = session.sets.filter((s) => s.exerciseId === 2)

function mountCard(
  set = topSet,
  loadKg: number | null = set.targetLoadKg,
  unit: 'kg' | 'lb' = 'kg',
  exercise: RunExercise = benchPress,
  blockSets = benchSets,
  startPrompt: 'ask' | 'ramp' | 'offline' | null = null,
) {
  return mount(SetCard, { props: { set, blockSets, exercise, unit, loadKg, startPrompt } })
}
const text = (wrapper: ReturnType<typeof mountCard>, id: string) => wrapper.get(`[data-testid="${id}"]`).text()
const plateMasses = (wrapper: ReturnType<typeof mountCard>) =>
  wrapper.findAll('.set-card-plates__plate').map((g) => Number(g.attributes('data-mass')))

describe('SetCard', () => {
  it('shows a top set with its target, rep range to technical failure and last time', () => {
    const card = mountCard()

    expect(card.text()).toContain('Bench press')
    expect(text(card, 'set-label')).toBe('Top set')
    expect(text(card, 'target-load')).toBe('100 kg')
    expect(text(card, 'target-reps')).toBe('6–9 reps, aim for 8 to technical failure')
    expect(text(card, 'last-time')).toBe('Last time: 97.5 kg × 8 · RIR 0')
  })

  it('counts warm-ups and back-off sets within the exercise, and straight sets as "Set n of m"', () => {
    expect(text(mountCard(warmup2), 'set-label')).toBe('Warm-up 2 of 2')
    expect(text(mountCard(backoffSet), 'set-label')).toBe('Back-off set 1 of 1')
    expect(text(mountCard(flySets[1], 20, 'kg', cableFly, flySets), 'set-label')).toBe('Set 2 of 2')
    expect(text(mountCard(flySets[1], 20, 'kg', cableFly, flySets), 'target-reps')).toBe('10–15 reps · RIR 2')
  })

  it('draws the plates of one side for 100 kg on a 20 kg bar with 2.5 kg collars, in IWF colours', () => {
    // 100 - 20 (bar) - 2 x 2.5 (collars) = 75 kg, 37.5 kg a side: 25 + 10 + 2.5, heaviest innermost.
    const card = mountCard()

    expect(plateMasses(card)).toEqual([25, 10, 2.5])
    const fills = card.findAll('.set-card-plates__disc').map((r) => r.attributes('fill'))
    expect(fills).toEqual([PLATE_COLOUR_HEX.red, PLATE_COLOUR_HEX.green, PLATE_COLOUR_HEX.red])
    const heights = card.findAll('.set-card-plates__disc').map((r) => Number(r.attributes('height')))
    expect(heights[0]).toBe(heights[1]) // 25 and 10 kg discs are both 450 mm across (IWF)
    expect(heights[2]).toBeLessThan(heights[1])
  })

  it('says what to change from the previous warm-up, per side', () => {
    // 80 kg is 25 + 2.5 a side; 100 kg is 25 + 10 + 2.5: the outer 2.5 comes off, 10 and 2.5 go on.
    expect(text(mountCard(), 'plate-change')).toBe('Take off 1 × 2.5 kg, add 1 × 10 kg + 1 × 2.5 kg each side')
  })

  it('says "Empty bar" for a first set on the bare bar and what to load for a first set above it', () => {
    expect(text(mountCard(warmup1), 'plate-change')).toBe('Empty bar')
    const firstAt60 = { ...warmup1, targetLoadKg: 60 }
    expect(text(mountCard(firstAt60, 60, 'kg', benchPress, [firstAt60, warmup2]), 'plate-change')).toBe(
      'Load 1 × 15 kg + 1 × 2.5 kg each side',
    )
  })

  it('follows the load stepper: plates for the load about to be lifted', () => {
    expect(plateMasses(mountCard(topSet, 105))).toEqual([25, 15])
  })

  it('draws pound plates grey with their mass printed, and shows loads in the lifter unit', () => {
    const lbBench = { ...benchPress, equipment: LB_GYM_SET }
    const set = { ...topSet, targetLoadKg: 102.05828325 } // 225 lb
    const card = mountCard(set, set.targetLoadKg, 'lb', lbBench)

    expect(text(card, 'target-load')).toBe('225 lb')
    expect(plateMasses(card)).toEqual([45, 45])
    expect(card.findAll('.set-card-plates__disc').map((r) => r.attributes('fill'))).toEqual([PLATE_COLOUR_HEX.grey, PLATE_COLOUR_HEX.grey])
    expect(card.findAll('.set-card-plates__plate text').map((t) => t.text())).toEqual(['45', '45'])
  })

  it('shows the coach comments from last time compactly as "Coach: …"', () => {
    const coached = {
      ...benchPress,
      coachComments: [{ body: 'Keep the elbows tucked on the way down', author: 'Dana Reyes', createdAt: '2026-11-27T09:00:00.000Z' }],
    }
    const note = mountCard(warmup1, warmup1.targetLoadKg, 'kg', coached).get('[data-testid="coach-note"]')

    expect(note.text()).toBe('Coach: Keep the elbows tucked on the way down')
    expect(mountCard().find('[data-testid="coach-note"]').exists()).toBe(false)
  })

  it('marks the first working target "set by your coach" when the coach edited the next step', () => {
    const byCoach = { ...benchPress, nextStepBy: 'coach' as const }

    expect(mountCard(topSet, topSet.targetLoadKg, 'kg', byCoach).get('[data-testid="set-by-coach"]').text()).toBe('set by your coach')
    expect(mountCard(warmup1, warmup1.targetLoadKg, 'kg', byCoach).find('[data-testid="set-by-coach"]').exists()).toBe(false)
    expect(mountCard(backoffSet, backoffSet.targetLoadKg, 'kg', byCoach).find('[data-testid="set-by-coach"]').exists()).toBe(false)
    expect(mountCard(topSet, topSet.targetLoadKg, 'kg', { ...benchPress, nextStepBy: 'lifter' }).find('[data-testid="set-by-coach"]').exists()).toBe(false)
  })

  it('says the load includes the collars when the gym counts them, and draws the outer collar', () => {
    // IWF: collars weigh 2.5 kg each and count in the total (IWF Technical and Competition Rules).
    const card = mountCard()
    const plates = card.get('[data-testid="set-plates"]')

    expect(plates.get('[data-testid="collar-note"]').text()).toBe('· incl. 2 × 2.5 kg collars')
    expect(plates.get('figcaption').text()).toBe('Each side: 25 kg, 10 kg, 2.5 kg · incl. 2 × 2.5 kg collars')
    expect(plates.get('svg').attributes('aria-label')).toBe('Each side: 25 kg, 10 kg, 2.5 kg, incl. 2 × 2.5 kg collars')
    const collar = plates.get('[data-testid="set-plates-collar"]')
    const lastDisc = card.findAll('.set-card-plates__disc').at(-1)!
    expect(Number(collar.attributes('x'))).toBeGreaterThan(Number(lastDisc.attributes('x')) + Number(lastDisc.attributes('width')))
  })

  it('reads "Empty bar" with the collar note on the bare bar plus collars', () => {
    // 25 kg = the 20 kg bar + 2 x 2.5 kg collars (IWF), no plates.
    const caption = mountCard(warmup1).get('[data-testid="set-plates"] figcaption')

    expect(caption.text()).toBe('Empty bar · incl. 2 × 2.5 kg collars')
  })

  it('says nothing of collars when the gym does not count them', () => {
    // KG_GYM_SET: 20 kg bar, collars not counted; 100 kg = 20 + 2 x 40, 40 = 25 + 15 a side (arithmetic).
    const card = mountCard(topSet, 100, 'kg', { ...benchPress, equipment: KG_GYM_SET })

    expect(plateMasses(card)).toEqual([25, 15])
    expect(card.get('[data-testid="set-plates"] figcaption').text()).toBe('Each side: 25 kg, 15 kg')
    expect(card.find('[data-testid="collar-note"]').exists()).toBe(false)
    expect(card.find('[data-testid="set-plates-collar"]').exists()).toBe(false)
  })

  it('shows no plates for a stack exercise', () => {
    expect(mountCard(flySets[0], 20, 'kg', cableFly, flySets).find('[data-testid="set-plates"]').exists()).toBe(false)
  })
})

describe('SetCard for bodyweight and assisted lifts', () => {
  const chinUp: RunExercise = {
    ...benchPress, exerciseId: 5, slotId: 20, name: 'Chin-up', pattern: 'vertical_pull', role: 'accessory', equipment: KG_GYM.bodyweight,
    equipmentKind: 'bodyweight', loadMode: 'bodyweight', bodyMassKg: 80, lastTime: [{ kind: 'straight', loadKg: 5, reps: 8, rir: 1 }],
  }
  const chinUpSet = (loadKg: number) => buildSet({ exerciseId: 5, slotId: 20, kind: 'straight', targetLoadKg: loadKg, targetRepsMin: 6, targetRepsMax: 10, targetRir: 1 })

  it('reads the logged added load as "Body + 10 kg" and last time as "Body + 5 kg × 8"', () => {
    const set = chinUpSet(10)
    const card = mountCard(set, 10, 'kg', chinUp, [set])

    expect(text(card, 'target-load')).toBe('Body + 10 kg')
    expect(text(card, 'last-time')).toBe('Last time: Body + 5 kg × 8 · RIR 1')
    expect(card.find('[data-testid="set-plates"]').exists()).toBe(false)
  })

  it('says "Body weight" when nothing is added, and what is lifted when the stepper moved off the target', () => {
    const set = chinUpSet(0)
    const card = mountCard(set, 2.5, 'kg', chinUp, [set])

    expect(text(card, 'target-load')).toBe('Body weight')
    expect(text(card, 'lifting')).toBe('Lifting Body + 2.5 kg')
  })

  it('reads an assisted lift\'s load as the help: "Help 30 kg"', () => {
    const assisted: RunExercise = {
      ...chinUp, name: 'Assisted pull-up', loadMode: 'assisted', equipmentKind: 'machine',
      equipment: { kind: 'stack', unit: 'kg', steps: [0, 10, 20, 30, 40], addOns: [] }, lastTime: [],
    }
    const set = chinUpSet(30)

    expect(text(mountCard(set, 30, 'kg', assisted, [set]), 'target-load')).toBe('Help 30 kg')
  })
})

describe('SetCard for deload sets and sleds', () => {
  it('labels a deload set "Deload" and shows the reserve it plans instead of failure', () => {
    // A deload keeps 3 reps in reserve (DELOAD.targetRir; common practice, no published source).
    const deloadTop = { ...topSet, deload: true, toFailure: false, targetRir: 3, targetLoadKg: 90 }
    const card = mountCard(deloadTop, 90, 'kg', benchPress, [warmup1, warmup2, deloadTop, backoffSet])

    expect(text(card, 'set-label')).toBe('Deload · Top set')
    expect(text(card, 'target-reps')).toBe('6–9 reps, aim for 8 · deload: stop with 3 in reserve')
    expect(text(mountCard(), 'set-label')).toBe('Top set')
  })

  it('says "Empty sled" instead of "Empty bar" for a plate-loaded sled, in the change and under the plates', () => {
    // KG_GYM's sled weighs 50 kg: its lightest load is the sled alone (gym.ts).
    const legPress: RunExercise = { ...benchPress, name: 'Leg press', pattern: 'squat', equipment: KG_GYM.sled, equipmentKind: 'sled', lastTime: [] }
    const first = buildSet({ kind: 'warmup', targetLoadKg: 50, targetRepsMin: 8, targetRepsMax: 8 })
    const card = mountCard(first, 50, 'kg', legPress, [first])

    expect(text(card, 'plate-change')).toBe('Empty sled')
    expect(card.get('[data-testid="set-plates"] figcaption').text()).toBe('Empty sled')
    expect(text(mountCard(warmup1, 20, 'kg', { ...benchPress, equipment: KG_GYM_SET }), 'plate-change')).toBe('Empty bar')
  })
})

describe('SetCard for a lift with no starting load', () => {
  const unplannedTop = { ...topSet, targetLoadKg: null, targetReps: 7 }
  const unplannedBlock = [unplannedTop, { ...backoffSet, targetLoadKg: null }]

  it('asks for a recent set or the ramp, with no plates drawn for the recent set on the steppers', () => {
    const card = mountCard(unplannedTop, 60, 'kg', benchPress, unplannedBlock, 'ask')

    expect(text(card, 'target-load')).toBe('No load yet')
    expect(text(card, 'target-reps')).toBe('6–9 reps, aim for 7 to technical failure')
    expect(text(card, 'start-prompt')).toContain('No starting load for Bench press yet.')
    expect(text(card, 'start-prompt')).toContain('Start from this set')
    expect(text(card, 'start-prompt')).toContain('Find my load')
    expect(card.find('[data-testid="set-plates"]').exists()).toBe(false)
    expect(card.find('[data-testid="last-time"]').exists()).toBe(false)
  })

  it('during the ramp shows the ramp set, its load with plates, 5 reps and the caution that it stops well short of failure', () => {
    // 25 kg on KG_COMPETITION_SET is the 20 kg bar with its two 2.5 kg collars (IWF): no plates.
    const card = mount(SetCard, {
      props: { set: unplannedTop, blockSets: unplannedBlock, exercise: benchPress, unit: 'kg', loadKg: 25, startPrompt: 'ramp', rampSet: 2 },
    })

    expect(text(card, 'set-label')).toBe('Find my load · ramp set 2')
    expect(text(card, 'target-load')).toBe('25 kg')
    expect(text(card, 'target-reps')).toBe('× 5 reps, well short of failure')
    expect(card.get('[data-testid="set-plates"] figcaption').text()).toBe('Empty bar · incl. 2 × 2.5 kg collars')
    expect(text(card, 'ramp-caution')).toMatch(/stops well short of failure/)
    expect(text(card, 'ramp-caution')).toMatch(/safety pins or have a spotter/)
  })

  it('with no signal says a start needs the server and that this set is logged with a load the lifter chooses', () => {
    const card = mountCard(unplannedTop, null, 'kg', benchPress, unplannedBlock, 'offline')

    expect(text(card, 'target-load')).toBe('Your load')
    expect(text(card, 'start-prompt')).toContain('No signal: a starting load needs the server.')
    expect(text(card, 'start-prompt')).toContain('Log this set with a load you choose')
  })
})

describe('plateChangeText', () => {
  it('adds plates: "Add 2 × 10 kg each side"', () => {
    expect(plateChangeText(plateChange([25], [25, 10, 10]), 'kg')).toBe('Add 2 × 10 kg each side')
  })

  it('swaps an outer plate: "Take off 1 × 5 kg, add 1 × 10 kg each side"', () => {
    expect(plateChangeText(plateChange([25, 5], [25, 10]), 'kg')).toBe('Take off 1 × 5 kg, add 1 × 10 kg each side')
  })

  it('takes plates off only', () => {
    expect(plateChangeText(plateChange([45, 45, 25], [45, 45]), 'lb')).toBe('Take off 1 × 25 lb each side')
  })

  it('says when nothing changes', () => {
    expect(plateChangeText(plateChange([20], [20]), 'kg')).toBe('No plate change')
  })
})
