import { computed, ref, type Ref } from 'vue'
import { useEventListener, useIntervalFn } from '@vueuse/core'
import type { RestClockState } from '@/stores/run'

export interface RestClockCues {
  warning: () => void
  done: () => void
}

/** Seconds before the end when the soft cue sounds. */
export const REST_WARNING_SEC = 10
const TICK_MS = 250

/**
 * The rest clock, driven by the stored deadline: every tick (and whenever the page becomes
 * visible again) it reads Date.now() against `endsAt`, never counting ticks, so it stays right
 * after the screen locks, the tab sleeps or the page reloads. The soft cue fires once when 10 s
 * are left, the done cue once when the time is up; a page that wakes long after the deadline
 * shows "Rest over · 1:20 ago" at once and skips the stale warning.
 */
export function useRestClock(state: Ref<RestClockState | null>, cues: RestClockCues) {
  const now = ref(Date.now())

  function tick() {
    now.value = Date.now()
    const clock = state.value
    if (!clock) return
    const leftMs = clock.endsAt - now.value
    if (leftMs <= 0 && !clock.ended) {
      state.value = { ...clock, warned: true, ended: true }
      cues.done()
    } else if (leftMs > 0 && leftMs <= REST_WARNING_SEC * 1000 && !clock.warned) {
      state.value = { ...clock, warned: true }
      cues.warning()
    }
  }

  useIntervalFn(tick, TICK_MS, { immediateCallback: true })
  if (typeof document !== 'undefined') {
    useEventListener(document, 'visibilitychange', () => {
      if (document.visibilityState === 'visible') tick()
    })
  }

  const running = computed(() => state.value !== null)
  /** Whole seconds left, rounded up (a clock showing 0:00 is over). */
  const remainingSec = computed(() => (state.value ? Math.max(0, Math.ceil((state.value.endsAt - now.value) / 1000)) : 0))
  const over = computed(() => state.value !== null && state.value.endsAt <= now.value)
  /** Whole seconds since rest ended. */
  const overSec = computed(() => (state.value && over.value ? Math.floor((now.value - state.value.endsAt) / 1000) : 0))

  /** +15 s / −15 s; never earlier than now. Adding time after the end starts a fresh short rest. */
  function adjust(deltaSec: number) {
    const clock = state.value
    if (!clock) return
    const t = Date.now()
    const base = deltaSec > 0 && clock.endsAt < t ? t : clock.endsAt
    const endsAt = Math.max(t, base + deltaSec * 1000)
    const leftMs = endsAt - t
    state.value = {
      ...clock,
      endsAt,
      durationSec: Math.max(0, clock.durationSec + deltaSec),
      // More than 10 s left again: the cues are armed again for this (longer) rest.
      warned: leftMs <= REST_WARNING_SEC * 1000 ? clock.warned : false,
      ended: leftMs <= 0 ? clock.ended : false,
    }
    tick()
  }

  function skip() {
    state.value = null
  }

  return { running, remainingSec, over, overSec, adjust, skip, tick }
}
