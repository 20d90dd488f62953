/**
 * SQL per request on the large demo club: how many statements each hot request issues (counted
 * with Sequelize's logging hook, against a fixed budget per request so an N+1 shows), the
 * EXPLAIN QUERY PLAN of every statement they run, and the median time of each request with the
 * query indexes of migration 0005 and without them (the same database, 0005 rolled back).
 *
 * Run alone: `npm run bench -- --only sql --no-build`, or `tsx tests/bench/sql.ts [database]`
 * on an existing database (e.g. one made by `npm run seed:large`; it is changed: a session is
 * started, sets are logged, and 0005 is rolled back and applied again).
 */
import { copyFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs'
import { availableParallelism, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { randomUUID } from 'node:crypto'
import { fileURLToPath, pathToFileURL } from 'node:url'
import type { Express } from 'express'
import { QueryTypes, type Sequelize } from 'sequelize'
import request from 'supertest'
import { createApp } from '../../server/app'
import { loadConfig, type AppConfig } from '../../server/config'
import { openDatabase, SessionModel, UserModel } from '../../server/db'
import { createMigrator, migrate } from '../../server/db/migrate'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createMailer } from '../../server/mail/mailer'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { budget, median, type BenchContext, type BenchPart, type Budget } from './bench-types'

// ---------------------------------------------------------------------------------------------
// Counting queries

export interface LoggedQuery {
  sql: string
  /** Bound values, when the statement has placeholders ($1 ... or $name). */
  bind?: unknown
  /** Ran on a transaction's connection (Sequelize's SQLite dialect opens one per transaction). */
  inTransaction: boolean
  /** Time in SQLite as Sequelize measures it (its `benchmark` option), when it was on. */
  ms?: number
}

export interface QueryLog {
  /** Pass as Sequelize's `logging` option (or let `attachQueryLog` set it). */
  logging: (message: string, ...rest: unknown[]) => void
  /** Statements since the last `take()`. */
  take(): LoggedQuery[]
}

/** Records every statement Sequelize runs (its `logging` hook sees each one before it runs). */
export function createQueryLog(): QueryLog {
  let queries: LoggedQuery[] = []
  return {
    // Without Sequelize's `benchmark` option: (message, options) before the statement runs;
    // with it: (message, elapsed ms, options) after it ran.
    logging(message: string, ...rest: unknown[]) {
      const match = /^Execut(?:ing|ed) \(([^)]*)\): ([\s\S]*)$/.exec(message)
      if (!match) return
      const ms = typeof rest[0] === 'number' ? rest[0] : undefined
      const bind = (rest.find((r) => typeof r === 'object' && r !== null) as { bind?: unknown } | undefined)?.bind
      queries.push({ sql: match[2], bind, inTransaction: match[1] !== 'default', ms })
    },
    take() {
      const taken = queries
      queries = []
      return taken
    },
  }
}

/**
 * Starts recording the statements of an open Sequelize instance (its `logging` and `benchmark`
 * options are read per query); with `timed`, each statement's time in SQLite too.
 */
export function attachQueryLog(sequelize: Sequelize, timed = false): QueryLog {
  const log = createQueryLog()
  const options = (sequelize as unknown as { options: { logging: QueryLog['logging']; benchmark: boolean } }).options
  options.logging = log.logging
  options.benchmark = timed
  return log
}

/** Runs one request (or any async work) and returns the statements it issued, start to end. */
export async function countQueries<T>(log: QueryLog, work: () => PromiseLike<T>): Promise<{ result: T; queries: LoggedQuery[] }> {
  log.take()
  const result = await work()
  return { result, queries: log.take() }
}

const isTransactionControl = (sql: string) => /^(BEGIN|COMMIT|ROLLBACK|SAVEPOINT|RELEASE)\b/i.test(sql.trim())

// ---------------------------------------------------------------------------------------------
// The app over an existing database, in this process

export interface InstrumentedApp {
  app: Express
  config: AppConfig
  sequelize: Sequelize
  log: QueryLog
  close(): Promise<void>
}

