import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { launchChromium, phoneContext, signInThroughForm } from '../helpers/browser'
import { startBuiltServer } from '../helpers/server-process'

let server: Awaited<ReturnType<typeof startBuiltServer>>
let browser: Browser
const artifacts = join('test-results', 'screenshots')

const signIn = (page: Page, email: string) => signInThroughForm(page, server.baseUrl, email, DEMO_PASSWORD)

beforeAll(async () => {
  server = await startBuiltServer()
  mkdirSync(artifacts, { recursive: true })
  browser = await launchChromium()
})

afterAll(async () => {
  await browser?.close()
  await server?.stop()
})

describe('a coach builds and assigns a plan', () => {
  it('makes a two-day plan with versions I/II from a template, assigns it, and the athlete trains its first day', async () => {
    const coachContext = await browser.newContext({ viewport: { width: 1100, height: 900 } })
    const coach = await coachContext.newPage()
    await signIn(coach, DEMO_ACCOUNTS.coach.email)
    await coach.getByRole('heading', { name: 'Athletes' }).waitFor()
    await coach.goto(server.baseUrl + '/plans')

    await coach.getByTestId('new-plan').click()
    await coach.getByTestId('template-upper_lower').click()
    await coach.getByLabel('Plan name').fill('Two-day test block')
    await coach.getByTestId('create-plan').click()

    // The template has Upper, Lower and a rest day: remove the rest day to keep two days.
    await expect.poll(() => coach.getByTestId('plan-day').count()).toBe(3)
    await coach.getByTestId('remove-day').nth(2).click()
    await expect.poll(() => coach.getByTestId('plan-day').count()).toBe(2)
    await coach.getByText('version II', { exact: false }).first().waitFor()
    await coach.getByTestId('plan-checks').waitFor()
    await coach.getByTestId('save-plan').click()
    await coach.getByText(/Saved/i).first().waitFor()
    await coach.screenshot({ path: join(artifacts, 'plan-editor-desktop.png') })

    await coach.getByTestId('assign-plan').click()
    const ben = await (await fetch(server.baseUrl + '/api/auth/sign-in', {
      method: 'POST', headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: DEMO_ACCOUNTS.lifterLb.email, password: DEMO_PASSWORD }),
    })).json()
    await coach.getByTestId(`assign-athlete-${ben.user.id}`).click()
    await coach.getByTestId('confirm-assign').click()
    await coach.getByText(/Assigned/i).first().waitFor()
    await coachContext.close()

    const lifterContext = await phoneContext(browser)
    const lifter = await lifterContext.newPage()
    await signIn(lifter, DEMO_ACCOUNTS.lifterLb.email)
    await lifter.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    await lifter.getByText('Two-day test block').waitFor()
    await lifter.getByText(/Upper · version I\b/).waitFor()
    await lifter.screenshot({ path: join(artifacts, 'train-after-assign.png') })
    await lifterContext.close()
  })
})
