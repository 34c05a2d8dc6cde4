/**
 * A form names every problem in one round, takes the person to the first, and forgets a
 * message as soon as its field changes: the daily test form, on a phone and on a desk, the
 * event form, a correction made in the tank's history, and the file fields: a plan upload,
 * the photo of a test and the CSV import, checked before anything is sent and answered beside
 * the field when the server refuses.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { TINY_PNG } from '../api/access-matrix.data'

let browser: Browser
let company: ScratchCompany
let tankId: string
beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('form-errors', 'metric')
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  const tank = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Form reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(tank.status).toBe(201)
  tankId = tank.body.id
  // One test in the history to correct.
  const saved = await aquarist.post(`/api/tanks/${tankId}/readings`, {
    takenAt: new Date(Date.now() - 30 * 3_600_000).toISOString(),
    basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
    temperatureUnit: 'C', salinityMode: 'practical', salinity: 34.2, pH: 8.1,
  })
  expect(saved.status).toBe(201)
})
afterAll(async () => { await browser?.close() })

const focusedId = (page: Page) => page.evaluate(() => document.activeElement?.id ?? '')

describe('the daily test form', () => {
  for (const width of [375, 1280]) {
    it(`names a value out of range and one that is not a number at once, focuses the first, and clears a fixed one (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, company.emails.client)
      await page.goto(`/tanks/${tankId}/tests`)
      await expect.poll(() => page.getByLabel('Tested at').inputValue()).not.toBe('')
      // The page-load bar is there on every page, in the theme's tide colour (#16808a).
      expect(await page.locator('.nuxt-loading-indicator').evaluate(el => getComputedStyle(el).backgroundColor)).toBe('rgb(22, 128, 138)')
      // Readings take decimals: the phone shows its decimal keypad.
      expect(await page.getByLabel('Nitrate (mg/L)').getAttribute('inputmode')).toBe('decimal')

      await page.getByLabel('Nitrate (mg/L)').fill('20')
      await page.getByLabel('pH', { exact: true }).fill('19')
      await page.getByLabel('Temperature', { exact: true }).fill('warm')
      await page.getByRole('button', { name: 'Save tests' }).click()

      // Both messages in the same round, not the type error first and the range on the next save.
      const rangeMessage = page.getByText('pH must be between 0 and 14.')
      const typeMessage = page.getByText('Temperature must be a number.')
      await expect.poll(() => rangeMessage.isVisible()).toBe(true)
      expect(await typeMessage.isVisible()).toBe(true)
      // Focus moved from the button to the first field marked (pH comes before temperature).
      await expect.poll(() => focusedId(page)).toBe('reading-pH')
      expect(await page.getByLabel('pH', { exact: true }).getAttribute('aria-invalid')).toBe('true')
      await screenshot(page, `form-errors-${width}`)

      // Fixing one field takes its message away at once; the other stays until it is fixed.
      await page.getByLabel('pH', { exact: true }).fill('8.1')
      await expect.poll(() => rangeMessage.count()).toBe(0)
      expect(await typeMessage.isVisible()).toBe(true)
      await page.getByLabel('Temperature', { exact: true }).fill('25')
      await expect.poll(() => typeMessage.count()).toBe(0)

      await page.getByRole('button', { name: 'Save tests' }).click()
      await expect.poll(() => page.getByRole('heading', { name: 'Tests saved' }).isVisible()).toBe(true)
      // The save is confirmed by a toast too, read out politely.
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'Tests saved.' }).count()).toBe(1)
      await screenshot(page, `toast-saved-${width}`)
      expect(problems).toEqual([])
      await context.close()
    })
  }

  it('the event form does the same: a date in the future and an amount that is not a number, at once (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto(`/tanks/${tankId}/tests`)
    await page.getByText('Something else happened?').click()
    await page.getByLabel('What happened').selectOption('water-change')
    // Days ahead on any clock the browser keeps.
    await page.getByLabel('When').fill(new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 16))
    await page.getByLabel(/Volume changed/).fill('lots')
    await page.getByRole('button', { name: 'Save event' }).click()
    const future = page.getByText('An event cannot be in the future. Check the date and time.')
    const notNumber = page.getByText('Amount must be a number.')
    await expect.poll(() => future.isVisible()).toBe(true)
    expect(await notNumber.isVisible()).toBe(true)
    await expect.poll(() => focusedId(page)).toBe('event-at')
    await page.getByLabel(/Volume changed/).fill('20')
    await expect.poll(() => notNumber.count()).toBe(0)
    expect(await future.isVisible()).toBe(true)
    // A count of animals asks for the number keypad, not the decimal one.
    await page.getByLabel('What happened').selectOption('livestock-added')
    expect(await page.getByLabel('How many').getAttribute('inputmode')).toBe('numeric')
    expect(problems).toEqual([])
    await context.close()
  })

  it('a correction in the history does the same: a pH out of range and a salinity that is not a number, at once (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}/history`)
    const row = page.getByRole('row').filter({ hasText: '34.2' })
    await expect.poll(() => row.isVisible()).toBe(true)
    await row.getByRole('button', { name: 'Edit' }).click()
    const form = page.getByRole('form', { name: /Correct the test of/ })
    // The correction's boxes ask for the decimal keypad too.
    expect(await form.getByLabel('pH').getAttribute('inputmode')).toBe('decimal')
    await form.getByLabel('pH').fill('19')
    await form.getByLabel('salinity').fill('salty')
    await form.getByRole('button', { name: 'Save correction' }).click()
    const rangeMessage = form.getByText('pH must be between 0 and 14.')
    const typeMessage = form.getByText('Salinity must be a number.')
    await expect.poll(() => rangeMessage.isVisible()).toBe(true)
    expect(await typeMessage.isVisible()).toBe(true)
    await expect.poll(() => focusedId(page)).toBe('edit-pH')
    await screenshot(page, 'history-correction-errors-375')
    await form.getByLabel('salinity').fill('34.5')
    await expect.poll(() => typeMessage.count()).toBe(0)
    expect(await rangeMessage.isVisible()).toBe(true)
    await form.getByLabel('pH').fill('8.2')
    await expect.poll(() => rangeMessage.count()).toBe(0)
    await form.getByRole('button', { name: 'Save correction' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Test corrected.' }).count()).toBe(1)
    await expect.poll(() => page.getByRole('row').filter({ hasText: '34.5' }).count()).toBeGreaterThan(0)
    expect(problems).toEqual([])
    await context.close()
  })
})

/** A PNG one byte over the upload limit (10 MB). */
const OVERSIZE_PNG = Buffer.concat([TINY_PNG, Buffer.alloc(10 * 1024 * 1024 + 1 - TINY_PNG.length)])
/** The requests a page sends whose address contains `part`. */
function requestsTo(page: Page, part: string): string[] {
  const sent: string[] = []
  page.on('request', (request) => { if (request.url().includes(part)) sent.push(`${request.method()} ${request.url()}`) })
  return sent
}

