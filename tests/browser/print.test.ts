/**
 * Printing the tank page and the sign-off evidence (app/assets/css/print.css): the navigation,
 * the skip link and every button and form leave the paper; the verdict, the readings and the
 * safety text stay, in black on white.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openPage, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const colourOf = (page: Page, selector: string) => page.locator(selector).first().evaluate(el => getComputedStyle(el).color)

describe('print view', () => {
  it('the tank page prints its verdict without navigation or buttons', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`/tanks/${demo.tanks.lounge}`)
    const nav = page.getByRole('navigation', { name: 'Main' })
    const edit = page.getByRole('link', { name: 'Edit tank' })
    const phase = page.getByTestId('verdict-phase')
    expect([await nav.isVisible(), await edit.isVisible(), await phase.isVisible()]).toEqual([true, true, true])
    await page.emulateMedia({ media: 'print' })
    expect([await nav.isVisible(), await edit.isVisible(), await phase.isVisible()]).toEqual([false, false, true])
    expect(await page.getByRole('button').evaluateAll(buttons => buttons.filter(b => (b as HTMLElement).offsetParent !== null).length)).toBe(0)
    await expect.poll(() => page.getByText(/water and mains electricity together can kill/).isVisible()).toBe(true)
    expect(await colourOf(page, '[data-testid="verdict-phase"]')).toBe('rgb(0, 0, 0)')
    expect(problems).toEqual([])
    await context.close()
  })

  it('the tank page prints its charts on a phone even when nobody scrolled down to them', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`/tanks/${demo.tanks.lounge}`)
    await expect.poll(() => page.getByTestId('verdict-phase').isVisible()).toBe(true)
    await page.emulateMedia({ media: 'print' })
    await expect.poll(() => page.locator('canvas').count(), { timeout: 15_000 }).toBeGreaterThan(0)
    expect(await page.getByText('Loading charts…').count()).toBe(0)
    expect(problems).toEqual([])
    await context.close()
  })

  it('the sign-off evidence prints its verdict and every reading, the table not cut at the scroll edge', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    await page.goto(`/reviews/${demo.tanks.nano}`)
    await page.emulateMedia({ media: 'print' })
    await expect.poll(() => page.getByRole('heading', { name: 'The engine\'s verdict' }).isVisible()).toBe(true)
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    expect(await page.getByRole('link', { name: 'Skip to content' }).isVisible()).toBe(false)
    const readings = page.getByRole('region', { name: /^Tests in the evidence/ })
    expect(await readings.evaluate(el => getComputedStyle(el).overflowX)).toBe('visible')
    expect(await page.getByRole('button').evaluateAll(buttons => buttons.filter(b => (b as HTMLElement).offsetParent !== null).length)).toBe(0)
    expect(problems).toEqual([])
    await context.close()
  })
})
