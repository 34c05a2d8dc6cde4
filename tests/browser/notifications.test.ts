import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { ApiClient } from '../support/http'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const { demo } = inject('fixtures')
const study = demo.tanks.study

describe('live notifications', () => {
  it('the aquarist\'s badge goes up without a reload when a client saves a bad reading', async () => {
    // First a clean test clears the seeded alert, so the next bad one opens a new alert.
    const client3 = await new ApiClient().signIn('client3@tidewright.test')
    const clear = await client3.post(`/api/tanks/${study}/readings`, {
      takenAt: new Date(Date.now() - 20 * 60_000).toISOString(), ammonia: 0, nitrite: 0.3, nitrate: 5,
      basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
    })
    expect(clear.status).toBe(201)

    const aquarist = await openPage(browser, 1280)
    await signInThroughForm(aquarist.page, 'aquarist2@tidewright.test')
    const bell = aquarist.page.getByRole('link', { name: /^Notifications/ })
    await expect.poll(() => bell.getAttribute('aria-label')).toMatch(/unread/)
    const before = Number(await aquarist.page.getByTestId('unread-badge').textContent())
    await aquarist.page.evaluate(() => {
      (window as unknown as { notReloaded: boolean }).notReloaded = true
    })
    await screenshot(aquarist.page, 'bell-before-1280')

    const client = await openPage(browser, 375)
    await signInThroughForm(client.page, 'client3@tidewright.test')
    await client.page.goto(`/tanks/${study}/tests`)
    await expect.poll(() => client.page.getByLabel('Tested at').inputValue()).not.toBe('')
    await client.page.getByLabel('Ammonia (mg/L)').fill('1.5')
    await client.page.getByLabel('Nitrite (mg/L)').fill('0.3')
    await client.page.getByLabel('Nitrate (mg/L)').fill('5')
    await client.page.getByLabel('pH', { exact: true }).fill('8.1')
    await client.page.getByLabel('Temperature', { exact: true }).fill('77')
    await client.page.getByLabel('Salinity', { exact: true }).fill('35')
    await client.page.getByRole('button', { name: 'Save tests' }).click()
    await expect.poll(() => client.page.getByRole('heading', { name: 'Tests saved' }).isVisible()).toBe(true)

    await expect.poll(async () => Number(await aquarist.page.getByTestId('unread-badge').textContent()), { timeout: 15_000 }).toBe(before + 1)
    expect(await aquarist.page.evaluate(() => (window as unknown as { notReloaded?: boolean }).notReloaded)).toBe(true)
    await screenshot(aquarist.page, 'bell-after-1280')

    await bell.click()
    await aquarist.page.waitForURL(/\/notifications$/)
    await expect.poll(() => aquarist.page.getByText('Danger on Fernhill study reef').first().isVisible()).toBe(true)
    await screenshot(aquarist.page, 'notifications-1280')
    await aquarist.page.getByRole('link', { name: 'Alerts', exact: true }).first().click()
    await aquarist.page.waitForURL(/\/alerts$/)
    await expect.poll(() => aquarist.page.getByRole('button', { name: 'Acknowledge' }).count()).toBe(1)
    await aquarist.page.getByRole('button', { name: 'Acknowledge' }).click()
    await aquarist.page.getByLabel('Note (optional)').fill('On my way with salt water.')
    await aquarist.page.getByRole('button', { name: 'Acknowledge alert' }).click()
    await expect.poll(() => aquarist.page.getByText('On my way with salt water.').isVisible()).toBe(true)
    await screenshot(aquarist.page, 'alerts-1280')

    expect(aquarist.problems).toEqual([])
    expect(client.problems).toEqual([])
    await aquarist.context.close()
    await client.context.close()
  })

  it('the notification centre and alerts read well on a phone (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    await page.goto('/alerts')
    await expect.poll(() => page.getByRole('heading', { name: 'Alerts' }).isVisible()).toBe(true)
    await screenshot(page, 'alerts-375')
    await page.goto('/notifications')
    await expect.poll(() => page.getByRole('heading', { name: 'Notifications' }).isVisible()).toBe(true)
    await screenshot(page, 'notifications-375')
    await page.goto('/settings/notifications')
    await expect.poll(() => page.getByLabel(/Danger alerts/).isVisible()).toBe(true)
    await screenshot(page, 'preferences-375')
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)
    expect(problems).toEqual([])
    await context.close()
  })

  it('the set-password page refuses a used or unknown link plainly', async () => {
    const { page, context } = await openPage(browser, 375)
    await page.goto('/reset-password?token=AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA')
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('expired or has already been used')
    await screenshot(page, 'reset-expired-375')
    await page.goto('/forgot-password')
    await page.getByLabel('E-mail').fill('someone@tidewright.test')
    await page.getByRole('button', { name: 'Send the link' }).click()
    await expect.poll(() => page.getByRole('status').textContent()).toContain('If that address has a Tidewright account')
    await screenshot(page, 'forgot-375')
    await context.close()
  })
})
