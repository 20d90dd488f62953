import { computed, ref } from 'vue'
import { acceptHMRUpdate, defineStore } from 'pinia'
import { StorageSerializers, useEventListener, useLocalStorage } from '@vueuse/core'
import { backoffTarget } from '@shared/domain/schemes'
import type { SlotRole } from '@shared/schemas/train.schema'
import type { LogSetInput, RunExercise, RunSession, RunSet, SessionReport, StartSessionInput } from '@shared/schemas/run.schema'
import { ApiError } from '@/api/client'
import * as runApi from '@/api/run'
import { localDay } from '@/utils/dates'
import { newUuid } from '@/utils/uuid'

/**
 * The session in progress on this device: its sets, the current set, the rest clock and the
 * outbox of set logs. Everything is kept in localStorage (written synchronously on every change),
 * so a reload or a crash resumes at the same set with the same rest clock.
 *
 * Logging never waits for the network: the store changes at once and the PUT goes into an ordered
 * queue, sent one at a time and retried with backoff on no signal or a 5xx. Each queued item
 * carries the set's full body with its `editedAt`, and the server is idempotent by the set's
 * UUID, so a retry can never make a duplicate.
 */

export const RUN_STORAGE_KEYS = {
  session: 'chalkline.run.session',
  jumpSetId: 'chalkline.run.jump',
  rest: 'chalkline.run.rest',
  queue: 'chalkline.run.queue',
} as const

/** The rest clock: it ends at `endsAt` (epoch ms); the cue flags keep each cue to once per rest. */
export interface RestClockState {
  endsAt: number
  durationSec: number
  warned?: boolean
  ended?: boolean
}

/** One set PUT waiting to be sent. */
export interface QueuedSetLog {
  sessionId: number
  setId: string
  body: LogSetInput
  attempts: number
}

/** What the lifter did in a set (load in kg). */
export interface SetResult {
  loadKg: number | null
  reps: number | null
  rir: number | null
  failure: boolean
  note?: string | null
}

/** Positions are per-exercise blocks of 100 (block i uses i*100 .. i*100+99). */
const BLOCK_STRIDE = 100
const MAX_RETRY_MS = 30_000

const isOpen = (s: RunSet) => s.loggedAt === null && !s.skipped
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

export const useRunStore = defineStore('run', () => {
  // Written synchronously on every change. Not listening to storage events: @vueuse pauses its
  // writer until the next tick after each such event, which would drop a second write in the
  // same tick (and two tabs running one session should not overwrite each other anyway).
  const persist = { flush: 'sync' as const, listenToStorageChanges: false }
  const asObject = { ...persist, serializer: StorageSerializers.object }
  const session = useLocalStorage<RunSession | null>(RUN_STORAGE_KEYS.session, null, asObject)
  const jumpSetId = useLocalStorage<string | null>(RUN_STORAGE_KEYS.jumpSetId, null, persist)
  const rest = useLocalStorage<RestClockState | null>(RUN_STORAGE_KEYS.rest, null, asObject)
  const queue = useLocalStorage<QueuedSetLog[]>(RUN_STORAGE_KEYS.queue, [], persist)
  /** The last refusal or failure from the server while sending, for a notice. */
  const sendError = ref<string | null>(null)

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
  // Loading

  /** Takes the server's copy, with this device's unsent edits laid over it. */
  function adopt(server: RunSession) {
    if (session.value?.id !== server.id) {
      jumpSetId.value = null
      rest.value = null
    }
    const merged = [...server.sets]
    for (const item of queue.value.filter((i) => i.sessionId === server.id)) {
      const index = merged.findIndex((s) => s.id === item.setId)
      const local: RunSet = { ...item.body, id: item.setId, targetReps: item.body.targetReps ?? null }
      if (index >= 0) merged[index] = local
      else merged.push(local)
    }
    session.value = { ...server, sets: merged }
    if (jumpSetId.value && !merged.some((s) => s.id === jumpSetId.value)) jumpSetId.value = null
  }

  async function start(input: Partial<StartSessionInput> = {}) {
    adopt(await runApi.startSession(input, localDay()))
    return session.value!
  }

  async function resume(id: number) {
    adopt(await runApi.getRunSession(id))
    return session.value!
  }

  /** The server's session in progress (null: none), for a device that has no local copy. */
  async function loadCurrent() {
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

  function enqueue(set: RunSet) {
    if (!session.value) return
    queue.value = [...queue.value, { sessionId: session.value.id, setId: set.id, body: toLogBody(set), attempts: 0 }]
    void flush()
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
    while (queue.value.length > 0) {
      const item = queue.value[0]
      try {
        const result = await runApi.logSet(item.sessionId, item.setId, item.body)
        queue.value = queue.value.slice(1)
        sendError.value = null
        if (session.value?.id === item.sessionId) applyUpdates(result.updated)
      } catch (error) {
        if (isRetryable(error)) {
          const attempts = item.attempts + 1
          queue.value = [{ ...item, attempts }, ...queue.value.slice(1)]
          sendError.value = error instanceof Error ? error.message : 'Could not send'
          scheduleRetry(attempts)
          return
        }
        // Refused for good (e.g. the session was finished elsewhere): drop it and say so.
        queue.value = queue.value.slice(1)
        sendError.value = `A set was not saved: ${error instanceof Error ? error.message : 'refused'}`
      }
    }
  }

  function scheduleRetry(attempts: number) {
    if (retryTimer) clearTimeout(retryTimer)
    const delay = Math.min(MAX_RETRY_MS, 1000 * 2 ** (attempts - 1))
    retryTimer = setTimeout(() => {
      retryTimer = null
      void flush()
    }, delay)
  }

  /** Sends the queue in order; resolves when it is empty or waiting for a retry. */
  function flush(): Promise<void> {
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

  if (typeof window !== 'undefined') useEventListener(window, 'online', () => void flush())

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
  function previewBackoffs(top: RunSet) {
    const exercise = exerciseOf(top)
    if (!exercise || top.loadKg === null || !top.reps || top.skipped) return
    session.value = {
      ...session.value!,
      sets: session.value!.sets.map((s) => {
        if (!sameBlock(s, top) || s.kind !== 'backoff' || !isOpen(s) || s.targetRepsMin === null || s.targetRepsMax === null) return s
        try {
          const target = backoffTarget({
            topLoadKg: top.loadKg!, topReps: top.reps!, topRir: top.failure ? 0 : (top.rir ?? 0),
            repsMin: s.targetRepsMin, repsMax: s.targetRepsMax, equipment: exercise.equipment,
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
      { ...model, id: newUuid(), position, kind: model.kind === 'top' ? 'backoff' : model.kind },
      { loadKg: null, reps: null, rir: null, failure: false, skipped: false, note: null, loggedAt: null },
    )
    jumpSetId.value = added.id
    return added
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

  /** Sends every set, completes the session, then forgets the local copy. */
  async function finish(note: string | null): Promise<SessionReport> {
    await sendPendingFirst()
    const report = await runApi.completeSession(session.value!.id, {
      completedAt: new Date().toISOString(),
      note: note && note.trim() ? note.trim() : null,
    })
    forget()
    return report
  }

  return {
    session,
    jumpSetId,
    rest,
    queue,
    sendError,
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
    flush,
    logSet,
    undoLast,
    skipSet,
    skipExercise,
    addSet,
    jumpTo,
    startRest,
    clearRest,
    swapExercise,
    addExercise,
    finish,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useRunStore, import.meta.hot))
