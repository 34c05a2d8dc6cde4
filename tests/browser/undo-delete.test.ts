/**
 * Deleting a test from a tank's history asks no question: the row goes at once with an Undo
 * toast, and the DELETE is sent only when the toast's time runs out. Undo sends nothing.
 */
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { openDatabase } from '../../server/db/connection'
import { auditLog } from '../../server/db/schema'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

let browser: Browser
let company: ScratchCompany
let aquarist: ApiClient
let tankId: string
const readingIds: Record<'kept' | 'deleted', string> = { kept: '', deleted: '' }

beforeAll(async () => {
  browser = await launchBrowser()
  company = await seedScratchCompany('undo-delete', 'metric')
  aquarist = await new ApiClient().signIn(company.emails.aquarist)
  const tank = await aquarist.post<{ id: string }>('/api/tanks', { name: 'Undo reef', clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(tank.status).toBe(201)
  tankId = tank.body.id
  // Two tests told apart by their salinity, which the history shows to one decimal.
  const entry = (hoursAgo: number, salinity: number) => ({
    takenAt: new Date(Date.now() - hoursAgo * 3_600_000).toISOString(),
    basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
    temperatureUnit: 'C', salinityMode: 'practical', salinity, pH: 8.1,
  })
  for (const [which, hoursAgo, salinity] of [['kept', 30, 33.1], ['deleted', 6, 35.4]] as const) {
    const saved = await aquarist.post<{ reading: { id: string } }>(`/api/tanks/${tankId}/readings`, entry(hoursAgo, salinity))
    expect(saved.status).toBe(201)
    readingIds[which] = saved.body.reading.id
  }
})
afterAll(async () => { await browser?.close() })

function deleteAudits(readingId: string): number {
  const db = openDatabase(inject('dbPath'))
  try {
    return db.select().from(auditLog).where(and(eq(auditLog.action, 'reading.delete'), eq(auditLog.entityId, readingId))).all().length
  }
  finally {
    db.$client.close()
  }
}

describe('deleting from a tank\'s history', () => {
  it('Undo brings the row back and deletes nothing; a deletion left alone is sent when the toast goes (1280 px)', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    const deletes: string[] = []
    page.on('request', (request) => { if (request.method() === 'DELETE') deletes.push(request.url()) })
    let dialogs = 0
    page.on('dialog', (dialog) => { dialogs++; void dialog.dismiss() })
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}/history`)
    const keptRow = page.getByRole('row').filter({ hasText: '33.1' })
    const deletedRow = page.getByRole('row').filter({ hasText: '35.4' })
    await expect.poll(() => keptRow.count()).toBe(1)
    expect(await deletedRow.count()).toBe(1)

    // The first deletion is taken back.
    await keptRow.getByRole('button', { name: 'Delete' }).click()
    await expect.poll(() => keptRow.count()).toBe(0)
    const toast = page.getByRole('status').filter({ hasText: 'deleted.' })
    await expect.poll(() => toast.getByRole('button', { name: 'Undo' }).isVisible()).toBe(true)
    await screenshot(page, 'toast-undo-1280')
    await toast.getByRole('button', { name: 'Undo' }).click()
    await expect.poll(() => keptRow.count()).toBe(1)

    // The second is left alone: its DELETE goes out when its window closes, which is after
    // the first one's window (opened earlier, as long) would have closed.
    await deletedRow.getByRole('button', { name: 'Delete' }).click()
    await expect.poll(() => deletedRow.count()).toBe(0)
    const response = await page.waitForResponse(r => r.request().method() === 'DELETE', { timeout: 30_000 })
    expect(response.status()).toBe(204)
    expect(deletes).toEqual([expect.stringContaining(`/readings/${readingIds.deleted}`)])
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'deleted.' }).count()).toBe(0)
    expect(await deletedRow.count()).toBe(0)
    expect(await keptRow.count()).toBe(1)
    expect(dialogs).toBe(0)

    // On the server: the one taken back is there and was never deleted; the other is gone, audited.
    const list = await aquarist.get<{ items: { id: string }[] }>(`/api/tanks/${tankId}/readings`)
    expect(list.body.items.map(r => r.id)).toEqual([readingIds.kept])
    expect(deleteAudits(readingIds.kept)).toBe(0)
    expect(deleteAudits(readingIds.deleted)).toBe(1)
    expect(problems).toEqual([])
    await context.close()
  })

  it('the Undo toast fits a phone (375 px)', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}/history`)
    const keptRow = page.getByRole('row').filter({ hasText: '33.1' })
    await expect.poll(() => keptRow.count()).toBe(1)
    await keptRow.getByRole('button', { name: 'Delete' }).click()
    const undo = page.getByRole('status').getByRole('button', { name: 'Undo' })
    await expect.poll(() => undo.isVisible()).toBe(true)
    await page.screenshot({ path: 'tests/browser/screenshots/toast-undo-375.png' })
    await undo.click()
    await expect.poll(() => keptRow.count()).toBe(1)
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(375)
    expect(problems).toEqual([])
    await context.close()
  })
})
