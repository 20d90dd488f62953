import { computed, onScopeDispose, ref, toRaw, watch } from 'vue'
import { acceptHMRUpdate, defineStore } from 'pinia'
import { useEventListener } from '@vueuse/core'
import type { PlanWarning } from '@shared/domain/plan-checks'
import type { backoffTarget as BackoffTarget } from '@shared/domain/schemes'
import type { SlotRole } from '@shared/schemas/train.schema'
import type {
  LogSetInput, RunExercise, RunSession, RunSet, SessionReport, StartFromRecentSetInput, StartSessionInput,
} from '@shared/schemas/run.schema'
import { ApiError } from '@/api/client'
import * as runApi from '@/api/run'
import {
  openDeviceStore,
  type DeviceContents,
  type DeviceStore,
  type OutboxEntry,
  type RestClockState,
  type RunnerSnapshot,
} from '@/offline/device-store'
import { afterNextPaint } from '@/offline/after-paint'
import { forgetSavedToday } from '@/offline/saved-today'
import { changesFromLegacy, readLegacyRunData, removeLegacyRunData, type LegacyRunData } from '@/offline/legacy-run-storage'
import { localDay } from '@/utils/dates'
import { newUuid } from '@/utils/uuid'

// The training engine validates its inputs with zod: with it, the engine would be a fifth of the
// app's start-up script, on every screen. The store loads it when a session is there to run
// (before its first set can be logged) and uses it only for the instant back-off preview.
let backoffTarget: typeof BackoffTarget | null = null
let engineLoad: Promise<void> | null = null
function loadEngine(): Promise<void> {
  engineLoad ??= import('@shared/domain/schemes').then(
    (engine) => {
      backoffTarget = engine.backoffTarget
    },
    () => {
      engineLoad = null // offline before the file was cached: the server's answer re-targets instead
    },
  )
  return engineLoad
}

/**
 * The session in progress on this device: its sets, the current set, the rest clock and the
 * outbox of set logs. All of it is kept on the phone in IndexedDB (`src/offline/device-store.ts`),
 * so a reload or a crash resumes at the same set with the same rest clock and the same unsent sets.
 *
 * Logging never waits for the network or the disk: the store changes at once, and the changes of
 * that moment are written in one IndexedDB transaction right after the next frame (so the next set
 * card is painted first). A set is sent only once its outbox entry has committed, in outbox order,
 * one at a time, retried with backoff on no signal or a 5xx, and removed only when the server has
 * acknowledged it. A log does not force a send while a retry is waiting or while the browser says it
 * is offline: the retry (or the 'online' event) sends the whole outbox in order. Each entry carries
 * the set's full body with its `editedAt`; a later edit of the same set replaces the entry (the
 * server keeps the later edit too), and the server is idempotent by the set's UUID, so a retry never
 * duplicates.
 *
 * With no IndexedDB (some private modes) the store keeps everything in memory and says so in
 * `storageWarning`: logging still works, but a reload loses what was not sent.
 */

export type { RestClockState } from '@/offline/device-store'

/** One set PUT waiting to be sent (an outbox entry). */
export type QueuedSetLog = OutboxEntry

/** What the lifter did in a set (load in kg). */
export interface SetResult {
  loadKg: number | null
  reps: number | null
  rir: number | null
  failure: boolean
  note?: string | null
}

/** A recent set of a lift with no history (or the hard set of a find-your-load ramp), load in kg. */
export type StartingSet = Omit<StartFromRecentSetInput, 'exerciseId' | 'slotId'>

/** Positions are per-exercise blocks of 100 (block i uses i*100 .. i*100+99). */
const BLOCK_STRIDE = 100
const MAX_RETRY_MS = 30_000

const isOpen = (s: RunSet) => s.loggedAt === null && !s.skipped
const isHardSet = (s: RunSet) => s.kind !== 'warmup' && !s.skipped

