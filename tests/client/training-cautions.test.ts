import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import TrainingCautions from '@/components/common/TrainingCautions.vue'

describe('TrainingCautions', () => {
  it('emits acknowledge when the lifter taps "I understand"', async () => {
    const wrapper = mount(TrainingCautions, { props: { acknowledgeable: true } })

    const button = wrapper.find('button')
    expect(button.text()).toBe('I understand')
    await button.trigger('click')

    expect(wrapper.emitted('acknowledge')).toHaveLength(1)
  })

  it('shows the text without a button where it is only for reading (the Me page)', () => {
    const wrapper = mount(TrainingCautions)

    expect(wrapper.find('button').exists()).toBe(false)
  })

  it('covers clearance, safety pins or a spotter, warning signs, breathing, deferring to professionals', () => {
    const text = mount(TrainingCautions).text()

    for (const point of [
      'PAR-Q+',
      'safety pins',
      'spotter',
      'joint pain',
      'dizziness',
      'chest pain',
      'breathlessness',
      'hold your breath',
      "gym's rules",
      'qualified coach or clinician',
      'suggestions, not prescriptions',
    ]) {
      expect(text).toContain(point)
    }
  })
})
