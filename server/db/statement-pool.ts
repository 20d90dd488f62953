import type { Model, ModelStatic, Sequelize } from 'sequelize'

interface SqliteStatement {
  all(params: object, callback: (err: Error | null, rows: Record<string, unknown>[]) => void): unknown
  run(params: object, callback: (this: { changes: number }, err: Error | null) => void): unknown
  finalize(callback: (err?: Error | null) => void): unknown
}
interface SqliteDatabase {
  prepare(sql: string, callback: (err: Error | null) => void): SqliteStatement
}
interface SqliteConnectionManager {
  getConnection(options: object): Promise<SqliteDatabase>
}

/**
 * One SQL statement prepared once on the main SQLite connection (node-sqlite3, under Sequelize),
 * for the statements every set log runs. Through Sequelize each statement was prepared,
 * formatted, logged and turned into model objects again on every call: about half of a set
 * log's CPU time. A statement runs one call at a time, so concurrent callers each take an idle
 * copy, or prepare another, instead of queueing behind one. Reads step to the end (`all`),
 * which leaves no statement holding a read snapshot open on the shared connection.
 */
export class PreparedStatement {
  private readonly idle: SqliteStatement[] = []
  private readonly prepared = new Set<SqliteStatement>()
  private closed = false

  constructor(
    private readonly sequelize: Sequelize,
    private readonly sql: string,
  ) {}

  /** Every row, with SQLite's own values (snake_case columns, dates as text, booleans as 0/1). */
  async all(params: Record<string, unknown>): Promise<Record<string, unknown>[]> {
    this.log(params)
    const statement = await this.take()
    try {
      return await new Promise((resolve, reject) => {
        statement.all(bindable(params), (err, rows) => (err ? reject(err) : resolve(rows)))
      })
    } finally {
      this.give(statement)
    }
  }

  /** Runs a write; resolves with the number of rows it changed. */
  async run(params: Record<string, unknown>): Promise<number> {
    this.log(params)
    const statement = await this.take()
    try {
      return await new Promise((resolve, reject) => {
        statement.run(bindable(params), function (err) {
          if (err) reject(err)
          else resolve(this.changes)
        })
      })
    } finally {
      this.give(statement)
    }
  }

  /** Finalizes every copy: SQLite will not close a connection with statements still open. */
  async close() {
    this.closed = true
    const all = [...this.prepared]
    this.prepared.clear()
    this.idle.length = 0
    await Promise.all(all.map((s) => new Promise<void>((resolve) => s.finalize(() => resolve()))))
  }

  /** Through Sequelize's logging hook, as its own statements are (the query counts read it). */
  private log(bind: Record<string, unknown>) {
    const logging = (this.sequelize as unknown as { options: { logging?: unknown } }).options.logging
    if (typeof logging === 'function') logging(`Executing (default): ${this.sql}`, { bind })
  }

  private async take(): Promise<SqliteStatement> {
    if (this.closed) throw new Error('This database is closed')
    const ready = this.idle.pop()
    if (ready) return ready
    const manager = (this.sequelize as unknown as { connectionManager: SqliteConnectionManager }).connectionManager
    const db = await manager.getConnection({})
    const statement = await new Promise<SqliteStatement>((resolve, reject) => {
      const s = db.prepare(this.sql, (err) => (err ? reject(err) : resolve(s)))
    })
    this.prepared.add(statement)
    return statement
  }

  private give(statement: SqliteStatement) {
    if (this.prepared.has(statement)) this.idle.push(statement)
  }
}

/** node-sqlite3 names bound parameters with their prefix; it stores booleans as 1/0 itself. */
function bindable(params: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(params).map(([k, v]) => [`$${k}`, v]))
}

const bySql = new WeakMap<Sequelize, Map<string, PreparedStatement>>()

/**
 * The prepared statement for `sql` on this database, made on first use. The first one made on
 * a database also makes its `close()` finalize them all before Sequelize closes the connections.
 */
export function prepared(sequelize: Sequelize, sql: string): PreparedStatement {
  let statements = bySql.get(sequelize)
  if (!statements) {
    const all = new Map<string, PreparedStatement>()
    bySql.set(sequelize, all)
    const close = sequelize.close.bind(sequelize)
    sequelize.close = async () => {
      await Promise.all([...all.values()].map((s) => s.close()))
      return close()
    }
    statements = all
  }
  let statement = statements.get(sql)
  if (!statement) statements.set(sql, (statement = new PreparedStatement(sequelize, sql)))
  return statement
}

/**
 * A model instance from a raw row, as Sequelize itself reads one on SQLite: columns mapped to
 * attributes, text dates to Date and 0/1 to booleans; the instance is unchanged and not new.
 * Only the types these rows hold are known here: another type is an error, not a guess.
 */
export function rowToModel<M extends Model>(model: ModelStatic<M>, row: Record<string, unknown>): M {
  const values: Record<string, unknown> = {}
  for (const [name, attribute] of Object.entries(model.getAttributes())) {
    const column = attribute.field ?? name
    if (!(column in row)) continue
    const value = row[column]
    const type = (attribute.type as { key?: string }).key
    if (value === null || value === undefined) values[name] = null
    // As Sequelize's SQLite DATE parser: text without an offset is in its time zone (+00:00).
    else if (type === 'DATE') values[name] = new Date(String(value).includes('+') ? String(value) : `${String(value)}+00:00`)
    else if (type === 'BOOLEAN') values[name] = value === 1 || value === true || value === '1'
    else if (type === 'INTEGER' || type === 'STRING' || type === 'TEXT' || type === 'DOUBLE' || type === 'FLOAT') values[name] = value
    else throw new Error(`rowToModel: ${model.name}.${name} has type ${type}, which it does not read`)
  }
  return model.build(values as never, { isNewRecord: false, raw: true })
}
