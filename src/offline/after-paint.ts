/**
 * When the runner's device writes run: in a task right after the next frame has been painted.
 *
 * A log changes the store and Vue draws the next set card in the same turn. The IndexedDB write of
 * that change (copying the session and serialising it into the transaction) is main-thread work
 * too: run before the frame, it delays the card the lifter is waiting for (about 15 ms a tap with
 * the CPU slowed 4x). Run after it, the commit comes about one frame (~16 ms) later; a set is still
 * sent only once its entry has committed, so nothing can reach the server that is not on the phone.
 *
 * A requestAnimationFrame callback runs just before the frame's style, layout and paint; a message
 * posted from it is handled as a new task after those steps. The write takes one more task hop, so
 * it comes after whatever the frame's other animation-frame callbacks queued for after the paint
 * (among them the runner view's timing mark, which then marks the paint, not the paint plus this
 * write; the write's own cost still falls right after the frame).
 *
 * A hidden page draws no frames, so there the promise resolves at once; it also resolves as soon as
 * the page is hidden or left (a reload, closing the tab) while waiting, so the write starts before
 * the page goes, and a timer keeps a frame that never comes from holding the write back for more
 * than FALLBACK_MS. Outside a browser (no document or no animation frames) it resolves at once.
 */

/** The longest a write waits for a frame that does not come (a throttled or frozen renderer). */
const FALLBACK_MS = 250

/** Runs `callback` in a task of its own (a MessageChannel message: not clamped, not among the page's timers). */
function inNextTask(callback: () => void) {
  if (typeof MessageChannel !== 'function') {
    setTimeout(callback, 0)
    return
  }
  const channel = new MessageChannel()
  channel.port1.onmessage = () => {
    channel.port1.close() // also lets Node exit: an open port would keep it running
    callback()
  }
  channel.port2.postMessage(null)
}

export function afterNextPaint(): Promise<void> {
  if (typeof document === 'undefined' || typeof requestAnimationFrame !== 'function' || document.visibilityState === 'hidden') {
    return Promise.resolve()
  }
  return new Promise((resolve) => {
    let done = false
    const finish = () => {
      if (done) return
      done = true
      clearTimeout(fallback)
      // The document may be gone by now (a torn-down test environment; in a browser, never):
      // the write that waited still goes ahead.
      if (typeof document !== 'undefined') document.removeEventListener('visibilitychange', onHidden)
      if (typeof window !== 'undefined') window.removeEventListener('pagehide', finish)
      resolve()
    }
    const onHidden = () => {
      if (document.visibilityState === 'hidden') finish()
    }
    const fallback = setTimeout(finish, FALLBACK_MS)
    document.addEventListener('visibilitychange', onHidden)
    window.addEventListener('pagehide', finish)
    requestAnimationFrame(() => inNextTask(() => inNextTask(finish)))
  })
}
