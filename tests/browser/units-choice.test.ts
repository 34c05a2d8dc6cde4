/**
 * A client whose account was made in metric units switches to US units under Your account
 * (reached from their name in the top bar): the tank page then reads gallons, and the choice
 * survives a reload. Phone width, as clients use it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

let browser: Browser
let company: ScratchCompany
let tankId: string
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('units-choice-page', 'metric')
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  // 1200 x 500 x 550 mm holds 330 L, about 87 US gallons.
  const tank = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Units reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 } })
  expect(tank.status).toBe(201)
  tankId = tank.body.id
})
afterAll(async () => { await browser?.close() })

describe('units per person', () => {
  it('a client switches from metric to US units and the tank page follows', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto(`/tanks/${tankId}`)
    await expect.poll(() => page.getByText(/330 L display/).count()).toBeGreaterThan(0)

    await page.getByRole('button', { name: 'Menu' }).click()
    await page.getByRole('link', { name: /Your account/ }).click()
    await page.waitForURL(/\/settings\/account$/)
    await page.getByRole('radio', { name: /US \(gallons/ }).check()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Saved' }).count()).toBe(1)
    await screenshot(page, 'units-choice-375')

    await page.goto(`/tanks/${tankId}`)
    await expect.poll(() => page.getByText(/87 gal display/).count()).toBeGreaterThan(0)
    await page.reload()
    await expect.poll(() => page.getByText(/87 gal display/).count()).toBeGreaterThan(0)
    expect(await page.getByText(/330 L display/).count()).toBe(0)
    expect(problems).toEqual([])
    await context.close()
  })
})
