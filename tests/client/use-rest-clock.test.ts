import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { effectScope, ref, type EffectScope } from 'vue'
import { mount } from '@vue/test-utils'
import type { RestClockState } from '@/stores/run'
import { useRestClock } from '@/composables/useRestClock'
import RestClock from '@/components/session/RestClock.vue'

const START = new Date('2026-12-01T18:00:00.000Z').getTime()
let scope: EffectScope

beforeEach(() => {
  vi.useFakeTimers()
  vi.setSystemTime(START)
  scope = effectScope()
})

afterEach(() => {
  scope.stop()
  vi.useRealTimers()
})

function startClock(durationSec: number) {
  const state = ref<RestClockState | null>({ endsAt: Date.now() + durationSec * 1000, durationSec })
  const cues = { warning: vi.fn(), done: vi.fn() }
  const clock = scope.run(() => useRestClock(state, cues))!
  return { state, cues, clock }
}

describe('useRestClock', () => {
  it('counts down from the stored end time', () => {
    const { clock } = startClock(90)
    expect(clock.remainingSec.value).toBe(90)

    vi.advanceTimersByTime(30_000)

    expect(clock.remainingSec.value).toBe(60)
    expect(clock.over.value).toBe(false)
  })

  it('adds and takes off 15 s by moving the end time', () => {
    const { clock, state } = startClock(90)
    vi.advanceTimersByTime(30_000)

    clock.adjust(15)
    expect(clock.remainingSec.value).toBe(75)
    expect(state.value!.endsAt).toBe(START + 105_000)
    clock.adjust(-15)
    clock.adjust(-15)

    expect(clock.remainingSec.value).toBe(45)
  })

  it('reads the clock, not the ticks: after the phone slept past the end it shows rest over and how long ago at once', () => {
    const { clock, cues, state } = startClock(90)
    vi.advanceTimersByTime(5_000)

    // The screen locks: timers stop, the wall clock moves on 2 min 45 s (to 80 s past the end).
    vi.setSystemTime(START + 170_000)
    document.dispatchEvent(new Event('visibilitychange'))

    expect(clock.over.value).toBe(true)
    expect(clock.overSec.value).toBe(80)
    expect(cues.done).toHaveBeenCalledTimes(1)
    expect(cues.warning).not.toHaveBeenCalled() // a stale "10 s left" is not played
    const face = mount(RestClock, {
      props: { remainingSec: clock.remainingSec.value, durationSec: state.value!.durationSec, over: true, overSec: clock.overSec.value },
    })
    expect(face.get('[data-testid="rest-clock-time"]').text()).toBe('Rest over · 1:20 ago')
  })

  it('fires the 10-s warning once and the done cue once', () => {
    const { cues } = startClock(60)

    vi.advanceTimersByTime(49_000)
    expect(cues.warning).not.toHaveBeenCalled()
    vi.advanceTimersByTime(1_000) // 10 s left
    expect(cues.warning).toHaveBeenCalledTimes(1)
    vi.advanceTimersByTime(9_750)
    expect(cues.done).not.toHaveBeenCalled()
    vi.advanceTimersByTime(250) // 0 s left
    vi.advanceTimersByTime(60_000)

    expect(cues.warning).toHaveBeenCalledTimes(1)
    expect(cues.done).toHaveBeenCalledTimes(1)
  })

  it('keeps the fired cues with the stored clock, so a reload does not replay them', () => {
    const { state } = startClock(30)
    vi.advanceTimersByTime(31_000)
    const stored = JSON.parse(JSON.stringify(state.value)) as RestClockState

    const cues = { warning: vi.fn(), done: vi.fn() }
    scope.run(() => useRestClock(ref(stored), cues))
    vi.advanceTimersByTime(1_000)

    expect(cues.done).not.toHaveBeenCalled()
    expect(cues.warning).not.toHaveBeenCalled()
  })

  it('Skip clears the clock', () => {
    const { clock, state } = startClock(90)
    clock.skip()
    expect(state.value).toBeNull()
    expect(clock.running.value).toBe(false)
  })
})

describe('RestClock', () => {
  it('shows mm:ss and sends +15 s, −15 s and Skip', async () => {
    const face = mount(RestClock, { props: { remainingSec: 125, durationSec: 180, over: false, overSec: 0 } })

    expect(face.get('[data-testid="rest-clock-time"]').text()).toBe('2:05')
    await face.get('[data-testid="rest-plus-15"]').trigger('click')
    await face.get('[data-testid="rest-minus-15"]').trigger('click')
    await face.get('[data-testid="rest-skip"]').trigger('click')

    expect(face.emitted('adjust')).toEqual([[15], [-15]])
    expect(face.emitted('skip')).toHaveLength(1)
  })
})