/** The real app (createApp) over an existing SQLite file, with every statement recorded. */
export async function openInstrumentedApp(databasePath: string): Promise<InstrumentedApp> {
  const config = loadConfig({ NODE_ENV: 'test', DATABASE_PATH: databasePath, SEED_DEMO: 'false', BCRYPT_COST: '10' })
  const sequelize = await openDatabase(config.databasePath)
  await migrate(sequelize)
  const log = attachQueryLog(sequelize, true)
  const smtp = await startFakeSmtp(config.mail.outboxDir)
  const app = createApp(config, { mailer: createMailer(config, smtp.port) })
  log.take()
  return {
    app, config, sequelize, log,
    async close() {
      await smtp.close()
      await sequelize.close()
    },
  }
}

// ---------------------------------------------------------------------------------------------
// The hot requests and their budgets

export interface HotWorld {
  app: Express
  coach: { Authorization: string }
  lifter: { Authorization: string }
  lifterId: number
  today: string
  /** The lifter's latest completed session (the logbook detail opens it). */
  completedSessionId: number
  /** The lifter's started session, once "start" has run. */
  session?: RunSession
  /** Planned sets of that session, logged in turn by "log a planned set". */
  nextPlanned: number
  nextPosition: number
}

export interface HotRequest {
  name: string
  /** The most statements (transaction control included) the request may issue, whatever the data size. */
  budget: number
  /** Timed over many calls (false: it changes state so it runs once). */
  repeatable: boolean
  send(world: HotWorld): PromiseLike<request.Response>
}

function setBody(set: RunSet, done: boolean) {
  const now = new Date().toISOString()
  return {
    exerciseId: set.exerciseId, slotId: set.slotId, position: set.position, kind: set.kind,
    targetLoadKg: set.targetLoadKg, targetRepsMin: set.targetRepsMin, targetRepsMax: set.targetRepsMax, targetReps: set.targetReps,
    toFailure: set.toFailure, targetRir: set.targetRir, loadKg: set.targetLoadKg, reps: done ? (set.targetRepsMin ?? 8) : null,
    rir: set.toFailure ? null : set.targetRir, failure: set.toFailure, skipped: false, note: null, loggedAt: done ? now : null, editedAt: now,
  }
}

/**
 * What a lifter between sets and a coach at the desk do most, in this order (the start and the
 * finish change state, so they run once). Budgets are fixed numbers from the code's own query
 * structure: the same whether a coach has 3 athletes or 150, or a lifter 40 sessions or 400.
 */
export const HOT_REQUESTS: HotRequest[] = [
  {
    name: "GET /api/train/today (lifter's next session)",
    // The plan, the history, taken steps, and the lifter's body mass, slot adjustments and starting estimates.
    budget: 12,
    repeatable: true,
    send: (w) => request(w.app).get('/api/train/today').query({ date: w.today, tzOffset: 0 }).set(w.lifter),
  },
  {
    name: 'POST /api/sessions (start today)',
    budget: 24,
    repeatable: false,
    send: (w) => request(w.app).post('/api/sessions').query({ date: w.today, tzOffset: 0 }).set(w.lifter).send({}),
  },
  {
    name: 'GET /api/sessions/:id/run (runner view)',
    budget: 10,
    repeatable: true,
    send: (w) => request(w.app).get(`/api/sessions/${w.session!.id}/run`).set(w.lifter),
  },
  {
    name: 'PUT /api/sessions/:id/sets/:setId (log a planned set)',
    budget: 14,
    repeatable: true,
    send: (w) => {
      const sets = w.session!.sets
      const set = sets[w.nextPlanned++ % sets.length]
      return request(w.app).put(`/api/sessions/${w.session!.id}/sets/${set.id}`).set(w.lifter).send(setBody(set, true))
    },
  },
  {
    name: 'PUT /api/sessions/:id/sets/:setId (a new set)',
    budget: 8,
    repeatable: true,
    send: (w) => {
      const template = w.session!.sets.find((s) => s.kind !== 'warmup' && s.kind !== 'top') ?? w.session!.sets[0]
      const body = { ...setBody(template, true), kind: 'straight', position: w.nextPosition++ }
      return request(w.app).put(`/api/sessions/${w.session!.id}/sets/${randomUUID()}`).set(w.lifter).send(body)
    },
  },
  {
    name: "GET /api/sessions (lifter's logbook list)",
    budget: 3,
    repeatable: true,
    send: (w) => request(w.app).get('/api/sessions').query({ limit: 50 }).set(w.lifter),
  },
  {
    name: "GET /api/sessions?athleteId (coach opens an athlete's logbook)",
    budget: 4,
    repeatable: true,
    send: (w) => request(w.app).get('/api/sessions').query({ athleteId: w.lifterId, limit: 50 }).set(w.coach),
  },
  {
    name: 'GET /api/sessions/:id (logbook detail of the last session)',
    budget: 3,
    repeatable: true,
    send: (w) => request(w.app).get(`/api/sessions/${w.completedSessionId}`).set(w.lifter),
  },
  {
    name: 'GET /api/athletes (coach\'s athlete table)',
    budget: 10,
    repeatable: true,
    send: (w) => request(w.app).get('/api/athletes').set(w.coach),
  },
  {
    name: 'GET /api/review-desk (waiting, 100 newest)',
    budget: 6,
    repeatable: true,
    send: (w) => request(w.app).get('/api/review-desk').query({ status: 'waiting', limit: 100 }).set(w.coach),
  },
  {
    name: 'POST /api/sessions/:id/complete (finish)',
    budget: 40,
    repeatable: false,
    send: (w) => request(w.app).post(`/api/sessions/${w.session!.id}/complete`).set(w.lifter).send({ completedAt: new Date().toISOString(), note: null }),
  },
]

