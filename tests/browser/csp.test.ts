/**
 * The content security policy is served and the app works under it: every page in
 * app/pages (found from the file tree, route parameters filled with demo ids) loads in
 * Chromium without a single CSP violation, console error or hydration warning.
 */
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
/** A demo id for each route parameter, by the folder it sits in. */
const PARAMS: Record<string, string> = {
  tanks: demo.tanks.lounge,
  reviews: demo.tanks.lounge,
  clients: demo.clients.lowe,
  // Well-formed, unknown: the page shows that no sign-off carries it.
  verify: 'TW-0000-0000-0000-0000-0000-0000',
}

function pages(dir = 'app/pages'): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? pages(path) : name.endsWith('.vue') ? [relative('app/pages', path)] : []
  })
}

/** `tanks/[id].vue` -> `/tanks/<lounge id>`; null when a parameter has no demo id here. */
function urlOf(file: string): string | null {
  const segments = file.replace(/\.vue$/, '').split('/').filter(s => s !== 'index')
  const out: string[] = []
  for (const [i, segment] of segments.entries()) {
    const param = /^\[(\w+)\]$/.exec(segment)
    if (!param) {
      out.push(segment)
      continue
    }
    const value = PARAMS[segments[i - 1] ?? '']
    if (!value) return null
    out.push(value)
  }
  return `/${out.join('/')}`
}

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('the content security policy', () => {
  const files = pages()
  const urls = files.map(urlOf)

  it('knows a demo id for every page parameter', () => {
    expect(files.filter((_, i) => urls[i] === null)).toEqual([])
  })

  it('is enforced: an inline handler and another origin\'s image are blocked and reported (so the check above can fail)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await context.addInitScript(() => {
      (window as unknown as { __csp: string[] }).__csp = []
      document.addEventListener('securitypolicyviolation', e => (window as unknown as { __csp: string[] }).__csp.push(e.violatedDirective))
    })
    await page.goto('/login')
    await page.evaluate(() => {
      const button = document.createElement('button')
      button.setAttribute('onclick', 'window.__ran = true')
      document.body.appendChild(button)
      button.click()
      const image = new Image()
      image.src = 'http://elsewhere.invalid/pixel.png'
    })
    await expect.poll(() => page.evaluate(() => [...new Set((window as unknown as { __csp: string[] }).__csp)].sort())).toEqual(['img-src', 'script-src-attr'])
    expect(await page.evaluate(() => (window as unknown as { __ran?: boolean }).__ran)).toBeUndefined()
    expect(problems.some(p => /content security policy/i.test(p))).toBe(true)
    await context.close()
  })

  for (const persona of ['admin@tidewright.test', 'client@tidewright.test']) {
    it(`no page breaks it, signed in as ${persona}`, async () => {
      const { page, context, problems } = await openPage(browser, 1280)
      await context.addInitScript(() => {
        (window as unknown as { __csp: string[] }).__csp = []
        document.addEventListener('securitypolicyviolation', (e) => {
          (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`)
        })
      })
      await page.goto('/login')
      const violations: string[] = [...await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp)]
      await signInThroughForm(page, persona)
      for (const url of urls.filter((u): u is string => u !== null && u !== '/login')) {
        const response = await page.goto(url)
        // Not 'networkidle': signed-in pages keep their notification stream open.
        await page.waitForLoadState('load')
        await page.waitForTimeout(500)
        const csp = response?.headers()['content-security-policy'] ?? ''
        // A client opening a staff page gets the not-found page; that page runs under the policy too.
        expect(csp, url).toContain('default-src \'self\'')
        expect(csp, url).toMatch(/script-src 'self' 'strict-dynamic' 'nonce-/)
        violations.push(...(await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp)).map(v => `${url}: ${v}`))
      }
      expect(violations).toEqual([])
      const cspErrors = problems.filter(p => /content security policy|refused to (load|execute|apply)/i.test(p))
      expect(cspErrors).toEqual([])
      // Staff-only pages answer a client with 403/404 and some pages probe for ids they are
      // not given; those HTTP answers are the feature tests' business. Script errors are not.
      const httpAnswers = /^4\d\d |Failed to load resource: the server responded with a status of 4\d\d/
      expect(problems.filter(p => !httpAnswers.test(p))).toEqual([])
      await context.close()
    })
  }
})
