/**
 * Drives Debian's Chromium through playwright-core. Every page records console errors,
 * failed requests and Vue hydration warnings; tests assert none happened.
 */
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { inject } from 'vitest'

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
const SCREENSHOT_DIR = join(process.cwd(), 'tests/browser/screenshots')

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-quic', '--no-first-run', '--disable-sync'],
  })
}

export interface WatchedPage {
  page: Page
  context: BrowserContext
  problems: string[]
}

/** A fresh context and page at the given width, with its problems collected; `timezoneId` sets the browser's own clock. */
export async function openPage(browser: Browser, width = 1280, options: { timezoneId?: string } = {}): Promise<WatchedPage> {
  const context = await browser.newContext({
    baseURL: inject('baseURL'),
    viewport: { width, height: width < 500 ? 812 : 900 },
    deviceScaleFactor: 1,
    timezoneId: options.timezoneId,
  })
  const page = await context.newPage()
  const problems: string[] = []
  page.on('console', (message) => {
    const text = message.text()
    if (message.type() === 'error' || /hydration/i.test(text)) problems.push(`${message.type()}: ${text}`)
  })
  page.on('pageerror', error => problems.push(`pageerror: ${error.message}`))
  page.on('response', (response) => {
    // 401s are how a signed-out page learns it is signed out; everything else >= 400 is a problem.
    if (response.status() >= 400 && response.status() !== 401) problems.push(`${response.status()} ${response.url()}`)
  })
  // A full page load is only usable once Vue has hydrated it: a click before then submits a
  // form natively or is lost, which a loaded machine turns into a failed test. Every goto
  // therefore waits for hydration, as a person waits for the page to respond.
  const goto = page.goto.bind(page)
  page.goto = async (url, options) => {
    const response = await goto(url, options)
    await waitForHydration(page)
    return response
  }
  return { page, context, problems }
}

/** Resolves when Nuxt has finished hydrating the page (or the page is not a Nuxt page). */
export async function waitForHydration(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const root = document.querySelector('#__nuxt') as (Element & { __vue_app__?: { config: { globalProperties: { $nuxt?: { isHydrating?: boolean } } } } }) | null
    if (!root) return true
    const nuxt = root.__vue_app__?.config.globalProperties.$nuxt
    return nuxt !== undefined && nuxt.isHydrating === false
  }, undefined, { timeout: 30_000 })
}

/** Scrolls the tank page's charts into view: Chart.js is fetched and the charts drawn only once they near the screen. */
export async function scrollToCharts(page: Page): Promise<void> {
  await page.locator('section[aria-labelledby="charts-heading"]').scrollIntoViewIfNeeded()
}

/** Saves a full-page screenshot under tests/browser/screenshots for people to look at. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  const path = join(SCREENSHOT_DIR, `${name}.png`)
  await page.screenshot({ path, fullPage: true })
  return path
}

/** Signs in through the real form. */
export async function signInThroughForm(page: Page, email: string, password = 'tidewright-demo'): Promise<void> {
  await page.goto('/login')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(url => !url.pathname.startsWith('/login'))
}