async function signIn(app: Express, email: string) {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { Authorization: `Bearer ${res.body.token}` }
}

/** Signs in the demo coach and a lifter (by default the one with the most completed sessions). */
export async function openHotWorld(app: Express, lifterEmail?: string): Promise<HotWorld> {
  let email = lifterEmail
  if (!email) {
    const [busiest] = await SessionModel.sequelize!.query<{ athleteId: number }>(
      "SELECT athlete_id AS athleteId FROM sessions WHERE status = 'completed' GROUP BY athlete_id ORDER BY COUNT(*) DESC, athlete_id LIMIT 1",
      { type: QueryTypes.SELECT },
    )
    email = (await UserModel.findByPk(busiest.athleteId))!.email
  }
  const lifterId = (await UserModel.findOne({ where: { email } }))!.id
  const latest = await SessionModel.findOne({ where: { athleteId: lifterId, status: 'completed' }, order: [['completedAt', 'DESC']], attributes: ['id'] })
  return {
    app,
    completedSessionId: latest?.id ?? 0,
    coach: await signIn(app, DEMO_ACCOUNTS.coach.email),
    lifter: await signIn(app, email),
    lifterId,
    today: new Date().toISOString().slice(0, 10),
    nextPlanned: 0,
    nextPosition: 50_000,
  }
}

export interface HotResult {
  name: string
  budget: number
  status: number
  statements: number
  inTransaction: number
  transactionControl: number
  queries: LoggedQuery[]
}

/** Sends one hot request, checks it succeeded, and counts its statements. */
export async function measureHotRequest(log: QueryLog, world: HotWorld, hot: HotRequest): Promise<HotResult> {
  const { result: res, queries } = await countQueries(log, () => hot.send(world))
  if (res.status >= 300) throw new Error(`${hot.name}: ${res.status} ${JSON.stringify(res.body)}`)
  if (hot.name.startsWith('POST /api/sessions (start')) world.session = res.body.session
  return {
    name: hot.name,
    budget: hot.budget,
    status: res.status,
    statements: queries.length,
    inTransaction: queries.filter((q) => q.inTransaction).length,
    transactionControl: queries.filter((q) => isTransactionControl(q.sql)).length,
    queries,
  }
}

// ---------------------------------------------------------------------------------------------
// Query plans

export interface PlannedStatement {
  sql: string
  plan: string[]
  /** Plan lines that read a whole table that grows with use (or a whole index of one). */
  fullScans: string[]
}

