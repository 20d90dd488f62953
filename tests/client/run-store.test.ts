import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { logSetSchema } from '@shared/schemas/run.schema'
import { backoffTarget } from '@shared/domain/schemes'
import { KG_COMPETITION_SET } from '@shared/domain/equipment'
import { setAuthToken } from '@/api/client'
import { useRunStore } from '@/stores/run'
import { buildRunSession } from './helpers/run-fixtures'
import { stubFetch } from './helpers/fetch-stub'

const NOW = new Date('2026-12-01T18:00:00.000Z')

beforeEach(() => {
  localStorage.clear()
  vi.useFakeTimers()
  vi.setSystemTime(NOW)
  setActivePinia(createPinia())
  setAuthToken('tok')
})

afterEach(() => {
  vi.useRealTimers()
  vi.unstubAllGlobals()
  setAuthToken(null)
})

function storeWithSession() {
  const run = useRunStore()
  run.adopt(buildRunSession())
  return run
}

const okReply = (body: unknown = { set: null, updated: [] }) => ({ status: 200, body })

describe('run store', () => {
  it('starts at the first set not done and moves on after logging, without waiting for the network', () => {
    stubFetch()
    const run = storeWithSession()
    const first = run.currentSet!
    expect(first.kind).toBe('warmup')

    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })

    expect(run.sets.find((s) => s.id === first.id)!.loggedAt).toBe(NOW.toISOString())
    expect(run.currentSet!.id).not.toBe(first.id)
    expect(run.pendingCount).toBe(1)
  })

  it('logging a top set As planned queues one PUT with the full body, sent to the set URL', async () => {
    const session = buildRunSession()
    const top = session.sets[2]
    const { requests } = stubFetch(okReply({ set: { ...top }, updated: [] }))
    const run = useRunStore()
    run.adopt(session)

    run.logSet(top.id, { loadKg: 100, reps: 8, rir: null, failure: true })
    await run.flush()

    expect(requests).toHaveLength(1)
    expect(requests[0]).toMatchObject({
      method: 'PUT',
      url: `/api/sessions/41/sets/${top.id}`,
      headers: { Authorization: 'Bearer tok' },
      body: {
        exerciseId: 1, slotId: 10, position: 2, kind: 'top', targetLoadKg: 100, loadKg: 100, reps: 8, rir: null,
        failure: true, skipped: false, loggedAt: NOW.toISOString(), editedAt: NOW.toISOString(),
      },
    })
    expect(logSetSchema.safeParse(requests[0].body).success).toBe(true)
    expect(run.pendingCount).toBe(0)
  })

  it('starts the rest clock with the exercise rest after a working set, and none after a warm-up', () => {
    stubFetch()
    const run = storeWithSession()

    run.logSet(run.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    expect(run.rest).toBeNull()
    run.logSet(run.currentSet!.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    run.logSet(run.currentSet!.id, { loadKg: 100, reps: 8, rir: null, failure: true })

    expect(run.rest).toEqual({ endsAt: NOW.getTime() + 180_000, durationSec: 180 })
  })

  it('previews the back-off target from what the top set did, with the engine', () => {
    stubFetch()
    const run = storeWithSession()
    const [, , top, backoff] = run.sets

    run.logSet(top.id, { loadKg: 105, reps: 9, rir: null, failure: true })

    const expected = backoffTarget({ topLoadKg: 105, topReps: 9, topRir: 0, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(run.sets.find((s) => s.id === backoff.id)!.targetLoadKg).toBe(expected.target.loadKg)
    expect(expected.target.loadKg).not.toBe(85)
  })

  it('keeps a set queued when the network fails and retries later with the same UUID and body', async () => {
    const run = storeWithSession()
    const fetchMock = vi
      .fn()
      .mockRejectedValueOnce(new TypeError('Failed to fetch'))
      .mockResolvedValueOnce(new Response(JSON.stringify({ set: null, updated: [] }), { status: 200 }))
    vi.stubGlobal('fetch', fetchMock)
    const set = run.currentSet!

    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await run.flush()
    expect(fetchMock).toHaveBeenCalledTimes(1)
    expect(run.pendingCount).toBe(1)

    await vi.advanceTimersByTimeAsync(1_000) // first retry after 1 s

    expect(fetchMock).toHaveBeenCalledTimes(2)
    const [firstUrl, firstInit] = fetchMock.mock.calls[0]
    const [secondUrl, secondInit] = fetchMock.mock.calls[1]
    expect(secondUrl).toBe(`/api/sessions/41/sets/${set.id}`)
    expect(secondUrl).toBe(firstUrl)
    expect(secondInit.body).toBe(firstInit.body)
    expect(run.pendingCount).toBe(0)
  })

  it('retries a 5xx with growing waits and sends in order', async () => {
    const run = storeWithSession()
    const { requests } = stubFetch({ status: 503 }, { status: 503 }, okReply(), okReply())
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    const second = run.currentSet!
    run.logSet(second.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    await run.flush()
    expect(requests).toHaveLength(1)

    await vi.advanceTimersByTimeAsync(1_000)
    expect(requests).toHaveLength(2)
    await vi.advanceTimersByTimeAsync(1_999)
    expect(requests).toHaveLength(2) // second wait is 2 s
    await vi.advanceTimersByTimeAsync(1)

    expect(requests.map((r) => r.url)).toEqual([
      `/api/sessions/41/sets/${first.id}`,
      `/api/sessions/41/sets/${first.id}`,
      `/api/sessions/41/sets/${first.id}`,
      `/api/sessions/41/sets/${second.id}`,
    ])
    expect(run.pendingCount).toBe(0)
  })

  it('survives a reload: a new store reads the same set, the same rest clock end and the unsent queue', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))
    const before = storeWithSession()
    before.logSet(before.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    before.logSet(before.currentSet!.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    before.logSet(before.currentSet!.id, { loadKg: 100, reps: 8, rir: null, failure: true })
    await before.flush()
    const setId = before.currentSet!.id
    const endsAt = before.rest!.endsAt

    setActivePinia(createPinia()) // the page reloads
    const after = useRunStore()

    expect(after.session!.id).toBe(41)
    expect(after.currentSet!.id).toBe(setId)
    expect(after.currentSet!.kind).toBe('backoff')
    expect(after.rest!.endsAt).toBe(endsAt)
    expect(after.pendingCount).toBe(3)
  })

  it('undo sends the last set back with no result and no logged time', async () => {
    const { requests } = stubFetch(okReply(), okReply())
    const run = storeWithSession()
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    vi.setSystemTime(NOW.getTime() + 5_000)

    run.undoLast()
    await run.flush()

    expect(run.currentSet!.id).toBe(first.id)
    expect(requests[1]).toMatchObject({
      method: 'PUT',
      url: `/api/sessions/41/sets/${first.id}`,
      body: { loadKg: null, reps: null, rir: null, failure: false, skipped: false, loggedAt: null, editedAt: new Date(NOW.getTime() + 5_000).toISOString() },
    })
  })

  it('skips a set with a logged time, and adds a set after the exercise with a new UUID in its block', async () => {
    const { requests } = stubFetch(okReply(), okReply())
    const run = storeWithSession()
    const flyFirst = run.sets[4]
    run.jumpTo(flyFirst.id)

    run.skipSet(flyFirst.id)
    const added = run.addSet(flyFirst)!
    await run.flush()

    expect(requests[0].body).toMatchObject({ skipped: true, loggedAt: NOW.toISOString() })
    expect(added.position).toBe(102)
    expect(added.id).not.toBe(flyFirst.id)
    expect(requests[1]).toMatchObject({ url: `/api/sessions/41/sets/${added.id}`, body: { position: 102, kind: 'straight', loggedAt: null } })
    expect(run.currentSet!.id).toBe(added.id)
  })

  it('refuses to finish while sets are still waiting for signal', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))
    const run = storeWithSession()
    run.logSet(run.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })

    await expect(run.finish(null)).rejects.toMatchObject({ code: 'pending_sets' })
    expect(run.session).not.toBeNull()
  })
})
