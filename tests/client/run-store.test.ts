import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { openDB } from 'idb'
import { logSetSchema, startFromRecentSetSchema, type RunExercise, type RunSession, type RunSet } from '@shared/schemas/run.schema'
import { backoffTarget } from '@shared/domain/schemes'
import { KG_COMPETITION_SET } from '@shared/domain/equipment'
import { KG_GYM } from '@shared/domain/gym'
import { setAuthToken } from '@/api/client'
import { toLogBody, useRunStore } from '@/stores/run'
import { DEVICE_DB_NAME, openDeviceStore, type OutboxEntry, type RunnerSnapshot } from '@/offline/device-store'
import { LEGACY_RUN_KEYS } from '@/offline/legacy-run-storage'
import { benchPress, buildRunSession, buildSet, buildUnplannedSession, cableFly, plannedFromStart } from './helpers/run-fixtures'
import { stubFetch } from './helpers/fetch-stub'

const NOW = new Date('2026-12-01T18:00:00.000Z')

beforeEach(() => {
  localStorage.clear()
  // IndexedDB (fake-indexeddb, fresh per test) runs on real setImmediate tasks: only the clock and timers are fake.
  vi.useFakeTimers({ toFake: ['Date', 'setTimeout', 'clearTimeout'] })
  vi.setSystemTime(NOW)
  setActivePinia(createPinia())
  setAuthToken('tok')
})

