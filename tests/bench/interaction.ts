/**
 * Bench part 3: the one-tap log. Time from the tap on "As planned" to the next set card painted,
 * read from the app's own performance marks (src/views/SessionRunView.vue: `as-planned:tap` at
 * the start of the handler, `as-planned:next-card` after the frame with the new card, and the
 * measure `as-planned→next-card` between them).
 *
 * Debian's Chromium through playwright-core, a 390x844 phone with touch, CPU throttled 4x with
 * CDP's Emulation.setCPUThrottlingRate. A demo lifter signs in through the form; sessions are
 * started through the API and run in the app; every sample is a real touch tap on As planned
 * that logs one set (the progress count goes up by one) and brings the next card. When a
 * session has no set left, it is finished in the app and the next one started, until there are
 * enough taps.
 *
 * Logging must never wait for the network, so the taps run under three network conditions, 50
 * taps each: the API answering on loopback as usual; every API response held back 2 s (page.route);
 * and no network at all (context.setOffline). A tap that waited for the network would take at
 * least the 2 s delay under the second condition; each is counted.
 *
 * Alone: `npx tsx tests/bench/interaction.ts` (uses the build at dist/ or $CHALKLINE_DIST).
 */
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, BrowserContext, CDPSession, Page, Route } from 'playwright-core'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { launchChromium, signInThroughForm } from '../helpers/browser'
import { budget, median, percentileOfSorted, type BenchContext, type BenchPart } from './bench-types'
import { isMainModule, runAlone, startBuiltServer, startOrResumeSession } from './built-server'

const TAPS = 50
const CPU_SLOWDOWN = 4
const API_DELAY_MS = 2000
/** A short pause between taps, so one tap's follow-up work (storage, sending) does not land in the next tap's timing. */
const PAUSE_BETWEEN_TAPS_MS = 250
const BUDGET_MEDIAN_MS = 50
const MEASURE = 'as-planned→next-card'

type Condition = 'online' | 'api-delayed' | 'offline'
const CONDITION_LABEL: Record<Condition, string> = {
  online: 'API on loopback, answering at once',
  'api-delayed': `every API response held back ${API_DELAY_MS / 1000} s`,
  offline: 'no network (context offline)',
}

interface Stats {
  taps: number
  medianMs: number
  p90Ms: number
  maxMs: number
  minMs: number
}

function stats(samples: number[]): Stats {
  return {
    taps: samples.length,
    medianMs: median(samples),
    p90Ms: percentileOfSorted([...samples].sort((a, b) => a - b), 90),
    maxMs: Math.max(...samples),
    minMs: Math.min(...samples),
  }
}

class Runner {
  private delayedApiCalls = 0
  private routed = false
  sessionsUsed = new Set<number>()

  constructor(
    private readonly ctx: BenchContext,
    private readonly baseUrl: string,
    private readonly context: BrowserContext,
    private readonly page: Page,
    private readonly token: string,
  ) {}

  get delayedCalls() {
    return this.delayedApiCalls
  }

  private readonly delay = async (route: Route) => {
    this.delayedApiCalls += 1
    await new Promise((r) => setTimeout(r, API_DELAY_MS))
    await route.continue().catch(() => undefined) // the page may have moved on meanwhile
  }

  private cdp: CDPSession | null = null

