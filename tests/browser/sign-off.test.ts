import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'

const { demo } = inject('fixtures')
const nano = demo.tanks.nano
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('sign-off, from request to certificate', () => {
  let code = ''

  it('supervisor returns the waiting nano with a note', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reviews' }).click()
    await page.waitForURL(/\/reviews$/)
    const queue = page.getByRole('list', { name: 'Review queue' })
    await expect.poll(() => queue.getByText('Quay Street nano').isVisible()).toBe(true)
    expect(await queue.getByText('Cycle complete').count()).toBeGreaterThan(0)
    await screenshot(page, 'reviews-1280')
    await queue.getByRole('link', { name: /Quay Street nano/ }).click()
    await page.waitForURL(new RegExp(`/reviews/${nano}`))
    await expect.poll(() => page.getByRole('heading', { name: 'The engine\'s verdict' }).isVisible()).toBe(true)
    await expect.poll(() => page.getByRole('img', { name: /Ammonia, nitrite and nitrate/ }).isVisible()).toBe(true)
    expect(await page.getByText('Site survey').count()).toBeGreaterThan(0)
    await screenshot(page, 'evidence-1280')
    await page.getByLabel('Return to the aquarist').check()
    await page.getByRole('button', { name: 'Return with note' }).click()
    await expect.poll(() => page.locator('#decision-note-error').textContent()).toContain('Say what needs doing')
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('decision-note')
    await page.getByLabel('What needs doing (required)').fill('Please add the leak-test photo to stage 2.')
    await page.getByRole('button', { name: 'Return with note' }).click()
    await expect.poll(() => page.getByText('Returned to the aquarist').first().isVisible()).toBe(true)
    expect(problems).toEqual([])
    await context.close()
  })

  it('aquarist sees the note and asks for sign-off again', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'aquarist@tidewright.test')
    await page.goto(`/tanks/${nano}`)
    await expect.poll(() => page.getByText(/Returned by Hollis Achterberg: Please add the leak-test photo/).isVisible()).toBe(true)
    await page.getByLabel('Note for the supervisor').fill('Photo added; ready again.')
    await screenshot(page, 'tank-request-375')
    await page.getByRole('button', { name: 'Ask for sign-off' }).click()
    await expect.poll(() => page.getByText(/waiting for the supervisor's sign-off/).isVisible()).toBe(true)
    expect(await page.getByRole('button', { name: 'Ask for sign-off' }).count()).toBe(0)
    expect(problems).toEqual([])
    await context.close()
  })

  it('supervisor approves; the tank is signed off', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, 'supervisor@tidewright.test')
    await page.goto('/reviews')
    await expect.poll(() => page.getByText('Photo added; ready again.').isVisible()).toBe(true)
    await screenshot(page, 'reviews-375')
    await page.getByRole('list', { name: 'Review queue' }).getByRole('link', { name: /Quay Street nano/ }).click()
    await page.waitForURL(new RegExp(`/reviews/${nano}`))
    await expect.poll(() => page.getByText('Photo added; ready again.').first().isVisible()).toBe(true)
    await screenshot(page, 'evidence-375')
    // Evidence first, decision last, and nothing chosen for the supervisor.
    const decision = page.getByRole('heading', { name: 'Your decision' })
    const evidenceTop = await page.getByRole('heading', { name: 'The engine\'s verdict' }).boundingBox()
    expect((await decision.boundingBox())!.y).toBeGreaterThan(evidenceTop!.y)
    // The stages' checklists read as marks with each item's state in words (the plan's StageChecklist), and the
    // events' amounts in the history page's words (describeEventAmount: a dose in mg/L as N to two places).
    expect(await page.getByRole('region', { name: 'Build plan' }).getByText('Done:', { exact: true }).count()).toBeGreaterThan(0)
    const events = await page.getByRole('region', { name: 'Events' }).innerText()
    expect(events).toMatch(/Ammonia dose · .+ · \d+\.\d\d mg\/L as N/)
    expect(events).not.toMatch(/\d\.\d{3,} mg\/L as N/)
    expect(await page.getByLabel('Approve and sign off').isChecked()).toBe(false)
    expect(await page.getByLabel('Return to the aquarist').isChecked()).toBe(false)
    await page.getByRole('button', { name: 'Choose a decision' }).click()
    await expect.poll(() => page.getByText('Choose to sign off or to return the tank.').isVisible()).toBe(true)
    // Focus goes to the unchosen decision, the first thing marked.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-describedby'))).toBe('decision-choice-error')
    // Choosing approve does not sign: a confirmation restates what is signed first.
    await page.getByLabel('Approve and sign off').check()
    await page.getByLabel('Note (optional)').fill('Clearance test convincing.')
    await page.getByRole('button', { name: 'Review what you sign' }).click()
    const confirm = page.getByRole('region', { name: 'You are signing' })
    await expect.poll(() => confirm.isVisible()).toBe(true)
    for (const words of ['Quay Street nano (Idris Quayle)', 'Cycle complete, rule set', 'No: the engine agrees', 'Clearance test convincing.']) {
      expect(await confirm.textContent(), words).toContain(words)
    }
    await screenshot(page, 'sign-off-confirm-375')
    expect(await page.getByText('Signed off', { exact: true }).count()).toBe(0)
    await confirm.getByRole('button', { name: 'Confirm and sign off' }).click()
    await expect.poll(() => page.getByRole('heading', { name: 'Reopen the sign-off' }).isVisible()).toBe(true)
    await expect.poll(() => page.getByText('Signed off', { exact: true }).first().isVisible()).toBe(true)
    // After signing: the certificate and the code to check it with.
    const signed = page.getByRole('region', { name: 'Signed off' })
    await expect.poll(() => signed.getByTestId('verification-code').textContent()).toMatch(/^TW(?:-[0-9A-Z]{4}){6}$/)
    expect(await signed.getByRole('link', { name: 'Download the certificate (PDF)' }).getAttribute('href')).toBe(`/api/tanks/${nano}/certificate.pdf`)
    await screenshot(page, 'sign-off-signed-375')
    // The signed record can only be corrected, with a reason, as a new linked entry.
    await page.getByRole('button', { name: /^Correct the test of/ }).first().click()
    const form = page.getByRole('form', { name: /Correct the test of/ })
    await form.getByLabel('Nitrate (mg/L as N)').fill('4.4')
    await form.getByRole('button', { name: 'Save correction' }).click()
    await expect.poll(() => form.getByText('Write what was wrong.').isVisible()).toBe(true)
    await form.getByLabel('What was wrong').fill('Nitrate card read in lamp light')
    await form.getByRole('button', { name: 'Save correction' }).click()
    await expect.poll(() => page.getByText('Correction: Nitrate card read in lamp light').isVisible()).toBe(true)
    await screenshot(page, 'evidence-corrected-375')
    expect(problems).toEqual([])
    await context.close()
  })

  for (const width of [1280, 375]) {
    it(`client downloads the certificate, reads the plan and verifies the code (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, 'client2@tidewright.test')
      await page.getByRole('link', { name: /Quay Street nano/ }).click()
      await page.waitForURL(/\/tanks\//)
      await expect.poll(() => page.getByRole('heading', { name: 'The first weeks' }).isVisible()).toBe(true)
      const order = page.getByRole('list', { name: 'Livestock order' })
      expect(await order.getByRole('listitem').count()).toBe(5)
      expect(await page.getByText('Lighting acclimation').isVisible()).toBe(true)
      await screenshot(page, `client-signed-tank-${width}`)
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('link', { name: 'Download the certificate (PDF)' }).click(),
      ])
      const path = await download.path()
      const bytes = readFileSync(path)
      expect(bytes.subarray(0, 5).toString()).toBe('%PDF-')
      const text = execFileSync('pdftotext', ['-layout', '-', '-'], { input: bytes }).toString('utf8')
      for (const expected of ['Cycle sign-off certificate', 'Quay Street nano', 'Idris Quayle', 'Hollis Achterberg', 'Fishless cycle', 'Final tests', 'Livestock plan', 'Brinefield Aquarium Studio']) {
        expect(text, expected).toContain(expected)
      }
      code = /TW(?:-[0-9A-Z]{4}){6}/.exec(text)?.[0] ?? ''
      expect(code).not.toBe('')
      await page.goto(`/verify/${code}`)
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'Valid' }).count()).toBe(1)
      expect(await page.getByText('Quay Street nano').isVisible()).toBe(true)
      await screenshot(page, `verify-${width}`)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('a tampered code does not verify, signed out', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    expect(code).toMatch(/^TW-/)
    const tampered = code.slice(0, -1) + (code.endsWith('Z') ? 'Y' : 'Z')
    await page.goto(`/verify/${tampered}`)
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Not verified' }).count()).toBe(1)
    expect(await page.getByText('Quay Street nano').count()).toBe(0)
    await screenshot(page, 'verify-tampered-375')
    expect(problems).toEqual([])
    await context.close()
  })
})
