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

    // The cautions are not shown again on the next visit. That visit sends today's request as
    // the app starts (src/main.ts) and the Train screen uses it: one request, not two.
    const todayRequests: string[] = []
    const apiOrder: string[] = []
    page.on('request', (req) => {
      const path = new URL(req.url()).pathname
      if (path === '/api/train/today') todayRequests.push(req.url())
      if (path.startsWith('/api/')) apiOrder.push(path)
    })
    await page.reload()
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    await page.getByRole('button', { name: /Start session/ }).waitFor()
    expect(await page.getByRole('button', { name: 'I understand' }).count()).toBe(0)
    expect(todayRequests).toHaveLength(1)
    // Sent before the app mounted: ahead of the signed-in user's refresh, which App.vue sends
    // once mounted (without the early request, Train asks only after the router's first navigation).
    expect(apiOrder.indexOf('/api/train/today')).toBeLessThan(apiOrder.indexOf('/api/me'))
    await page.close()
  })
})
