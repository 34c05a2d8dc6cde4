/**
 * Lists keep their filters in the address (Back and reload show the same list), and pickers
 * over long lists say how many there are and search the rest instead of stopping at a page.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { openDatabase } from '../../server/db/connection'
import { clients } from '../../server/db/schema'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'

const EXTRA_CLIENTS = 60
let browser: Browser
let co: ScratchCompany
beforeAll(async () => {
  browser = await launchBrowser()
  co = await seedScratchCompany('pickers', 'metric')
  const db = openDatabase(inject('dbPath'))
  try {
    for (let i = 1; i <= EXTRA_CLIENTS; i++) {
      db.insert(clients).values({ organisationId: co.organisationId, name: `Picker client ${String(i).padStart(3, '0')}` }).run()
    }
  }
  finally {
    db.$client.close()
  }
})
afterAll(async () => { await browser?.close() })

describe('lists and pickers', () => {
  it('the client list keeps its search and order in the address through Back and a reload', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, co.emails.aquarist)
    await page.goto('/clients')
    await page.getByLabel('Search').fill('Picker client 05')
    await page.getByLabel('Sort by').selectOption('updated')
    await page.waitForURL(url => url.searchParams.get('q') === 'Picker client 05' && url.searchParams.get('sort') === 'updated')
    const rows = page.getByRole('link', { name: /^Picker client 05\d$/ })
    await expect.poll(() => rows.count()).toBe(10)
    await rows.first().click()
    await page.waitForURL(/\/clients\/[0-9a-f-]{36}$/)
    await page.goBack()
    await expect.poll(() => page.getByLabel('Search').inputValue()).toBe('Picker client 05')
    expect(await page.getByLabel('Sort by').inputValue()).toBe('updated')
    await expect.poll(() => rows.count()).toBe(10)
    await page.reload()
    await expect.poll(() => page.getByLabel('Search').inputValue()).toBe('Picker client 05')
    await expect.poll(() => rows.count()).toBe(10)
    expect(problems).toEqual([])
    await context.close()
  })

  it('a hand-edited address with an unknown order or page shows the plain list, not an error', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, co.emails.aquarist)
    await page.goto('/clients?sort=shoe-size&page=-3')
    expect(await page.getByLabel('Sort by').inputValue()).toBe('name')
    await expect.poll(() => page.getByRole('link', { name: 'Picker client 001' }).isVisible()).toBe(true)
    expect(problems).toEqual([])
    await context.close()
  })

  it('the tank form\'s client picker says how many clients there are and finds one past the first page', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, co.emails.aquarist)
    await page.goto('/tanks/new')
    const total = EXTRA_CLIENTS + 2
    await expect.poll(() => page.getByText(`Showing 50 of ${total} clients`).isVisible()).toBe(true)
    const picker = page.getByLabel('Client', { exact: true })
    expect(await picker.locator('option', { hasText: 'Picker client 060' }).count()).toBe(0)
    await page.getByLabel('Search clients by name').fill('client 060')
    await expect.poll(() => picker.locator('option', { hasText: 'Picker client 060' }).count()).toBe(1)
    await picker.selectOption({ label: 'Picker client 060' })
    // The staff pickers are filled from the company's staff list ({ items } from GET /api/staff).
    await expect.poll(() => page.getByLabel('Aquarist', { exact: true }).locator(`option[value="${co.ids.aquarist}"]`).count()).toBe(1)
    await expect.poll(() => page.getByLabel('Supervisor', { exact: true }).locator(`option[value="${co.ids.supervisor}"]`).count()).toBe(1)
    await screenshot(page, 'client-picker-375')
    // The chosen client stays chosen when the search moves on.
    await page.getByLabel('Search clients by name').fill('client 001')
    await expect.poll(() => picker.locator('option', { hasText: 'Picker client 001' }).count()).toBe(1)
    expect(await picker.inputValue()).not.toBe('')
    expect(await picker.locator('option:checked').textContent()).toContain('Picker client 060')
    expect(problems).toEqual([])
    await context.close()
  })
})
