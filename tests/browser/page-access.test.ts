/**
 * Pages follow their URLs and say in route meta who may open them: a person whose role a
 * page does not name gets a 403 page, and the tank editor's former address still works.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('who may open a page', () => {
  for (const path of ['/alerts', '/clients', '/tanks/new', '/plan-template', '/people/invite', `/tanks/${demo.tanks.lounge}/edit`]) {
    it(`a client opening ${path} is told it is not open to them`, async () => {
      const { page, context } = await openPage(browser, 375)
      await signInThroughForm(page, 'client@tidewright.test')
      const response = await page.goto(path)
      expect(response?.status()).toBe(403)
      await expect.poll(() => page.getByRole('heading', { name: 'Not open to your account' }).isVisible()).toBe(true)
      await context.close()
    })
  }

  it('a supervisor may not edit the plan template but an admin may', async () => {
    const { page, context } = await openPage(browser, 1280)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    expect((await page.goto('/plan-template'))?.status()).toBe(403)
    await context.close()
    const admin = await openPage(browser, 1280)
    await signInThroughForm(admin.page, 'admin@tidewright.test')
    expect((await admin.page.goto('/plan-template'))?.status()).toBe(200)
    expect(admin.problems).toEqual([])
    await admin.context.close()
  })

  it('the tank editor\'s former address leads to /tanks/:id/edit', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`/tanks/edit/${demo.tanks.lounge}`)
    await page.waitForURL(new RegExp(`/tanks/${demo.tanks.lounge}/edit$`))
    await expect.poll(() => page.getByLabel('Tank name').inputValue()).toBe('Marlowe lounge reef')
    await page.getByRole('link', { name: /Marlowe lounge reef/ }).click()
    await page.waitForURL(new RegExp(`/tanks/${demo.tanks.lounge}$`))
    await page.getByRole('link', { name: 'Edit tank' }).click()
    await page.waitForURL(new RegExp(`/tanks/${demo.tanks.lounge}/edit$`))
    expect(problems.filter(p => !p.startsWith('301 '))).toEqual([])
    await context.close()
  })
})
