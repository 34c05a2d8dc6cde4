/**
 * A client who measures salinity with a hydrometer (specific gravity, 77/60 °F scale) finds the
 * daily form the way they left it, not back at practical salinity on every visit; their other
 * tank, tested another way or not yet, keeps its own (the instrument is remembered per tank).
 * Another device is in tests/browser/us-client.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

let browser: Browser
let company: ScratchCompany
let tankId: string
let otherTankId: string
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('salinity-instrument', 'us')
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  const tank = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Hydrometer reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(tank.status).toBe(201)
  tankId = tank.body.id
  const other = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Refractometer reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 600, widthMm: 400, heightMm: 400 } })
  expect(other.status).toBe(201)
  otherTankId = other.body.id
})
afterAll(async () => { await browser?.close() })

describe('the salinity instrument is remembered per tank', () => {
  it('opens the daily form in specific gravity on the 77/60 °F scale after one test taken that way (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto(`/tanks/${tankId}/tests`)
    const mode = page.getByLabel('Salinity measured as')
    expect(await mode.inputValue()).toBe('practical')
    await mode.selectOption('sg')
    await page.getByLabel('Scale printed on the instrument').selectOption('77/60F')
    await page.getByLabel('Salinity', { exact: true }).fill('1.025')
    await page.getByLabel('Temperature', { exact: true }).fill('77')
    await page.getByRole('button', { name: 'Save tests' }).click()
    await expect.poll(() => page.getByRole('heading', { name: 'Tests saved' }).isVisible()).toBe(true)

    await page.goto(`/tanks/${tankId}/tests`)
    await expect.poll(() => mode.inputValue()).toBe('sg')
    expect(await page.getByLabel('Scale printed on the instrument').inputValue()).toBe('77/60F')
    await screenshot(page, 'salinity-remembered-375')

    // The client's other tank has nothing remembered: practical salinity, as before.
    const remembered = page.waitForResponse(r => r.url().endsWith(`/api/tanks/${otherTankId}/salinity-instrument`))
    await page.goto(`/tanks/${otherTankId}/tests`)
    expect(await (await remembered).json()).toEqual({ instrument: null })
    expect(await mode.inputValue()).toBe('practical')
    expect(problems).toEqual([])
    await context.close()
  })
})
