import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, scrollToCharts, signInThroughForm } from '../support/browser'
import { TINY_PNG } from '../api/access-matrix.data'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('daily tests', () => {
  it('a client enters a day\'s tests on a phone and sees the chart and the verdict change (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'client@tidewright.test')
    await page.getByRole('link', { name: /Marlowe lounge reef/ }).click()
    await page.waitForURL(/\/tanks\/[^/]+$/)
    const phase = page.getByTestId('verdict-phase')
    await expect.poll(() => phase.textContent()).toContain('Nitrite stage')
    await scrollToCharts(page)
    const chart = page.getByTestId('nitrogen-chart')
    await expect.poll(() => chart.getAttribute('data-points'), { timeout: 15_000 }).toMatch(/^\d+$/)
    const before = Number(await chart.getAttribute('data-points'))
    expect(await page.locator('canvas').count()).toBe(3)
    // On a phone only the nitrogen chart is open; the other two wait behind one tap.
    const freeAmmonia = page.getByRole('img', { name: 'Chart of free ammonia against the EPA criteria' })
    expect(await freeAmmonia.isVisible()).toBe(false)
    await page.getByText('More charts: free ammonia, salinity and temperature').click()
    await expect.poll(() => freeAmmonia.isVisible()).toBe(true)
    await screenshot(page, 'tank-before-tests-375')

    await page.getByRole('link', { name: 'Enter today\'s tests' }).click()
    await page.waitForURL(/\/tests$/)
    await expect.poll(() => page.getByLabel('Tested at').inputValue()).not.toBe('')
    await page.getByLabel('Ammonia (mg/L)').fill('0')
    await page.getByLabel('Nitrite (mg/L)').fill('0')
    await page.getByLabel('Nitrate (mg/L)').fill('20')
    await page.getByLabel('pH', { exact: true }).fill('8.1')
    // The client's units are US: the form starts in °F.
    expect(await page.getByLabel('Temperature unit').inputValue()).toBe('F')
    await page.getByLabel('Temperature', { exact: true }).fill('77')
    await page.getByLabel('Salinity', { exact: true }).fill('35')
    await screenshot(page, 'tests-form-375')
    // A value outside physical bounds is refused next to its field before anything is sent.
    await page.getByLabel('pH', { exact: true }).fill('19')
    await page.getByRole('button', { name: 'Save tests' }).click()
    await expect.poll(() => page.getByText('pH must be between 0 and 14.').isVisible()).toBe(true)
    await page.getByLabel('pH', { exact: true }).fill('8.1')
    await expect.poll(() => page.getByText('pH must be between 0 and 14.').count()).toBe(0)
    // A photo of the test strip goes with the reading; it is stored as soon as it is chosen.
    await page.getByText('More tests and notes').click()
    await page.getByLabel('Photo of the test (optional)').setInputFiles({ name: 'strip.png', mimeType: 'image/png', buffer: TINY_PNG })
    await expect.poll(() => page.getByText('Photo attached: strip.png').isVisible()).toBe(true)
    await screenshot(page, 'tests-photo-375')
    await page.getByRole('button', { name: 'Save tests' }).click()
    await expect.poll(() => page.getByRole('heading', { name: 'Tests saved' }).isVisible()).toBe(true)
    await expect.poll(() => page.getByText('The cycle now reads').textContent()).toContain('Settling')
    await screenshot(page, 'tests-saved-375')

    await page.getByRole('link', { name: 'See the charts and what to do next' }).click()
    await page.waitForURL(/\/tanks\/[^/]+$/)
    await expect.poll(() => phase.textContent()).toContain('Settling')
    await scrollToCharts(page)
    await expect.poll(() => chart.getAttribute('data-points'), { timeout: 15_000 }).toBe(String(before + 1))
    // What to do next about ammonia: dose it for the proof, or (the demo lounge has a proof dose
    // under way) test it to show that dose arrived.
    await expect.poll(() => page.getByRole('list', { name: 'Findings' }).textContent()).toMatch(/[Dd]ose ammonia|[Tt]est ammonia/)
    await screenshot(page, 'tank-after-tests-375')
    await page.locator('section[aria-labelledby="charts-heading"]').screenshot({ path: 'tests/browser/screenshots/charts-375.png' })
    await page.locator('section[aria-labelledby="verdict-heading"]').screenshot({ path: 'tests/browser/screenshots/verdict-375.png' })
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(375)
    expect(problems).toEqual([])
    await context.close()
  })

  it('staff see the rule ids and the history table with the new test (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.getByRole('link', { name: /Marlowe lounge reef/ }).click()
    await page.waitForURL(/\/tanks\/[^/]+$/)
    await expect.poll(() => page.getByText('Rule cycle.phase').isVisible()).toBe(true)
    // A livestock blocker's rule, with its source, comes with the verdict like a finding's.
    const whyNot = page.getByRole('list', { name: 'Why not yet' })
    await whyNot.locator('summary', { hasText: /Rule readiness\./ }).first().click()
    await expect.poll(() => whyNot.locator('details[open]').first().innerText()).toContain('Source: ')
    await scrollToCharts(page)
    await expect.poll(() => page.locator('canvas').count(), { timeout: 15_000 }).toBe(3)
    await screenshot(page, 'tank-staff-1280')
    await page.getByRole('link', { name: 'All tests and events' }).click()
    await page.waitForURL(/\/history$/)
    const table = page.getByRole('table', { name: 'Tests' })
    await expect.poll(() => table.getByRole('row').count()).toBeGreaterThan(5)
    await expect.poll(() => table.getByRole('row').nth(1).textContent()).toContain('Marguerite Lowe')
    await table.getByRole('button', { name: 'Nitrate' }).click()
    await expect.poll(() => table.locator('th', { hasText: 'Nitrate' }).getAttribute('aria-sort')).toBe('ascending')
    await screenshot(page, 'history-1280')
    await page.goBack()
    await page.locator('section[aria-labelledby="charts-heading"]').screenshot({ path: 'tests/browser/screenshots/charts-1280.png' })
    expect(problems).toEqual([])
    await context.close()
  })

  it('an aquarist previews a CSV file, maps nothing by hand and imports it once (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.getByRole('link', { name: /Harbour Parade lobby reef/ }).click()
    await page.waitForURL(/\/tanks\/[^/]+$/)
    await page.getByRole('link', { name: 'All tests and events' }).click()
    await page.waitForURL(/\/history$/)
    await page.getByText('Import tests from a CSV file').click()
    const day = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString()
    const csv = `Date,NH3,NO2,NO3,pH\n${day(3)},0.5,0,5,8.1\n${day(2)},0.25,0,5,8.2\nnot a date,1,1,1,8\n`
    await page.getByLabel('Ammonia as').selectOption('NH3')
    // The file itself is the request's body (never JSON text; Chromium does not show a file's bytes here), the options in the query string.
    const sent: { url: URL, type: string | undefined }[] = []
    page.on('request', (request) => {
      if (request.url().includes('/readings/import')) sent.push({ url: new URL(request.url()), type: request.headers()['content-type'] })
    })
    await page.getByLabel('CSV file').setInputFiles({ name: 'tests.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await expect.poll(() => page.getByText('2 ready to import').isVisible()).toBe(true)
    await expect.poll(() => page.getByRole('list', { name: 'Rows with errors' }).textContent()).toContain('Row 4')
    expect(await page.getByLabel('Date and time').inputValue()).toBe('Date')
    await screenshot(page, 'import-preview-375')
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)
    await page.getByRole('button', { name: 'Import 2 tests' }).click()
    await expect.poll(() => page.getByText('2 tests imported').isVisible()).toBe(true)
    await expect.poll(() => page.getByRole('table', { name: 'Tests' }).getByRole('row').count()).toBe(3)
    // The demo aquarist works in US units: the form reads temperatures in °F.
    expect(sent.map(s => [s.type, s.url.searchParams.get('dryRun'), s.url.searchParams.get('temperatureUnit'), s.url.searchParams.get('mapping.takenAt')])).toEqual([['text/csv', 'true', 'F', null], ['text/csv', 'false', 'F', 'Date']])
    expect(problems).toEqual([])
    await context.close()
  })
})