/** Tables that grow with users and their training; the plan and exercise tables stay small. */
export const GROWING_TABLES = [
  'users', 'coach_athletes', 'invites', 'password_resets', 'body_weights', 'equipment_profiles', 'assignments',
  'sessions', 'set_logs', 'next_steps', 'reviews', 'comments', 'uploads',
]

/** Table behind each alias of a statement (Sequelize writes `table` AS `Alias`). */
function aliases(sql: string): Map<string, string> {
  const map = new Map<string, string>()
  for (const m of sql.matchAll(/(?:FROM|JOIN|UPDATE|INTO)\s+`?(\w+)`?(?:\s+AS\s+`?([\w.>-]+)`?)?/gi)) map.set(m[2] ?? m[1], m[1])
  return map
}

/** EXPLAIN QUERY PLAN of a recorded statement, with its bound values. */
export async function explain(sequelize: Sequelize, query: LoggedQuery): Promise<PlannedStatement | null> {
  const sql = query.sql.trim().replace(/;$/, '')
  if (!/^(SELECT|UPDATE|INSERT|DELETE|WITH)\b/i.test(sql)) return null
  const rows = await sequelize.query<{ id: number; parent: number; detail: string }>(`EXPLAIN QUERY PLAN ${sql}`, {
    type: QueryTypes.SELECT,
    bind: query.bind as Record<string, unknown> | unknown[] | undefined,
    logging: false,
  })
  const depth = new Map<number, number>([[0, 0]])
  const plan = rows.map((r) => {
    const d = (depth.get(r.parent) ?? 0) + 1
    depth.set(r.id, d)
    return `${'  '.repeat(d - 1)}${r.detail}`
  })
  const tables = aliases(sql)
  // "SCAN x" after "CO-ROUTINE x" reads a subquery's few rows, not a table.
  const coroutines = new Set(plan.map((line) => /^\s*CO-ROUTINE (\S+)/.exec(line)?.[1]).filter(Boolean))
  const fullScans = plan.filter((line) => {
    const m = /^\s*SCAN (?:TABLE )?`?([\w.>-]+)`?/.exec(line)
    return m !== null && !coroutines.has(m[1]) && GROWING_TABLES.includes(tables.get(m[1]) ?? m[1])
  })
  return { sql, plan, fullScans }
}

// ---------------------------------------------------------------------------------------------
// Deletes that look up referring rows (foreign keys)

/** Deletes a coach or lifter makes, whose foreign-key checks read the tables that refer to the row. */
const CASCADING_DELETES = [
  { name: 'Remove an exercise from a plan day (DELETE a slot)', sql: 'DELETE FROM slots WHERE id = $1', table: 'slots' },
  { name: 'Remove a plan day (DELETE a plan day)', sql: 'DELETE FROM plan_days WHERE id = $1', table: 'plan_days' },
  { name: 'Swap an exercise mid-session (DELETE an open set)', sql: 'DELETE FROM set_logs WHERE id = $1', table: 'set_logs' },
]

interface DeleteCheck {
  name: string
  plan: string[]
  fullScans: string[]
  ms: number
}

/** Plan and time (rolled back) of each delete, on the row most referred to. */
async function checkDeletes(sequelize: Sequelize): Promise<DeleteCheck[]> {
  const one = async (sql: string) => (await sequelize.query<{ id: number | string }>(sql, { type: QueryTypes.SELECT, logging: false }))[0]?.id
  const ids: Record<string, number | string | undefined> = {
    slots: await one('SELECT slot_id AS id FROM set_logs WHERE slot_id IS NOT NULL GROUP BY slot_id ORDER BY COUNT(*) DESC LIMIT 1'),
    plan_days: await one('SELECT plan_day_id AS id FROM sessions WHERE plan_day_id IS NOT NULL GROUP BY plan_day_id ORDER BY COUNT(*) DESC LIMIT 1'),
    set_logs: await one("SELECT id FROM set_logs WHERE kind = 'warmup' LIMIT 1"),
  }
  const checks: DeleteCheck[] = []
  for (const d of CASCADING_DELETES) {
    const id = ids[d.table]
    if (id === undefined) continue
    const planned = (await explain(sequelize, { sql: d.sql, bind: [id], inTransaction: false }))!
    // An unmanaged transaction, rolled back: the database is left as it was.
    const transaction = await sequelize.transaction()
    const started = performance.now()
    try {
      await sequelize.query(d.sql, { bind: [id], transaction, logging: false })
    } finally {
      const ms = performance.now() - started
      await transaction.rollback()
      checks.push({ name: d.name, plan: planned.plan, fullScans: planned.fullScans, ms })
    }
  }
  return checks
}

