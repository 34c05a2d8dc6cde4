import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { NITRITE_FALLING, NITRITE_FALLING_SLOWLY, seedCyclingTank, seedDangerTank } from '../support/forecast-tanks'

const THREE_TESTS = { ammonia: [1.6, 1.2, 0.6], nitrite: [0.3, 0.9, 1.2], nitrate: [0, 0, 0.1] }
let browser: Browser
let company: ScratchCompany
let boardCompany: ScratchCompany
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('forecast-page', 'us')
  seedCyclingTank(company, 'Falling nitrite reef', NITRITE_FALLING)
  seedCyclingTank(company, 'Three tests reef', THREE_TESTS)
  // The board's own company, with names whose alphabetical order is not their completion order.
  boardCompany = await seedScratchCompany('forecast-board', 'us')
  seedCyclingTank(boardCompany, 'Anchor reef', NITRITE_FALLING_SLOWLY)
  seedCyclingTank(boardCompany, 'Coral Bay reef', THREE_TESTS)
  seedCyclingTank(boardCompany, 'Marlin reef', NITRITE_FALLING)
  seedDangerTank(boardCompany, 'Zephyr reef')
})
afterAll(async () => { await browser?.close() })

describe('completion forecast', () => {
  for (const width of [375, 1280]) {
    it(`a client sees the likely range on the card and the tank page, and "not enough data yet" for a tank with three tests (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, company.emails.client)
      const card = page.getByRole('link', { name: /Falling nitrite reef/ })
      await expect.poll(() => card.textContent()).toMatch(/Likely ready for fish between .+ and .+\(a forecast; the verdict decides\)/)
      await expect.poll(() => page.getByRole('link', { name: /Three tests reef/ }).textContent()).toContain('Forecast: not enough data yet')
      await screenshot(page, `forecast-cards-${width}`)

      await card.click()
      await page.waitForURL(/\/tanks\/[^/]+$/)
      const section = page.locator('section[aria-labelledby="forecast-heading"]')
      await expect.poll(() => section.getByTestId('forecast-headline').textContent()).toMatch(/^\s*Likely ready for fish between .+ and .+$/)
      const text = await section.textContent()
      expect(text).toMatch(/Nitrite has halved about every \d+ days? since/)
      // Rule set 2.0.0 makes SPS corals wait clearly longer than LPS, so each has its own range.
      expect(text).toMatch(/LPS corals: likely between/)
      expect(text).toMatch(/SPS corals: likely between/)
      expect(text).toContain('A forecast, not a promise: livestock goes in only when the verdict says the cycle is complete.')
      await section.scrollIntoViewIfNeeded()
      await screenshot(page, `forecast-tank-${width}`)
      await section.screenshot({ path: `tests/browser/screenshots/forecast-section-${width}.png` })

      await page.goto('/')
      await page.getByRole('link', { name: /Three tests reef/ }).click()
      await page.waitForURL(/\/tanks\/[^/]+$/)
      await expect.poll(() => page.getByTestId('forecast-headline').textContent()).toContain('Not enough data yet')
      await page.getByTestId('forecast').screenshot({ path: `tests/browser/screenshots/forecast-not-enough-${width}.png` })
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width)
      expect(problems).toEqual([])
      await context.close()
    })
  }
})

describe('the attention board by expected completion', () => {
  for (const width of [375, 1280]) {
    it(`reorders the tanks soonest likely completion first, keeps the danger alert on top, and survives a reload (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, boardCompany.emails.aquarist)
      const needing = page.getByRole('list', { name: 'Tanks that need attention' })
      const quiet = page.getByRole('region', { name: 'Nothing due today' })
      const quietNames = async () => (await quiet.getByRole('link').allTextContents()).map(t => t.trim())
      await expect.poll(() => quiet.isVisible()).toBe(true)
      // Most urgent first, then by name.
      expect(await quietNames()).toEqual(['Anchor reef', 'Coral Bay reef', 'Marlin reef'])
      expect(await needing.locator(':scope > li').first().textContent()).toContain('Zephyr reef')

      await page.getByLabel('Order').selectOption({ label: 'Expected completion' })
      await page.waitForURL(url => url.searchParams.get('sort') === 'completion')
      await expect.poll(quietNames).toEqual(['Marlin reef', 'Anchor reef', 'Coral Bay reef'])
      const check = async () => {
        expect(await page.getByLabel('Order').inputValue()).toBe('completion')
        const first = needing.locator(':scope > li').first()
        expect(await first.textContent()).toContain('Zephyr reef')
        expect(await first.textContent()).toContain('Danger alert, not acknowledged')
        expect(await page.getByText('Tanks with a danger alert stay at the top in any order.').isVisible()).toBe(true)
        const rows = quiet.getByRole('listitem')
        expect(await rows.nth(0).textContent()).toMatch(/Cycle likely complete between .+ and .+\(a forecast\)/)
        expect(await rows.nth(2).textContent()).toContain('Completion forecast: not enough data yet')
      }
      await check()
      await screenshot(page, `board-completion-${width}`)

      await page.reload()
      await expect.poll(quietNames).toEqual(['Marlin reef', 'Anchor reef', 'Coral Bay reef'])
      await check()
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width)
      expect(problems).toEqual([])
      await context.close()
    })
  }
})