  /** The CDP session stays attached: Chromium drops its emulation settings when it detaches. */
  private async throttle() {
    this.cdp ??= await this.context.newCDPSession(this.page)
    await this.cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN })
  }

  /** Opens the runner on a started session (the network condition is lifted meanwhile). */
  async openSession() {
    const session = await startOrResumeSession(this.baseUrl, this.token)
    this.sessionsUsed.add(session.id)
    await this.page.goto(this.baseUrl + '/train/session')
    await this.page.getByTestId('set-card').waitFor()
    await this.throttle()
  }

  async apply(condition: Condition) {
    if (condition === 'api-delayed') {
      await this.page.route('**/api/**', this.delay)
      this.routed = true
    }
    if (condition === 'offline') await this.context.setOffline(true)
  }

  async lift() {
    if (this.routed) {
      await this.page.unroute('**/api/**', this.delay)
      this.routed = false
    }
    await this.context.setOffline(false)
  }

  /** Finishes the session in the app (all its sets are logged) and opens the next one. */
  async nextSession(condition: Condition) {
    await this.lift()
    await this.page.getByTestId('finish-session').tap()
    await this.page.getByTestId('session-summary').waitFor({ timeout: 60_000 })
    await this.openSession()
    await this.apply(condition)
  }

  private async loggedCount(): Promise<number> {
    const text = await this.page.locator('.session-run-view__progress').innerText()
    const m = /^(\d+) of (\d+) sets$/.exec(text.trim())
    if (!m) throw new Error(`unexpected progress text "${text}"`)
    return Number(m[1])
  }

  /** One real tap on As planned; returns the app's measure for it. */
  async tap(): Promise<number> {
    const page = this.page
    const measures = () => page.evaluate((name) => performance.getEntriesByName(name, 'measure').length, MEASURE)
    const before = await measures()
    const logged = await this.loggedCount()
    const card = await page.getByTestId('set-card').getAttribute('aria-label')
    await page.getByTestId('as-planned').tap()
    await page.waitForFunction(([name, n]) => performance.getEntriesByName(name as string, 'measure').length > (n as number), [MEASURE, before] as const, {
      timeout: 30_000,
    })
    const [duration, count] = await page.evaluate((name) => {
      const all = performance.getEntriesByName(name, 'measure')
      return [all.at(-1)!.duration, all.length] as const
    }, MEASURE)
    if (count !== before + 1) throw new Error(`one tap gave ${count - before} measures`)
    if ((await this.loggedCount()) !== logged + 1) throw new Error('the tap did not log exactly one set')
    const cardAfter = (await page.getByTestId('set-card').isVisible()) ? await page.getByTestId('set-card').getAttribute('aria-label') : null
    const allDone = await page.getByTestId('finish-session').isVisible()
    if (!allDone && cardAfter === null) throw new Error('no set card after the tap')
    if (!allDone && cardAfter === card) throw new Error(`the card still shows "${card}" after the tap`)
    return duration
  }

  async samples(condition: Condition, count: number): Promise<number[]> {
    await this.apply(condition)
    const out: number[] = []
    try {
      while (out.length < count) {
        if (!(await this.page.getByTestId('set-card').isVisible())) await this.nextSession(condition)
        out.push(await this.tap())
        await this.page.waitForTimeout(PAUSE_BETWEEN_TAPS_MS)
      }
    } finally {
      await this.lift()
    }
    this.ctx.log(`interaction ${condition}: median ${median(out).toFixed(1)} ms over ${out.length} taps`)
    return out
  }
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  mkdirSync(ctx.workDir, { recursive: true })
  const server = await startBuiltServer({ root: ctx.root, distDir: ctx.distDir, dataDir: join(ctx.workDir, 'interaction-db') })
  let browser: Browser | undefined
  const results = {} as Record<Condition, Stats>
  const raw = {} as Record<Condition, number[]>
  let delayedCalls = 0
  let sessions = 0
  try {
    browser = await launchChromium()
    // The phone of tests/helpers/browser.ts phoneContext; service workers blocked so that page.route
    // sees every API call (the worker never caches the API anyway).
    const context = await browser.newContext({
      viewport: { width: 390, height: 844 },
      hasTouch: true,
      isMobile: true,
      deviceScaleFactor: 2,
      serviceWorkers: 'block',
    })
    const page = await context.newPage()
    const lifter = DEMO_ACCOUNTS.lifterAdvanced
    await signInThroughForm(page, server.baseUrl, lifter.email, DEMO_PASSWORD)
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    const token = await page.evaluate(() => localStorage.getItem('chalkline.token'))
    if (!token) throw new Error('no token after signing in')
    const runner = new Runner(ctx, server.baseUrl, context, page, token)
    await runner.openSession()
    for (const condition of ['online', 'api-delayed', 'offline'] as const) {
      raw[condition] = await runner.samples(condition, TAPS)
      results[condition] = stats(raw[condition])
    }
    delayedCalls = runner.delayedCalls
    sessions = runner.sessionsUsed.size
  } finally {
    await browser?.close()
    await server.stop()
  }

  if (delayedCalls === 0) throw new Error('the 2 s delay never held back an API call: the condition was not applied')
  const waited = raw['api-delayed'].filter((d) => d >= API_DELAY_MS).length
  const main = results['api-delayed']
  const f = (v: number) => `${v.toFixed(1)} ms`
  const lines = [
    `Time from the tap on **As planned** to the next set card painted, read from the app's performance marks ` +
      `(\`${MEASURE}\`: handler start → a task after the frame that shows the new card). ` +
      `Debian's Chromium (playwright-core), 390×844 phone with touch, **CPU throttled ${CPU_SLOWDOWN}×** (CDP Emulation.setCPUThrottlingRate), ` +
      `${TAPS} real taps per network condition, each logging one set; ${PAUSE_BETWEEN_TAPS_MS} ms between taps; ${sessions} demo sessions of ${DEMO_ACCOUNTS.lifterAdvanced.name} used. Machine: ${ctx.cores} cores.`,
    '',
    '| network during the taps | taps | median | p90 | max | min |',
    '|---|---:|---:|---:|---:|---:|',
    ...(Object.keys(results) as Condition[]).map((c) => {
      const s = results[c]
      return `| ${CONDITION_LABEL[c]} | ${s.taps} | ${f(s.medianMs)} | ${f(s.p90Ms)} | ${f(s.maxMs)} | ${f(s.minMs)} |`
    }),
    '',
    `Logging never waits for the network: with every API response held back ${API_DELAY_MS / 1000} s (${delayedCalls} calls held), ` +
      `${waited} of ${TAPS} taps took ${API_DELAY_MS} ms or more; the median is ${(main.medianMs / results.online.medianMs).toFixed(2)}× the loopback median, ` +
      `and offline ${(results.offline.medianMs / results.online.medianMs).toFixed(2)}×.`,
    '',
    `Budget: median < ${BUDGET_MEDIAN_MS} ms under every network condition; no tap waits for the network.`,
  ]
  return {
    title: '3. Interaction: As planned → next set card',
    command: 'npx tsx tests/bench/interaction.ts',
    markdown: lines.join('\n'),
    figures: {
      measure: MEASURE,
      cpuSlowdown: CPU_SLOWDOWN,
      viewport: '390x844, touch',
      tapsPerCondition: TAPS,
      apiDelayMs: API_DELAY_MS,
      pauseBetweenTapsMs: PAUSE_BETWEEN_TAPS_MS,
      sessions,
      delayedApiCalls: delayedCalls,
      tapsThatWaitedForNetwork: waited,
      conditions: results,
      samplesMs: raw,
    },
    budgets: [
      ...(Object.keys(results) as Condition[]).map((c) =>
        budget({ name: `As planned → next card, median (${CONDITION_LABEL[c]})`, value: Number(results[c].medianMs.toFixed(1)), limit: BUDGET_MEDIAN_MS, unit: 'ms', kind: 'max', strict: true }),
      ),
      budget({ name: `As planned taps that waited for the network (≥ ${API_DELAY_MS} ms with the API delayed)`, value: waited, limit: 0, unit: 'taps', kind: 'max' }),
    ],
  }
}

if (isMainModule(import.meta.url)) void runAlone(run, import.meta.url)
