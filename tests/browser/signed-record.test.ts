/**
 * Editing a signed-off tank in the browser: a change the certificate does not print (who
 * the aquarist is) saves as usual, also for someone working in inches and gallons; a change
 * it prints (the name) asks for a reason beside its own field, and is saved as an amendment
 * once one is written.
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { planStages, signOffAmendments, tanks } from '../../server/db/schema'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'

let browser: Browser
let db: TidewrightDB
let company: ScratchCompany
let tankId: string

beforeAll(async () => {
  browser = await launchBrowser()
  db = openDatabase(inject('dbPath'))
  // US units: the form shows inches and gallons, which must not turn an untouched volume into a change.
  company = await seedScratchCompany('amend-browser', 'us')
  tankId = copyTank(db, inject('fixtures').demo.tanks.nano, 'Kestrel Wharf reef', {
    organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId,
    aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor, sumpLitres: 80,
    // The demo nano may already be signed off by another test; the copy starts cycled, awaiting its request.
    status: 'cycled',
  })
  const stages = db.select().from(planStages).where(eq(planStages.tankId, inject('fixtures').demo.tanks.nano)).all()
  db.insert(planStages).values(stages.map(({ id: _id, createdAt: _c, updatedAt: _u, tankId: _t, completedBy: _b, ...s }) => ({ ...s, tankId }))).run()
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  const supervisor = await new ApiClient().signIn(company.emails.supervisor)
  expect((await aquarist.post(`/api/tanks/${tankId}/sign-off-requests`, { note: 'Zero for a week' })).status).toBe(201)
  expect((await supervisor.post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve', note: 'Evidence is clear' })).status).toBe(200)
})
afterAll(async () => {
  await browser?.close()
  db?.$client.close()
})

const amendments = () => db.select().from(signOffAmendments).where(eq(signOffAmendments.tankId, tankId)).all()

describe('editing a signed-off tank', () => {
  it('saves a change the certificate does not print without asking for a reason', async () => {
    const { page, context, problems } = await openPage(browser, 375)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}/edit`)
    await expect.poll(() => page.getByLabel('Tank name').inputValue()).toBe('Kestrel Wharf reef')
    await expect.poll(() => page.getByText(/signed off/i).first().isVisible()).toBe(true)
    await screenshot(page, 'tank-edit-signed-375')
    await page.getByLabel('Aquarist').selectOption({ label: `admin ${company.emails.admin.slice(6, -13)}` })
    await page.getByRole('button', { name: 'Save changes' }).click()
    await page.waitForURL(new RegExp(`/tanks/${tankId}$`))
    expect(db.select({ aquaristId: tanks.aquaristId }).from(tanks).where(eq(tanks.id, tankId)).get()?.aquaristId).toBe(company.ids.admin)
    expect(amendments()).toEqual([])
    expect(problems).toEqual([])
    await context.close()
  })

  it('asks why beside the reason field when the name changes, then records the amendment', async () => {
    const { page, context, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, company.emails.aquarist)
    await page.goto(`/tanks/${tankId}/edit`)
    await expect.poll(() => page.getByLabel('Tank name').inputValue()).toBe('Kestrel Wharf reef')
    await page.getByLabel('Tank name').fill('Kestrel Wharf lagoon reef')
    await page.getByRole('button', { name: 'Save changes' }).click()
    const reason = page.getByLabel(/Reason for amending the signed record/)
    await expect.poll(() => reason.getAttribute('aria-invalid')).toBe('true')
    await expect.poll(() => page.locator('#amendmentReason-error').textContent()).toContain('Write a reason to amend it')
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('amendmentReason')
    expect(db.select({ name: tanks.name }).from(tanks).where(eq(tanks.id, tankId)).get()?.name).toBe('Kestrel Wharf reef')
    await screenshot(page, 'tank-edit-amendment-1280')
    await reason.fill('The client renamed the room; the certificate should carry the new name.')
    await page.getByRole('button', { name: 'Save changes' }).click()
    await page.waitForURL(new RegExp(`/tanks/${tankId}$`))
    expect(db.select({ name: tanks.name }).from(tanks).where(eq(tanks.id, tankId)).get()?.name).toBe('Kestrel Wharf lagoon reef')
    expect(amendments()).toMatchObject([{ reason: 'The client renamed the room; the certificate should carry the new name.', changes: [{ field: 'name', before: 'Kestrel Wharf reef', after: 'Kestrel Wharf lagoon reef' }] }])
    // A 409 is how the page learned a reason was needed; nothing else went wrong.
    expect(problems.filter(p => !/^409 |status of 409/.test(p))).toEqual([])
    await context.close()
  })
})
