/**
 * A person sees where they are signed in and ends the sessions they do not recognise:
 * one at a time, or every one but this browser's. An ended session's cookie is refused.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

let browser: Browser
let company: ScratchCompany
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('sessions-page')
})
afterAll(async () => { await browser?.close() })

/** A phone signed in as the same person elsewhere. */
async function phone(email: string): Promise<ApiClient> {
  const api = new ApiClient()
  const response = await api.request('POST', '/api/auth/login', { email, password: 'tidewright-demo' }, { 'user-agent': 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.4 Mobile/15E148 Safari/604.1' })
  expect(response.status).toBe(200)
  return api
}

describe('signed-in devices', () => {
  it('lists this browser and another device, and signs the other one out', async () => {
    const other = await phone(company.emails.aquarist)
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto('/settings/notifications')
    await page.getByRole('link', { name: 'Signed-in devices' }).click()
    await page.waitForURL(/\/settings\/sessions$/)
    const list = page.getByRole('list', { name: 'Where you are signed in' })
    await expect.poll(() => list.getByRole('listitem').count()).toBe(2)
    await expect.poll(() => list.getByRole('listitem').filter({ hasText: 'This browser' }).count()).toBe(1)
    const phoneRow = list.getByRole('listitem').filter({ hasText: 'Safari on iOS' })
    await expect.poll(() => phoneRow.isVisible()).toBe(true)
    await screenshot(page, 'sessions-1280')
    await phoneRow.getByRole('button', { name: /Sign out/ }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Safari on iOS is signed out.' }).count()).toBe(1)
    await expect.poll(() => list.getByRole('listitem').count()).toBe(1)
    expect((await other.get('/api/me')).status).toBe(401)
    // This browser is still signed in: the page reloads with its own session listed.
    await page.reload()
    await expect.poll(() => list.getByRole('listitem').filter({ hasText: 'This browser' }).count()).toBe(1)
    expect(await page.evaluate(() => fetch('/api/me').then(r => r.status))).toBe(200)
    expect(problems).toEqual([])
    await context.close()
  })

  it('signs out every other device at once on a phone-sized screen', async () => {
    const others = [await phone(company.emails.client), await phone(company.emails.client)]
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto('/settings/sessions')
    const list = page.getByRole('list', { name: 'Where you are signed in' })
    await expect.poll(() => list.getByRole('listitem').count()).toBe(3)
    await screenshot(page, 'sessions-375')
    await page.getByRole('button', { name: 'Sign out everywhere else' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: '2 other sessions ended.' }).count()).toBe(1)
    await expect.poll(() => list.getByRole('listitem').count()).toBe(1)
    for (const api of others) expect((await api.get('/api/me')).status).toBe(401)
    expect(problems).toEqual([])
    await context.close()
  })
})
