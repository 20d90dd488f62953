/**
 * Bench part 2: load time, measured with Lighthouse (its Node API) driving Debian's Chromium.
 *
 * The production server of the build runs on loopback over a fresh database with the demo club.
 * Two pages, each loaded 3 times with Lighthouse's mobile defaults (form factor mobile, simulated
 * throttling: slow 4G and a 4x CPU slowdown), performance category only:
 *   1. the sign-in page, signed out;
 *   2. the Train screen (/train) of a demo lifter with a started session: the lifter is signed
 *      in, the cautions confirmed and a session started through the API, and the token and user
 *      are put into the origin's localStorage (what src/stores/session.ts reads) before
 *      Lighthouse loads the page with `disableStorageReset`;
 *   3. the same Train screen reopened later that day: the phone also keeps the Train answer
 *      it showed last (src/offline/saved-today.ts), so the plan paints before the server answers.
 *      Reported beside the budgeted pages; the budgets stay on the first visit of the day (2).
 * Every run gets its own Chromium with a fresh profile, so each load is a first visit: empty
 * HTTP cache, no service worker.
 *
 * Alone: `npx tsx tests/bench/lighthouse.ts` (uses the build at dist/ or $CHALKLINE_DIST).
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import lighthouse from 'lighthouse'
import { computeMedianRun } from 'lighthouse/core/lib/median-run.js'
import type { Flags, Result } from 'lighthouse'
import { chromium } from 'playwright-core'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { CHROMIUM_PATH } from '../helpers/browser'
import { budget, median, type BenchContext, type BenchPart } from './bench-types'
import { SAVED_TODAY_KEY, savedTodayEntry } from '../../src/offline/saved-today'
import type { Today } from '../../shared/schemas/train.schema'
import { api, demoLifterWithStartedSession, isMainModule, localDayQuery, runAlone, signedInStorage, startBuiltServer } from './built-server'

const RUNS = 5
const BUDGET_SCORE = 0.95
const BUDGET_LCP_MS = 2000
const BUDGET_CLS = 0.05

const CHROMIUM_FLAGS = [
  '--headless=new', '--no-sandbox', '--disable-gpu', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--no-first-run',
]

interface RunFigures {
  score: number
  lcpMs: number
  tbtMs: number
  cls: number
  fcpMs: number
  speedIndexMs: number
  totalBytes: number
}

interface PageResult {
  name: string
  path: string
  runs: RunFigures[]
  median: RunFigures
  medianRunJson: string
  lcpElement: string | null
  requests: number
}

/** Debian's Chromium with a fresh profile and a DevTools port picked by Chromium itself. */
async function launchChromium(profileDir: string): Promise<{ port: number; kill: () => Promise<void> }> {
  const child: ChildProcess = spawn(CHROMIUM_PATH, [...CHROMIUM_FLAGS, `--user-data-dir=${profileDir}`, '--remote-debugging-port=0', 'about:blank'], {
    stdio: ['ignore', 'ignore', 'pipe'],
    detached: true, // its own process group, so the renderers go with it
  })
  let stderr = ''
  child.stderr?.on('data', (d: Buffer) => (stderr = (stderr + d.toString()).slice(-4000)))
  const portFile = join(profileDir, 'DevToolsActivePort')
  const deadline = Date.now() + 30_000
  let port = 0
  while (!port) {
    if (child.exitCode !== null) throw new Error(`chromium exited early:\n${stderr}`)
    if (Date.now() > deadline) throw new Error(`chromium gave no DevTools port within 30 s:\n${stderr}`)
    if (existsSync(portFile)) port = Number.parseInt(readFileSync(portFile, 'utf8').split('\n')[0] ?? '', 10) || 0
    if (!port) await new Promise((r) => setTimeout(r, 100))
  }
  async function kill() {
    if (child.exitCode !== null || child.signalCode !== null || child.pid === undefined) return
    const exited = new Promise((r) => child.once('exit', r))
    process.kill(-child.pid, 'SIGTERM')
    await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))])
    if (child.exitCode === null && child.signalCode === null) process.kill(-child.pid, 'SIGKILL')
  }
  return { port, kill }
}

/**
 * Puts the signed-in lifter into the origin's localStorage, as the app itself keeps it after a
 * sign-in. The visit goes to an API URL of the same origin, so no app file reaches the HTTP
 * cache and no service worker is registered before Lighthouse's load.
 */
