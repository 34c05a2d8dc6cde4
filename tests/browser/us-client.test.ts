/**
 * A client whose units are US reads their tank in gallons and °F, reads a danger in plain words
 * with each concentration as their kit reads it (ppm as NH3) and the aquarist's reason behind
 * "Why?", and finds the daily form in specific gravity on their hydrometer's scale after a
 * reload and on another device (the server remembers it per person and tank). Staff read the
 * same finding with its rule and source and can switch to canonical units (mg/L as N).
 * Total ammonia above 0.5 ppm as NH3 with fish in calls for a water change (common practice,
 * no published source); 2 ppm as NH3 is 1.64 mg/L as N (IUPAC atomic weights).
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { openDatabase } from '../../server/db/connection'
import { tanks } from '../../server/db/schema'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

const DAY_MS = 86_400_000
let browser: Browser
let company: ScratchCompany
let tankId: string
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('us-client', 'us')
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  // 1200 x 500 x 550 mm holds 330 L, about 87 US gallons.
  const tank = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Porch reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 } })
  expect(tank.status).toBe(201)
  tankId = tank.body.id
  // A fish-in cycle started yesterday: fish are in, so a high ammonia test is a danger.
  const db = openDatabase(inject('dbPath'))
  try {
    db.update(tanks).set({ status: 'cycling', cycleMethod: 'fish-in', cycleStartedAt: new Date(Date.now() - DAY_MS).toISOString() }).where(eq(tanks.id, tankId)).run()
  }
  finally {
    db.$client.close()
  }
})
afterAll(async () => { await browser?.close() })

describe('a client in US units', () => {
  it('reads gallons, °F and their kit\'s ppm in plain words, and keeps their hydrometer across a reload and another device (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto(`/tanks/${tankId}`)
    await expect.poll(() => page.getByText(/87 gal display/).count()).toBeGreaterThan(0)

    await page.goto(`/tanks/${tankId}/tests`)
    await expect.poll(() => page.getByLabel('Tested at').inputValue()).not.toBe('')
    const mode = page.getByLabel('Salinity measured as')
    expect(await mode.inputValue()).toBe('practical')
    await page.getByLabel('Ammonia (mg/L)').fill('2')
    await page.getByLabel('Nitrite (mg/L)').fill('0')
    await page.getByLabel('pH', { exact: true }).fill('8.1')
    await page.getByLabel('Temperature', { exact: true }).fill('77')
    await mode.selectOption('sg')
    await page.getByLabel('Scale printed on the instrument').selectOption('77/60F')
    await page.getByLabel('Salinity', { exact: true }).fill('1.025')
    await page.getByRole('button', { name: 'Save tests' }).click()

    const danger = page.getByTestId('act-now')
    await expect.poll(() => danger.isVisible()).toBe(true)
    const sentence = danger.getByText('Total ammonia is 2 ppm as NH3, as your kit reads it: too high for the animals in the tank.')
    expect(await sentence.isVisible()).toBe(true)
    const shown = await danger.innerText()
    expect(shown).not.toMatch(/mg\/L as N|EPA|°C|\d L\b/)
    expect(shown).toMatch(/about [\d.]+ gal/)
    // The aquarist's reason is one tap away, in the same units.
    const why = danger.locator('summary', { hasText: 'Why?' }).first()
    await why.click()
    const reason = danger.getByText(/above the 0\.5 ppm as NH3 limit for a tank with animals in/)
    await expect.poll(() => reason.isVisible()).toBe(true)
    expect(await danger.getByText(/Rule ammonia\./).count()).toBe(0)
    await screenshot(page, 'us-client-danger-375')

    await page.reload()
    await expect.poll(() => mode.inputValue()).toBe('sg')
    expect(await page.getByLabel('Scale printed on the instrument').inputValue()).toBe('77/60F')
    expect(problems).toEqual([])
    await context.close()

    // Another device, where this browser's storage holds nothing: the server remembers.
    const laptop = await openPage(browser, 1280)
    await signInThroughForm(laptop.page, company.emails.client)
    await laptop.page.goto(`/tanks/${tankId}/tests`)
    await expect.poll(() => laptop.page.getByLabel('Salinity measured as').inputValue()).toBe('sg')
    expect(await laptop.page.getByLabel('Scale printed on the instrument').inputValue()).toBe('77/60F')
    await laptop.page.goto(`/tanks/${tankId}`)
    await expect.poll(() => laptop.page.getByTestId('act-now').isVisible()).toBe(true)
    expect(await laptop.page.getByText(/87 gal display/).count()).toBeGreaterThan(0)
    await screenshot(laptop.page, 'us-client-tank-1280')
    expect(laptop.problems).toEqual([])
    await laptop.context.close()
  })

  it('staff read the same danger with its rule and source, and switch to canonical units (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}`)
    const danger = page.getByTestId('act-now')
    await expect.poll(() => danger.isVisible()).toBe(true)
    // The engine's words, in the tank's kit units by default.
    expect(await danger.innerText()).toContain('Total ammonia is 2 ppm as NH3')
    await danger.locator('summary', { hasText: 'Rule ammonia.action-threshold' }).click()
    await expect.poll(() => danger.locator('details[open]').first().innerText()).toContain('Source: ')
    await screenshot(page, 'us-staff-tank-1280')

    await page.getByLabel('Canonical units (mg/L as N)').check()
    await expect.poll(() => danger.innerText()).toContain('Total ammonia is 1.6 mg/L as N')
    expect(await danger.innerText()).not.toContain('Total ammonia is 2 ppm as NH3')
    await page.getByLabel('Canonical units (mg/L as N)').uncheck()
    await expect.poll(() => danger.innerText()).toContain('Total ammonia is 2 ppm as NH3')
    expect(problems).toEqual([])
    await context.close()
  })
})
