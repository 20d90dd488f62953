import { Howl } from 'howler'

/**
 * The rest clock's cues: a sound through howler and a vibration where the phone supports it.
 * "warning" is the soft cue 10 s before the end; "done" says rest is over.
 *
 * Test hook (deliberate and documented): every cue is also recorded on `window.__chalklineCues`
 * as `{ kind, at }` (epoch ms), so a browser test can check that the cues fire without hearing them.
 */
export type RestCueKind = 'warning' | 'done'

export interface RestCues {
  /** Call from a tap: creates the sounds inside a user gesture so the browser lets them play later. */
  unlock: () => void
  warning: () => void
  done: () => void
}

declare global {
  interface Window {
    __chalklineCues?: { kind: RestCueKind; at: number }[]
  }
}

/** Vibration patterns (ms on, off, on...): one short buzz, then three long ones. */
export const CUE_VIBRATION: Readonly<Record<RestCueKind, number[]>> = {
  warning: [120],
  done: [400, 150, 400, 150, 400],
}

const CUE_SOUND: Readonly<Record<RestCueKind, { src: string; volume: number }>> = {
  warning: { src: '/sounds/rest-soon.wav', volume: 0.35 },
  done: { src: '/sounds/rest-over.wav', volume: 1 },
}

let sounds: Partial<Record<RestCueKind, Howl>> | null = null

function soundsReady(): Partial<Record<RestCueKind, Howl>> {
  if (!sounds) {
    sounds = {}
    for (const kind of ['warning', 'done'] as const) {
      try {
        sounds[kind] = new Howl({ src: [CUE_SOUND[kind].src], volume: CUE_SOUND[kind].volume, preload: true })
      } catch {
        // No audio on this device: the vibration and the flash still tell the lifter.
      }
    }
  }
  return sounds
}

function cue(kind: RestCueKind) {
  window.__chalklineCues ??= []
  window.__chalklineCues.push({ kind, at: Date.now() })
  try {
    soundsReady()[kind]?.play()
  } catch {
    // A blocked or missing audio output must never break the clock.
  }
  if (typeof navigator !== 'undefined' && typeof navigator.vibrate === 'function') navigator.vibrate(CUE_VIBRATION[kind])
}

export function useRestCues(): RestCues {
  return {
    unlock: () => void soundsReady(),
    warning: () => cue('warning'),
    done: () => cue('done'),
  }
}