// ---------------------------------------------------------------------------------------------
// The benchmark part

const TIMED_CALLS = 50

interface Pass {
  results: HotResult[]
  plans: Array<{ request: string; statements: PlannedStatement[] }>
  medianMs: Map<string, number>
  deletes: DeleteCheck[]
}

async function timeRequest(world: HotWorld, hot: HotRequest, calls: number) {
  const times: number[] = []
  for (let i = 0; i < calls; i++) {
    const started = performance.now()
    const res = await hot.send(world)
    times.push(performance.now() - started)
    if (res.status >= 300) throw new Error(`${hot.name}: ${res.status} ${JSON.stringify(res.body)}`)
  }
  return median(times)
}

/** Work the app does after answering (the coach's e-mail on a finished session): wait until it is done. */
export async function settle(log: QueryLog, quietMs = 300, maxMs = 5000) {
  const until = Date.now() + maxMs
  let seen = 0
  for (;;) {
    await new Promise((r) => setTimeout(r, quietMs))
    const late = log.take().length
    if (late === 0 || Date.now() > until) return seen + late
    seen += late
  }
}

/** One pass over the repeatable hot requests: counts, plans, then the median of TIMED_CALLS calls. */
async function measurePass(target: InstrumentedApp, world: HotWorld, label: string, log: (line: string) => void): Promise<Pass> {
  const results: HotResult[] = []
  const plans: Pass['plans'] = []
  const medianMs = new Map<string, number>()
  for (const hot of HOT_REQUESTS.filter((h) => h.repeatable)) {
    const result = await measureHotRequest(target.log, world, hot)
    results.push(result)
    const statements: PlannedStatement[] = []
    for (const q of result.queries) {
      const planned = await explain(target.sequelize, q)
      if (planned) statements.push(planned)
    }
    plans.push({ request: hot.name, statements })
    log(`sql (${label}): ${TIMED_CALLS} × ${hot.name}`)
    medianMs.set(hot.name, await timeRequest(world, hot, TIMED_CALLS))
  }
  return { results, plans, medianMs, deletes: await checkDeletes(target.sequelize) }
}

export interface SqlBenchOptions {
  /** An existing large database to measure (a copy is used); default: the run's large club. */
  databasePath?: string
}

/** A statement for reading: the column list and long IN lists elided. */
export function shortSql(sql: string) {
  return sql
    .replace(/^SELECT ([\s\S]{120,}?) FROM /, 'SELECT … FROM ')
    .replace(/^(INSERT INTO \S+) \([^)]{80,}\) VALUES \([^)]*\)/, '$1 (…) VALUES (…)')
    .replace(/IN \(((?:[^(),]+, ){8,}[^(),]+)\)/g, (_, list: string) => {
      const items = list.split(', ')
      return `IN (${items.slice(0, 3).join(', ')}, … ${items.length} values)`
    })
}

