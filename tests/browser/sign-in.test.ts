import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('signing in', () => {
  for (const width of [375, 1280]) {
    it(`a client sees their own tanks and not another client's (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await page.goto('/')
      await page.waitForURL(/\/login/)
      await screenshot(page, `sign-in-${width}`)
      await signInThroughForm(page, 'client@tidewright.test')
      const tanks = page.getByRole('list', { name: 'Tanks' })
      await expect.poll(() => tanks.getByRole('link').count()).toBe(2)
      await expect.poll(() => page.getByText('Marlowe lounge reef').isVisible()).toBe(true)
      expect(await page.getByText('Quay Street nano').count()).toBe(0)
      await screenshot(page, `client-home-${width}`)
      await page.getByRole('link', { name: /Marlowe lounge reef/ }).click()
      await page.waitForURL(/\/tanks\//)
      await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Marlowe lounge reef' }).isVisible()).toBe(true)
      await screenshot(page, `client-tank-${width}`)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('shows one clear message for a wrong password and keeps what was typed', async () => {
    const { page, context } = await openPage(browser, 375)
    await page.goto('/login')
    await page.getByLabel('E-mail').fill('client2@tidewright.test')
    await page.getByLabel('Password').fill('wrong-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('Wrong e-mail or password')
    expect(await page.getByLabel('E-mail').inputValue()).toBe('client2@tidewright.test')
    await context.close()
  })

  it('a client cannot open another client\'s tank by its address', async () => {
    const { page, context } = await openPage(browser, 1280)
    await signInThroughForm(page, 'client2@tidewright.test')
    const response = await page.goto(`/tanks/${inject('fixtures').demo.tanks.lounge}`)
    expect(response?.status()).toBe(404)
    await expect.poll(() => page.getByRole('heading', { name: 'Nothing here' }).isVisible()).toBe(true)
    await context.close()
  })
})
