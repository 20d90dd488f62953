import { chromium, type Browser, type Page } from 'playwright-core'

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

/**
 * Debian's Chromium, headless, with nothing reaching outside loopback. Playwright gives every
 * launch a fresh temporary profile (its own --user-data-dir).
 */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic',
    ],
  })
}

/** A phone-sized context: 390x844 with touch, as the product's thumb-zone rules assume. */
export async function phoneContext(browser: Browser) {
  return browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 })
}

/** Signs a demo account in through the form and confirms the first-sign-in cautions. */
export async function signInThroughForm(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(baseUrl + '/sign-in')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.getByRole('button', { name: 'I understand' }).click()
}
