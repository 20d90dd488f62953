import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunSession, SessionReport } from '../../shared/schemas/run.schema'
import type { SessionDetail } from '../../shared/schemas/session.schema'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { launchChromium, phoneContext, signInThroughForm } from '../helpers/browser'
import { startBuiltServer } from '../helpers/server-process'

const VIEWPORT_HEIGHT = 844
const THUMB_ZONE_TOP = VIEWPORT_HEIGHT * 0.6 // the bottom 40 % of the screen
const artifacts = join('test-results', 'screenshots')

let server: Awaited<ReturnType<typeof startBuiltServer>>
let browser: Browser
let context: BrowserContext
let page: Page

/** Every control used during a set must sit in the bottom 40 % and be at least 56 px tall. */
async function tapInThumbZone(control: Locator) {
  const box = await control.boundingBox()
  expect(box, 'control is on screen').not.toBeNull()
  expect(box!.y, 'control starts inside the bottom 40 %').toBeGreaterThanOrEqual(THUMB_ZONE_TOP)
  expect(box!.y + box!.height).toBeLessThanOrEqual(VIEWPORT_HEIGHT)
  expect(box!.height, 'control is at least 56 px tall').toBeGreaterThanOrEqual(56)
  await control.tap()
}

async function api<T>(path: string, init: RequestInit = {}): Promise<T> {
  const token = await page.evaluate(() => localStorage.getItem('chalkline.token'))
  const res = await fetch(server.baseUrl + '/api' + path, {
    ...init,
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', ...(init.headers ?? {}) },
  })
  expect(res.ok, `${path} answered ${res.status}`).toBe(true)
  return (await res.json()) as T
}

const setLabel = () => page.getByTestId('set-label').innerText()
const card = () => page.getByTestId('set-card')

beforeAll(async () => {
  server = await startBuiltServer()
  mkdirSync(artifacts, { recursive: true })
  browser = await launchChromium()
  context = await phoneContext(browser)
  // Record vibration calls: the test's window onto the buzz (sound cues record themselves).
  await context.addInitScript(() => {
    const calls: unknown[] = []
    ;(window as unknown as { __vibrations: unknown[] }).__vibrations = calls
    Object.defineProperty(navigator, 'vibrate', { value: (pattern: unknown) => (calls.push(pattern), true), configurable: true })
  })
  page = await context.newPage()
  // A controllable clock: the rest clock counts from a stored end time, so jumping ahead is real.
  await page.clock.install()
})

afterAll(async () => {
  await browser?.close()
  await server?.stop()
})

describe('a whole demo session on a 390x844 phone, one thumb', () => {
  it('runs warm-ups, top set, back-off, rest clock, reload, finish and next step, and stores every set once', async () => {
    await page.goto(server.baseUrl + '/sign-in')
    await page.getByLabel('E-mail').fill(DEMO_ACCOUNTS.lifterKg.email)
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('button', { name: 'I understand' }).click()
    await page.getByRole('heading', { name: 'Train', exact: true }).waitFor()

    await tapInThumbZone(page.getByRole('button', { name: 'Start session' }))
    await card().waitFor()
    const { session: started } = await api<{ session: RunSession }>('/sessions/current')
    const firstExercise = started.exercises[0]
    const warmups = started.sets.filter((s) => s.exerciseId === firstExercise.exerciseId && s.kind === 'warmup')
    expect(warmups.length).toBeGreaterThan(0)

    // Warm-up ramp: tick each off with one tap; plates per side are drawn for a bar (or sled), none for a machine.
    const onPlates = firstExercise.equipment.kind === 'barbell' ? 1 : 0
    for (let i = 0; i < warmups.length; i++) {
      expect(await setLabel()).toMatch(new RegExp(`Warm-up ${i + 1} of ${warmups.length}`))
      expect(await page.getByTestId('set-plates').count()).toBe(onPlates)
      if (i === 0) await page.screenshot({ path: join(artifacts, 'set-card-warmup.png') })
      await tapInThumbZone(page.getByTestId('as-planned'))
    }

    // Top set: one tap logs it as planned; the rest clock starts by itself.
    expect(await setLabel()).toMatch(/Top set/)
    expect(await card().innerText()).toMatch(/Last time/)
    await page.screenshot({ path: join(artifacts, 'set-card-top.png') })
    await tapInThumbZone(page.getByTestId('as-planned'))
    const clock = page.getByTestId('rest-clock')
    await clock.waitFor()
    await page.screenshot({ path: join(artifacts, 'rest-clock.png') })

    // Reload mid-rest: the same set comes back and the clock keeps its end time.
    const timeBefore = await page.getByTestId('rest-clock-time').innerText()
    await page.reload()
    await card().waitFor()
    expect(await setLabel()).toMatch(/Back-off set 1 of 1/)
    await clock.waitFor()
    const seconds = (mmss: string) => mmss.split(':').reduce((total, part) => total * 60 + Number(part), 0)
    const timeAfter = await page.getByTestId('rest-clock-time').innerText()
    // The page clock keeps running during the reload, so allow the few seconds it takes.
    expect(seconds(timeBefore) - seconds(timeAfter)).toBeGreaterThanOrEqual(0)
    expect(seconds(timeBefore) - seconds(timeAfter)).toBeLessThanOrEqual(10)

    // Rest runs out (the page clock jumps past the 3 minutes): sound cues and vibration fire.
    await page.clock.runFor(firstExercise.restSec * 1000 + 2000)
    await expect.poll(() => page.evaluate(() => (window as unknown as { __chalklineCues?: Array<{ kind: string }> }).__chalklineCues?.map((c) => c.kind) ?? [])).toEqual(
      expect.arrayContaining(['warning', 'done']),
    )
    expect((await page.evaluate(() => (window as unknown as { __vibrations: unknown[] }).__vibrations)).length).toBeGreaterThanOrEqual(1)
    expect(await clock.innerText()).toMatch(/Rest over/i)

    // Back-off set with one rep fewer: taps only in the thumb zone, at most three.
    const backoff = (await api<{ session: RunSession }>('/sessions/current')).session.sets.find(
      (s) => s.exerciseId === firstExercise.exerciseId && s.kind === 'backoff',
    )!
    const plannedReps = Number.parseInt(await page.getByTestId('reps-value').innerText(), 10)
    await tapInThumbZone(page.getByTestId('reps-minus'))
    await tapInThumbZone(page.getByTestId('log-set'))

    // The rest of the session as planned, skipping each rest clock.
    for (let guard = 0; guard < 80; guard++) {
      const skip = page.getByTestId('rest-skip')
      if (await skip.isVisible()) await tapInThumbZone(skip)
      if (!(await card().isVisible())) break
      await tapInThumbZone(page.getByTestId('as-planned'))
    }
    await tapInThumbZone(page.getByTestId('finish-session'))
    await page.getByTestId('session-summary').waitFor()
    await page.screenshot({ path: join(artifacts, 'summary.png') })

    // Take the first exercise's next step.
    const firstStep = page.getByTestId('next-step').first()
    await firstStep.getByRole('button', { name: 'Take it' }).tap()
    await expect.poll(async () => (await api<{ report: SessionReport }>(`/sessions/${started.id}/report`)).report.exercises[0].taken).not.toBeNull()

    // Through the API: every planned set stored exactly once, the back-off with one rep fewer.
    const { session } = await api<{ session: SessionDetail }>(`/sessions/${started.id}`)
    expect(session.status).toBe('completed')
    const ids = session.sets.map((s) => s.id)
    expect(new Set(ids).size).toBe(ids.length)
    expect(ids.sort()).toEqual(started.sets.map((s) => s.id).sort())
    expect(session.sets.every((s) => s.loggedAt !== null)).toBe(true)
    expect(session.sets.find((s) => s.id === backoff.id)!.reps).toBe(plannedReps - 1)
    const { report } = await api<{ report: SessionReport }>(`/sessions/${started.id}/report`)
    expect(report.exercises[0].taken!.targetLoadKg).toBe(report.exercises[0].nextStep!.targetLoadKg)
  })
})

