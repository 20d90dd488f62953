import { AsyncLocalStorage } from 'node:async_hooks'
import { Transaction, type Sequelize } from 'sequelize'

/** How long any connection waits for a write lock held elsewhere (a backup, a CLI, a statement). */
export const BUSY_TIMEOUT_MS = 5000

interface SqliteConnection {
  configure(option: 'busyTimeout', ms: number): void
}
interface SqliteConnectionManager {
  getConnection(options: unknown): Promise<SqliteConnection>
}

/**
 * Makes concurrent requests safe on SQLite.
 *
 * Sequelize's SQLite dialect opens a separate connection for every transaction, and only the
 * main connection gets the PRAGMAs run through `sequelize.query`. SQLite lets one writer in at a
 * time; two deferred transactions that both read and then write fail at once with SQLITE_BUSY
 * (waiting cannot help them), and node-sqlite3 would wait for a lock on its small thread pool.
 * So, in this process:
 * - managed transactions (`sequelize.transaction(async (t) => ...)`) run one at a time, in
 *   arrival order, and take the write lock when they begin (IMMEDIATE); a hot single-statement
 *   write on the main connection joins the same queue through `writeAlone`;
 * - every connection, the per-transaction ones included, waits up to BUSY_TIMEOUT_MS for a
 *   lock held by someone else instead of failing.
 * Reads outside transactions still run alongside (WAL lets readers and one writer overlap).
 * Found by the load benchmark: 10 concurrent set logs answered 500 "database is locked".
 */
export function makeConcurrencySafe(sequelize: Sequelize) {
  const manager = (sequelize as unknown as { connectionManager: SqliteConnectionManager }).connectionManager
  const getConnection = manager.getConnection.bind(manager)
  const configured = new WeakSet<SqliteConnection>()
  manager.getConnection = async (options) => {
    const connection = await getConnection(options)
    if (!configured.has(connection)) {
      connection.configure('busyTimeout', BUSY_TIMEOUT_MS)
      configured.add(connection)
    }
    return connection
  }

  const transaction = sequelize.transaction.bind(sequelize) as (...args: unknown[]) => Promise<unknown>
  sequelize.transaction = ((...args: unknown[]) => {
    const callback = args.find((a) => typeof a === 'function') as ((t: Transaction) => Promise<unknown>) | undefined
    // An unmanaged transaction (no callback) is committed by its caller: it cannot be queued here.
    // A transaction opened inside a queued one would wait for itself: let it through (and fail on the lock, loudly).
    if (!callback || insideQueued.getStore()) return transaction(...args)
    const options = typeof args[0] === 'object' && args[0] !== null ? args[0] : {}
    return writeAlone(sequelize, () => transaction({ type: Transaction.TYPES.IMMEDIATE, ...options }, callback))
  }) as Sequelize['transaction']
}

const insideQueued = new AsyncLocalStorage<true>()
const writeQueues = new WeakMap<Sequelize, Promise<unknown>>()

/**
 * Runs one write (a managed transaction, or a single statement on the main connection) after
 * every write queued before it in this process, so that it never waits for SQLite's lock on
 * node-sqlite3's small thread pool. Reads are not queued.
 */
export function writeAlone<T>(sequelize: Sequelize, write: () => Promise<T>): Promise<T> {
  if (insideQueued.getStore()) return write()
  const run = (writeQueues.get(sequelize) ?? Promise.resolve()).then(() => insideQueued.run(true, write))
  writeQueues.set(sequelize, run.catch(() => undefined))
  return run
}

interface WriteBatch {
  writes: Array<() => Promise<void>>
}
const openBatches = new WeakMap<Sequelize, WriteBatch>()

/**
 * Like `writeAlone`, for single statements on the main connection (autocommit): every such
 * write that arrives while the queue is busy joins one batch, and the batch's statements are
 * handed to node-sqlite3 together when its turn comes. One by one, each write waited for a
 * round trip through a busy event loop, which capped set logging at about 200 a second under
 * load; together, SQLite runs them back to back. Each statement still commits on its own, and
 * one that fails fails only its own caller.
 */
export function writeWithOthers<T>(sequelize: Sequelize, write: () => Promise<T>): Promise<T> {
  if (insideQueued.getStore()) return write()
  let batch = openBatches.get(sequelize)
  if (!batch) {
    const fresh: WriteBatch = { writes: [] }
    openBatches.set(sequelize, fresh)
    void writeAlone(sequelize, async () => {
      // From here on, new writes form the next batch.
      openBatches.delete(sequelize)
      await Promise.all(fresh.writes.map((run) => run()))
    })
    batch = fresh
  }
  return new Promise<T>((resolve, reject) => {
    batch.writes.push(() => write().then(resolve, reject))
  })
}