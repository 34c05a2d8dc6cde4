import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { ApiClient } from '../support/http'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { tokenIn, waitForMail } from '../support/mail'

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

  it('an invited client chooses a password through the e-mailed link and lands on their tanks (375 px)', async () => {
    const email = 'ines.hart@tidewright.test'
    const admin = await new ApiClient().signIn('admin@tidewright.test')
    expect((await admin.post('/api/invitations', { email, name: 'Ines Hart', role: 'client', clientId: demo.clients.hart })).status).toBe(201)
    const mail = await waitForMail('invitation', all => all.find(m => m.envelopeTo.includes(email)))
    const { page, context, problems } = await openPage(browser, 375)
    await page.goto(`/accept-invite?token=${tokenIn(mail.text, '/accept-invite')}`)
    await expect.poll(() => page.getByText(`Choose a password for ${email}`).isVisible()).toBe(true)
    await page.getByLabel('New password').fill(email)
    await page.getByLabel('Repeat the password').fill(email)
    await page.getByRole('button', { name: 'Set password and sign in' }).click()
    await expect.poll(() => page.getByText('Do not use your e-mail address as your password.').isVisible()).toBe(true)
    await screenshot(page, 'accept-invite-375')
    await page.getByLabel('New password').fill('brine-shrimp-harbour')
    await page.getByLabel('Repeat the password').fill('brine-shrimp-harbour')
    await page.getByRole('button', { name: 'Set password and sign in' }).click()
    await page.waitForURL(url => url.pathname === '/')
    await expect.poll(() => page.getByText('Fernhill study reef').isVisible()).toBe(true)
    expect(problems).toEqual([])
    await context.close()
  })

  it('the admin reads the caught mail, including the seeded alert\'s e-mail (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'admin@tidewright.test')
    await page.getByRole('link', { name: 'Outgoing mail' }).click()
    await page.waitForURL(/\/admin\/mail$/)
    const message = page.getByRole('button', { name: /Danger on Fernhill study reef/ }).first()
    await expect.poll(() => message.isVisible()).toBe(true)
    await message.click()
    await expect.poll(() => page.getByText('What to do:').first().isVisible()).toBe(true)
    await screenshot(page, 'caught-mail-1280')
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
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'If that address has a Tidewright account' }).count()).toBe(1)
    await screenshot(page, 'forgot-375')
    await context.close()
  })
})
