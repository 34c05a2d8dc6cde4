import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Locator } from 'playwright-core'
import sharp from 'sharp'
import theme from '../../tailwind.config'
import { launchBrowser, openPage, screenshot, scrollToCharts, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
const { series, signal } = theme.theme.extend.colors
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

/** How many of a canvas's pixels are drawn in (close to) a theme colour. */
async function pixelsOf(canvas: Locator, hex: string): Promise<number> {
  const { data, info } = await sharp(await canvas.screenshot()).removeAlpha().raw().toBuffer({ resolveWithObject: true })
  const want = [1, 3, 5].map(i => Number.parseInt(hex.slice(i, i + 2), 16))
  let count = 0
  for (let i = 0; i < data.length; i += info.channels) {
    if (Math.abs(data[i]! - want[0]!) + Math.abs(data[i + 1]! - want[1]!) + Math.abs(data[i + 2]! - want[2]!) < 30) count++
  }
  return count
}

/** The shapes the marker legend names, as { shape: words }. */
async function legendShapes(legend: Locator): Promise<Record<string, string>> {
  const items = await legend.getByRole('listitem').all()
  return Object.fromEntries(await Promise.all(items.map(async item => [await item.getAttribute('data-shape'), (await item.textContent())!.trim()])))
}

describe('the charts: one palette, annotation bands and lines, shaped event markers', () => {
  it.each([375, 1280])('the tank page charts at %i px draw thresholds and markers, and the legend names each shape', async (width) => {
    const { page, context, problems } = await openPage(browser, width)
    await signInThroughForm(page, 'client@tidewright.test')
    await page.goto(`/tanks/${demo.tanks.lounge}`)
    await scrollToCharts(page)
    const chart = page.getByTestId('nitrogen-chart')
    await expect.poll(() => chart.getAttribute('data-points'), { timeout: 15_000 }).toMatch(/^\d+$/)
    if (width < 640) await page.getByText('More charts: free ammonia, salinity and temperature').click()
    // The leading chart is drawn first; the other two follow once it has been painted.
    await expect.poll(() => page.locator('canvas').count()).toBe(3)

    // The lounge's cycle began with bottled bacteria and an ammonia dose: two kinds, two shapes, each named.
    const shapes = await legendShapes(chart.getByTestId('marker-legend'))
    expect(shapes).toEqual({ triangle: 'Ammonia dose', circle: 'Bacteria dose' })

    // The red water-change line is drawn by the annotation plugin; no series is drawn in a signal colour.
    const nitrogen = chart.locator('canvas')
    await expect.poll(() => pixelsOf(nitrogen, signal.danger), { timeout: 10_000 }).toBeGreaterThan(60)
    expect(await pixelsOf(nitrogen, series.ammonia)).toBeGreaterThan(20)
    expect(await pixelsOf(nitrogen, signal.caution)).toBeLessThan(5)
    // Free ammonia: the EPA chronic line in caution amber, the acute line in danger red, over a plum series.
    const free = page.locator('canvas[aria-label="Chart of free ammonia against the EPA criteria"]')
    await expect.poll(() => pixelsOf(free, signal.caution), { timeout: 10_000 }).toBeGreaterThan(60)
    expect(await pixelsOf(free, signal.danger)).toBeGreaterThan(60)
    expect(await pixelsOf(free, series.freeAmmonia)).toBeGreaterThan(20)

    await page.locator('section[aria-labelledby="charts-heading"]').screenshot({ path: `tests/browser/screenshots/charts-annotated-${width}.png` })
    expect(problems).toEqual([])
    await context.close()
  })

  it('a fish-in tank shows its livestock and its note as their own shapes (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist2@tidewright.test')
    await page.goto(`/tanks/${demo.tanks.study}`)
    await scrollToCharts(page)
    const chart = page.getByTestId('nitrogen-chart')
    await expect.poll(() => chart.getAttribute('data-points'), { timeout: 15_000 }).toMatch(/^\d+$/)
    const shapes = await legendShapes(chart.getByTestId('marker-legend'))
    expect(shapes).toMatchObject({ star: 'Livestock added', crossRot: 'Note', circle: 'Bacteria dose' })
    expect(new Set(Object.keys(shapes)).size).toBe(Object.values(shapes).length)
    expect(problems).toEqual([])
    await context.close()
  })

  it.each([375, 1280])('the evidence chart at %i px is drawn with Chart.js in the same colours, with its summary and legend', async (width) => {
    const { page, context, problems } = await openPage(browser, width)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    await page.goto(`/reviews/${demo.tanks.nano}`)
    const figure = page.getByTestId('evidence-chart')
    await expect.poll(() => figure.getByRole('img', { name: /^Ammonia, nitrite and nitrate from .+ mg\/L as N$/ }).isVisible()).toBe(true)
    const canvas = figure.locator('canvas')
    await expect.poll(() => canvas.count(), { timeout: 15_000 }).toBe(1)
    await expect.poll(() => pixelsOf(canvas, series.nitrate), { timeout: 10_000 }).toBeGreaterThan(20)
    expect(await pixelsOf(canvas, series.ammonia)).toBeGreaterThan(20)
    expect(await legendShapes(figure.getByTestId('marker-legend'))).toMatchObject({ triangle: 'Ammonia dose' })
    await figure.screenshot({ path: `tests/browser/screenshots/evidence-chart-${width}.png` })
    await screenshot(page, `evidence-chart-page-${width}`)
    expect(problems).toEqual([])
    await context.close()
  })
})
