/**
 * Danger is the first thing on screen: a client's bad test, the staff attention board and a
 * tank still being built, in Chromium at phone and desk widths. The scratch company has a
 * tank in each situation. Total ammonia above 0.5 ppm as NH3 with fish in calls for a water
 * change (common practice, no published source).
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Locator } from 'playwright-core'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { ATTENTION_USERS, seedAttentionCompany, type AttentionCompany } from '../support/attention-company'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
let browser: Browser
let db: TidewrightDB
let company: AttentionCompany
beforeAll(async () => {
  browser = await launchBrowser()
  db = openDatabase(inject('dbPath'))
  company = await seedAttentionCompany(db, demo.tanks)
})
afterAll(async () => {
  await browser?.close()
  db?.$client.close()
})

const top = async (locator: Locator) => (await locator.boundingBox())!.y

describe('a client saves a dangerous test', () => {
  for (const [width, tankKey] of [[375, 'firstTest'], [1280, 'secondTest']] as const) {
    it(`sees the danger first, in their kit's units, can log the water change in one tap, and gets a notice (${width} px)`, async () => {
      const tankId = company.tanks[tankKey]
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, ATTENTION_USERS.client.email)
      const bell = page.getByRole('link', { name: /^Notifications/ })
      const unreadBefore = Number(await page.getByTestId('unread-badge').textContent().catch(() => '0')) || 0
      await page.goto(`/tanks/${tankId}/tests`)
      await expect.poll(() => page.getByLabel('Tested at').inputValue()).not.toBe('')
      await page.getByLabel('Ammonia (mg/L)').fill('2')
      await page.getByLabel('Nitrite (mg/L)').fill('0')
      await page.getByLabel('Nitrate (mg/L)').fill('0')
      await page.getByLabel('pH', { exact: true }).fill('8.1')
      await page.getByLabel('Temperature', { exact: true }).fill('77')
      await page.getByLabel('Salinity', { exact: true }).fill('35')
      await page.getByRole('button', { name: 'Save tests' }).click()

      const danger = page.getByTestId('act-now')
      await expect.poll(() => danger.isVisible()).toBe(true)
      expect(await danger.getAttribute('role')).toBe('alert')
      expect(await danger.getByRole('heading', { level: 2 }).textContent()).toContain('Act now: danger to the animals')
      // Above the "saved" line, and inside the first screen.
      const saved = page.getByRole('heading', { name: 'Tests saved' })
      expect(await top(danger)).toBeLessThan(await top(saved))
      expect(await top(danger)).toBeGreaterThanOrEqual(0)
      expect(await top(danger)).toBeLessThan(width < 500 ? 812 : 900)
      await screenshot(page, `danger-saved-${width}`)
      const text = await danger.textContent()
      expect(text, text ?? '').toContain('Total ammonia is 2 ppm as NH3')
      expect(text).not.toContain('mg/L as N')
      expect(text).toMatch(/Change \d+ % of the water/)
      const volume = danger.getByLabel('Water changed (gal)')
      expect(Number(await volume.inputValue())).toBeGreaterThan(0)
      await screenshot(page, `danger-saved-${width}`)

      // The notice arrives without a reload.
      await expect.poll(async () => Number(await page.getByTestId('unread-badge').textContent().catch(() => '0')) || 0, { timeout: 15_000 }).toBe(unreadBefore + 1)

      if (width === 375) {
        await volume.fill('12')
        await danger.getByRole('button', { name: 'I did the water change' }).click()
        await expect.poll(() => page.getByText('Water change of 12 gal logged.').isVisible()).toBe(true)
      }
      await bell.click()
      await page.waitForURL(/\/notifications$/)
      await expect.poll(() => page.getByText(`Act now: Kelpwater ${tankKey === 'firstTest' ? 'first' : 'second'}-test reef`).first().isVisible()).toBe(true)
      await screenshot(page, `danger-notice-${width}`)

      // The tank page leads with the same block; the verdict below does not repeat it.
      await page.goto(`/tanks/${tankId}`)
      await expect.poll(() => page.getByTestId('act-now').isVisible()).toBe(true)
      expect(await top(page.getByTestId('act-now'))).toBeLessThan(await top(page.getByRole('link', { name: 'Enter today\'s tests' })))
      await screenshot(page, `danger-tank-${width}`)
      if (width === 375) {
        // The water change is in the history as an event.
        await page.getByRole('link', { name: 'All tests and events' }).click()
        await expect.poll(() => page.getByText('Logged from the danger notice').first().isVisible()).toBe(true)
      }
      expect(problems).toEqual([])
      await context.close()
    })
  }
})

describe('the attention board', () => {
  for (const width of [375, 1280]) {
    it(`orders the alerting tank above quiet ones, says how long the silent tank has gone untested, and keeps the filter in the URL (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, ATTENTION_USERS.supervisor.email)
      await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Today' }).isVisible()).toBe(true)
      const board = page.getByRole('list', { name: 'Tanks that need attention' })
      await expect.poll(() => board.getByRole('listitem').first().isVisible()).toBe(true)
      const rows = await board.locator(':scope > li').allTextContents()
      const alerting = rows.findIndex(r => r.includes('Kelpwater alerting reef'))
      const silent = rows.findIndex(r => r.includes('Kelpwater silent reef'))
      expect(alerting).toBeGreaterThanOrEqual(0)
      expect(rows[alerting]).toContain('Danger alert, not acknowledged')
      expect(rows[silent]).toMatch(/No test for (6|7|8) days/)
      expect(alerting).toBeLessThan(silent)
      // The quiet plan is below, with nothing to do.
      const quiet = page.getByRole('region', { name: 'Nothing due today' })
      expect(await quiet.textContent()).toContain('Kelpwater quiet reef')
      expect(await top(board)).toBeLessThan(await top(quiet))
      await screenshot(page, `board-${width}`)

      await page.getByLabel('Aquarist').selectOption({ label: ATTENTION_USERS.aquarist2.name })
      await page.waitForURL(url => url.searchParams.get('aquarist') === company.users.aquarist2)
      await expect.poll(() => board.locator(':scope > li').count()).toBe(1)
      await page.reload()
      expect(await page.getByLabel('Aquarist').inputValue()).toBe(company.users.aquarist2)
      await expect.poll(() => board.locator(':scope > li').first().textContent()).toContain('Kelpwater alerting reef')
      await screenshot(page, `board-filtered-${width}`)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('the client\'s home card shows the alert instead of the cycle phase (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, ATTENTION_USERS.client.email)
    const card = page.getByRole('link', { name: /Kelpwater alerting reef/ })
    await expect.poll(() => card.isVisible()).toBe(true)
    expect(await card.textContent()).toContain('Danger alert')
    expect(await card.textContent()).not.toMatch(/Ammonia stage|Nitrite stage|Settling/)
    await screenshot(page, 'client-home-alert-375')
    expect(problems).toEqual([])
    await context.close()
  })
})

describe('a tank still being built', () => {
  for (const [width, email] of [[375, ATTENTION_USERS.client.email], [1280, ATTENTION_USERS.aquarist.email]] as const) {
    it(`shows its build plan first and no cycle advice or test prompt (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, email)
      await page.goto(`/tanks/${company.tanks.building}`)
      await expect.poll(() => page.getByRole('heading', { name: 'Build plan' }).isVisible()).toBe(true)
      const body = (await page.locator('main').textContent()) ?? ''
      expect(body).not.toMatch(/dose ammonia|ammonia dose|Enter today's tests|Where the cycle stands/i)
      expect(await page.getByRole('link', { name: 'Enter today\'s tests' }).count()).toBe(0)
      await screenshot(page, `building-tank-${width}`)
      expect(problems).toEqual([])
      await context.close()
    })
  }
})
