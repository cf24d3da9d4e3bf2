// The system Chromium driven by playwright-core (never a downloaded browser). The flags keep it
// quiet on a machine without outside network.
import { existsSync } from 'node:fs'
import { chromium, type Browser, type Page } from 'playwright-core'
import { afterAll, beforeAll } from 'vitest'
import { startApp, type RunningApp } from './app'

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

export async function launch(): Promise<Browser> {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium not found at ${CHROMIUM}. Install it: sudo apt-get install -y chromium`)
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
}

/** Waits until the page has hydrated (forms enable their submit buttons only then). */
export async function ready(page: Page, selector = 'button[type=submit]:not([disabled])') {
  await page.waitForSelector(selector, { timeout: 15_000 })
}

export async function register(page: Page, base: string, user: { name: string, email: string, password: string }, path = '/register') {
  await page.goto(base + path)
  await ready(page)
  await page.fill('#name', user.name)
  await page.fill('#email', user.email)
  await page.fill('#password', user.password)
  await page.click('button[type=submit]')
}

export async function signIn(page: Page, base: string, email: string, password: string) {
  await page.goto(`${base}/login`)
  await ready(page)
  await page.fill('#email', email)
  await page.fill('#password', password)
  await page.click('button[type=submit]')
  await page.waitForURL(u => !u.pathname.startsWith('/login'))
}

/**
 * Starts the built app and the system Chromium once for a test file and stops both after it;
 * `bind` receives them for the file's own variables.
 */
export function withAppAndBrowser(bind: (app: RunningApp, browser: Browser) => void) {
  let app: RunningApp | undefined
  let browser: Browser | undefined
  beforeAll(async () => {
    [app, browser] = await Promise.all([startApp(), launch()])
    bind(app, browser)
  })
  afterAll(async () => {
    await browser?.close()
    await app?.stop()
  })
}
