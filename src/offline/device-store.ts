import { openDB, type DBSchema, type IDBPDatabase } from 'idb'
import type { LogSetInput, RunSession } from '@shared/schemas/run.schema'

/**
 * What this phone keeps of a session in progress, in IndexedDB (database `chalkline`):
 *
 * - `outbox`: one entry per set waiting for the server, keyed by the set's UUID (a later edit of
 *   the same set replaces its entry), with a sequence number that only grows (index `bySeq`): the
 *   order in which entries are sent.
 * - `sessions`: the runner's copy of the session in progress (sets, exercises, targets, last
 *   results, the rest clock and the set the lifter jumped to), keyed by the session's id. The
 *   phone runs one session at a time, so a new snapshot replaces any other.
 *
 * Every change goes in one transaction and the returned promise resolves once it has committed.
 * Only this module touches IndexedDB; the runner's Pinia store (`src/stores/run.ts`) sits over it.
 */

export const DEVICE_DB_NAME = 'chalkline'
const DEVICE_DB_VERSION = 1

/** The rest clock: it ends at `endsAt` (epoch ms); the cue flags keep each cue to once per rest. */
export interface RestClockState {
  endsAt: number
  durationSec: number
  warned?: boolean
  ended?: boolean
}

/** One set PUT waiting to be sent: the set's full body, with the client's edit time. */
export interface OutboxEntry {
  /** Sending order: grows with every new entry, also when an edit replaces a set's entry. */
  seq: number
  sessionId: number
  setId: string
  body: LogSetInput
  attempts: number
}

/** The runner's copy of the session in progress. */
export interface RunnerSnapshot {
  id: number
  session: RunSession
  jumpSetId: string | null
  rest: RestClockState | null
  savedAt: string
}

interface ChalklineDB extends DBSchema {
  outbox: { key: string; value: OutboxEntry; indexes: { bySeq: number } }
  sessions: { key: number; value: RunnerSnapshot }
}

/** The changes of one transaction. */
export interface DeviceChanges {
  /** Entries to write; each replaces the entry of the same set. */
  put?: OutboxEntry[]
  /** Sets whose entries go (acknowledged by the server, or refused for good). */
  remove?: string[]
  /** A snapshot replaces every other one; null removes them all; undefined leaves them. */
  snapshot?: RunnerSnapshot | null
}

export interface DeviceContents {
  snapshot: RunnerSnapshot | null
  /** In sending order. */
  outbox: OutboxEntry[]
}

export interface DeviceStore {
  load(): Promise<DeviceContents>
  /** Writes all the changes in one transaction; resolves once it has committed. */
  write(changes: DeviceChanges): Promise<void>
  close(): void
}

/** IndexedDB is missing (some private modes), refused, or did not open in time. */
export class DeviceStorageUnavailable extends Error {
  override name = 'DeviceStorageUnavailable'
}

/** Opens (creating on first use) the device database. Rejects with DeviceStorageUnavailable. */
export async function openDeviceStore({ timeoutMs = 5_000 }: { timeoutMs?: number } = {}): Promise<DeviceStore> {
  if (typeof indexedDB === 'undefined' || indexedDB === null) throw new DeviceStorageUnavailable('IndexedDB is not available')
  let timer: ReturnType<typeof setTimeout> | undefined
  let timedOut = false
  let db: IDBPDatabase<ChalklineDB>
  try {
    const opening = openDB<ChalklineDB>(DEVICE_DB_NAME, DEVICE_DB_VERSION, {
      upgrade(database, oldVersion) {
        if (oldVersion < 1) {
          database.createObjectStore('outbox', { keyPath: 'setId' }).createIndex('bySeq', 'seq')
          database.createObjectStore('sessions', { keyPath: 'id' })
        }
      },
    })
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new DeviceStorageUnavailable(`IndexedDB did not open within ${timeoutMs} ms`)), timeoutMs)
    })
    // An open that succeeds after the timeout is closed again, so it cannot block a later version.
    opening.then((late) => timedOut && late.close(), () => undefined)
    db = await Promise.race([opening, timeout]).catch((error: unknown) => {
      timedOut = true
      throw error
    })
  } catch (error) {
    if (error instanceof DeviceStorageUnavailable) throw error
    throw new DeviceStorageUnavailable(error instanceof Error ? `${error.name}: ${error.message}` : String(error))
  } finally {
    clearTimeout(timer)
  }

  return {
    async load() {
      const tx = db.transaction(['outbox', 'sessions'], 'readonly')
      const [outbox, snapshots] = await Promise.all([
        tx.objectStore('outbox').index('bySeq').getAll(),
        tx.objectStore('sessions').getAll(),
        tx.done,
      ])
      const snapshot = snapshots.sort((a, b) => a.savedAt.localeCompare(b.savedAt)).at(-1) ?? null
      return { snapshot, outbox }
    },

    async write({ put = [], remove = [], snapshot }) {
      // A new or edited set is flushed to disk before the commit is reported ('strict'), so it also
      // survives the phone losing power; acknowledgements and snapshot-only changes need not wait.
      const tx = db.transaction(['outbox', 'sessions'], 'readwrite', { durability: put.length > 0 ? 'strict' : 'default' })
      const outbox = tx.objectStore('outbox')
      const sessions = tx.objectStore('sessions')
      const requests: Promise<unknown>[] = []
      try {
        for (const setId of remove) requests.push(outbox.delete(setId))
        for (const entry of put) requests.push(outbox.put(entry))
        if (snapshot !== undefined) {
          requests.push(sessions.clear())
          if (snapshot) requests.push(sessions.put(snapshot))
        }
        // Commit now rather than after a round of success events on the main thread, which is busy
        // drawing the next set right after a log (IndexedDB 3.0; older browsers auto-commit).
        if (typeof tx.commit === 'function') tx.commit()
      } catch (error) {
        tx.abort() // all or nothing
        requests.forEach((r) => r.catch(() => undefined))
        tx.done.catch(() => undefined)
        throw error
      }
      await Promise.all([...requests, tx.done])
    },

    close() {
      db.close()
    },
  }
}