describe('file fields', () => {
  it('a plan file over 10 MB is refused beside its field before anything is sent, and the field is focused (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}`)
    const survey = page.getByRole('article', { name: 'Site survey' })
    const toggle = survey.getByRole('button', { name: /Site survey/ }).first()
    if (await toggle.getAttribute('aria-expanded') !== 'true') await toggle.click()
    const sent = requestsTo(page, '/uploads')
    const field = survey.getByLabel('Add a photo or PDF to Site survey')
    await field.setInputFiles({ name: 'whole-wall.png', mimeType: 'image/png', buffer: OVERSIZE_PNG })
    await expect.poll(() => field.getAttribute('aria-invalid')).toBe('true')
    const described = await field.getAttribute('aria-describedby')
    expect(described).toBeTruthy()
    expect(await page.locator(`[id="${described!.split(' ').pop()}"]`).textContent()).toContain('Files are at most 10 MB.')
    await expect.poll(() => field.evaluate(el => el === document.activeElement)).toBe(true)
    expect(sent).toEqual([])
    // A file that fits takes the message away and is added, with a toast.
    await field.setInputFiles({ name: 'wall.png', mimeType: 'image/png', buffer: TINY_PNG })
    await expect.poll(() => survey.getByRole('img', { name: 'wall.png' }).count()).toBe(1)
    expect(await field.getAttribute('aria-invalid')).toBeNull()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'wall.png added.' }).count()).toBe(1)
    expect(problems).toEqual([])
    await context.close()
  })

  it('a test photo over 10 MB is refused beside its field before anything is sent; one the server refuses says why there, focused (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.client)
    await page.goto(`/tanks/${tankId}/tests`)
    await expect.poll(() => page.getByLabel('Tested at').inputValue()).not.toBe('')
    await page.getByText('More tests and notes').click()
    const sent = requestsTo(page, '/test-photos')
    const field = page.getByLabel('Photo of the test (optional)')
    await field.setInputFiles({ name: 'strip.png', mimeType: 'image/png', buffer: OVERSIZE_PNG })
    await expect.poll(() => field.getAttribute('aria-invalid')).toBe('true')
    await expect.poll(() => page.getByText('Files are at most 10 MB.').isVisible()).toBe(true)
    await expect.poll(() => focusedId(page)).toBe('reading-photo')
    expect(sent).toEqual([])
    // Named like a PNG but not one: only the server can tell, and its words go beside the field.
    await field.setInputFiles({ name: 'strip.png', mimeType: 'image/png', buffer: Buffer.from('not a picture at all') })
    await expect.poll(() => page.getByText(/this file's content is none of those/).isVisible()).toBe(true)
    expect(await page.getByText('Files are at most 10 MB.').count()).toBe(0)
    expect(await field.getAttribute('aria-invalid')).toBe('true')
    await expect.poll(() => focusedId(page)).toBe('reading-photo')
    expect(sent).toHaveLength(1)
    // The refusal is the point: its 415 (and the browser's note of it) is the one problem allowed.
    expect(problems.filter(p => !/\b415\b/.test(p))).toEqual([])
    await context.close()
  })

  for (const width of [375, 1280]) {
    it(`the CSV import refuses a picture before sending, shows the server's refusal beside the file, focused, and forgets it for the next file (${width} px)`, async () => {
      const { page, context, problems } = await openPage(browser, width)
      await signInThroughForm(page, company.emails.aquarist)
      await page.goto(`/tanks/${tankId}/history`)
      await page.getByText('Import tests from a CSV file').click()
      const sent = requestsTo(page, '/readings/import')
      const field = page.getByLabel('CSV file')
      await field.setInputFiles({ name: 'strip.png', mimeType: 'image/png', buffer: TINY_PNG })
      await expect.poll(() => field.getAttribute('aria-invalid')).toBe('true')
      await expect.poll(() => page.getByText(/not a CSV file/).isVisible()).toBe(true)
      await expect.poll(() => focusedId(page)).toBe('import-file')
      expect(sent).toEqual([])

      // A header row that names a column twice: the server refuses the file, beside the field.
      const day = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString()
      await field.setInputFiles({ name: 'twice.csv', mimeType: 'text/csv', buffer: Buffer.from(`Date,NH3,NH3\n${day(3)},0.5,0.5\n`) })
      const repeated = page.getByText(/The header row repeats a column name/)
      await expect.poll(() => repeated.isVisible()).toBe(true)
      expect(await page.getByText(/not a CSV file/).count()).toBe(0)
      expect(await field.getAttribute('aria-invalid')).toBe('true')
      expect(await field.getAttribute('aria-describedby')).toContain('import-file-error')
      await expect.poll(() => focusedId(page)).toBe('import-file')
      expect(sent).toHaveLength(1)
      await screenshot(page, `import-field-error-${width}`)
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width)

      // The next file takes the message away; its import is confirmed by a toast.
      await field.setInputFiles({ name: 'tests.csv', mimeType: 'text/csv', buffer: Buffer.from(`Date,NH3\n${day(4 + width / 1000)},0.5\n`) })
      await expect.poll(() => page.getByText('1 ready to import').isVisible()).toBe(true)
      expect(await repeated.count()).toBe(0)
      expect(await field.getAttribute('aria-invalid')).toBeNull()
      await page.getByRole('button', { name: 'Import 1 tests' }).click()
      await expect.poll(() => page.getByRole('status').filter({ hasText: '1 tests imported' }).count()).toBeGreaterThan(0)
      expect(problems.filter(p => !/\b400\b/.test(p))).toEqual([])
      await context.close()
    })
  }
})
