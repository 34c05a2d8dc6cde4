/**
 * Each page loads what it shows, and says so at once: the tank page's HTML names as modulepreload
 * links every script the page runs before the reader scrolls. The tank page's first load on a phone fetches no Chart.js
 * (recognised by the `_chartjs` property it sets on every chart's data) and no chart data until
 * the reader comes near the charts, and then draws them; and no rule engine code (recognised by the rules' descriptions, which
 * the verdict answer carries for the rules it cites).
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openPage, scrollToCharts, signInThroughForm } from '../support/browser'
import { RULES } from '../../shared/cycle/registry'

const { demo } = inject('fixtures')
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

/** Lets the page run a few frames: long enough for any IntersectionObserver to report and any import it starts to be requested. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState('load')
  await page.evaluate(() => new Promise<void>((resolve) => {
    let frames = 0
    const tick = () => (++frames >= 5 ? resolve() : requestAnimationFrame(tick))
    requestAnimationFrame(tick)
  }))
}

/** A client's first load of the lounge tank on a phone, settled; `scripts` lists every script requested so far, and goes on growing. */
async function clientTankFirstLoad() {
  const watched = await openPage(browser, 375)
  const { page } = watched
  await signInThroughForm(page, 'client@tidewright.test')
  // From a blank page: what the home page shown after sign-in still loads is not the tank page's.
  await page.goto('about:blank')
  const scripts: string[] = []
  const chartData: string[] = []
  page.on('request', (request) => {
    // A prefetch link's download is for a later page; it runs nothing here.
    if (request.resourceType() === 'script' && request.headers()['sec-purpose'] !== 'prefetch') scripts.push(request.url())
    if (request.url().endsWith('/chart')) chartData.push(request.url())
  })
  const response = await page.goto(`/tanks/${demo.tanks.lounge}`)
  const html = await response!.text()
  await expect.poll(() => page.getByTestId('verdict-phase').isVisible()).toBe(true)
  await settle(page)
  return { ...watched, scripts, chartData, html }
}

/** The script paths a page's HTML names at once: its entry script and its modulepreload links. */
function scriptsNamedIn(html: string): Set<string> {
  const tags = html.match(/<(?:script|link)\b[^>]*>/g) ?? []
  const named = tags.filter(tag => /\btype="module"/.test(tag) || /\brel="modulepreload"/.test(tag))
  return new Set(named.map(tag => /\b(?:src|href)="([^"]+)"/.exec(tag)?.[1]).filter(path => path !== undefined))
}

describe('what the tank page loads', () => {
  it('fetches Chart.js only once the charts near the screen, then draws them (375 px)', async () => {
    const { page, context, problems, scripts, chartData } = await clientTankFirstLoad()
    expect(await page.locator('canvas').count()).toBe(0)
    expect(chartData).toEqual([])
    const beforeScroll = [...scripts]

    await scrollToCharts(page)
    await expect.poll(() => page.getByTestId('nitrogen-chart').locator('canvas').count()).toBeGreaterThan(0)
    const afterScroll = scripts.slice(beforeScroll.length)

    const definesChartJs = async (url: string) => (await (await context.request.get(url)).text()).includes('_chartjs')
    const early = await Promise.all(beforeScroll.map(definesChartJs))
    const late = await Promise.all(afterScroll.map(definesChartJs))
    expect(beforeScroll.filter((_, i) => early[i])).toEqual([])
    expect(late.some(Boolean)).toBe(true)
    expect(problems).toEqual([])
    await context.close()
  })

  it('names in its HTML every script it runs before the reader scrolls: none waits for the entry to ask for it (375 px)', async () => {
    const { context, problems, scripts, html } = await clientTankFirstLoad()
    const named = scriptsNamedIn(html)
    expect(named.size).toBeGreaterThan(1)
    expect(scripts.length).toBeGreaterThan(1)
    expect(scripts.map(url => new URL(url).pathname).filter(path => !named.has(path))).toEqual([])
    expect(problems).toEqual([])
    await context.close()
  })

  it('loads no rule registry: the verdict brings the words of the rules it cites (375 px)', async () => {
    const { context, problems, scripts } = await clientTankFirstLoad()
    expect(scripts.length).toBeGreaterThan(0)
    const texts = await Promise.all(scripts.map(async url => (await context.request.get(url)).text()))
    const withRules = scripts.filter((_, i) => RULES.some(rule => texts[i]!.includes(rule.description)))
    expect(withRules).toEqual([])
    expect(problems).toEqual([])
    await context.close()
  })
})
