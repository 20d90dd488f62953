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
const COMMENT = 'Strong top set. Keep the elbows tucked on the last reps.'

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

describe('the coach reviews a session and the lifter sees it', () => {
  it('comments on a set, marks the session reviewed, the lifter reads the comment, and the e-mail is in the outbox', async () => {
    const coachContext = await browser.newContext({ viewport: { width: 1100, height: 900 } })
    const coach = await coachContext.newPage()
    await signIn(coach, DEMO_ACCOUNTS.coach.email)
    await coach.getByRole('heading', { name: 'Athletes', exact: true }).waitFor()
    await coach.goto(server.baseUrl + '/review')
    const row = coach.getByTestId('desk-row').filter({ hasText: 'Ana Kovac' }).first()
    await row.click()
    await coach.getByTestId('review-set').first().waitFor()
    const sessionId = Number(new URL(coach.url()).pathname.split('/').pop())

    await coach.getByTestId('comment-set').first().click()
    await coach.getByTestId('comment-body').first().fill(COMMENT)
    await coach.getByTestId('send-comment').first().click()
    await coach.getByTestId('comment').filter({ hasText: COMMENT }).waitFor()
    await coach.getByTestId('mark-reviewed').click()
    await coach.getByTestId('reviewed-badge').waitFor()
    await coach.screenshot({ path: join(artifacts, 'review-session-desktop.png') })
    await coachContext.close()

    const lifterContext = await phoneContext(browser)
    const lifter = await lifterContext.newPage()
    await signIn(lifter, DEMO_ACCOUNTS.lifterKg.email)
    await lifter.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    await lifter.goto(`${server.baseUrl}/logbook/${sessionId}`)
    await lifter.getByTestId('coach-comment').filter({ hasText: COMMENT }).waitFor()
    await lifter.getByText(/Reviewed by Ines Marlowe/).waitFor()
    await lifter.screenshot({ path: join(artifacts, 'logbook-comment.png') })
    await lifterContext.close()

    // The "reviewed" e-mail went through SMTP to the local fake server.
    const outbox = await (await fetch(`${server.baseUrl}/api/dev/outbox`)).json()
    const mail = outbox.messages.find((m: { to: string; subject: string }) => m.to.includes(DEMO_ACCOUNTS.lifterKg.email) && /reviewed your/.test(m.subject))
    expect(mail).toBeDefined()
    expect(mail.text).toMatch(/left 1 comment/)
  })
})