const mdCode = (s: string) => '`' + s.replace(/`/g, "'") + '`'
const fmt = (ms: number | undefined) => (ms === undefined ? '' : ms.toFixed(1))

export async function run(ctx: BenchContext, options: SqlBenchOptions = {}): Promise<BenchPart> {
  let path: string
  if (options.databasePath) {
    path = join(ctx.workDir, 'sql-given.sqlite')
    copyFileSync(options.databasePath, path)
    if (existsSync(options.databasePath + '-wal')) copyFileSync(options.databasePath + '-wal', path + '-wal')
  } else {
    const { largeDatabaseCopy } = await import('./large-db')
    path = (await largeDatabaseCopy(ctx, 'sql')).path
  }
  const target = await openInstrumentedApp(path)
  try {
    const count = async (sql: string) => Number((await target.sequelize.query<{ n: number }>(sql, { type: QueryTypes.SELECT, logging: false }))[0].n)
    const lifters = await count("SELECT COUNT(*) AS n FROM users WHERE role = 'lifter'")
    const sessions = await count('SELECT COUNT(*) AS n FROM sessions')
    const sets = await count('SELECT COUNT(*) AS n FROM set_logs')
    const world = await openHotWorld(target.app)
    const byName = (prefix: string) => HOT_REQUESTS.find((h) => h.name.startsWith(prefix))!
    // Today's session is started first (counted once): the runner's requests need it.
    const startResult = await measureHotRequest(target.log, world, byName('POST /api/sessions (start'))
    const startPlans = await Promise.all(startResult.queries.map((q) => explain(target.sequelize, q)))

    // Both passes on the same warm database: first without the indexes, then with them.
    ctx.log('sql: warm-up')
    for (const hot of HOT_REQUESTS.filter((h) => h.repeatable)) await timeRequest(world, hot, 3)
    ctx.log('sql: without the query indexes (migration 0005 rolled back)')
    const migrator = createMigrator(target.sequelize)
    await migrator.down({ to: '0005-query-indexes' })
    const without = await measurePass(target, world, 'without 0005', ctx.log)
    ctx.log('sql: with them (0005 applied again)')
    await migrator.up()
    const withIndexes = await measurePass(target, world, 'with 0005', ctx.log)

    const finishStarted = performance.now()
    const finishResult = await measureHotRequest(target.log, world, byName('POST /api/sessions/:id/complete'))
    const finishMs = performance.now() - finishStarted
    const finishPlans = await Promise.all(finishResult.queries.map((q) => explain(target.sequelize, q)))
    const afterAnswer = await settle(target.log)

    const results = [startResult, ...withIndexes.results, finishResult]
    const ordered = HOT_REQUESTS.map((h) => results.find((r) => r.name === h.name)!)
    const allPlans = [
      { request: startResult.name, statements: startPlans.filter((p): p is PlannedStatement => p !== null) },
      ...withIndexes.plans,
      { request: finishResult.name, statements: finishPlans.filter((p): p is PlannedStatement => p !== null) },
    ]
    const scans = (plans: Pass['plans']) =>
      plans.flatMap((p) => p.statements.filter((st) => st.fullScans.length > 0).map((st) => ({ request: p.request, sql: st.sql, scans: st.fullScans })))
    const scansWith = scans(allPlans)
    const scansWithout = scans(without.plans)
    const deleteScansWith = withIndexes.deletes.filter((d) => d.fullScans.length > 0)

    const countTable = [
      '| Request | SQL statements | of them BEGIN/COMMIT | budget | median ms without 0005 | median ms with 0005 |',
      '|---|---:|---:|---:|---:|---:|',
      ...ordered.map((r) => {
        const once = r === startResult || r === finishResult
        const afterMs = once ? (r === finishResult ? finishMs : undefined) : withIndexes.medianMs.get(r.name)
        return `| ${r.name} | ${r.statements} | ${r.transactionControl} | ${r.budget} | ${fmt(without.medianMs.get(r.name))} | ${fmt(afterMs)}${r === finishResult ? ' (one call)' : ''} |`
      }),
    ]
    const deleteTable = [
      '| Delete | full scans without 0005 | ms without 0005 | full scans with 0005 | ms with 0005 |',
      '|---|---|---:|---|---:|',
      ...withIndexes.deletes.map((d) => {
        const b = without.deletes.find((x) => x.name === d.name)
        const list = (lines: string[] | undefined) => (lines && lines.length > 0 ? lines.map((l) => mdCode(l.trim())).join(', ') : 'none')
        return `| ${d.name} | ${list(b?.fullScans)} | ${fmt(b?.ms)} | ${list(d.fullScans)} | ${fmt(d.ms)} |`
      }),
    ]
    const planBlocks = allPlans.map((p) => {
      const seen = new Set<string>()
      const statements = p.statements.filter((st) => !seen.has(st.sql) && seen.add(st.sql))
      return [
        `**${p.request}**`,
        '',
        ...statements.flatMap((st) => ['```sql', shortSql(st.sql), '```', '```', ...st.plan, '```']),
      ].join('\n')
    })
    const markdown = [
      `The app in process (createApp) over a copy of the large demo club: ${lifters} lifters, ${sessions} sessions, ${sets} set logs; ` +
        `the lifter is the one with the most sessions, the coach the demo coach with every athlete. ` +
        `Statements are counted with Sequelize's logging hook from a request's start to its answer (supertest, one request at a time). ` +
        `Timings: median of ${TIMED_CALLS} calls per request on ${ctx.cores} cores, after a warm-up, first with migration 0005 rolled back, then with it applied again on the same database. ` +
        'Plans below show statements shortened (column lists and long IN lists elided).',
      '',
      ...countTable,
      '',
      afterAnswer > 0 ? `After the finish answered, ${afterAnswer} more statements ran (the coach's e-mail about the finished session is sent after the answer).` : '',
      '',
      `Statements of these requests that read a whole table that grows with use (${GROWING_TABLES.join(', ')}), or a whole index of one: ` +
        `${scansWith.length} with 0005, ${scansWithout.length} without it.`,
      '',
      ...scansWithout.map((x) => `- without 0005, ${x.request}: ${x.scans.map((l) => mdCode(l.trim())).join(', ')}`),
      ...scansWith.map((x) => `- **with 0005**, ${x.request}: ${x.scans.map((l) => mdCode(l.trim())).join(', ')}`),
      '',
      'Deletes look up the rows that refer to the deleted row (foreign keys); one call each on the most used row, rolled back:',
      '',
      ...deleteTable,
      '',
      '<details><summary>EXPLAIN QUERY PLAN of every statement of the hot requests (with 0005)</summary>',
      '',
      ...planBlocks,
      '',
      '</details>',
    ].join('\n')
    const budgets: Budget[] = [
      ...ordered.map((r) => budget({ name: `SQL statements: ${r.name}`, value: r.statements, limit: r.budget, unit: 'statements', kind: 'max' })),
      budget({ name: 'Full scans of growing tables in the hot requests', value: scansWith.length, limit: 0, unit: 'statements', kind: 'max' }),
      budget({ name: 'Full scans of growing tables in plan and session deletes', value: deleteScansWith.length, limit: 0, unit: 'statements', kind: 'max' }),
    ]
    return {
      title: 'SQL per request and query plans',
      command: 'npm run bench -- --only sql --no-build',
      markdown,
      figures: {
        lifters, sessions, sets, timedCalls: TIMED_CALLS, statementsAfterFinishAnswer: afterAnswer,
        requests: ordered.map((r) => ({
          name: r.name, statements: r.statements, transactionControl: r.transactionControl, budget: r.budget,
          medianMsWithout0005: without.medianMs.get(r.name) ?? null,
          medianMsWith0005: withIndexes.medianMs.get(r.name) ?? (r === finishResult ? finishMs : null),
        })),
        deletes: withIndexes.deletes.map((d) => ({ name: d.name, msWith0005: d.ms, msWithout0005: without.deletes.find((x) => x.name === d.name)?.ms ?? null, plan: d.plan })),
        fullScansWith0005: scansWith,
        fullScansWithout0005: scansWithout,
      },
      budgets,
    }
  } finally {
    await target.close()
  }
}

// `tsx tests/bench/sql.ts [database]`: this part alone, the report section on stdout.
if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const workDir = mkdtempSync(join(tmpdir(), 'chalkline-sql-'))
  const ctx: BenchContext = {
    root: fileURLToPath(new URL('../..', import.meta.url)), distDir: '', workDir, cores: availableParallelism(),
    log: (line) => process.stderr.write(`[sql] ${line}\n`),
  }
  try {
    const part = await run(ctx, { databasePath: process.argv[2] })
    console.log(part.markdown)
    for (const b of part.budgets) console.log(`${b.pass ? 'PASS' : 'FAIL'} ${b.name}: ${b.value} (limit ${b.limit})`)
  } finally {
    rmSync(workDir, { recursive: true, force: true })
  }
}
