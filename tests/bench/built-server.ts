/**
 * Support for the browser benchmarks (Lighthouse, interaction): the production server of a
 * given build, the few API calls that put a demo lifter into a started session, and running a
 * part alone.
 *
 * The server is started by production-server.ts (shared with the API parts) from any build folder: the bench
 * runner passes its fresh build, and a part run alone uses dist/ or $CHALKLINE_DIST.
 */
import { existsSync, mkdirSync, mkdtempSync } from 'node:fs'
import { cpus, tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import type { User } from '../../shared/schemas/auth.schema'
import type { RunSession } from '../../shared/schemas/run.schema'
import type { Today } from '../../shared/schemas/train.schema'
import type { BenchContext, BenchPart } from './bench-types'
import { startProductionServer } from './production-server'

export interface BuiltServer {
  baseUrl: string
  stop: () => Promise<void>
}

/** The build a part uses when run alone: $CHALKLINE_DIST, else dist/ under the repository. */
export function standaloneDistDir(root: string): string {
  return resolve(root, process.env.CHALKLINE_DIST ?? 'dist')
}

/**
 * `node <distDir>/server/index.js` on a free loopback port, production mode, over a fresh
 * SQLite file in `dataDir` (the server loads the invented demo club on first start).
 * The server bundle keeps its packages external, so its folder must resolve node_modules
 * (true for dist/ in the repository; a build elsewhere needs a node_modules link beside it).
 */
export async function startBuiltServer(opts: { root: string; distDir: string; dataDir: string }): Promise<BuiltServer> {
  if (!existsSync(join(opts.distDir, 'server', 'index.js'))) {
    throw new Error(`no production build at ${opts.distDir} (run npm run build, or set CHALKLINE_DIST)`)
  }
  mkdirSync(opts.dataDir, { recursive: true })
  return startProductionServer(opts.distDir, join(opts.dataDir, 'bench.sqlite'), join(opts.dataDir, 'server.log'), { BCRYPT_COST: '10' })
}

/** A JSON call to the API with an optional bearer token; throws on any non-2xx answer. */
export async function api<T>(baseUrl: string, method: string, path: string, opts: { token?: string; body?: unknown; query?: Record<string, string | number> } = {}): Promise<T> {
  const url = new URL(baseUrl + '/api' + path)
  for (const [k, v] of Object.entries(opts.query ?? {})) url.searchParams.set(k, String(v))
  const res = await fetch(url, {
    method,
    headers: {
      ...(opts.token ? { Authorization: `Bearer ${opts.token}` } : {}),
      ...(opts.body !== undefined ? { 'Content-Type': 'application/json' } : {}),
    },
    body: opts.body !== undefined ? JSON.stringify(opts.body) : undefined,
  })
  if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${await res.text()}`)
  return (await res.json()) as T
}

/** The lifter's calendar day as the client sends it (src/utils/dates.ts localDay). */
export function localDayQuery(now = new Date()) {
  const pad = (n: number) => String(n).padStart(2, '0')
  return { date: `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`, tzOffset: now.getTimezoneOffset() }
}

/**
 * What the client keeps in localStorage for a signed-in user (src/stores/session.ts
 * TOKEN_STORAGE_KEY, USER_STORAGE_KEY): put there, a page opens signed in as that user.
 */
export function signedInStorage(signedIn: { token: string; user: User }): Record<string, string> {
  return { 'chalkline.token': signedIn.token, 'chalkline.user': JSON.stringify(signedIn.user) }
}

/** Signs a demo lifter in through the API and confirms the first-sign-in cautions, so the dialog does not cover the page. */
export async function signInDemoLifter(baseUrl: string, email: string, password: string) {
  const { token } = await api<{ token: string; user: User }>(baseUrl, 'POST', '/auth/sign-in', { body: { email, password } })
  const { user } = await api<{ user: User }>(baseUrl, 'POST', '/me/cautions', { token })
  if (user.cautionsAcknowledgedAt === null) throw new Error('cautions were not acknowledged')
  return { token, user }
}

/**
 * Starts today's session through the API, or the next training day's on a rest day, or takes
 * the one already in progress.
 */
export async function startOrResumeSession(baseUrl: string, token: string): Promise<RunSession> {
  const day = localDayQuery()
  const today = await api<Today>(baseUrl, 'GET', '/train/today', { token, query: day })
  if (today.inProgressSessionId !== null) {
    return (await api<{ session: RunSession }>(baseUrl, 'GET', `/sessions/${today.inProgressSessionId}/run`, { token })).session
  }
  const body = today.day && !today.day.isRest ? {} : today.nextTraining ? { dayId: today.nextTraining.dayId, version: today.nextTraining.version } : null
  if (body === null) throw new Error('the demo lifter has no training day to start')
  return (await api<{ session: RunSession }>(baseUrl, 'POST', '/sessions', { token, body, query: day })).session
}

/** A demo lifter signed in (cautions confirmed) with a started session. */
export async function demoLifterWithStartedSession(baseUrl: string, email: string, password: string) {
  const { token, user } = await signInDemoLifter(baseUrl, email, password)
  const session = await startOrResumeSession(baseUrl, token)
  return { token, user, session }
}

/** True when the module at `url` was started directly (`tsx tests/bench/<part>.ts`), not imported. */
export function isMainModule(url: string): boolean {
  return Boolean(process.argv[1]) && url === pathToFileURL(resolve(process.argv[1]!)).href
}

/** Run alone: print the section's markdown and budgets. */
export async function runAlone(part: (ctx: BenchContext) => Promise<BenchPart>, url: string) {
  const root = resolve(dirname(fileURLToPath(url)), '../..')
  const workDir = mkdtempSync(join(tmpdir(), 'chalkline-bench-'))
  const ctx: BenchContext = {
    root,
    distDir: standaloneDistDir(root),
    workDir,
    cores: cpus().length,
    log: (line) => process.stderr.write(line + '\n'),
  }
  let result: BenchPart
  try {
    result = await part(ctx)
  } catch (err) {
    console.error(err)
    process.exit(1)
  }
  console.log(`## ${result.title}\n`)
  if (result.command) console.log(`Command: \`${result.command}\`\n`)
  console.log(result.markdown + '\n')
  for (const b of result.budgets) {
    console.log(`${b.pass ? 'PASS' : 'FAIL'}  ${b.name}: ${b.value} ${b.unit} (budget ${b.kind === 'max' ? (b.strict ? '<' : '≤') : b.strict ? '>' : '≥'} ${b.limit})`)
  }
  console.log(`\n(work folder: ${workDir})`)
  if (result.budgets.some((b) => !b.pass)) process.exitCode = 1
}

