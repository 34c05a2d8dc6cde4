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
  'signed-out': ['/login', '/forgot-password'],
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