describe('a lift with no history on a 390x844 phone: the set card asks for a start', () => {
  it('finds the load with a short ramp from the empty bar and plans the sets from its hard set', async () => {
    const fresh = await phoneContext(browser)
    const phone = await fresh.newPage()
    const email = 'first.lift@example.com'
    const registered = await fetch(server.baseUrl + '/api/auth/register', {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ name: 'Rowan Pell', email, password: 'first-lift-password', role: 'lifter', unit: 'kg' }),
    })
    expect(registered.status).toBe(201)
    await signInThroughForm(phone, server.baseUrl, email, 'first-lift-password')
    await phone.getByRole('heading', { name: 'Train', exact: true }).waitFor()
    const token = await phone.evaluate(() => localStorage.getItem('chalkline.token'))
    const call = async <T>(method: string, path: string, body?: unknown): Promise<T> => {
      const res = await fetch(server.baseUrl + '/api' + path, {
        method,
        headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      })
      expect(res.ok, `${method} ${path} answered ${res.status}`).toBe(true)
      return (await res.json()) as T
    }
    const { session: empty } = await call<{ session: RunSession }>('POST', '/sessions?date=2026-12-01&tzOffset=0', { empty: true })
    const squat = (await call<{ exercises: Array<{ id: number; name: string }> }>('GET', '/exercises?q=Back%20squat')).exercises.find((e) => e.name === 'Back squat')!
    const { session: planned } = await call<{ session: RunSession }>('POST', `/sessions/${empty.id}/exercises`, { exerciseId: squat.id, role: 'compound_primary' })
    expect(planned.sets.filter((s) => s.kind !== 'warmup').map((s) => s.targetLoadKg)).toEqual([null, null])

    await phone.goto(server.baseUrl + '/train/session')
    const prompt = phone.getByTestId('start-prompt')
    await prompt.waitFor()
    expect(await prompt.innerText()).toMatch(/No starting load for Back squat yet/)
    const inThumbZone = async (id: string) => {
      const box = await phone.getByTestId(id).boundingBox()
      expect(box!.y, `${id} starts inside the bottom 40 %`).toBeGreaterThanOrEqual(THUMB_ZONE_TOP)
      expect(box!.height, `${id} is at least 56 px tall`).toBeGreaterThanOrEqual(56)
      await phone.getByTestId(id).tap()
    }

    // The ramp: the empty bar (20 kg in the default kilogram gym), then about 20 % a set.
    await inThumbZone('find-load')
    expect(await phone.getByTestId('target-load').innerText()).toMatch(/^20\s*kg$/)
    expect(await phone.getByTestId('ramp-caution').innerText()).toMatch(/stops well short of failure/)
    await inThumbZone('ramp-heavier') // 22.5 kg
    await inThumbZone('ramp-heavier') // 25 kg
    await inThumbZone('ramp-hard')
    await prompt.waitFor({ state: 'detached' })

    // The server kept the ramp's hard set as the start and planned the squat's sets from it.
    const { session } = await call<{ session: RunSession }>('GET', '/sessions/current')
    const working = session.sets.filter((s) => s.kind !== 'warmup')
    expect(working.every((s) => s.targetLoadKg !== null && s.targetLoadKg > 0)).toBe(true)
    expect(await phone.getByTestId('as-planned').isVisible()).toBe(true)
    await fresh.close()
  })
})

