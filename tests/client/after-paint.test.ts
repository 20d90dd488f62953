import { afterEach, describe, expect, it, vi } from 'vitest'
import { afterNextPaint } from '@/offline/after-paint'

afterEach(() => {
  vi.unstubAllGlobals()
})

describe('offline/after-paint', () => {
  it('resolves after the next frame', async () => {
    let framed = false
    vi.stubGlobal('requestAnimationFrame', (cb: FrameRequestCallback) => setTimeout(() => ((framed = true), cb(0)), 5))
    await afterNextPaint()
    expect(framed).toBe(true)
  })

  it('still resolves, without throwing, when the document is gone before the frame comes', async () => {
    const errors: unknown[] = []
    const onError = (e: unknown) => errors.push(e)
    process.on('uncaughtException', onError)
    let frame: FrameRequestCallback | undefined
    vi.stubGlobal('requestAnimationFrame', (cb: FrameRequestCallback) => ((frame = cb), 1))
    const done = afterNextPaint()
    // As when a test environment is torn down while a write waits for its frame.
    vi.stubGlobal('document', undefined)
    vi.stubGlobal('window', undefined)
    frame!(0)
    await done
    process.off('uncaughtException', onError)
    expect(errors).toEqual([])
  })
})
