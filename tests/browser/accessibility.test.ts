/**
 * WCAG 2.2 AA, checked by axe-core: every page each role can open, and the signed-out pages,
 * at a desktop width (1280 px) and a phone width (375 px), with no serious or critical violation.
 * Each failure prints the page, width, rule id and the elements it found.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, signInThroughForm } from '../support/browser'
import { axeViolations, seriousOnly } from '../support/axe'

const { demo } = inject('fixtures')
const lounge = `/tanks/${demo.tanks.lounge}`
const TANK_PAGES = [lounge, `${lounge}/tests`, `${lounge}/history`]
const SETTINGS_FOR_EVERYONE = ['/settings/account', '/settings/notifications', '/settings/sessions']

/** The pages each role can open (route meta and app/utils/nav-links.ts), signed-out ones last. */
const PAGES: Record<'admin' | 'aquarist' | 'supervisor' | 'client' | 'signed-out', string[]> = {
  'admin': ['/', '/admin', '/admin/mail', '/settings', '/people', '/people/invite', '/audit', '/plan-template',
    '/reviews', `/reviews/${demo.tanks.nano}`, '/alerts', '/notifications', '/clients', `/clients/${demo.clients.lowe}`,
    '/tanks', '/tanks/new', ...TANK_PAGES, `${lounge}/edit`, ...SETTINGS_FOR_EVERYONE],
  'aquarist': ['/', '/tanks', '/tanks/new', ...TANK_PAGES, `${lounge}/edit`, `/reviews/${demo.tanks.nano}`,
    '/alerts', '/notifications', '/clients', `/clients/${demo.clients.quayle}`, '/people', '/people/invite', ...SETTINGS_FOR_EVERYONE],
  'supervisor': ['/', '/reviews', `/reviews/${demo.tanks.nano}`, '/audit', '/alerts', '/notifications', '/tanks',
    ...TANK_PAGES, '/clients', ...SETTINGS_FOR_EVERYONE],
  'client': ['/', ...TANK_PAGES, '/notifications', ...SETTINGS_FOR_EVERYONE],
  'signed-out': ['/login', '/forgot-password', '/reset-password', '/accept-invite', '/verify/TW-NOT-A-CODE'],
}
const WIDTHS = [1280, 375] as const

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('accessibility (WCAG 2.2 AA, axe-core)', () => {
  for (const [role, paths] of Object.entries(PAGES)) {
    for (const width of WIDTHS) {
      it(`${role} at ${width} px: no serious or critical violation on ${paths.length} pages`, async () => {
        const { page, context } = await openPage(browser, width)
        if (role !== 'signed-out') await signInThroughForm(page, `${role}@tidewright.test`)
        const found: string[] = []
        for (const path of paths) {
          const response = await page.goto(path)
          expect(response?.status(), `${path} opens for ${role}`).toBe(200)
          for (const v of seriousOnly(await axeViolations(page))) {
            for (const target of v.targets) found.push(`${role} ${width}px ${path} [${v.impact}] ${v.id}: ${target}`)
          }
        }
        if (found.length) console.log(found.join('\n'))
        expect(found).toEqual([])
        await context.close()
      })
    }
  }
})

describe('keyboard and phone use', () => {
  it('"Skip to content" is the first stop for Tab and moves focus to the page\'s main content', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(lounge)
    await page.keyboard.press('Tab')
    const first = await page.evaluate(() => ({ text: document.activeElement?.textContent?.trim(), outline: getComputedStyle(document.activeElement!).outlineStyle }))
    expect(first).toEqual({ text: 'Skip to content', outline: 'solid' })
    await expect.poll(() => page.getByRole('link', { name: 'Skip to content' }).isVisible()).toBe(true)
    await page.keyboard.press('Enter')
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('main-content')
    await page.keyboard.press('Tab')
    expect(await page.evaluate(() => !!document.activeElement?.closest('main'))).toBe(true)
    expect(problems).toEqual([])
    await context.close()
  })

  it('every element Tab reaches on the tank page shows a focus ring (outline or ring)', async () => {
    const { page, context } = await openPage(browser, 1280)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`${lounge}/history`)
    const unringed: string[] = []
    for (let i = 0; i < 40; i++) {
      await page.keyboard.press('Tab')
      const seen = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null
        if (!el || el === document.body) return null
        const style = getComputedStyle(el)
        const ringed = (style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 2) || /rgb\(\d+, \d+, \d+\) 0px 0px 0px [2-9]px/.test(style.boxShadow)
        return { ringed, name: `${el.tagName.toLowerCase()} "${(el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 40)}"` }
      })
      if (seen && !seen.ringed) unringed.push(seen.name)
    }
    expect(unringed).toEqual([])
    await context.close()
  })

  it('on a phone the readings table scrolls inside a named frame that says so, and the page does not scroll sideways', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`${lounge}/history`)
    const frame = page.getByRole('region', { name: 'Tests, scrolls sideways' })
    await expect.poll(() => frame.isVisible()).toBe(true)
    expect(await frame.getAttribute('tabindex')).toBe('0')
    await expect.poll(() => page.getByText('Scroll sideways to see every column.').first().isVisible()).toBe(true)
    expect(await frame.evaluate(el => el.scrollWidth > el.clientWidth)).toBe(true)
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await frame.focus()
    await page.keyboard.press('ArrowRight')
    await expect.poll(() => frame.evaluate(el => el.scrollLeft)).toBeGreaterThan(0)
    expect(problems).toEqual([])
    await context.close()
  })
})
