/**
 * Each page loads what it shows: the tank page's first load on a phone fetches no Chart.js
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
  const scripts: string[] = []
  const chartData: string[] = []
  page.on('request', (request) => {
    if (request.resourceType() === 'script') scripts.push(request.url())
    if (request.url().endsWith('/chart')) chartData.push(request.url())
  })
  await page.goto(`/tanks/${demo.tanks.lounge}`)
  await expect.poll(() => page.getByTestId('verdict-phase').isVisible()).toBe(true)
  await settle(page)
  return { ...watched, scripts, chartData }
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
