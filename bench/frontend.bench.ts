/**
 * Front end: the JavaScript and CSS the sign-in page and a tank page actually load in
 * headless Chromium (gzip-compressed size, compressed here at level 9 from the bytes
 * received), and the time from navigation to the first drawn chart on a tank with a
 * year of readings (when the tank page has charts).
 */
import { gzipSync } from 'node:zlib'
import { chromium, type Page } from 'playwright-core'
import type { BenchServer, Row } from './support'

const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'

/** Collects every script and stylesheet the page loads while `action` runs. */
async function shipped(page: Page, action: () => Promise<void>): Promise<{ js: number, css: number, files: number }> {
  const bodies: Promise<{ type: string, bytes: Buffer } | null>[] = []
  const listener = (response: import('playwright-core').Response) => {
    const type = response.request().resourceType()
    if (type !== 'script' && type !== 'stylesheet') return
    bodies.push(response.body().then(bytes => ({ type, bytes })).catch(() => null))
  }
  page.on('response', listener)
  await action()
  // Not 'networkidle': a signed-in page keeps its notification stream open.
  await page.waitForLoadState('load')
  await page.waitForTimeout(1500)
  page.off('response', listener)
  const all = (await Promise.all(bodies)).filter(b => b !== null)
  const size = (type: string) => all.filter(b => b.type === type).reduce((sum, b) => sum + gzipSync(b.bytes, { level: 9 }).length, 0)
  return { js: size('script'), css: size('stylesheet'), files: all.length }
}

export async function runFrontendBench(bench: BenchServer): Promise<Row[]> {
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run'] })
  const rows: Row[] = []
  try {
    const context = await browser.newContext({ baseURL: bench.server.baseURL, viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    const login = await shipped(page, async () => {
      await page.goto('/login')
    })
    rows.push({ area: 'Front end', name: `sign-in page: JS shipped (${login.files} files)`, value: login.js / 1024, unit: 'kB gzip' })
    rows.push({ area: 'Front end', name: 'sign-in page: CSS shipped', value: login.css / 1024, unit: 'kB gzip' })
    await page.getByLabel('E-mail').fill('client@tidewright.test')
    await page.getByLabel('Password').fill('tidewright-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(url => !url.pathname.startsWith('/login'))
    await page.waitForLoadState('load')

    // A fresh page (cold cache) straight onto the tank with a year of data.
    const tankPage = await context.newPage()
    await context.clearCookies()
    const cookies = await fetch(`${bench.server.baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'client@tidewright.test', password: 'tidewright-demo' }) })
    const session = cookies.headers.getSetCookie()[0]!.split(';')[0]!.split('=')
    await context.addCookies([{ name: session[0]!, value: session.slice(1).join('='), url: bench.server.baseURL }])
    let chartMs: number | null = null
    const tank = await shipped(tankPage, async () => {
      await tankPage.goto(`/tanks/${bench.fixtures.demo.tanks.lounge}`)
      chartMs = await tankPage.waitForFunction(() => {
        const canvas = document.querySelector('canvas')
        return canvas && canvas.width > 0 && canvas.height > 0 ? performance.now() : false
      }, undefined, { timeout: 15_000, polling: 'raf' }).then(h => h.jsonValue() as Promise<number>).catch(() => null)
    })
    rows.push({ area: 'Front end', name: `tank page: JS shipped (${tank.files} files)`, value: tank.js / 1024, unit: 'kB gzip' })
    rows.push({ area: 'Front end', name: 'tank page: CSS shipped', value: tank.css / 1024, unit: 'kB gzip' })
    const loadMs = await tankPage.evaluate(() => {
      const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming | undefined
      return nav ? nav.loadEventEnd : 0
    })
    if (chartMs !== null) {
      rows.push({ area: 'Front end', name: 'tank page: first chart drawn (year of data)', value: chartMs, unit: 'ms', reference: { name: `load event ${loadMs.toFixed(0)} ms`, value: loadMs }, ratio: chartMs / loadMs })
    }
    else {
      rows.push({ area: 'Front end', name: 'tank page: first chart drawn — no chart on the tank page in this build', value: Number.NaN, unit: 'ms', reference: { name: `load event ${loadMs.toFixed(0)} ms`, value: loadMs } })
    }
  }
  finally {
    await browser.close()
  }
  return rows
}
