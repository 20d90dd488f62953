import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunSession, SessionReport } from '../../shared/schemas/run.schema'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { launchChromium, phoneContext, signInThroughForm } from '../helpers/browser'
import { startBuiltServer } from '../helpers/server-process'

/**
 * Beat last time, as a lifter and a coach meet it on the demo club: Ana runs her push day
 * (version I, the bench press as its main lift) twice in a row, every set "As planned", and takes
 * every next step. Neither session may show a regression anywhere, and the bench press shows one
 * estimated-1RM figure on her summary and on the coach's review.
 */
let server: Awaited<ReturnType<typeof startBuiltServer>>
let browser: Browser
let lifter: Page
const artifacts = join('test-results', 'screenshots')
const BENCH = 'Barbell bench press'

async function api<T>(page: Page, path: string): Promise<T> {
  const token = await page.evaluate(() => localStorage.getItem('chalkline.token'))
  const res = await fetch(server.baseUrl + '/api' + path, { headers: { Authorization: `Bearer ${token}` } })
  expect(res.ok, `${path} answered ${res.status}`).toBe(true)
  return (await res.json()) as T
}

beforeAll(async () => {
  server = await startBuiltServer()
  mkdirSync(artifacts, { recursive: true })
  browser = await launchChromium()
  lifter = await (await phoneContext(browser)).newPage()
  await signInThroughForm(lifter, server.baseUrl, DEMO_ACCOUNTS.lifterKg.email, DEMO_PASSWORD)
  await lifter.getByRole('heading', { name: 'Train', exact: true }).waitFor()
})

afterAll(async () => {
  await browser?.close()
  await server?.stop()
})

/** Ana starts push version I from Train, logs every set as planned, finishes and takes every next step. */
async function runPushAsPlanned(round: number): Promise<{ sessionId: number; benchFigure: string }> {
  await lifter.goto(server.baseUrl + '/train')
  await lifter.getByTestId('pick-another-day').click()
  await lifter.getByRole('button', { name: 'Push · version I', exact: true }).click()
  await lifter.getByTestId('set-card').waitFor()
  const { session } = await api<{ session: RunSession }>(lifter, '/sessions/current')
  const bench = session.exercises.find((e) => e.name === BENCH)!
  for (let guard = 0; guard < 80; guard++) {
    const skip = lifter.getByTestId('rest-skip')
    if (await skip.isVisible()) await skip.tap()
    if (!(await lifter.getByTestId('set-card').isVisible())) break
    if (round === 1 && (await lifter.getByTestId('set-label').innerText()).includes('Top set') && (await lifter.getByTestId('set-card').innerText()).includes(BENCH)) {
      await lifter.screenshot({ path: join(artifacts, 'beat-last-time-bench-top-set.png') })
    }
    await lifter.getByTestId('as-planned').tap()
  }
  await lifter.getByTestId('finish-session').tap()
  await lifter.getByTestId('session-summary').waitFor()

  // Every bench set was done as planned: the server's report agrees.
  const { report } = await api<{ report: SessionReport }>(lifter, `/sessions/${session.id}/report`)
  const benchReport = report.exercises.find((e) => e.exerciseId === bench.exerciseId)!
  expect(benchReport.asPlanned).toBe(true)
  expect(benchReport.regression).toBe(false)
  expect(report.exercises.every((e) => !e.regression)).toBe(true)
  expect(benchReport.nextStep!.gain.pct).toBeGreaterThanOrEqual(0)

  const card = lifter.getByTestId('next-step').filter({ hasText: BENCH })
  const benchFigure = (await card.getByTestId('e1rm-change').innerText()).trim()
  expect(benchFigure).not.toMatch(/[−-]/) // a set done as planned never reads as a step back
  await card.scrollIntoViewIfNeeded()
  await lifter.screenshot({ path: join(artifacts, `beat-last-time-summary-${round}.png`) })
  await lifter.getByTestId('take-all').tap()
  await expect.poll(async () => (await api<{ report: SessionReport }>(lifter, `/sessions/${session.id}/report`)).report.exercises.every((e) => !e.nextStep || e.taken)).toBe(true)
  return { sessionId: session.id, benchFigure }
}

describe("Ana's bench press, twice in a row as planned", () => {
  it('shows progress, never a regression, and the same figure to the lifter and the coach', async () => {
    const first = await runPushAsPlanned(1)
    const second = await runPushAsPlanned(2)

    // The second session planned the bench from the first one's taken next step.
    const { report } = await api<{ report: SessionReport }>(lifter, `/sessions/${second.sessionId}/report`)
    const secondBench = report.exercises.find((e) => e.name === BENCH)!
    expect(secondBench.previousBestE1rmKg).not.toBeNull()
    expect(secondBench.e1rmChangePct!).toBeGreaterThanOrEqual(0)

    const coachContext = await browser.newContext({ viewport: { width: 1440, height: 900 } })
    const coach = await coachContext.newPage()
    await signInThroughForm(coach, server.baseUrl, DEMO_ACCOUNTS.coach.email, DEMO_PASSWORD)
    await coach.getByRole('heading', { name: 'Athletes', exact: true }).waitFor()
    await coach.goto(server.baseUrl + '/review')
    await coach.getByTestId('desk-row').first().waitFor()
    await coach.screenshot({ path: join(artifacts, 'beat-last-time-review-desk.png') })
    for (const { sessionId, benchFigure } of [first, second]) {
      const review = await api<{ review: { flags: Array<{ code: string }> } }>(coach, `/sessions/${sessionId}/review`)
      expect(review.review.flags.map((f) => f.code)).not.toContain('regression')
      await coach.goto(`${server.baseUrl}/review/${sessionId}`)
      const exercise = coach.getByTestId('review-exercise').filter({ hasText: BENCH })
      await exercise.waitFor()
      expect(await coach.getByTestId('flag-regression').count()).toBe(0)
      expect((await exercise.getByTestId('review-e1rm-change').innerText()).trim()).toBe(benchFigure)
    }
    await coach.screenshot({ path: join(artifacts, 'beat-last-time-review-session.png') })
    await coachContext.close()
  })
})