async function seedStorage(port: number, baseUrl: string, storage: Record<string, string>) {
  const browser = await chromium.connectOverCDP(`http://127.0.0.1:${port}`)
  try {
    const page = await browser.contexts()[0]!.newPage()
    await page.goto(baseUrl + '/api/health')
    await page.evaluate((items) => {
      for (const [k, v] of Object.entries(items)) localStorage.setItem(k, v)
    }, storage)
    await page.close()
  } finally {
    await browser.close() // over CDP this only disconnects; the launched Chromium stays up
  }
}

function figuresOf(lhr: Result): RunFigures {
  const num = (id: string) => {
    const v = lhr.audits[id]?.numericValue
    if (typeof v !== 'number') throw new Error(`Lighthouse gave no ${id}: ${lhr.audits[id]?.errorMessage ?? 'missing'}`)
    return v
  }
  const score = lhr.categories.performance?.score
  if (typeof score !== 'number') throw new Error('Lighthouse gave no performance score')
  return {
    score,
    lcpMs: num('largest-contentful-paint'),
    tbtMs: num('total-blocking-time'),
    cls: num('cumulative-layout-shift'),
    fcpMs: num('first-contentful-paint'),
    speedIndexMs: num('speed-index'),
    totalBytes: num('total-byte-weight'),
  }
}

interface NetworkRow {
  url: string
  statusCode: number
}

function networkRows(lhr: Result): NetworkRow[] {
  const details = lhr.audits['network-requests']?.details as { items?: NetworkRow[] } | undefined
  return details?.items ?? []
}

/** Checks that the load showed what it should: the page asked for, not a redirect or a dialog. */
function checkLoad(lhr: Result, path: string, signedIn: boolean) {
  const finalPath = new URL(lhr.finalDisplayedUrl).pathname
  if (finalPath !== path) throw new Error(`Lighthouse ended on ${finalPath}, not ${path}`)
  if (lhr.runtimeError) throw new Error(`Lighthouse runtime error: ${lhr.runtimeError.message}`)
  const settings = lhr.configSettings
  if (settings.formFactor !== 'mobile' || settings.throttlingMethod !== 'simulate') {
    throw new Error(`unexpected Lighthouse settings: ${settings.formFactor}, ${settings.throttlingMethod}`)
  }
  if (signedIn) {
    const today = networkRows(lhr).find((r) => new URL(r.url).pathname === '/api/train/today')
    if (!today || today.statusCode !== 200) throw new Error(`the Train screen did not load today's session (${today?.statusCode ?? 'no request'})`)
  }
  for (const r of networkRows(lhr)) {
    const host = new URL(r.url).hostname
    if (!r.url.startsWith('data:') && host !== '127.0.0.1') throw new Error(`a request left loopback: ${r.url}`)
  }
}

function lcpElement(lhr: Result): string | null {
  const details = lhr.audits['largest-contentful-paint-element']?.details as
    | { items?: Array<{ items?: Array<{ node?: { snippet?: string; selector?: string } }> }> }
    | undefined
  const node = details?.items?.[0]?.items?.[0]?.node
  return node ? (node.selector ?? node.snippet ?? null) : null
}