afterEach(async () => {
  // Let this test's store settle against this test's fetch, so nothing it sends leaks into the next test.
  const run = useRunStore()
  await run.flush()
  await run.whenSaved()
  run.$dispose() // its 'online' listener and retry timer go with it
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
const okResponse = () => new Response(JSON.stringify({ set: null, updated: [] }), { status: 200 })
const noSignal = () => vi.fn().mockRejectedValue(new TypeError('Failed to fetch'))

/** What the device database holds, read through a connection of its own. */
async function onDevice(): Promise<{ outbox: OutboxEntry[]; sessions: RunnerSnapshot[] }> {
  const db = await openDB(DEVICE_DB_NAME)
  try {
    if (!db.objectStoreNames.contains('outbox')) return { outbox: [], sessions: [] }
    return { outbox: await db.getAllFromIndex('outbox', 'bySeq'), sessions: await db.getAll('sessions') }
  } finally {
    db.close()
  }
}

/** The page reloads: a new Pinia (a new store) over the same device database and localStorage. */
async function reload() {
  useRunStore().$dispose() // the old page is gone, with its retry timer
  setActivePinia(createPinia())
  const run = useRunStore()
  await run.whenReady()
  return run
}

/** Lets real tasks run (IndexedDB works in them; the test's timers are fake). */
async function realTasks(n = 20) {
  for (let i = 0; i < n; i += 1) await new Promise((resolve) => setImmediate(resolve))
}

const logWarmups = (run: ReturnType<typeof useRunStore>) => {
  run.logSet(run.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })
  run.logSet(run.currentSet!.id, { loadKg: 80, reps: 3, rir: null, failure: false })
}

/** A fetch that answers only when the test says so. */
function heldFetch() {
  const calls: Array<{ url: string; body: Record<string, unknown>; answer: (res: Response) => void }> = []
  const fetchMock = vi.fn(
    (input: RequestInfo | URL, init: RequestInit = {}) =>
      new Promise<Response>((resolve) => calls.push({ url: String(input), body: JSON.parse(String(init.body)), answer: resolve })),
  )
  vi.stubGlobal('fetch', fetchMock)
  return calls
}

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

  it('previews the back-off target from what the top set did, with the engine', async () => {
    stubFetch()
    const run = storeWithSession()
    const [, , top, backoff] = run.sets

    // Logged at once: the engine is loaded when a session arrives, so the preview may follow it.
    run.logSet(top.id, { loadKg: 105, reps: 9, rir: null, failure: true })

    const expected = backoffTarget({ topLoadKg: 105, topReps: 9, topRir: 0, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(expected.target.loadKg).not.toBe(85)
    await vi.waitFor(() => expect(run.sets.find((s) => s.id === backoff.id)!.targetLoadKg).toBe(expected.target.loadKg))

    // Once loaded, a later top set is previewed in the same tick as the tap.
    run.logSet(top.id, { loadKg: 110, reps: 7, rir: null, failure: true })
    const again = backoffTarget({ topLoadKg: 110, topReps: 7, topRir: 0, repsMin: 9, repsMax: 12, equipment: KG_COMPETITION_SET })
    expect(again.target.loadKg).not.toBe(expected.target.loadKg)
    expect(run.sets.find((s) => s.id === backoff.id)!.targetLoadKg).toBe(again.target.loadKg)
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

  it('writes a log to the device right after the next frame (not before it is drawn), then sends it; whenSaved does not wait for the frame', async () => {
    const frames: FrameRequestCallback[] = []
    vi.stubGlobal('requestAnimationFrame', (callback: FrameRequestCallback) => frames.push(callback))
    const { requests } = stubFetch(okReply())
    const run = storeWithSession()
    await run.whenSaved() // the adopted session, written at once: this caller asked for it
    frames.length = 0
    const set = run.currentSet!

    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await realTasks()
    expect(frames).toHaveLength(1) // waiting for the frame that draws the next set
    expect((await onDevice()).outbox).toEqual([])
    expect(requests).toHaveLength(0) // and so not sent yet

    frames.shift()!(performance.now())
    await vi.waitFor(() => expect(requests).toHaveLength(1))
    expect(requests[0].url).toBe(`/api/sessions/41/sets/${set.id}`)

    const next = run.currentSet!
    run.logSet(next.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    await run.whenSaved() // hurried: no frame needed
    expect((await onDevice()).outbox.map((e) => e.setId)).toContain(next.id)
  })

  it('makes no send attempt while the browser is offline, and sends as soon as the online event fires', async () => {
    const online = vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(false)
    const { requests } = stubFetch(okReply(), okReply())
    const run = storeWithSession()
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    const second = run.currentSet!
    run.logSet(second.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    await run.whenSaved()
    await realTasks()
    expect(requests).toHaveLength(0) // no request per tap with no network
    expect((await onDevice()).outbox.map((e) => e.setId)).toEqual([first.id, second.id]) // kept on the device meanwhile

    online.mockReturnValue(true)
    window.dispatchEvent(new Event('online'))
    await vi.waitFor(() => expect(requests).toHaveLength(2)) // at once: no timer was advanced

    expect(requests.map((r) => r.url)).toEqual([`/api/sessions/41/sets/${first.id}`, `/api/sessions/41/sets/${second.id}`])
    await run.flush()
    expect(run.pendingCount).toBe(0)
    online.mockRestore()
  })

  it('still retries with backoff while the browser says it is offline (its online flag may be wrong)', async () => {
    const online = vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(false)
    const { requests } = stubFetch(okReply())
    const run = storeWithSession()
    const set = run.currentSet!
    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await run.whenSaved()
    await vi.advanceTimersByTimeAsync(999)
    expect(requests).toHaveLength(0)

    await vi.advanceTimersByTimeAsync(1)
    await vi.waitFor(() => expect(requests).toHaveLength(1))
    expect(requests[0].url).toBe(`/api/sessions/41/sets/${set.id}`)
    online.mockRestore()
  })

  it('makes no send attempt for a new log while a retry is waiting; the retry sends the queue in order', async () => {
    const { requests } = stubFetch({ status: 503 }, okReply(), okReply())
    const run = storeWithSession()
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await run.whenSaved()
    await vi.waitFor(() => expect(run.sendError).not.toBeNull())
    expect(requests).toHaveLength(1) // refused with a 503: a retry waits 1 s

    const second = run.currentSet!
    run.logSet(second.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    await run.whenSaved()
    await realTasks()
    expect(requests).toHaveLength(1) // the new log did not cut the wait short

    await vi.advanceTimersByTimeAsync(1_000)
    await vi.waitFor(() => expect(run.pendingCount).toBe(0))
    expect(requests.map((r) => r.url)).toEqual([
      `/api/sessions/41/sets/${first.id}`,
      `/api/sessions/41/sets/${first.id}`,
      `/api/sessions/41/sets/${second.id}`,
    ])
  })

  it('survives a reload: a new store reads the same set, the same rest clock end and the unsent queue from IndexedDB', async () => {
    vi.stubGlobal('fetch', noSignal())
    const before = storeWithSession()
    before.logSet(before.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    before.logSet(before.currentSet!.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    before.logSet(before.currentSet!.id, { loadKg: 100, reps: 8, rir: null, failure: true })
    await before.flush()
    await before.whenSaved()
    const setId = before.currentSet!.id
    const endsAt = before.rest!.endsAt

    const after = await reload()

    expect(after.session!.id).toBe(41)
    expect(after.currentSet!.id).toBe(setId)
    expect(after.currentSet!.kind).toBe('backoff')
    expect(after.rest!.endsAt).toBe(endsAt)
    expect(after.pendingCount).toBe(3)
    expect(localStorage.length).toBe(0) // nothing of the runner in localStorage any more
  })

  it('keeps the sending order across a reload and sends the queued sets in that order', async () => {
    vi.stubGlobal('fetch', noSignal())
    const before = storeWithSession()
    const ids = before.sets.slice(0, 3).map((s) => s.id)
    before.logSet(ids[0], { loadKg: 25, reps: 6, rir: null, failure: false })
    before.logSet(ids[1], { loadKg: 80, reps: 3, rir: null, failure: false })
    before.logSet(ids[2], { loadKg: 100, reps: 8, rir: null, failure: true })
    await before.flush()
    await before.whenSaved()
    const stored = (await onDevice()).outbox
    expect(stored.map((e) => e.setId)).toEqual(ids)
    expect(stored.map((e) => e.seq)).toEqual([...stored.map((e) => e.seq)].sort((a, b) => a - b))

    const { requests } = stubFetch(okReply(), okReply(), okReply())
    const after = await reload()
    await after.flush()

    expect(requests.map((r) => r.url)).toEqual(ids.map((id) => `/api/sessions/41/sets/${id}`))
    expect(requests[2].body).toMatchObject({ kind: 'top', loadKg: 100, reps: 8, failure: true })
    expect(after.pendingCount).toBe(0)
    await after.whenSaved()
    expect((await onDevice()).outbox).toEqual([])
  })

  it('sends a set only after its outbox entry has committed in IndexedDB', async () => {
    const calls = heldFetch()
    const run = storeWithSession()
    await run.whenReady()
    await run.whenSaved()
    // Another connection holds a write transaction on the outbox, so the store's write must wait.
    const db = await openDB(DEVICE_DB_NAME)
    const blocker = db.transaction('outbox', 'readwrite')
    let holding = true
    const held = (async () => {
      while (holding) await blocker.store.count()
      await blocker.done
    })()

    const set = run.currentSet!
    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    expect(run.sets.find((s) => s.id === set.id)!.loggedAt).toBe(NOW.toISOString()) // the UI has it at once
    void run.flush()
    await realTasks(50)
    expect(calls).toHaveLength(0) // not sent: not on the device yet

    holding = false
    await held
    db.close()
    await vi.waitFor(() => expect(calls).toHaveLength(1))
    expect((await onDevice()).outbox.map((e) => e.setId)).toEqual([set.id])
    calls[0].answer(okResponse())
  })

  it('removes an entry from the device only when the server has acknowledged it', async () => {
    const calls = heldFetch()
    const run = storeWithSession()
    const set = run.currentSet!
    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    const sending = run.flush()
    await vi.waitFor(() => expect(calls).toHaveLength(1))
    await run.whenSaved()
    expect((await onDevice()).outbox.map((e) => e.setId)).toEqual([set.id]) // in flight, still kept

    calls[0].answer(okResponse())
    await sending
    await run.whenSaved()

    expect(run.pendingCount).toBe(0)
    expect((await onDevice()).outbox).toEqual([])
  })

  it('a later edit of a queued set replaces its entry, and the later edit is what is sent', async () => {
    vi.stubGlobal('fetch', noSignal())
    const run = storeWithSession()
    const set = run.currentSet!
    const other = run.sets[1]
    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    run.logSet(other.id, { loadKg: 80, reps: 3, rir: null, failure: false })
    await run.flush()
    vi.setSystemTime(NOW.getTime() + 60_000)
    run.logSet(set.id, { loadKg: 25, reps: 5, rir: null, failure: false, note: 'bar slipped' })
    await run.whenSaved()

    expect(run.pendingCount).toBe(2)
    const stored = (await onDevice()).outbox
    expect(stored.map((e) => e.setId)).toEqual([other.id, set.id]) // in the order of the last edits
    expect(stored[1].body).toMatchObject({ reps: 5, note: 'bar slipped', editedAt: new Date(NOW.getTime() + 60_000).toISOString() })

    const { requests } = stubFetch(okReply(), okReply())
    await run.flush()
    expect(requests.map((r) => r.url)).toEqual([`/api/sessions/41/sets/${other.id}`, `/api/sessions/41/sets/${set.id}`])
    expect(requests[1].body).toMatchObject({ reps: 5, editedAt: new Date(NOW.getTime() + 60_000).toISOString() })
  })

  it('an edit made while the set is on its way stays queued after the acknowledgement and is sent next', async () => {
    const calls = heldFetch()
    const run = storeWithSession()
    const set = run.currentSet!
    run.logSet(set.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    const sending = run.flush()
    await vi.waitFor(() => expect(calls).toHaveLength(1))

    vi.setSystemTime(NOW.getTime() + 30_000)
    run.logSet(set.id, { loadKg: 25, reps: 7, rir: null, failure: false })
    calls[0].answer(okResponse())
    await vi.waitFor(() => expect(calls).toHaveLength(2))
    await run.whenSaved()

    expect(calls[0].body).toMatchObject({ reps: 6 })
    expect(calls[1].body).toMatchObject({ reps: 7, editedAt: new Date(NOW.getTime() + 30_000).toISOString() })
    expect(run.pendingCount).toBe(1)
    expect((await onDevice()).outbox.map((e) => e.body.reps)).toEqual([7])
    calls[1].answer(okResponse())
    await sending
    await run.whenSaved()
    expect(run.pendingCount).toBe(0)
    expect((await onDevice()).outbox).toEqual([])
  })

  it('undo sends the last set back with no result and no logged time (replacing the unsent log)', async () => {
    const { requests } = stubFetch(okReply(), okReply())
    const run = storeWithSession()
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    vi.setSystemTime(NOW.getTime() + 5_000)

    run.undoLast()
    await run.flush()

    expect(run.currentSet!.id).toBe(first.id)
    // The log had not left the phone yet: the undo replaced it in the outbox, so only the undo is sent.
    expect(requests).toHaveLength(1)
    expect(requests[0]).toMatchObject({
      method: 'PUT',
      url: `/api/sessions/41/sets/${first.id}`,
      body: { loadKg: null, reps: null, rir: null, failure: false, skipped: false, loggedAt: null, editedAt: new Date(NOW.getTime() + 5_000).toISOString() },
    })
  })

  it('undo after the log was sent sends the undo as a second PUT of the same set', async () => {
    const { requests } = stubFetch(okReply(), okReply())
    const run = storeWithSession()
    const first = run.currentSet!
    run.logSet(first.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await run.flush()
    vi.setSystemTime(NOW.getTime() + 5_000)

    run.undoLast()
    await run.flush()

    expect(requests.map((r) => r.url)).toEqual([`/api/sessions/41/sets/${first.id}`, `/api/sessions/41/sets/${first.id}`])
    expect(requests[0].body).toMatchObject({ reps: 6, loggedAt: NOW.toISOString() })
    expect(requests[1].body).toMatchObject({ reps: null, loggedAt: null, editedAt: new Date(NOW.getTime() + 5_000).toISOString() })
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

describe('run store: moving the old localStorage copy into IndexedDB', () => {
  /** What the previous version left in localStorage in the middle of a session. */
  function seedOldCopy(session = buildRunSession()) {
    const [w1, w2, top] = session.sets
    const at = (s: number) => new Date(NOW.getTime() - 600_000 + s * 1000).toISOString()
    const body = (set: typeof w1, reps: number, editedAt: string) =>
      toLogBody({ ...set, loadKg: set.targetLoadKg, reps, loggedAt: editedAt, editedAt })
    // The old queue appended every edit: w1 was logged, then w2, then w1 corrected.
    const queue = [
      { sessionId: 41, setId: w1.id, body: body(w1, 6, at(1)), attempts: 3 },
      { sessionId: 41, setId: w2.id, body: body(w2, 3, at(2)), attempts: 0 },
      { sessionId: 41, setId: w1.id, body: body(w1, 5, at(3)), attempts: 0 },
    ]
    session.sets = session.sets.map((s) => (s.id === w1.id ? { ...s, ...queue[2].body } : s.id === w2.id ? { ...s, ...queue[1].body } : s))
    localStorage.setItem(LEGACY_RUN_KEYS.session, JSON.stringify(session))
    localStorage.setItem(LEGACY_RUN_KEYS.jumpSetId, top.id)
    localStorage.setItem(LEGACY_RUN_KEYS.rest, JSON.stringify({ endsAt: NOW.getTime() + 90_000, durationSec: 180 }))
    localStorage.setItem(LEGACY_RUN_KEYS.queue, JSON.stringify(queue))
    localStorage.setItem('chalkline.token', 'tok') // not the runner's: stays
    return { w1, w2, top }
  }

  it('moves the queued sets and the snapshot into IndexedDB once, deletes the old keys, and sends the latest edits in order', async () => {
    vi.stubGlobal('fetch', noSignal())
    const { w1, w2, top } = seedOldCopy()

    const run = useRunStore()
    await run.whenReady()

    expect(Object.values(LEGACY_RUN_KEYS).map((k) => localStorage.getItem(k))).toEqual([null, null, null, null])
    expect(localStorage.getItem('chalkline.token')).toBe('tok')
    expect(run.session!.id).toBe(41)
    expect(run.currentSet!.id).toBe(top.id)
    expect(run.rest).toEqual({ endsAt: NOW.getTime() + 90_000, durationSec: 180 })
    expect(run.pendingCount).toBe(2)
    const stored = await onDevice()
    expect(stored.outbox.map((e) => [e.setId, e.body.reps])).toEqual([[w2.id, 3], [w1.id, 5]])
    expect(stored.sessions.map((s) => s.id)).toEqual([41])

    // A second load finds nothing left to move and the same queue.
    const again = await reload()
    expect(again.pendingCount).toBe(2)

    const { requests } = stubFetch(okReply(), okReply())
    await vi.advanceTimersByTimeAsync(1_000) // the retry after the failed first attempt
    await again.flush()
    expect(requests.map((r) => [r.url, (r.body as { reps: number }).reps])).toEqual([
      [`/api/sessions/41/sets/${w2.id}`, 3],
      [`/api/sessions/41/sets/${w1.id}`, 5],
    ])
  })

  it('keeps a later edit already in IndexedDB over an older one found in localStorage', async () => {
    vi.stubGlobal('fetch', noSignal())
    const session = buildRunSession()
    const run = useRunStore()
    run.adopt(session)
    const w1 = run.currentSet!
    run.logSet(w1.id, { loadKg: 25, reps: 4, rir: null, failure: false }) // edited at NOW
    await run.flush()
    await run.whenSaved()
    seedOldCopy(session) // older edits of w1 (and w2) of the same session

    const after = await reload()

    expect(after.pendingCount).toBe(2)
    const stored = (await onDevice()).outbox
    expect(stored.map((e) => [e.setId, e.body.reps])).toEqual([[w1.id, 4], [after.sets[1].id, 3]])
  })
})

describe('run store with no IndexedDB (some private modes)', () => {
  it.each([
    ['missing', () => vi.stubGlobal('indexedDB', undefined)],
    [
      'refusing to open',
      () =>
        vi.stubGlobal('indexedDB', {
          open() {
            throw new DOMException('A mutation operation was attempted on a database that did not allow mutations.', 'InvalidStateError')
          },
        }),
    ],
  ])('IndexedDB %s: keeps everything in memory, says so quietly, and still logs and sends', async (_, breakIndexedDb) => {
    breakIndexedDb()
    const { requests } = stubFetch(okReply(), okReply())
    const run = useRunStore()
    await run.whenReady()
    run.adopt(buildRunSession())

    expect(run.storageWarning).toMatch(/not keeping sets on the device/)
    logWarmups(run)
    expect(run.pendingCount).toBe(2)
    await run.flush()

    expect(requests).toHaveLength(2)
    expect(run.pendingCount).toBe(0)
    expect(localStorage.length).toBe(0)
  })

  it('takes the old localStorage queue into memory and keeps the old keys until those sets are sent', async () => {
    vi.stubGlobal('indexedDB', undefined)
    const session = buildRunSession()
    const w1 = session.sets[0]
    const body = toLogBody({ ...w1, loadKg: 25, reps: 6, loggedAt: NOW.toISOString(), editedAt: NOW.toISOString() })
    localStorage.setItem(LEGACY_RUN_KEYS.session, JSON.stringify(session))
    localStorage.setItem(LEGACY_RUN_KEYS.queue, JSON.stringify([{ sessionId: 41, setId: w1.id, body, attempts: 0 }]))
    vi.stubGlobal('fetch', noSignal())

    const run = useRunStore()
    await run.whenReady()
    await run.flush()

    expect(run.pendingCount).toBe(1)
    expect(run.sets[0].reps).toBe(6)
    expect(localStorage.getItem(LEGACY_RUN_KEYS.queue)).not.toBeNull() // a reload must not lose it

    const { requests } = stubFetch(okReply())
    await vi.advanceTimersByTimeAsync(1_000)
    expect(requests.map((r) => r.url)).toEqual([`/api/sessions/41/sets/${w1.id}`])
    expect(run.pendingCount).toBe(0)
    expect(localStorage.getItem(LEGACY_RUN_KEYS.queue)).toBeNull()
  })

  it('falls back to memory when a write fails (e.g. the disk is full) and keeps sending', async () => {
    const run = storeWithSession()
    await run.whenReady()
    await run.whenSaved()
    const { requests } = stubFetch(okReply())
    const put = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(() => {
      throw new DOMException('The quota has been exceeded.', 'QuotaExceededError')
    })

    run.logSet(run.currentSet!.id, { loadKg: 25, reps: 6, rir: null, failure: false })
    await run.flush()
    put.mockRestore()

    expect(run.storageWarning).toMatch(/not keeping sets on the device/)
    expect(requests).toHaveLength(1)
    expect(run.pendingCount).toBe(0)
  })
})

describe('run store: a lift with no starting load', () => {
  it('POSTs the recent set as the start and takes the answer: the block planned again, from its first warm-up', async () => {
    const session = buildUnplannedSession()
    const answer = plannedFromStart(session)
    const { requests } = stubFetch(okReply({ session: answer }))
    const run = useRunStore()
    run.adopt(session)
    expect(run.currentSet!.targetLoadKg).toBeNull()

    await run.startFromRecentSet(run.currentSet!, { loadKg: 80, reps: 5, rir: 1, source: 'recent_set' })

    expect(requests).toEqual([
      expect.objectContaining({
        method: 'POST',
        url: '/api/sessions/41/start-estimate',
        body: { exerciseId: 1, slotId: 10, loadKg: 80, reps: 5, rir: 1, source: 'recent_set' },
      }),
    ])
    expect(startFromRecentSetSchema.safeParse(requests[0].body).success).toBe(true)
    expect(run.sets.map((s) => s.id)).toEqual(answer.sets.map((s) => s.id))
    expect(run.currentSet).toMatchObject({ kind: 'warmup', targetLoadKg: 25 })
  })

  it('sends the sets waiting in the outbox before the start, so the plan follows what was done', async () => {
    const session = buildUnplannedSession()
    const { requests } = stubFetch(okReply(), okReply({ session: plannedFromStart(session) }))
    const run = useRunStore()
    run.adopt(session)
    const fly = run.sets.find((s) => s.exerciseId === 2)!
    run.logSet(fly.id, { loadKg: 20, reps: 12, rir: 2, failure: false })

    await run.startFromRecentSet({ exerciseId: 1, slotId: 10 }, { loadKg: 60, reps: 5, rir: 2, source: 'ramp' })

    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual([`PUT /api/sessions/41/sets/${fly.id}`, 'POST /api/sessions/41/start-estimate'])
    expect(requests[1].body).toEqual({ exerciseId: 1, slotId: 10, loadKg: 60, reps: 5, rir: 2, source: 'ramp' })
  })

  it('with no signal rejects with status 0 and leaves the session as it was', async () => {
    vi.stubGlobal('fetch', noSignal())
    const session = buildUnplannedSession()
    const run = useRunStore()
    run.adopt(session)

    await expect(run.startFromRecentSet({ exerciseId: 1, slotId: 10 }, { loadKg: 80, reps: 5, rir: 0, source: 'recent_set' })).rejects.toMatchObject({ status: 0 })
    expect(run.sets.map((s) => s.id)).toEqual([...session.sets].sort((a, b) => a.position - b.position).map((s) => s.id))
  })
})

describe('run store: caps when adding a set', () => {
  // The caps (3 working sets on a main lift, 4 hard sets of one movement pattern in a session) are
  // common practice, no published source (shared/domain/schemes.ts, progression.ts).
  const legPress: RunExercise = {
    ...cableFly, exerciseId: 3, slotId: 12, name: 'Leg press', pattern: 'squat', role: 'accessory', equipment: KG_GYM.sled, equipmentKind: 'sled',
  }
  const squat: RunExercise = { ...benchPress, exerciseId: 4, slotId: 13, name: 'Back squat', pattern: 'squat' }
  function legsSession() {
    const session = buildRunSession()
    const block = (e: RunExercise, start: number, kinds: RunSet['kind'][]) =>
      kinds.map((kind, i) => buildSet({ exerciseId: e.exerciseId, slotId: e.slotId, position: start + i, kind }))
    session.exercises = [squat, legPress]
    session.sets = [...block(squat, 0, ['warmup', 'top', 'backoff']), ...block(legPress, 100, ['straight', 'straight'])]
    return session
  }

  it('names the pattern cap a fifth squat-pattern set would pass, counting every exercise of the pattern and not warm-ups', async () => {
    stubFetch()
    const run = useRunStore()
    run.adopt(legsSession())

    const warnings = await run.addSetCapWarnings({ exerciseId: 3, slotId: 12 })

    // Back squat 2 + leg press 2 + the new one = 5 hard sets of the squat pattern, over the cap of 4.
    expect(warnings).toEqual([expect.objectContaining({ code: 'PATTERN_OVER_SESSION_CAP', values: expect.objectContaining({ pattern: 'squat', sets: 5, cap: 4 }) })])
  })

  it('leaves skipped sets out, and says nothing while the session stays within the caps', async () => {
    stubFetch()
    const run = useRunStore()
    const session = legsSession()
    session.sets = session.sets.map((s) => (s.kind === 'backoff' ? { ...s, skipped: true, loggedAt: NOW.toISOString() } : s))
    run.adopt(session)

    expect(await run.addSetCapWarnings({ exerciseId: 3, slotId: 12 })).toEqual([])
  })

  it("names a main lift's own cap: a fourth working set of a primary compound passes 3", async () => {
    stubFetch()
    const run = useRunStore()
    const session = buildRunSession()
    session.sets.push(buildSet({ exerciseId: 1, slotId: 10, position: 4, kind: 'backoff' }))
    run.adopt(session)

    const warnings = await run.addSetCapWarnings({ exerciseId: 1, slotId: 10 })

    expect(warnings).toEqual([expect.objectContaining({ code: 'PRIMARY_COMPOUND_OVER_CAP', values: { exercise: 'Bench press', sets: 4, cap: 3 } })])
    expect(await run.addSetCapWarnings({ exerciseId: 2, slotId: 11 })).toEqual([]) // cable fly: 3 of 4
  })

  it('adds a set of a deload block as an ordinary set (the server does not plan it as a deload)', () => {
    stubFetch(okReply())
    const run = useRunStore()
    const session = buildRunSession()
    session.sets = session.sets.map((s) => (s.exerciseId === 2 ? { ...s, deload: true, targetRir: 3 } : s))
    run.adopt(session)

    const added = run.addSet({ exerciseId: 2, slotId: 11 })!

    expect(added.deload).toBe(false)
  })
})

describe('run store: bodyweight lifts and copies kept by older versions', () => {
  it("previews a chin-up's back-off from the load moved: body mass plus the added load", async () => {
    stubFetch()
    const chinUp: RunExercise = {
      ...benchPress, name: 'Chin-up', pattern: 'vertical_pull', equipment: KG_GYM.bodyweight, equipmentKind: 'bodyweight', loadMode: 'bodyweight', bodyMassKg: 80,
    }
    const session = buildRunSession()
    session.exercises = [chinUp, cableFly]
    const run = useRunStore()
    run.adopt(session)
    const top = run.sets.find((s) => s.kind === 'top')!
    const backoff = run.sets.find((s) => s.kind === 'backoff')!

    run.logSet(top.id, { loadKg: 10, reps: 8, rir: null, failure: true })

    const reading = { mode: 'bodyweight' as const, bodyMassKg: 80 }
    const expected = backoffTarget({ topLoadKg: 10, topReps: 8, topRir: 0, repsMin: 9, repsMax: 12, equipment: KG_GYM.bodyweight, reading })
    // 90 kg moved x 8 reps: Epley 90 x (1 + 8/30) = 114 kg; 12 reps at it: 114 / 1.4 = 81.4 kg moved, 1.4 kg added -> 1.25 kg on the belt.
    expect(expected.target.loadKg).toBe(1.25)
    await vi.waitFor(() => expect(run.sets.find((s) => s.id === backoff.id)!.targetLoadKg).toBe(1.25))
  })

  it('reads a session kept on the phone before deloads and load modes existed as no deload, loads as logged', async () => {
    vi.stubGlobal('fetch', noSignal())
    const old = buildRunSession() as unknown as { sets: Array<Record<string, unknown>>; exercises: Array<Record<string, unknown>> }
    for (const set of old.sets) delete set.deload
    for (const exercise of old.exercises) {
      delete exercise.loadMode
      delete exercise.bodyMassKg
    }
    const device = await openDeviceStore()
    await device.write({ snapshot: { id: 41, session: old as unknown as RunSession, jumpSetId: null, rest: null, savedAt: NOW.toISOString() } })
    device.close()

    const run = useRunStore()
    await run.whenReady()

    expect(run.sets.every((s) => s.deload === false)).toBe(true)
    expect(run.exercises.map((e) => [e.loadMode, e.bodyMassKg])).toEqual([['external', null], ['external', null]])
  })

  it('keeps a deload set a deload when its unsent log is laid over the server copy', async () => {
    vi.stubGlobal('fetch', noSignal())
    const session = buildRunSession()
    session.sets = session.sets.map((s) => (s.kind === 'top' ? { ...s, deload: true, toFailure: false, targetRir: 3 } : s))
    const run = useRunStore()
    run.adopt(session)
    const top = run.sets.find((s) => s.kind === 'top')!
    run.logSet(top.id, { loadKg: 90, reps: 8, rir: 3, failure: false })

    run.adopt(session) // the server's copy again (a resume), the log still unsent

    expect(run.sets.find((s) => s.id === top.id)).toMatchObject({ deload: true, reps: 8 })
  })
})
