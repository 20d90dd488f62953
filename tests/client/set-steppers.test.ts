import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { KG_COMPETITION_SET, type Equipment } from '@shared/domain/equipment'
import { KG_GYM } from '@shared/domain/gym'
import type { LoadMode } from '@shared/domain/lift-progress'
import SetRepsStepper from '@/components/session/SetRepsStepper.vue'
import SetLoadStepper from '@/components/session/SetLoadStepper.vue'

function mountReps(modelValue: number, props: { min?: number; max?: number } = {}) {
  const wrapper = mount(SetRepsStepper, {
    props: { modelValue, ...props, 'onUpdate:modelValue': (v: number) => wrapper.setProps({ modelValue: v }) },
  })
  return wrapper
}

function mountLoad(modelValue: number | null, equipment: Equipment, unit: 'kg' | 'lb' = 'kg', mode: LoadMode = 'external') {
  const wrapper = mount(SetLoadStepper, {
    props: { modelValue, equipment, unit, mode, 'onUpdate:modelValue': (v: number | null) => wrapper.setProps({ modelValue: v }) },
  })
  return wrapper
}

describe('SetRepsStepper', () => {
  it('takes one rep off and puts one on', async () => {
    const stepper = mountReps(8)

    await stepper.get('[data-testid="reps-minus"]').trigger('click')
    await stepper.get('[data-testid="reps-minus"]').trigger('click')
    expect(stepper.get('[data-testid="reps-value"]').text()).toBe('6 reps')
    await stepper.get('[data-testid="reps-plus"]').trigger('click')

    expect(stepper.emitted('update:modelValue')).toEqual([[7], [6], [7]])
  })

  it('stops at its bounds: minus is disabled at the minimum, plus at the maximum', () => {
    expect(mountReps(0).get('[data-testid="reps-minus"]').attributes()).toHaveProperty('disabled')
    expect(mountReps(50).get('[data-testid="reps-plus"]').attributes()).toHaveProperty('disabled')
    expect(mountReps(1, { min: 1 }).get('[data-testid="reps-minus"]').attributes()).toHaveProperty('disabled')
  })
})

describe('SetLoadStepper', () => {
  const dumbbells: Equipment = { kind: 'dumbbell', unit: 'kg', pairs: [10, 12.5, 15, 17.5, 20, 22.5, 25] }

  it('steps a dumbbell to the next pair on the rack, not by a fixed amount', async () => {
    const stepper = mountLoad(22.5, dumbbells)

    await stepper.get('[data-testid="load-plus"]').trigger('click')
    expect(stepper.emitted('update:modelValue')!.at(-1)).toEqual([25])
    expect(stepper.get('[data-testid="load-plus"]').attributes()).toHaveProperty('disabled') // 25 kg is the heaviest pair
    await stepper.get('[data-testid="load-minus"]').trigger('click')

    expect(stepper.emitted('update:modelValue')!.at(-1)).toEqual([22.5])
  })

  it('steps a kilogram barbell by its smallest jump: a pair of 0.5 kg discs is 1 kg', async () => {
    const stepper = mountLoad(100, KG_COMPETITION_SET)

    await stepper.get('[data-testid="load-plus"]').trigger('click')
    expect(stepper.emitted('update:modelValue')!.at(-1)).toEqual([101])
    await stepper.get('[data-testid="load-minus"]').trigger('click')
    await stepper.get('[data-testid="load-minus"]').trigger('click')

    expect(stepper.emitted('update:modelValue')!.at(-1)).toEqual([99])
  })

  it('cannot go below the empty bar with collars (25 kg)', () => {
    expect(mountLoad(25, KG_COMPETITION_SET).get('[data-testid="load-minus"]').attributes()).toHaveProperty('disabled')
  })

  it('shows a pound gym load in pounds and steps by its 5 lb pair', async () => {
    const lbStack: Equipment = { kind: 'any', unit: 'lb', step: 5, min: 0 }
    const stepper = mountLoad(45.359237, lbStack, 'lb') // 100 lb

    expect(stepper.get('[data-testid="load-value"]').text()).toBe('100 lb')
    await stepper.get('[data-testid="load-plus"]').trigger('click')

    expect(stepper.get('[data-testid="load-value"]').text()).toBe('105 lb')
  })

  it('steps the added load of a bodyweight lift and reads it "Body + 10 kg", "Body weight" with nothing added', async () => {
    // KG_GYM's dip-belt plates: 20, 10, 5, 2.5 and two 1.25 kg; the smallest added loads are 0, 1.25, 2.5 (arithmetic).
    const stepper = mountLoad(0, KG_GYM.bodyweight, 'kg', 'bodyweight')
    expect(stepper.get('[data-testid="load-value"]').text()).toBe('Body weight')
    expect(stepper.get('[data-testid="load-minus"]').attributes()).toHaveProperty('disabled')
    expect(stepper.get('[data-testid="load-plus"]').attributes('aria-label')).toBe('More added load')

    await stepper.get('[data-testid="load-plus"]').trigger('click')
    await stepper.get('[data-testid="load-plus"]').trigger('click')

    expect(stepper.emitted('update:modelValue')).toEqual([[1.25], [2.5]])
    expect(stepper.get('[data-testid="load-value"]').text()).toBe('Body + 2.5 kg')
  })

  it('reads an assisted lift\'s load as the help: "Help 30 kg", plus gives more help', async () => {
    const assistStack: Equipment = { kind: 'stack', unit: 'kg', steps: [0, 10, 20, 30, 40], addOns: [] }
    const stepper = mountLoad(30, assistStack, 'kg', 'assisted')
    expect(stepper.get('[data-testid="load-value"]').text()).toBe('Help 30 kg')
    expect(stepper.get('[data-testid="load-plus"]').attributes('aria-label')).toBe('More help')

    await stepper.get('[data-testid="load-plus"]').trigger('click')

    expect(stepper.get('[data-testid="load-value"]').text()).toBe('Help 40 kg')
  })
})
