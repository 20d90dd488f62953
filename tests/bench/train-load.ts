/**
 * Bench part: the Train screen's first visit of the day as Chromium itself times it, under
 * DevTools throttling rather than Lighthouse's simulation. Lighthouse (part 2) re-times a fast
 * load through its Lantern model, which on this machine is dominated by main-thread time; this
 * part shows the order of events that the model folds away: when today's request leaves (from
 * src/main.ts, before the app mounts), when its answer is in, and when the browser reports the
 * first and the largest contentful paint. If the answer is in before the first paint, the card
 * waits for the app (its start-up, the answer's zod check, the render), not for the network.
 * Reported, no budget.
 *
 *   npx tsx tests/bench/train-load.ts      (against dist/, or the build in CHALKLINE_DIST)
 */
import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { launchChromium } from '../helpers/browser'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { median, type BenchContext, type BenchPart } from './bench-types'
import { demoLifterWithStartedSession, isMainModule, runAlone, signedInStorage, startBuiltServer } from './built-server'

const VISITS = 7
/** Lighthouse's mobile throttling figures (part 2), applied by DevTools to the real load. */
const LATENCY_MS = 150
const DOWNLOAD_BYTES_PER_S = (1.6 * 1024 * 1024) / 8
const UPLOAD_BYTES_PER_S = (750 * 1024) / 8
const CPU_SLOWDOWN = 4

interface Visit {
  todaySentMs: number
  todayAnsweredMs: number
  fcpMs: number
  lcpMs: number
}

/** Times read from the page's own performance entries, from the start of the navigation. */
async function readVisit(page: Page): Promise<Visit> {
  return page.evaluate(async () => {
    const lcp = await new Promise<PerformanceEntry[]>((resolve) => {
      new PerformanceObserver((list) => resolve(list.getEntries())).observe({ type: 'largest-contentful-paint', buffered: true })
    })
    const fcp = performance.getEntriesByName('first-contentful-paint')[0]
    const today = (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).find((e) => new URL(e.name).pathname === '/api/train/today')
    if (!today || !fcp || lcp.length === 0) throw new Error('the Train visit left no request for today, no first paint or no LCP entry')
    return { todaySentMs: today.startTime, todayAnsweredMs: today.responseEnd, fcpMs: fcp.startTime, lcpMs: lcp[lcp.length - 1]!.startTime }
  })
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  const server = await startBuiltServer({ root: ctx.root, distDir: ctx.distDir, dataDir: join(ctx.workDir, 'train-load-db') })
  const browser = await launchChromium()
  const visits: Visit[] = []
  try {
    const signedIn = await demoLifterWithStartedSession(server.baseUrl, DEMO_ACCOUNTS.lifterKg.email, DEMO_PASSWORD)
    for (let i = 1; i <= VISITS; i++) {
      // A fresh context each time: empty cache, no service worker, the lifter kept on the phone.
      const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, serviceWorkers: 'block' })
      try {
        const page = await context.newPage()
        await page.goto(server.baseUrl + '/api/health')
        await page.evaluate((items) => {
          for (const [key, value] of Object.entries(items)) localStorage.setItem(key, value)
        }, signedInStorage(signedIn))
        const cdp = await context.newCDPSession(page)
        await cdp.send('Network.enable')
        await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: LATENCY_MS, downloadThroughput: DOWNLOAD_BYTES_PER_S, uploadThroughput: UPLOAD_BYTES_PER_S })
        await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN })
        await page.goto(server.baseUrl + '/train')
        await page.getByRole('button', { name: /(Start|Resume) session/ }).first().waitFor({ timeout: 60_000 })
        if (new URL(page.url()).pathname !== '/train') throw new Error(`the visit ended on ${page.url()}, not /train`)
        const visit = await readVisit(page)
        visits.push(visit)
        ctx.log(`train-load visit ${i}/${VISITS}: today sent ${visit.todaySentMs.toFixed(0)} ms, answered ${visit.todayAnsweredMs.toFixed(0)} ms, FCP ${visit.fcpMs.toFixed(0)} ms, LCP ${visit.lcpMs.toFixed(0)} ms`)
      } finally {
        await context.close()
      }
    }
  } finally {
    await browser.close()
    await server.stop()
  }

  const med = (key: keyof Visit) => median(visits.map((v) => v[key]))
  const ms = (v: number) => `${Math.round(v).toLocaleString('en-GB')} ms`
  const row = (label: string, key: keyof Visit) => `| ${label} | ${ms(med(key))} | ${visits.map((v) => Math.round(v[key])).join(', ')} |`
  const markdown = [
    `The Train screen's first visit of the day (the demo lifter ${DEMO_ACCOUNTS.lifterKg.name} kept on the phone, a session started, no plan kept for today), ` +
      `loaded ${VISITS} times in Debian's Chromium (playwright-core, 390×844, fresh context each time, service worker blocked) ` +
      `with DevTools throttling at Lighthouse's mobile figures: ${LATENCY_MS} ms latency per request, 1.6 Mbit/s down, 750 kbit/s up, CPU slowed ${CPU_SLOWDOWN}×. ` +
      `Times are the page's own performance entries, from the start of the navigation. Machine: ${ctx.cores} cores. Reported, no budget.`,
    '',
    '| moment | median | single visits |',
    '|---|---:|---|',
    row("today's request sent", 'todaySentMs'),
    row("today's answer in", 'todayAnsweredMs'),
    row('first contentful paint', 'fcpMs'),
    row('largest contentful paint', 'lcpMs'),
    '',
    "DevTools throttling delays each request as a whole, so it is coarser than Lighthouse's simulation; compare builds with this part, not with part 2's figures.",
  ].join('\n')

  return {
    title: '2b. Train first visit, DevTools throttling',
    command: 'npx tsx tests/bench/train-load.ts',
    markdown,
    figures: {
      visits: VISITS,
      throttling: { latencyMs: LATENCY_MS, downloadBytesPerS: DOWNLOAD_BYTES_PER_S, uploadBytesPerS: UPLOAD_BYTES_PER_S, cpuSlowdown: CPU_SLOWDOWN },
      median: { todaySentMs: med('todaySentMs'), todayAnsweredMs: med('todayAnsweredMs'), fcpMs: med('fcpMs'), lcpMs: med('lcpMs') },
      runs: visits,
    },
    budgets: [],
  }
}

if (isMainModule(import.meta.url)) void runAlone(run, import.meta.url)
