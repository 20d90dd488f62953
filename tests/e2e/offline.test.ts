import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import type { SessionDetail } from '../../shared/schemas/session.schema'
import { launchChromium, phoneContext, signInThroughForm } from '../helpers/browser'
import { startBuiltServer } from '../helpers/server-process'

const SETS = 30
const artifacts = join('test-results', 'screenshots')

let server: Awaited<ReturnType<typeof startBuiltServer>>
let browser: Browser
let context: BrowserContext
let page: Page

beforeAll(async () => {
  server = await startBuiltServer()
  mkdirSync(artifacts, { recursive: true })
  browser = await launchChromium()
  context = await phoneContext(browser)
  page = await context.newPage()
})

afterAll(async () => {
  await browser?.close()
  await server?.stop()
})

async function api<T>(path: string): Promise<T> {
  const token = await page.evaluate(() => localStorage.getItem('chalkline.token'))
  const res = await fetch(server.baseUrl + '/api' + path, { headers: { Authorization: `Bearer ${token}` } })
  expect(res.ok, `${path} answered ${res.status}`).toBe(true)
  return (await res.json()) as T
}

interface StoredEntry {
  seq: number
  sessionId: number
  setId: string
  body: { loggedAt: string | null; editedAt: string }
}

/** The phone's outbox, read straight from the page's IndexedDB (database `chalkline`, store `outbox`). */
function readOutbox(): Promise<StoredEntry[]> {
  return page.evaluate(
    () =>
      new Promise<StoredEntry[]>((resolve, reject) => {
        const open = indexedDB.open('chalkline')
        open.onerror = () => reject(open.error)
        open.onsuccess = () => {
          const db = open.result
          if (!db.objectStoreNames.contains('outbox')) {
            db.close()
            return resolve([])
          }
          const read = db.transaction('outbox').objectStore('outbox').index('bySeq').getAll()
          read.onerror = () => reject(read.error)
          read.onsuccess = () => {
            db.close()
            resolve(read.result as StoredEntry[])
          }
        }
      }),
  )
}

/** "n sets kept on this phone": the number on the quiet indicator (0 when it is not shown). */
async function pendingShown() {
  const indicator = page.getByTestId('pending-sets')
  if ((await indicator.count()) === 0) return 0
  return Number((await indicator.innerText()).match(/^(\d+) sets?/)?.[1] ?? NaN)
}

/** Skips a running rest clock if one shows; returns whether a set card is there to log. */
async function readyToLog() {
  const skip = page.getByTestId('rest-skip')
  if (await skip.isVisible()) await skip.tap()
  return page.getByTestId('set-card').isVisible()
}

describe('training with no signal', () => {
  it(`logs ${SETS} sets while the network is cut and restored, reloads twice offline, and every set arrives once, in order`, async () => {
    await signInThroughForm(page, server.baseUrl, DEMO_ACCOUNTS.lifterAdvanced.email, DEMO_PASSWORD)
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    // One visit installs the service worker; it then controls the page.
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker?.controller !== null), { timeout: 30_000 }).toBe(true)

    // Network plan by set number: cut, restore, reload while cut (twice).
    const offlineAt = new Set([2, 9, 17, 24])
    const onlineAt = new Set([6, 14, 21, 28])
    const reloadAt = new Set([11, 19])
    const sessionIds: number[] = []
    let logged = 0
    let offline = false

    while (logged < SETS) {
      if (!(await page.getByTestId('set-card').isVisible()) && !(await page.getByTestId('finish-session').isVisible())) {
        // On Train: start (or resume) a session; on a rest day, train the next day anyway.
        await page.getByRole('button', { name: /Start session|Resume session|Train anyway/ }).first().tap()
        await page.getByTestId('set-card').waitFor()
        sessionIds.push((await api<{ session: { id: number } }>('/sessions/current')).session.id)
      }
      if (!(await readyToLog())) {
        // Every set of this session is logged: finish it (needs signal to send the last sets).
        if (offline) {
          await context.setOffline(false)
          offline = false
        }
        await page.getByTestId('finish-session').tap()
        await page.getByTestId('session-summary').waitFor({ timeout: 30_000 })
        await page.getByTestId('summary-done').tap()
        await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()
        continue
      }
      await page.getByTestId('as-planned').tap()
      logged += 1
      if (offlineAt.has(logged)) {
        await context.setOffline(true)
        offline = true
      }
      if (onlineAt.has(logged)) {
        await context.setOffline(false)
        offline = false
      }
      if (reloadAt.has(logged)) {
        expect(offline, 'reloads happen with no signal').toBe(true)
        // The sets logged with no signal wait in IndexedDB, in the order they were logged.
        const waiting = await pendingShown()
        expect(waiting, 'at least the sets logged since the cut are waiting').toBeGreaterThanOrEqual(2)
        await expect.poll(async () => (await readOutbox()).length).toBe(waiting)
        const stored = await readOutbox()
        expect(stored.map((e) => e.sessionId)).toEqual(stored.map(() => sessionIds.at(-1)))
        const loggedTimes = stored.map((e) => e.body.loggedAt)
        expect(loggedTimes.every((t) => t !== null)).toBe(true)
        expect(loggedTimes).toEqual([...loggedTimes].sort())
        await page.reload()
        await page.getByTestId('set-card').or(page.getByTestId('finish-session')).first().waitFor()
        // After the reload the page shows the same waiting sets, read back from IndexedDB.
        expect(await pendingShown()).toBe(waiting)
        expect((await readOutbox()).map((e) => e.setId)).toEqual(stored.map((e) => e.setId))
        await page.screenshot({ path: join(artifacts, `offline-reload-${logged}.png`) })
      }
    }
    await context.setOffline(false)
    // The quiet indicator goes away once the phone has sent everything.
    await expect.poll(() => page.getByTestId('pending-sets').count(), { timeout: 30_000 }).toBe(0)
    // Acknowledged sets leave the phone's outbox.
    await expect.poll(async () => (await readOutbox()).length).toBe(0)

    let stored = 0
    for (const id of sessionIds) {
      const { session } = await api<{ session: SessionDetail }>(`/sessions/${id}`)
      const done = session.sets.filter((s) => s.loggedAt !== null)
      const ids = done.map((s) => s.id)
      expect(new Set(ids).size).toBe(ids.length) // exactly once
      // In order: the log times follow the order of the sets in the session.
      const byPosition = [...done].sort((a, b) => a.position - b.position).map((s) => s.loggedAt)
      expect(byPosition).toEqual([...byPosition].sort())
      stored += done.length
    }
    expect(stored).toBe(SETS)
  })
})