/**
 * A copy kept on the phone by an older version lacks the fields added since: read them as that
 * version meant them (no deload, loads as logged, no body mass).
 */
function withCurrentFields(copy: RunSession): RunSession {
  return {
    ...copy,
    exercises: copy.exercises.map((e) => ({ ...e, loadMode: e.loadMode ?? 'external', bodyMassKg: e.bodyMassKg ?? null })),
    sets: copy.sets.map((s) => ({ ...s, deload: s.deload ?? false })),
  }
}
const sameBlock = (a: { exerciseId: number; slotId: number | null }, b: { exerciseId: number; slotId: number | null }) =>
  a.exerciseId === b.exerciseId && a.slotId === b.slotId

/** No signal, an expired token, a timeout, rate limiting or a server fault: keep the item and retry. */
function isRetryable(error: unknown): boolean {
  if (!(error instanceof ApiError)) return true
  return error.status === 0 || error.status === 401 || error.status === 408 || error.status === 429 || error.status >= 500
}

export function toLogBody(set: RunSet): LogSetInput {
  return {
    exerciseId: set.exerciseId,
    slotId: set.slotId,
    position: set.position,
    kind: set.kind,
    targetLoadKg: set.targetLoadKg,
    targetRepsMin: set.targetRepsMin,
    targetRepsMax: set.targetRepsMax,
    targetReps: set.targetReps,
    toFailure: set.toFailure,
    targetRir: set.targetRir,
    loadKg: set.loadKg,
    reps: set.reps,
    rir: set.rir,
    failure: set.failure,
    skipped: set.skipped,
    note: set.note,
    loggedAt: set.loggedAt,
    editedAt: set.editedAt ?? new Date().toISOString(),
  }
}

/** How long a change waited for its IndexedDB commit (a user-timing entry, seen in the profiler). */
function measureOutboxCommit(start: number) {
  try {
    performance.measure('chalkline:outbox-commit', { start, end: performance.now() })
  } catch {
    // no user timing here
  }
}

