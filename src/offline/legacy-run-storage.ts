import type { LogSetInput, RunSession } from '@shared/schemas/run.schema'
import type { DeviceChanges, DeviceContents, OutboxEntry, RestClockState, RunnerSnapshot } from './device-store'

/**
 * Earlier versions kept the runner in localStorage under these keys. A phone that updates in the
 * middle of a session still has them: on load they are moved into IndexedDB once, then deleted.
 */
export const LEGACY_RUN_KEYS = {
  session: 'chalkline.run.session',
  jumpSetId: 'chalkline.run.jump',
  rest: 'chalkline.run.rest',
  queue: 'chalkline.run.queue',
} as const

/** One item of the old queue (it appended every edit, so a set can appear more than once). */
export interface LegacyQueuedSetLog {
  sessionId: number
  setId: string
  body: LogSetInput
  attempts: number
}

export interface LegacyRunData {
  session: RunSession | null
  jumpSetId: string | null
  rest: RestClockState | null
  queue: LegacyQueuedSetLog[]
}

function parseJson(text: string | null): unknown {
  if (text === null) return null
  try {
    return JSON.parse(text)
  } catch {
    return null
  }
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

function isQueued(v: unknown): v is LegacyQueuedSetLog {
  return isObject(v) && typeof v.sessionId === 'number' && typeof v.setId === 'string' && isObject(v.body) && typeof v.body.editedAt === 'string'
}

function storageOrNull(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage
  } catch {
    return null // access to storage can throw when the browser blocks it
  }
}

/** The old keys' contents, or null when none of them is there. Unreadable values count as absent. */
export function readLegacyRunData(storage: Storage | null = storageOrNull()): LegacyRunData | null {
  if (!storage) return null
  let raw: Record<keyof typeof LEGACY_RUN_KEYS, string | null>
  try {
    raw = {
      session: storage.getItem(LEGACY_RUN_KEYS.session),
      jumpSetId: storage.getItem(LEGACY_RUN_KEYS.jumpSetId),
      rest: storage.getItem(LEGACY_RUN_KEYS.rest),
      queue: storage.getItem(LEGACY_RUN_KEYS.queue),
    }
  } catch {
    return null
  }
  if (Object.values(raw).every((v) => v === null)) return null
  const session = parseJson(raw.session)
  const rest = parseJson(raw.rest)
  const queue = parseJson(raw.queue)
  return {
    session: isObject(session) && typeof session.id === 'number' && Array.isArray(session.sets) ? (session as unknown as RunSession) : null,
    // The old store wrote this one as a plain string.
    jumpSetId: raw.jumpSetId && raw.jumpSetId !== 'null' ? raw.jumpSetId : null,
    rest: isObject(rest) && typeof rest.endsAt === 'number' && typeof rest.durationSec === 'number' ? (rest as unknown as RestClockState) : null,
    queue: Array.isArray(queue) ? queue.filter(isQueued) : [],
  }
}

export function removeLegacyRunData(storage: Storage | null = storageOrNull()) {
  if (!storage) return
  try {
    for (const key of Object.values(LEGACY_RUN_KEYS)) storage.removeItem(key)
  } catch {
    // storage blocked: nothing to remove
  }
}

const editTime = (body: LogSetInput) => Date.parse(body.editedAt) || 0

/**
 * The latest edit of each set (by edit time; the later item on a tie), at the place in the queue
 * where that edit was made.
 */
export function latestPerSet(queue: LegacyQueuedSetLog[]): LegacyQueuedSetLog[] {
  const chosen = new Map<string, { item: LegacyQueuedSetLog; index: number }>()
  queue.forEach((item, index) => {
    const held = chosen.get(item.setId)
    if (!held || editTime(item.body) >= editTime(held.item.body)) chosen.set(item.setId, { item, index })
  })
  return [...chosen.values()].sort((a, b) => a.index - b.index).map((c) => c.item)
}

/**
 * What to write so the old data joins what the device database already holds: queued sets after
 * the entries already there (unless the database has a later edit of the same set), and the old
 * snapshot only when the database has none.
 */
export function changesFromLegacy(legacy: LegacyRunData, current: DeviceContents, savedAt: string): DeviceChanges {
  let seq = current.outbox.reduce((max, e) => Math.max(max, e.seq), 0)
  const onDevice = new Map(current.outbox.map((e) => [e.setId, e]))
  const put: OutboxEntry[] = latestPerSet(legacy.queue)
    .filter((item) => {
      const held = onDevice.get(item.setId)
      return !held || editTime(held.body) < editTime(item.body)
    })
    .map((item) => ({ seq: (seq += 1), sessionId: item.sessionId, setId: item.setId, body: item.body, attempts: item.attempts ?? 0 }))
  const snapshot: RunnerSnapshot | undefined =
    !current.snapshot && legacy.session
      ? { id: legacy.session.id, session: legacy.session, jumpSetId: legacy.jumpSetId, rest: legacy.rest, savedAt }
      : undefined
  return { put, snapshot }
}