async function measurePage(opts: {
  ctx: BenchContext
  baseUrl: string
  name: string
  path: string
  slug: string
  storage: Record<string, string> | null
}): Promise<PageResult> {
  const { ctx, baseUrl, name, path, slug, storage } = opts
  const lhrs: Result[] = []
  const jsons: string[] = []
  // A run whose trace Lighthouse itself could not record (NO_NAVSTART and the like) is run again,
  // at most twice per page; every other failed check still stops the benchmark.
  let retries = 2
  for (let i = 1; i <= RUNS; i++) {
    const profile = mkdtempSync(join(tmpdir(), 'chalkline-lh-profile-'))
    const browser = await launchChromium(profile)
    try {
      if (storage) await seedStorage(browser.port, baseUrl, storage)
      const flags: Flags = {
        port: browser.port,
        output: 'json',
        logLevel: 'error',
        onlyCategories: ['performance'],
        // Lighthouse's mobile defaults, spelled out: they are what the budgets assume.
        formFactor: 'mobile',
        throttlingMethod: 'simulate',
        // The signed-in page needs the token put there above; every run has a fresh profile anyway.
        disableStorageReset: storage !== null,
      }
      const started = Date.now()
      const result = await lighthouse(baseUrl + path, flags)
      if (!result) throw new Error('Lighthouse returned nothing')
      if (result.lhr.runtimeError && retries > 0) {
        retries--
        ctx.log(`lighthouse ${name} run ${i}/${RUNS}: ${result.lhr.runtimeError.code}, running it again`)
        i--
        continue
      }
      checkLoad(result.lhr, path, storage !== null)
      lhrs.push(result.lhr)
      jsons.push(typeof result.report === 'string' ? result.report : result.report[0]!)
      const f = figuresOf(result.lhr)
      ctx.log(`lighthouse ${name} run ${i}/${RUNS}: score ${Math.round(f.score * 100)}, LCP ${Math.round(f.lcpMs)} ms, TBT ${Math.round(f.tbtMs)} ms, CLS ${f.cls.toFixed(3)} (${((Date.now() - started) / 1000).toFixed(1)} s)`)
    } finally {
      await browser.kill()
      rmSync(profile, { recursive: true, force: true })
    }
  }
  const runs = lhrs.map(figuresOf)
  const medianLhr = computeMedianRun(lhrs)
  const medianIndex = lhrs.indexOf(medianLhr)
  // Kept after the run (the work folder is removed): bench/out is not committed.
  mkdirSync(join(ctx.root, 'bench/out'), { recursive: true })
  const file = join(ctx.root, 'bench/out', `lighthouse-${slug}-median.json`)
  writeFileSync(file, jsons[medianIndex]!)
  const med = (k: keyof RunFigures) => median(runs.map((r) => r[k]))
  return {
    name,
    path,
    runs,
    median: {
      score: med('score'),
      lcpMs: med('lcpMs'),
      tbtMs: med('tbtMs'),
      cls: med('cls'),
      fcpMs: med('fcpMs'),
      speedIndexMs: med('speedIndexMs'),
      totalBytes: med('totalBytes'),
    },
    medianRunJson: file,
    lcpElement: lcpElement(medianLhr),
    requests: networkRows(medianLhr).length,
  }
}

const ms = (v: number) => `${Math.round(v).toLocaleString('en-GB')} ms`
const kb = (v: number) => `${(v / 1024).toFixed(1)} KB`