export const useRunStore = defineStore('run', () => {
  const session = ref<RunSession | null>(null)
  // A session to run: load the engine now, while the lifter reads the first set card.
  watch(
    () => session.value !== null,
    (running) => {
      if (running) void loadEngine()
    },
  )
  const jumpSetId = ref<string | null>(null)
  const rest = ref<RestClockState | null>(null)
  /** The outbox in sending order (the same entries as on the device, plus any not yet written). */
  const queue = ref<QueuedSetLog[]>([])
  /** The last refusal or failure from the server while sending, for a notice. */
  const sendError = ref<string | null>(null)
  /** Set when this phone cannot keep the session on the device (no IndexedDB): a quiet notice. */
  const storageWarning = ref<string | null>(null)

  const sets = computed(() => [...(session.value?.sets ?? [])].sort((a, b) => a.position - b.position))
  const exercises = computed(() => session.value?.exercises ?? [])
  const pendingCount = computed(() => queue.value.length)
  const openSets = computed(() => sets.value.filter(isOpen))
  const allDone = computed(() => sets.value.length > 0 && openSets.value.length === 0)

  /** The set on the card: the one the lifter jumped to, else the first set not done and not skipped. */
  const currentSet = computed<RunSet | null>(() => {
    const jumped = jumpSetId.value ? sets.value.find((s) => s.id === jumpSetId.value) : undefined
    return jumped ?? openSets.value[0] ?? null
  })
  const currentExercise = computed(() => (currentSet.value ? exerciseOf(currentSet.value) : undefined))

  function exerciseOf(set: { exerciseId: number; slotId: number | null }): RunExercise | undefined {
    return exercises.value.find((e) => sameBlock(e, set))
  }
  function blockSets(set: { exerciseId: number; slotId: number | null }): RunSet[] {
    return sets.value.filter((s) => sameBlock(s, set))
  }

  // ---------------------------------------------------------------------------------------------
  // The copy on the device

  /** The device database; null before it opened, and for good when it cannot be used. */
  let device: DeviceStore | null = null
  let memoryOnly = false
  /** The sequence number of each set's entry as committed on the device. */
  const committed = new Map<string, number>()
  /** What changed since the last write: outbox entries by set, and the snapshot. */
  const dirtySets = new Set<string>()
  let snapshotDirty = false
  let changedAt: number | null = null
  let writeQueued = false
  let nextSeq = 1
  /** Set while loading assigns what the device held, so that is not written straight back. */
  let applyingLoaded = false

  /**
   * A copy without Vue's proxies (IndexedDB stores structured clones, and proxies are not cloneable).
   * The session's arrays keep reactive proxies of unchanged sets, so a shallow `toRaw` is not enough;
   * this walks the tree once, unwrapping and copying arrays and plain objects, which costs a fraction
   * of a JSON round trip (no string is built or parsed).
   */
  function plain<T>(value: T): T {
    const raw: unknown = toRaw(value)
    if (Array.isArray(raw)) return raw.map(plain) as T
    if (raw !== null && typeof raw === 'object' && Object.getPrototypeOf(raw) === Object.prototype) {
      const copy: Record<string, unknown> = {}
      for (const [key, item] of Object.entries(raw)) copy[key] = plain(item)
      return copy as T
    }
    return raw as T
  }

  function useMemoryOnly(reason: unknown) {
    memoryOnly = true
    device?.close()
    device = null
    storageWarning.value = 'This phone is not keeping sets on the device (private browsing?). Keep this page open until they are sent.'
    if (import.meta.env.DEV) console.warn('Runner storage falls back to memory:', reason)
  }

  /** Whether an entry may be sent: it is on the device (or the device cannot keep anything). */
  const isDurable = (item: QueuedSetLog) => memoryOnly || committed.get(item.setId) === item.seq

  function snapshotRecord(): RunnerSnapshot | null {
    if (!session.value) return null
    return plain({ id: session.value.id, session: session.value, jumpSetId: jumpSetId.value, rest: rest.value, savedAt: new Date().toISOString() })
  }

  /** Writes everything changed since the last write in one transaction. Never rejects. */
  async function writeChanges() {
    writeQueued = false
    const entries = [...dirtySets].map((setId) => ({ setId, entry: queue.value.find((i) => i.setId === setId) }))
    dirtySets.clear()
    const withSnapshot = snapshotDirty
    snapshotDirty = false
    const since = changedAt
    changedAt = null
    if (device) {
      try {
        await device.write({
          put: entries.flatMap((e) => (e.entry ? [plain(e.entry)] : [])),
          remove: entries.filter((e) => !e.entry).map((e) => e.setId),
          snapshot: withSnapshot ? snapshotRecord() : undefined,
        })
        if (since !== null && entries.length > 0) measureOutboxCommit(since)
      } catch (error) {
        useMemoryOnly(error) // e.g. quota exceeded: keep logging, keep sending, say so
      }
    }
    for (const { setId, entry } of entries) {
      if (entry) committed.set(setId, entry.seq)
      else committed.delete(setId)
    }
  }

  let writes: Promise<void> = Promise.resolve()

  /**
   * Queues one write for all changes of this moment. It runs in a task right after the next frame
   * is painted, not in this turn: copying the session and serialising it into the transaction is
   * main-thread work that would otherwise sit between a tap and the next set card. That keeps the
   * gap between a change and its commit to about one frame (a set is sent only after its commit, so
   * sending waits that frame too); changes made meanwhile join the same transaction. A caller that
   * needs the commit now (`whenSaved`, `flush`) hurries the queued write past that wait.
   */
  function scheduleWrite() {
    changedAt ??= typeof performance === 'undefined' ? null : performance.now()
    if (writeQueued) return
    writeQueued = true
    writes = writes.then(frameThenWrite)
  }

  /** Set when a caller needs the queued write committed now; cleared once it has run. */
  let hurried = false
  /** Ends the queued write's wait for the frame (set while it waits). */
  let endFrameWait: (() => void) | null = null

  async function frameThenWrite() {
    if (!hurried) {
      await new Promise<void>((resolve) => {
        endFrameWait = resolve
        void afterNextPaint().then(resolve)
      })
      endFrameWait = null
    }
    hurried = false
    await writeChanges()
  }

  /** The queued write (if any) runs now rather than after the next frame. */
  function hurryWrite() {
    if (!writeQueued) return
    hurried = true
    endFrameWait?.()
  }
  function markSet(setId: string) {
    dirtySets.add(setId)
    scheduleWrite()
  }
  watch(
    [session, jumpSetId, rest],
    () => {
      if (applyingLoaded) return
      snapshotDirty = true
      scheduleWrite()
    },
    { flush: 'sync' },
  )

  /** Lays unsent outbox entries of the session over a copy of its sets. */
  function withUnsent(copy: RunSession): RunSession {
    const merged = [...copy.sets]
    for (const item of queue.value.filter((i) => i.sessionId === copy.id)) {
      const index = merged.findIndex((s) => s.id === item.setId)
      // The log body carries no deload flag (the server plans deloads): the copy's set keeps its own.
      const local: RunSet = { ...item.body, id: item.setId, targetReps: item.body.targetReps ?? null, deload: merged[index]?.deload ?? false }
      if (index >= 0) merged[index] = local
      else merged.push(local)
    }
    return { ...copy, sets: merged }
  }

  /** Takes what the device held; anything this page changed before loading finished is newer. */
  function applyLoaded({ snapshot, outbox }: DeviceContents, onDevice: boolean) {
    const madeHere = new Set(queue.value.map((i) => i.setId))
    const earlier = outbox.filter((e) => !madeHere.has(e.setId))
    if (onDevice) for (const e of earlier) committed.set(e.setId, e.seq)
    let seq = outbox.reduce((max, e) => Math.max(max, e.seq), 0)
    // Entries made here are not written yet (writes wait for loading): number them after the device's.
    const later = queue.value.map((e) => ({ ...e, seq: (seq += 1) }))
    nextSeq = seq + 1
    queue.value = [...earlier, ...later]
    if (!session.value && snapshot) {
      applyingLoaded = true
      session.value = withUnsent(withCurrentFields(snapshot.session))
      jumpSetId.value = snapshot.jumpSetId
      rest.value = snapshot.rest
      applyingLoaded = false
    } else if (session.value && earlier.length > 0) {
      session.value = withUnsent(session.value)
    }
  }

  /** With no device database, the old localStorage copy is used in memory, its keys kept until those sets are sent. */
  function keepLegacyInMemory(legacy: LegacyRunData) {
    const { put = [], snapshot } = changesFromLegacy(legacy, { snapshot: null, outbox: [] }, new Date().toISOString())
    applyLoaded({ snapshot: snapshot ?? null, outbox: put }, false)
    const stopWatching = watch(
      pendingCount,
      (n) => {
        if (n > 0) return
        removeLegacyRunData()
        stopWatching()
      },
      { immediate: true },
    )
  }

  /** Opens the device database, moves the old localStorage copy into it once, and loads. */
  async function load(): Promise<void> {
    let legacy = readLegacyRunData()
    try {
      device = await openDeviceStore()
      let contents = await device.load()
      if (legacy) {
        await device.write(changesFromLegacy(legacy, contents, new Date().toISOString()))
        removeLegacyRunData() // only once the move has committed
        legacy = null
        contents = await device.load()
      }
      applyLoaded(contents, true)
    } catch (error) {
      useMemoryOnly(error)
      if (legacy) keepLegacyInMemory(legacy)
    }
  }

  const loading = load().catch(useMemoryOnly)
  writes = loading
  void loading.then(() => (queue.value.length > 0 ? sendSoon() : undefined))

  /** Resolves once the copy on the device has been loaded (at once on later calls). */
  function whenReady(): Promise<void> {
    return loading
  }

  /** Resolves once every change made so far has been written (or the device cannot keep it). */
  async function writesSettled(): Promise<void> {
    let current: Promise<void>
    do {
      current = writes
      await current
    } while (current !== writes)
  }

  /** Resolves once every change made so far is on the device (or the device cannot keep it), at once. */
  async function whenSaved(): Promise<void> {
    let current: Promise<void>
    do {
      current = writes
      hurryWrite()
      await current
    } while (current !== writes)
  }

  // ---------------------------------------------------------------------------------------------
  // Loading

  /** Takes the server's copy, with this device's unsent edits laid over it. */
  function adopt(server: RunSession) {
    if (session.value?.id !== server.id) {
      jumpSetId.value = null
      rest.value = null
    }
    session.value = withUnsent(server)
    if (jumpSetId.value && !session.value.sets.some((s) => s.id === jumpSetId.value)) jumpSetId.value = null
  }

  // Starting, resuming and finishing change what Train shows: its copy on the phone goes.
  async function start(input: Partial<StartSessionInput> = {}) {
    await loading
    adopt(await runApi.startSession(input, localDay()))
    forgetSavedToday()
    return session.value!
  }

  async function resume(id: number) {
    await loading
    adopt(await runApi.getRunSession(id))
    forgetSavedToday()
    return session.value!
  }

  /** The server's session in progress (null: none), for a device that has no local copy. */
  async function loadCurrent() {
    await loading
    const current = await runApi.getCurrentSession()
    if (current) adopt(current)
    else forget()
    return current
  }

  /** Forgets the local copy (after finishing, or when another user signs in on this device). */
  function forget() {
    session.value = null
    jumpSetId.value = null
    rest.value = null
  }

  // ---------------------------------------------------------------------------------------------
  // The outbox

  let sending: Promise<void> | null = null
  let retryTimer: ReturnType<typeof setTimeout> | null = null

  /** Puts the set's body in the outbox, replacing an earlier unsent edit of the same set. */
  function enqueue(set: RunSet) {
    if (!session.value) return
    const entry: QueuedSetLog = { seq: nextSeq++, sessionId: session.value.id, setId: set.id, body: toLogBody(set), attempts: 0 }
    queue.value = [...queue.value.filter((i) => i.setId !== set.id), entry]
    markSet(set.id)
    sendSoon()
  }

  const isSameEntry = (a: QueuedSetLog, b: QueuedSetLog) => a.setId === b.setId && a.seq === b.seq

  /** Takes an entry out once the server has answered for it (an edit made meanwhile stays). */
  function settle(item: QueuedSetLog) {
    if (!queue.value.some((i) => isSameEntry(i, item))) return
    queue.value = queue.value.filter((i) => !isSameEntry(i, item))
    markSet(item.setId)
  }

  /** Server answers: back-off targets recomputed from a top set, unless logged here since. */
  function applyUpdates(updated: RunSet[]) {
    if (!session.value) return
    const byId = new Map(updated.map((s) => [s.id, s]))
    session.value = {
      ...session.value,
      sets: session.value.sets.map((s) => {
        const fresh = byId.get(s.id)
        const unsent = queue.value.some((i) => i.setId === s.id)
        return fresh && isOpen(s) && !unsent ? { ...s, targetLoadKg: fresh.targetLoadKg } : s
      }),
    }
  }

  async function sendAll() {
    await loading
    while (queue.value.length > 0) {
      const item = queue.value[0]
      if (!isDurable(item)) {
        // Sent only once its entry has committed on the device: wait for the write under way (not
        // hurried: after a tap, that write waits for the next card's frame).
        await writesSettled()
        if (queue.value[0] && isSameEntry(queue.value[0], item) && !isDurable(item)) markSet(item.setId)
        continue
      }
      try {
        const result = await runApi.logSet(item.sessionId, item.setId, item.body)
        settle(item)
        sendError.value = null
        if (session.value?.id === item.sessionId) applyUpdates(result.updated)
      } catch (error) {
        if (isRetryable(error)) {
          // Counted in memory only (a reload starts the waits afresh), so no disk write per failed try.
          const attempts = item.attempts + 1
          queue.value = queue.value.map((i) => (isSameEntry(i, item) ? { ...i, attempts } : i))
          sendError.value = error instanceof Error ? error.message : 'Could not send'
          scheduleRetry(attempts)
          return
        }
        // Refused for good (e.g. the session was finished elsewhere): drop it and say so.
        settle(item)
        sendError.value = `A set was not saved: ${error instanceof Error ? error.message : 'refused'}`
      }
    }
  }

  function scheduleRetry(attempts: number) {
    if (retryTimer) clearTimeout(retryTimer)
    const delay = Math.min(MAX_RETRY_MS, 1000 * 2 ** (attempts - 1))
    retryTimer = setTimeout(() => {
      retryTimer = null
      void startSending()
    }, delay)
  }

  /**
   * Sends the queue in order now, also cutting short a retry's wait and the device write's wait for
   * a frame (signal is back, the page is shown again, or the lifter finishes); resolves when the
   * queue is empty or waiting for a retry.
   */
  function flush(): Promise<void> {
    hurryWrite()
    return startSending()
  }

  function startSending(): Promise<void> {
    if (!sending) {
      if (retryTimer) {
        clearTimeout(retryTimer)
        retryTimer = null
      }
      sending = sendAll().finally(() => {
        sending = null
      })
    }
    return sending
  }

  const browserOffline = () => typeof navigator !== 'undefined' && navigator.onLine === false

  /**
   * After a change: sends unless a send is under way (it takes the new entry in turn), a retry is
   * waiting (it sends the whole queue when it fires), or the browser knows it has no network (the
   * 'online' event sends). So taps with no signal do not each start a doomed request. Offline with
   * no retry waiting, a retry is set up, so the outbox is still tried with backoff should the
   * browser's online flag be wrong.
   */
  function sendSoon() {
    if (sending || retryTimer) return
    if (browserOffline()) {
      scheduleRetry(Math.max(1, queue.value[0]?.attempts ?? 1))
      return
    }
    void startSending()
  }

  if (typeof window !== 'undefined') useEventListener(window, 'online', () => void flush())
  onScopeDispose(() => {
    if (retryTimer) clearTimeout(retryTimer)
  })

  // ---------------------------------------------------------------------------------------------
  // Logging (instant; the PUT follows)

  function write(set: RunSet, changes: Partial<RunSet>): RunSet {
    const next: RunSet = { ...set, ...changes, editedAt: new Date().toISOString() }
    const current = session.value!
    const exists = current.sets.some((s) => s.id === set.id)
    session.value = {
      ...current,
      sets: exists ? current.sets.map((s) => (s.id === set.id ? next : s)) : [...current.sets, next],
    }
    enqueue(next)
    return next
  }

  /** Instant back-off preview from what the top set did (the server recomputes the same on its PUT). */
  function previewBackoffs(logged: RunSet) {
    const computeBackoff = backoffTarget
    if (!computeBackoff) {
      // Only if a top set is logged before the engine has loaded: preview it as soon as it has.
      void loadEngine().then(() => backoffTarget && previewBackoffs(logged))
      return
    }
    const top = session.value?.sets.find((s) => s.id === logged.id)
    const exercise = top && exerciseOf(top)
    if (!top || !exercise || top.loadKg === null || !top.reps || top.skipped) return
    session.value = {
      ...session.value!,
      sets: session.value!.sets.map((s) => {
        if (!sameBlock(s, top) || s.kind !== 'backoff' || !isOpen(s) || s.targetRepsMin === null || s.targetRepsMax === null) return s
        try {
          const target = computeBackoff({
            topLoadKg: top.loadKg!, topReps: top.reps!, topRir: top.failure ? 0 : (top.rir ?? 0),
            repsMin: s.targetRepsMin, repsMax: s.targetRepsMax, equipment: exercise.equipment,
            // A bodyweight lift's added load (or an assisted lift's help) is read with the body mass.
            reading: { mode: exercise.loadMode, bodyMassKg: exercise.bodyMassKg },
          })
          return { ...s, targetLoadKg: target.target.loadKg }
        } catch {
          return s
        }
      }),
    }
  }

  /** Logs (or re-logs) a set. A working set starts the rest clock; warm-ups get none. */
  function logSet(setId: string, result: SetResult): RunSet | null {
    const set = sets.value.find((s) => s.id === setId)
    if (!set) return null
    const wasCurrent = currentSet.value?.id === setId
    const logged = write(set, {
      loadKg: result.loadKg,
      reps: result.reps,
      rir: result.failure ? null : result.rir,
      failure: result.failure,
      skipped: false,
      note: result.note === undefined ? set.note : result.note,
      loggedAt: new Date().toISOString(),
    })
    if (logged.kind === 'top') previewBackoffs(logged)
    jumpSetId.value = null
    if (wasCurrent && logged.kind !== 'warmup') startRest(exerciseOf(logged)?.restSec ?? 120)
    else if (rest.value && rest.value.endsAt <= Date.now()) rest.value = null
    return logged
  }

  /** The set logged most recently (done or skipped), as undo takes it back. */
  const lastLogged = computed(() =>
    sets.value.filter((s) => s.loggedAt !== null).sort((a, b) => (a.editedAt ?? '').localeCompare(b.editedAt ?? '')).at(-1) ?? null,
  )

  function undoLast(): RunSet | null {
    const set = lastLogged.value
    if (!set) return null
    const undone = write(set, { loadKg: null, reps: null, rir: null, failure: false, skipped: false, loggedAt: null })
    rest.value = null
    jumpSetId.value = null
    return undone
  }

  function skipSet(setId: string) {
    const set = sets.value.find((s) => s.id === setId)
    if (!set) return
    write(set, { skipped: true, loggedAt: new Date().toISOString(), loadKg: null, reps: null, rir: null, failure: false })
    jumpSetId.value = null
  }

  function skipExercise(block: { exerciseId: number; slotId: number | null }) {
    for (const set of blockSets(block).filter(isOpen)) skipSet(set.id)
  }

  /** One more set like the exercise's last one, at the next free position of its block. */
  function addSet(block: { exerciseId: number; slotId: number | null }): RunSet | null {
    const own = blockSets(block)
    const model = [...own].reverse().find((s) => s.kind !== 'warmup') ?? own.at(-1)
    if (!model) return null
    const position = Math.max(...own.map((s) => s.position)) + 1
    if (Math.floor(position / BLOCK_STRIDE) !== Math.floor(model.position / BLOCK_STRIDE)) return null
    const added = write(
      // The lifter's own extra set: the server does not plan it as a deload, so neither does the card.
      { ...model, id: newUuid(), position, kind: model.kind === 'top' ? 'backoff' : model.kind, deload: false },
      { loadKg: null, reps: null, rir: null, failure: false, skipped: false, note: null, loggedAt: null },
    )
    jumpSetId.value = added.id
    return added
  }

  /**
   * The set caps one more working set of this exercise would pass (none: add it quietly): the
   * engine's caps across the session (sessionCapWarnings, over every exercise with its pattern,
   * role and hard sets, this one counting the new set) and the cap on one exercise's own sets.
   * Null when the engine cannot be loaded (no signal before it was cached): add without the check.
   */
  async function addSetCapWarnings(block: { exerciseId: number; slotId: number | null }): Promise<PlanWarning[] | null> {
    const engine = await Promise.all([import('@shared/domain/plan-checks'), import('@shared/domain/schemes')]).catch(() => null)
    const exercise = exerciseOf(block)
    if (!engine || !exercise) return null
    const [{ sessionCapWarnings }, { maxWorkingSets }] = engine
    const hardSets = (b: RunExercise) => blockSets(b).filter(isHardSet).length + (sameBlock(b, block) ? 1 : 0)
    const acrossSession = sessionCapWarnings(
      exercises.value.map((e) => ({ role: e.role, exerciseName: e.name, pattern: e.pattern, workingSets: hardSets(e) })),
    ).filter((w) => (w.code === 'PATTERN_OVER_SESSION_CAP' ? w.values.pattern === exercise.pattern : w.values.exercise === exercise.name))
    const sets = hardSets(exercise)
    const cap = maxWorkingSets(exercise.role)
    if (sets <= cap) return acrossSession
    const primary = exercise.role === 'compound_primary'
    const own: PlanWarning = {
      code: primary ? 'PRIMARY_COMPOUND_OVER_CAP' : 'MOVEMENT_OVER_CAP',
      message: `${exercise.name}: ${sets} working sets, the cap is ${cap}`,
      values: { exercise: exercise.name, sets, cap },
    }
    return [own, ...acrossSession]
  }

  function jumpTo(setId: string | null) {
    jumpSetId.value = setId
  }

  // ---------------------------------------------------------------------------------------------
  // Rest clock

  function startRest(durationSec: number, now = Date.now()) {
    rest.value = { endsAt: now + durationSec * 1000, durationSec }
  }

  function clearRest() {
    rest.value = null
  }

  // ---------------------------------------------------------------------------------------------
  // Changes the server makes (they need the sets already sent)

  async function sendPendingFirst() {
    await flush()
    if (queue.value.length > 0) {
      throw new ApiError(0, 'pending_sets', 'Some sets have not reached the server yet. Wait for signal, then try again.')
    }
  }

  async function swapExercise(block: { exerciseId: number; slotId: number | null }, toExerciseId: number) {
    await sendPendingFirst()
    jumpSetId.value = null
    adopt(await runApi.swapExercise(session.value!.id, { exerciseId: block.exerciseId, slotId: block.slotId, toExerciseId }))
  }

  async function addExercise(exerciseId: number, role: SlotRole) {
    await sendPendingFirst()
    adopt(await runApi.addExercise(session.value!.id, { exerciseId, role }))
  }

  /**
   * A lift with no starting load: the server keeps the lifter's recent set (or the ramp's hard set)
   * as its estimate and plans the block's open sets again, warm-ups included. Its sets are sent
   * first, so the new plan follows what was done; the answer replaces the session's sets.
   */
  async function startFromRecentSet(block: { exerciseId: number; slotId: number | null }, start: StartingSet) {
    await sendPendingFirst()
    const answer = await runApi.startFromRecentSet(session.value!.id, { exerciseId: block.exerciseId, slotId: block.slotId, ...start })
    jumpSetId.value = null
    adopt(answer)
  }

  /** Sends every set, completes the session, then forgets the local copy. */
  async function finish(note: string | null): Promise<SessionReport> {
    await sendPendingFirst()
    const report = await runApi.completeSession(session.value!.id, {
      completedAt: new Date().toISOString(),
      note: note && note.trim() ? note.trim() : null,
    })
    forget()
    forgetSavedToday()
    return report
  }

  return {
    session,
    jumpSetId,
    rest,
    queue,
    sendError,
    storageWarning,
    sets,
    exercises,
    pendingCount,
    openSets,
    allDone,
    currentSet,
    currentExercise,
    lastLogged,
    exerciseOf,
    blockSets,
    adopt,
    start,
    resume,
    loadCurrent,
    forget,
    whenReady,
    whenSaved,
    flush,
    logSet,
    undoLast,
    skipSet,
    skipExercise,
    addSet,
    addSetCapWarnings,
    jumpTo,
    startRest,
    clearRest,
    swapExercise,
    addExercise,
    startFromRecentSet,
    finish,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useRunStore, import.meta.hot))
