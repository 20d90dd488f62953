import type { Sequelize } from 'sequelize'

type Callback = (this: unknown, err: Error | null, rows?: unknown) => void
interface SqliteConnection {
  all(sql: string, ...rest: unknown[]): unknown
  run(sql: string, ...rest: unknown[]): unknown
}
interface SqliteConnectionManager {
  getConnection(options: unknown): Promise<SqliteConnection>
}

const TABLE_INFO = /^PRAGMA table_info\(`?([^`)]+)`?\)$/i
const SCHEMA_CHANGE = /^\s*(CREATE|ALTER|DROP)\b/i

/**
 * Sequelize's SQLite dialect asks SQLite for a table's column types (`PRAGMA table_info`) before
 * every SELECT that names a table, to parse dates and booleans: one more trip through
 * node-sqlite3's thread pool and back through the event loop for each read. The answers change
 * only with the schema, so they are kept here per database and dropped as soon as any statement
 * creates, alters or drops something (migrations, tests). Found in the set-log benchmark: the
 * sign-in check before each set paid for two round trips instead of one.
 */
export function cacheTableInfo(sequelize: Sequelize) {
  const manager = (sequelize as unknown as { connectionManager: SqliteConnectionManager }).connectionManager
  const getConnection = manager.getConnection.bind(manager)
  const columns = new Map<string, unknown>()
  const wrapped = new WeakSet<SqliteConnection>()

  manager.getConnection = async (options) => {
    const connection = await getConnection(options)
    if (wrapped.has(connection)) return connection
    wrapped.add(connection)
    const all = connection.all.bind(connection)
    const run = connection.run.bind(connection)
    connection.all = (sql: string, ...rest: unknown[]) => {
      if (SCHEMA_CHANGE.test(sql)) columns.clear()
      const table = TABLE_INFO.exec(sql)?.[1]
      const callback = rest.length === 1 && typeof rest[0] === 'function' ? (rest[0] as Callback) : undefined
      if (table === undefined || !callback) return all(sql, ...rest)
      const known = columns.get(table)
      if (known) {
        process.nextTick(() => callback.call(connection, null, known))
        return connection
      }
      return all(sql, function (this: unknown, err: Error | null, rows?: unknown) {
        if (!err) columns.set(table, rows)
        callback.call(this, err, rows)
      })
    }
    connection.run = (sql: string, ...rest: unknown[]) => {
      if (SCHEMA_CHANGE.test(sql)) columns.clear()
      return run(sql, ...rest)
    }
    return connection
  }
}
