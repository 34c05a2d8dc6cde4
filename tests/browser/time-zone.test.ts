/**
 * Dates and times read the same on the server's page and in the browser after hydration,
 * wherever the browser's own clock is: every moment is shown on the company's clock. A
 * browser on UTC+14 (Kiritimati) is as far from the demo company's UTC as a clock gets, so a
 * moment formatted on the browser's clock would differ in its hour and often its day.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('one clock for every reader', () => {
  for (const [who, email, paths] of [
    ['a client', 'client@tidewright.test', [`/tanks/${demo.tanks.lounge}`, `/tanks/${demo.tanks.lounge}/history`]],
    ['a supervisor', 'supervisor@tidewright.test', ['/alerts', `/tanks/${demo.tanks.nano}`, '/reviews']],
  ] as const) {
    it(`shows ${who} the same times before and after hydration in a browser 14 hours ahead`, async () => {
      const { page, context, problems } = await openPage(browser, 1280, { timezoneId: 'Pacific/Kiritimati' })
      await signInThroughForm(page, email)
      // Other suites change what these pages list (a review decided, an alert cleared): at least one moment overall.
      let seen = 0
      for (const path of paths) {
        await page.goto(path)
        // The page as the server rendered it for this person, fetched with their cookie.
        const served = await page.evaluate(url => fetch(url).then(r => r.text()), path)
        // Every "Dec 2, 3:01 PM"-style moment the server wrote is still on the hydrated page.
        const moments = [...served.matchAll(/[A-Z][a-z]{2} \d{1,2}, (?:\d{4}, )?\d{1,2}:\d{2}\s?[AP]M/g)].map(m => m[0].replace(/\s/g, ' '))
        seen += moments.length
        // The hydrated DOM's text, folded parts (<details>) included, scripts and their data left out.
        const shown = (await page.evaluate(() => {
          const body = document.body.cloneNode(true) as HTMLElement
          body.querySelectorAll('script').forEach(script => script.remove())
          return body.textContent ?? ''
        })).replace(/\s/g, ' ')
        expect(moments.filter(m => !shown.includes(m)), path).toEqual([])
      }
      expect(seen).toBeGreaterThan(0)
      expect(problems.filter(p => /hydration/i.test(p))).toEqual([])
      await context.close()
    })
  }
})