export async function run(ctx: BenchContext): Promise<BenchPart> {
  mkdirSync(ctx.workDir, { recursive: true })
  const server = await startBuiltServer({ root: ctx.root, distDir: ctx.distDir, dataDir: join(ctx.workDir, 'lighthouse-db') })
  let pages: PageResult[]
  let sessionId: number
  let throttling: Result['configSettings']['throttling']
  try {
    const lifter = DEMO_ACCOUNTS.lifterKg
    const signedIn = await demoLifterWithStartedSession(server.baseUrl, lifter.email, DEMO_PASSWORD)
    sessionId = signedIn.session.id
    const signInPage = await measurePage({ ctx, baseUrl: server.baseUrl, name: 'Sign-in page', path: '/sign-in', slug: 'sign-in', storage: null })
    const trainPage = await measurePage({
      ctx,
      baseUrl: server.baseUrl,
      name: 'Train screen, session started',
      path: '/train',
      slug: 'train',
      storage: signedInStorage(signedIn),
    })
    // What the phone keeps after showing Train once today: the same answer the page will ask for.
    const day = localDayQuery()
    const today = await api<Today>(server.baseUrl, 'GET', '/train/today', { token: signedIn.token, query: day })
    const reopenedPage = await measurePage({
      ctx,
      baseUrl: server.baseUrl,
      name: 'Train screen, reopened the same day (plan kept on the phone)',
      path: '/train',
      slug: 'train-reopened',
      storage: {
        ...signedInStorage(signedIn),
        [SAVED_TODAY_KEY]: savedTodayEntry(signedIn.user.id, day, today),
      },
    })
    pages = [signInPage, trainPage, reopenedPage]
    const firstJson = JSON.parse(readFileSync(signInPage.medianRunJson, 'utf8')) as Result
    throttling = firstJson.configSettings.throttling
  } finally {
    await server.stop()
  }

  // The budgets are the two pages; the reopened Train screen is reported beside them.
  const budgets = pages.slice(0, 2).flatMap((p) => [
    budget({ name: `${p.name}: performance score`, value: p.median.score, limit: BUDGET_SCORE, unit: 'score (0–1)', kind: 'min' }),
    budget({ name: `${p.name}: LCP`, value: Math.round(p.median.lcpMs), limit: BUDGET_LCP_MS, unit: 'ms', kind: 'max', strict: true }),
    budget({ name: `${p.name}: CLS`, value: p.median.cls, limit: BUDGET_CLS, unit: '', kind: 'max', strict: true }),
  ])

  const lines: string[] = []
  lines.push(
    `Lighthouse ${lighthouseVersion()} (Node API) driving Debian's Chromium (${CHROMIUM_PATH}, headless), mobile form factor, ` +
      `simulated throttling (RTT ${throttling.rttMs} ms, ${(throttling.throughputKbps / 1024).toFixed(1)} Mbit/s, CPU slowdown ${throttling.cpuSlowdownMultiplier}x), ` +
      `performance category only, against the production server of the build on 127.0.0.1. ` +
      `**Each figure is the median of ${RUNS} runs**; every run is a first visit in a fresh Chromium profile (empty cache, no service worker). ` +
      `Machine: ${ctx.cores} cores.`,
    '',
    '| page | score | LCP | TBT | CLS | FCP | Speed Index | total bytes |',
    '|---|---:|---:|---:|---:|---:|---:|---:|',
  )
  for (const p of pages) {
    const m = p.median
    lines.push(`| ${p.name} (\`${p.path}\`) | ${Math.round(m.score * 100)} | ${ms(m.lcpMs)} | ${ms(m.tbtMs)} | ${m.cls.toFixed(3)} | ${ms(m.fcpMs)} | ${ms(m.speedIndexMs)} | ${kb(m.totalBytes)} |`)
  }
  lines.push('', 'Single runs (score, LCP, TBT, CLS):', '')
  for (const p of pages) {
    const runs = p.runs.map((r) => `${Math.round(r.score * 100)} / ${ms(r.lcpMs)} / ${ms(r.tbtMs)} / ${r.cls.toFixed(3)}`).join('; ')
    lines.push(`- ${p.name}: ${runs}. LCP element: \`${p.lcpElement ?? 'none reported'}\`; ${p.requests} requests in the median run.`)
  }
  lines.push(
    '',
    `The Train screen is loaded as the demo lifter ${DEMO_ACCOUNTS.lifterKg.name} with session ${sessionId} started through the API and the first-sign-in cautions confirmed; ` +
      `each run checks that the page stayed on \`/train\` and loaded \`/api/train/today\`. ` +
      `"Reopened the same day" is the same visit with the Train answer the phone kept from an earlier look that day (\`src/offline/saved-today.ts\`) also in localStorage, ` +
      `so the plan paints before the server answers; it is reported for comparison, and the budgets apply to the first two pages. ` +
      `Raw Lighthouse JSON of the median run (Lighthouse's own median-run pick by FCP and TTI) is kept in the work folder: ` +
      pages.map((p) => `\`${p.medianRunJson}\``).join(', ') + '.',
    '',
    `Budgets: score ≥ ${BUDGET_SCORE * 100}, LCP < ${BUDGET_LCP_MS} ms, CLS < ${BUDGET_CLS}.`,
  )

  return {
    title: '2. Load time (Lighthouse)',
    command: 'npx tsx tests/bench/lighthouse.ts',
    markdown: lines.join('\n'),
    figures: {
      runsPerPage: RUNS,
      statistic: 'median of runs',
      formFactor: 'mobile',
      throttlingMethod: 'simulate',
      throttling,
      pages: Object.fromEntries(
        pages.map((p) => [p.path, { name: p.name, median: p.median, runs: p.runs, lcpElement: p.lcpElement, medianRunJson: p.medianRunJson }]),
      ),
    },
    budgets,
  }
}

function lighthouseVersion(): string {
  const pkg = resolve(dirname(fileURLToPath(import.meta.url)), '../../node_modules/lighthouse/package.json')
  try {
    return (JSON.parse(readFileSync(pkg, 'utf8')) as { version: string }).version
  } catch {
    return '(version unknown)'
  }
}

if (isMainModule(import.meta.url)) void runAlone(run, import.meta.url)
