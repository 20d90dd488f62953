/**
 * 4. API throughput and latency: autocannon on loopback against the production server over the
 * large demo club, next to a bare Express JSON route measured in the same run, and next to the
 * floor of a set log on this stack (floor-server.ts: Express, token check, user read and the same
 * upsert on the same database file, nothing else).
 *
 * Run alone: `tsx tests/bench/api.ts` (needs a build in dist/, or CHALKLINE_DIST).
 */
import { randomUUID } from 'node:crypto'
import { dirname, join } from 'node:path'
import autocannon from 'autocannon'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { startBaselineProcess, type BaselineProcess } from './baseline-process'
import { budget, type BenchContext, type BenchPart } from './bench-types'
import { largeDatabaseCopy } from './large-db'
import { pacedLoadInWorker, type PacedRequest, type PacedResult } from './paced-load'
import { startProductionServer, type ProductionServer } from './production-server'

const CONNECTIONS = 10
const DURATION_S = 10
const FIXED_RATE = 200
const FIXED_RATE_DURATION_S = 20
const LIFTERS = 20

export interface Measured {
  name: string
  requestsPerSecond: number
  p50Ms: number
  p90Ms: number
  p99Ms: number
  maxMs: number
  requests: number
  errors: number
  non2xx: number
}

export interface Lifter {
  token: string
  sessionId: number
  template: RunSet
  /** The session's first top set, if it has one: logging it re-targets its back-offs. */
  topSet: RunSet | undefined
  nextPosition: number
}

export interface ApiWorld {
  server: ProductionServer
  /** The server's database file (a copy of the large club); its JWT secret is beside it. */
  databasePath: string
  bareUrl: string
  coachToken: string
  lifters: Lifter[]
  today: string
  stopBare: () => Promise<void>
}

async function json(res: Response) {
  if (!res.ok) throw new Error(`${res.status} ${res.url}: ${await res.text()}`)
  return res.json()
}

