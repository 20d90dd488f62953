import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, phoneContext } from '../helpers/browser'
import { startBuiltServer } from '../helpers/server-process'
import { DEMO_PASSWORD, DEMO_ACCOUNTS } from '../../server/db/seed/demo-accounts'

let server: Awaited<ReturnType<typeof startBuiltServer>>
let browser: Browser
let context: BrowserContext
const artifacts = join('test-results', 'screenshots')

beforeAll(async () => {
  server = await startBuiltServer()
  mkdirSync(artifacts, { recursive: true })
  browser = await launchChromium()
  context = await phoneContext(browser)
})

afterAll(async () => {
  await browser?.close()
  await server?.stop()
})

describe('a demo lifter on a 390x844 phone', () => {
  it('signs in, confirms the cautions once, and sees the Train tab with today\'s session', async () => {
    const page = await context.newPage()
    const requestsOffOrigin: string[] = []
    page.on('request', (req) => {
      if (!req.url().startsWith(server.baseUrl) && !req.url().startsWith('data:')) requestsOffOrigin.push(req.url())
    })

    await page.goto(server.baseUrl + '/')
    await expect.poll(() => new URL(page.url()).pathname).toBe('/sign-in')

    await page.getByLabel('E-mail').fill(DEMO_ACCOUNTS.lifterKg.email)
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()

    // First sign-in: the training cautions, confirmed with one button.
    const understand = page.getByRole('button', { name: 'I understand' })
    await understand.waitFor({ timeout: 15_000 })
    await expect.poll(() => page.getByText(/spotter/i).first().isVisible()).toBe(true)
    await understand.click()

    await expect.poll(() => new URL(page.url()).pathname).toBe('/train')
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    // Today's session from the demo plan, with its version.
    await page.getByText(/version (I|II)/).first().waitFor()
    await page.getByRole('button', { name: /Start session/ }).waitFor()
    for (const tab of ['Train', 'Logbook', 'Plan', 'Me']) {
      expect(await page.getByRole('tablist').getByText(tab, { exact: true }).isVisible()).toBe(true)
    }
    await page.screenshot({ path: join(artifacts, 'train-390x844.png') })

    // Fonts and scripts all come from our own origin.
    expect(requestsOffOrigin).toEqual([])

    // The cautions are not shown again on the next visit. The phone kept today's plan from the
    // first visit, so Train paints it before the server answers (held back here), and asks once.
    const todayRequests: string[] = []
    const apiOrder: string[] = []
    page.on('request', (req) => {
      const path = new URL(req.url()).pathname
      if (path === '/api/train/today') todayRequests.push(req.url())
      if (path.startsWith('/api/')) apiOrder.push(path)
    })
    let releaseToday = () => {}
    const todayHeld = new Promise<void>((resolve) => (releaseToday = resolve))
    await page.route('**/api/train/today*', async (route) => {
      await todayHeld
      await route.continue()
    })
    await page.reload()
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    await page.getByText(/version (I|II)/).first().waitFor() // from the phone: the answer is still held
    await page.getByRole('button', { name: /Start session/ }).waitFor()
    expect(await page.getByRole('button', { name: 'I understand' }).count()).toBe(0)
    await expect.poll(() => todayRequests.length).toBe(1)
    const answered = page.waitForResponse((res) => new URL(res.url()).pathname === '/api/train/today')
    releaseToday()
    await answered
    await page.unroute('**/api/train/today*')

    // With no plan kept (another day), the request goes out as the app starts: ahead of the
    // signed-in user's refresh, which App.vue sends after the first paint (without the early
    // request, Train would ask only after the router's first navigation). One request, not two.
    todayRequests.length = 0
    apiOrder.length = 0
    await page.evaluate(() => localStorage.removeItem('chalkline.today'))
    await page.reload()
    await page.getByText(/version (I|II)/).first().waitFor()
    await page.getByRole('button', { name: /Start session/ }).waitFor()
    await expect.poll(() => apiOrder.includes('/api/me')).toBe(true)
    expect(todayRequests).toHaveLength(1)
    // Which left first, by the page's own clock (Resource Timing's startTime: when the page made
    // the request). The order of Playwright's request events is not that: with the service worker
    // of the first visit in the way, an earlier request can be reported after a later one.
    const startedAt = async () =>
      page.evaluate(() =>
        (performance.getEntriesByType('resource') as PerformanceResourceTiming[])
          .filter((e) => ['/api/train/today', '/api/me'].includes(new URL(e.name).pathname))
          .map((e) => ({ path: new URL(e.name).pathname, start: e.startTime })),
      )
    await expect.poll(async () => (await startedAt()).length).toBe(2)
    const started = await startedAt()
    const todayAt = started.find((e) => e.path === '/api/train/today')!.start
    const meAt = started.find((e) => e.path === '/api/me')!.start
    expect(todayAt).toBeLessThan(meAt)
    await page.close()
  })
})
