import { onBeforeUnmount } from 'vue'
import { useWakeLock } from '@vueuse/core'

/**
 * Keeps the phone's screen on while a session runs (where the Screen Wake Lock API exists):
 * `start()` when the session starts or resumes, `stop()` at finish; leaving the page releases it.
 * The browser drops the lock when the tab is hidden; useWakeLock takes it again on return.
 */
export function useWakeLockDuringSession() {
  const wakeLock = useWakeLock()

  async function start() {
    if (!wakeLock.isSupported.value) return
    try {
      await wakeLock.request('screen')
    } catch {
      // Refused (battery saver, no permission): the session runs anyway.
    }
  }

  async function stop() {
    if (!wakeLock.isSupported.value) return
    try {
      await wakeLock.release()
    } catch {
      // Already released.
    }
  }

  onBeforeUnmount(() => void stop())
  return { start, stop, active: wakeLock.isActive }
}