async function signIn(baseUrl: string, email: string): Promise<string> {
  const body = await json(
    await fetch(`${baseUrl}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email, password: DEMO_PASSWORD }),
    }),
  )
  return body.token
}

/** The headers of an API call with a bearer token (and a JSON body, when there is one). */
export function authed(token: string, body?: unknown) {
  return {
    Authorization: `Bearer ${token}`,
    ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
  }
}

/** A set as the runner sends it: a new client-made UUID each time, at the lifter's next position. */
export function nextSetRequest(lifter: Lifter) {
  const now = new Date().toISOString()
  const t = lifter.template
  const body = {
    exerciseId: t.exerciseId, slotId: t.slotId, position: lifter.nextPosition++, kind: 'backoff', targetLoadKg: 60,
    targetRepsMin: 8, targetRepsMax: 12, targetReps: null, toFailure: false, targetRir: 2, loadKg: 60, reps: 10,
    rir: 2, failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
  }
  return { path: `/api/sessions/${lifter.sessionId}/sets/${randomUUID()}`, body: JSON.stringify(body) }
}

/** The lifter's top set logged again (a later edit): the path that re-targets back-offs in a transaction. */
export function topSetRequest(lifter: Lifter & { topSet: RunSet }) {
  const now = new Date().toISOString()
  const t = lifter.topSet
  const body = {
    exerciseId: t.exerciseId, slotId: t.slotId, position: t.position, kind: 'top', targetLoadKg: t.targetLoadKg,
    targetRepsMin: t.targetRepsMin, targetRepsMax: t.targetRepsMax, targetReps: t.targetReps, toFailure: t.toFailure,
    targetRir: t.targetRir, loadKg: t.targetLoadKg ?? 60, reps: t.targetRepsMin ?? 5, rir: 1, failure: false, skipped: false,
    note: null, loggedAt: now, editedAt: now,
  }
  return { path: `/api/sessions/${lifter.sessionId}/sets/${t.id}`, body: JSON.stringify(body) }
}

/** Starts the server over a copy of the large club, the bare baseline, and signs people in. */
export async function openApiWorld(ctx: BenchContext, name: string): Promise<ApiWorld> {
  const { path } = await largeDatabaseCopy(ctx, name)
  // Signing in the benchmark's 21 users from one address would trip the per-address limit.
  const server = await startProductionServer(ctx.distDir, path, join(ctx.workDir, `${name}-server.log`), { RATE_LIMIT_AUTH: '1000' })
  let bare: BaselineProcess | null = null
  try {
    bare = await startBaselineProcess(ctx.root, ['tests/bench/bare-server.mjs'])
    return await signInEveryone(server, path, bare.url, bare.stop)
  } catch (error) {
    await server.stop()
    await bare?.stop()
    throw error
  }
}

async function signInEveryone(server: ProductionServer, databasePath: string, bareUrl: string, stopBare: () => Promise<void>): Promise<ApiWorld> {
  const today = new Date().toISOString().slice(0, 10)
  const coachToken = await signIn(server.baseUrl, DEMO_ACCOUNTS.coach.email)
  const athletes: { email: string }[] = (await json(await fetch(`${server.baseUrl}/api/athletes`, { headers: authed(coachToken) }))).athletes
  // The busiest lifters of the large club: each starts today's session, as at a gym at peak time.
  const lifters: Lifter[] = []
  for (const athlete of athletes.slice(-LIFTERS)) {
    const token = await signIn(server.baseUrl, athlete.email)
    const started = await json(
      await fetch(`${server.baseUrl}/api/sessions?date=${today}&tzOffset=0`, { method: 'POST', headers: authed(token, {}), body: '{}' }),
    )
    const session: RunSession = started.session
    const template = session.sets.find((s) => s.kind !== 'warmup') ?? session.sets[0]
    if (!template) throw new Error(`no sets in the session of ${athlete.email}`)
    lifters.push({ token, sessionId: session.id, template, topSet: session.sets.find((s) => s.kind === 'top'), nextPosition: 10_000 })
  }
  return { server, databasePath, bareUrl, coachToken, lifters, today, stopBare }
}

/**
 * The floor baseline (floor-server.ts) on the server's own database file and JWT secret, so the
 * same requests and tokens work on both. Runs are sequential, so the two never write at once.
 */
function startFloor(ctx: BenchContext, world: ApiWorld): Promise<BaselineProcess> {
  return startBaselineProcess(ctx.root, ['--import', 'tsx', 'tests/bench/floor-server.ts'], {
    DATABASE_PATH: world.databasePath,
    JWT_SECRET_FILE: join(dirname(world.databasePath), 'jwt-secret'),
  })
}

function summarise(name: string, r: autocannon.Result): Measured {
  return {
    name,
    requestsPerSecond: r.requests.average,
    p50Ms: r.latency.p50,
    p90Ms: r.latency.p90,
    p99Ms: r.latency.p99,
    maxMs: r.latency.max,
    requests: r.requests.total,
    errors: r.errors + r.timeouts,
    non2xx: r.non2xx,
  }
}

export async function cannon(name: string, options: autocannon.Options): Promise<Measured> {
  const result = await autocannon({ connections: CONNECTIONS, duration: DURATION_S, ...options })
  return summarise(name, result)
}

/** A paced request's parts for autocannon, whose request object names its method itself. */
function withoutMethod({ path, body, headers }: PacedRequest) {
  return { path, body, headers }
}

function setPuts(world: ApiWorld): autocannon.Request[] {
  const next = nextSetPaced(world)
  return [{ method: 'PUT', setupRequest: (req) => ({ ...req, ...withoutMethod(next()) }) }]
}

function topSetPuts(world: ApiWorld): autocannon.Request[] {
  const withTop = world.lifters.filter((l): l is Lifter & { topSet: RunSet } => l.topSet !== undefined)
  if (withTop.length === 0) throw new Error('no started session has a top set')
  let turn = 0
  return [
    {
      method: 'PUT',
      setupRequest: (req) => {
        const lifter = withTop[turn++ % withTop.length]!
        const { path, body } = topSetRequest(lifter)
        return { ...req, path, body, headers: authed(lifter.token, {}) }
      },
    },
  ]
}

function barePuts(world: ApiWorld): autocannon.Request[] {
  const next = nextBarePaced(world)
  return [{ method: 'PUT', setupRequest: (req) => ({ ...req, ...withoutMethod(next()) }) }]
}

function todayGets(world: ApiWorld): autocannon.Request[] {
  let turn = 0
  return [
    {
      method: 'GET',
      setupRequest: (req) => {
        const lifter = world.lifters[turn++ % world.lifters.length]!
        return { ...req, path: `/api/train/today?date=${world.today}&tzOffset=0`, headers: authed(lifter.token) }
      },
    },
  ]
}

/** The next set log as a plain HTTP request, for the paced runs. */
function nextSetPaced(world: ApiWorld): () => PacedRequest {
  let turn = 0
  return () => {
    const lifter = world.lifters[turn++ % world.lifters.length]!
    const { path, body } = nextSetRequest(lifter)
    return { method: 'PUT', path, body, headers: { ...authed(lifter.token, {}), 'Content-Length': String(Buffer.byteLength(body)) } }
  }
}

function nextBarePaced(world: ApiWorld): () => PacedRequest {
  return () => {
    const { body } = nextSetRequest(world.lifters[0]!)
    return { method: 'PUT', path: `/bare/${randomUUID()}`, body, headers: { 'Content-Type': 'application/json', 'Content-Length': String(Buffer.byteLength(body)) } }
  }
}

const fmt = (n: number, digits = 1) => n.toFixed(digits)

export async function run(ctx: BenchContext): Promise<BenchPart> {
  const world = await openApiWorld(ctx, 'api')
  let floor: BaselineProcess | null = null
  try {
    const { server, bareUrl } = world
    floor = await startFloor(ctx, world)
    ctx.log('api: warm-up')
    await cannon('warm-up', { url: server.baseUrl, duration: 3, requests: todayGets(world) })
    await cannon('warm-up', { url: bareUrl + '/bare', duration: 2 })

    ctx.log('api: maximum throughput, 10 connections, 10 s each')
    const bareGet = await cannon('Bare Express: GET JSON', { url: bareUrl + '/bare' })
    const barePut = await cannon('Bare Express: PUT JSON body', { url: bareUrl, requests: barePuts(world) })
    const floorPut = await cannon('Floor: PUT a set log with nothing but Express, the token check, the user read and the upsert', { url: floor.url, requests: setPuts(world) })
    await floor.stop()
    const setPut = await cannon('PUT a set log', { url: server.baseUrl, requests: setPuts(world) })
    const topPut = await cannon('PUT a top set (re-targets its back-offs in a transaction)', { url: server.baseUrl, requests: topSetPuts(world) })
    const health = await cannon('GET /api/health (middleware only: log, headers, compression)', { url: `${server.baseUrl}/api/health` })
    const today = await cannon("GET today's session", { url: server.baseUrl, requests: todayGets(world) })
    const athletes = await cannon('GET athlete table (150 athletes)', {
      url: `${server.baseUrl}/api/athletes`,
      headers: authed(world.coachToken),
    })
    const athleteCount = (await json(await fetch(`${server.baseUrl}/api/athletes`, { headers: authed(world.coachToken) }))).athletes.length

    ctx.log(`api: fixed rate ${FIXED_RATE} req/s for ${FIXED_RATE_DURATION_S} s, evenly spaced (paced-load.ts)`)
    const due = FIXED_RATE * FIXED_RATE_DURATION_S
    const made = (next: () => PacedRequest) => Array.from({ length: due }, next)
    const setPaced = await pacedLoadInWorker({ name: `PUT a set log, one every ${1000 / FIXED_RATE} ms`, url: server.baseUrl, rate: FIXED_RATE, durationS: FIXED_RATE_DURATION_S, requests: made(nextSetPaced(world)) })
    const barePaced = await pacedLoadInWorker({ name: `Bare Express PUT, one every ${1000 / FIXED_RATE} ms`, url: bareUrl, rate: FIXED_RATE, durationS: FIXED_RATE_DURATION_S, requests: made(nextBarePaced(world)) })

    ctx.log(`api: fixed rate ${FIXED_RATE} req/s for ${FIXED_RATE_DURATION_S} s, autocannon overallRate`)
    const setAtRate = await cannon(`PUT a set log at ${FIXED_RATE} req/s`, {
      url: server.baseUrl, requests: setPuts(world), overallRate: FIXED_RATE, duration: FIXED_RATE_DURATION_S,
    })
    const bareAtRate = await cannon(`Bare Express PUT at ${FIXED_RATE} req/s`, {
      url: bareUrl, requests: barePuts(world), overallRate: FIXED_RATE, duration: FIXED_RATE_DURATION_S,
    })

    const maxRuns = [bareGet, barePut, floorPut, setPut, topPut, health, today, athletes]
    const ratioPut = setPut.requestsPerSecond / barePut.requestsPerSecond
    const ratioGet = setPut.requestsPerSecond / bareGet.requestsPerSecond
    const ratioFloor = floorPut.requestsPerSecond / barePut.requestsPerSecond
    const errors = [...maxRuns, setAtRate, bareAtRate].reduce((n, m) => n + m.errors + m.non2xx, 0) + setPaced.failures + barePaced.failures
    const row = (m: Measured, ratio?: number) =>
      `| ${m.name} | ${fmt(m.requestsPerSecond, 0)} | ${ratio === undefined ? '' : fmt(ratio * 100, 0) + ' %'} | ${fmt(m.p50Ms)} | ${fmt(m.p99Ms)} | ${fmt(m.maxMs)} | ${m.requests} | ${m.errors + m.non2xx} |`
    const markdown = [
      `autocannon ${CONNECTIONS} connections, ${DURATION_S} s per row, loopback, ${ctx.cores} cores shared by autocannon, the server and the baseline.`,
      `Server: \`node dist/server/index.js\` (NODE_ENV=production, request log at info to a file) over the large demo club (${athleteCount} athletes on the coach's table).`,
      `Set logs are spread over ${world.lifters.length} lifters with a started session; each request is a new set with a new UUID.`,
      '',
      '| Request | req/s | vs bare | p50 ms | p99 ms | max ms | requests | errors + non-2xx |',
      '|---|---:|---:|---:|---:|---:|---:|---:|',
      row(bareGet, 1),
      row(barePut, barePut.requestsPerSecond / bareGet.requestsPerSecond),
      row(floorPut, ratioFloor),
      row(setPut, ratioPut),
      row(topPut, topPut.requestsPerSecond / barePut.requestsPerSecond),
      row(health, health.requestsPerSecond / bareGet.requestsPerSecond),
      row(today, today.requestsPerSecond / bareGet.requestsPerSecond),
      row(athletes, athletes.requestsPerSecond / bareGet.requestsPerSecond),
      '',
      `"vs bare": set logging against the bare PUT-with-JSON-body route; GET rows against the bare GET route. Set logging is ${fmt(ratioGet * 100, 0)} % of the bare GET route.`,
      `The floor row is \`tests/bench/floor-server.ts\`: the same set-log requests and tokens against Express 5 with its JSON parser, jsonwebtoken's check, the user read by id and the app's own upsert statement through node-sqlite3 on the same database file, and nothing else (no Sequelize, log, headers, compression or body check). It is what this stack and this machine allow a set log at best: ${fmt(ratioFloor * 100, 0)} % of the bare PUT in this run, and the real set log is ${fmt((setPut.requestsPerSecond / floorPut.requestsPerSecond) * 100, 0)} % of the floor.`,
      'The budgeted row is "PUT a set log" (a back-off or any set but a top set: one upsert statement). A top set is logged about once per exercise and takes the transactional path. The health row is the same server with no sign-in check and no database: what the middleware every request passes through costs by itself.',
      '',
      `Fixed rate, ${FIXED_RATE} req/s for ${FIXED_RATE_DURATION_S} s, evenly spaced (the budgeted row): request i is sent at start + i × ${1000 / FIXED_RATE} ms whether or not earlier answers are back, over keep-alive connections, and its latency counts from that due moment (\`tests/bench/paced-load.ts\`, in a worker thread of its own).`,
      '',
      '| Request | req/s | p50 ms | p90 ms | p99 ms | max ms | errors + non-2xx | generator lag, max ms |',
      '|---|---:|---:|---:|---:|---:|---:|---:|',
      ...[setPaced, barePaced].map(
        (m: PacedResult) => `| ${m.name} | ${fmt(m.requestsPerSecond, 0)} | ${fmt(m.p50Ms)} | ${fmt(m.p90Ms)} | ${fmt(m.p99Ms)} | ${fmt(m.maxMs)} | ${m.failures} | ${fmt(m.maxSendLagMs)} |`,
      ),
      '',
      `The same rate with autocannon's \`overallRate\` (${CONNECTIONS} connections), for comparison with earlier reports. autocannon 9 lets each connection send its share of the second back to back at the start of the second and then wait, so the server sees bursts of ${CONNECTIONS} concurrent requests; it also "corrects" each latency with an expected interval of \`Math.ceil(1 / rate)\` = 1 ms, recording an answer of L ms about L times. Its p99 here is the queueing inside a burst, not the latency at a steady ${FIXED_RATE} req/s.`,
      '',
      '| Request | req/s | p50 ms | p90 ms | p99 ms | max ms | errors + non-2xx |',
      '|---|---:|---:|---:|---:|---:|---:|',
      ...[setAtRate, bareAtRate].map(
        (m) => `| ${m.name} | ${fmt(m.requestsPerSecond, 0)} | ${fmt(m.p50Ms)} | ${fmt(m.p90Ms)} | ${fmt(m.p99Ms)} | ${fmt(m.maxMs)} | ${m.errors + m.non2xx} |`,
      ),
    ].join('\n')
    return {
      title: '4. API throughput and latency',
      command: 'npm run bench -- --only api',
      markdown,
      figures: { connections: CONNECTIONS, durationS: DURATION_S, athleteCount, lifters: world.lifters.length, maxRuns, setPaced, barePaced, setAtRate, bareAtRate, ratioSetToBarePut: ratioPut, ratioSetToBareGet: ratioGet, ratioFloorToBarePut: ratioFloor, ratioSetToFloor: setPut.requestsPerSecond / floorPut.requestsPerSecond },
      budgets: [
        budget({ name: 'Set logging throughput vs bare Express PUT', value: ratioPut * 100, limit: 50, unit: '%', kind: 'min' }),
        budget({ name: `Set logging p99 at ${FIXED_RATE} req/s (evenly spaced)`, value: setPaced.p99Ms, limit: 25, unit: 'ms', kind: 'max', strict: true }),
        budget({ name: 'Errors and non-2xx answers in the API runs', value: errors, limit: 0, unit: '', kind: 'max' }),
      ],
    }
  } finally {
    await floor?.stop()
    await world.server.stop()
    await world.stopBare()
  }
}
