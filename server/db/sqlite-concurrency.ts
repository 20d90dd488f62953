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
 *   arrival order, and take the write lock when they begin (IMMEDIATE);
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
  const insideQueued = new AsyncLocalStorage<true>()
  let queue: Promise<unknown> = Promise.resolve()
  sequelize.transaction = ((...args: unknown[]) => {
    const callback = args.find((a) => typeof a === 'function') as ((t: Transaction) => Promise<unknown>) | undefined
    // An unmanaged transaction (no callback) is committed by its caller: it cannot be queued here.
    // A transaction opened inside a queued one would wait for itself: let it through (and fail on the lock, loudly).
    if (!callback || insideQueued.getStore()) return transaction(...args)
    const options = typeof args[0] === 'object' && args[0] !== null ? args[0] : {}
    const run = queue.then(() =>
      insideQueued.run(true, () => transaction({ type: Transaction.TYPES.IMMEDIATE, ...options }, callback)),
    )
    queue = run.catch(() => undefined)
    return run
  }) as Sequelize['transaction']
}
