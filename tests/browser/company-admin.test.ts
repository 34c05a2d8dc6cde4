import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { formatStamp } from '../../shared/readings/reader-words'
import { openDatabase } from '../../server/db/connection'
import { tanks } from '../../server/db/schema'
import { auditRows, seedScratchCompany } from '../support/company'
import { signedIn } from '../support/http'
import { launchBrowser, openPage, screenshot, signInThroughForm } from '../support/browser'
import { tokenIn, waitForMail } from '../support/mail'

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** An aquarist signed in on a phone, and an admin at a desk who has found them on the People page. */
async function adminFindsAquaristSignedInElsewhere(label: string) {
  const co = await seedScratchCompany(label)
  const aquarist = await openPage(browser, 375)
  await signInThroughForm(aquarist.page, co.emails.aquarist)
  await aquarist.page.goto('/clients')
  await expect.poll(() => aquarist.page.getByRole('heading', { name: 'Clients' }).isVisible()).toBe(true)

  const admin = await openPage(browser, 1280)
  await signInThroughForm(admin.page, co.emails.admin)
  await admin.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'People' }).click()
  await admin.page.waitForURL(/\/people/)
  await admin.page.getByLabel('Search').fill(co.emails.aquarist)
  await expect.poll(() => admin.page.getByRole('listitem').filter({ hasText: co.emails.aquarist }).count()).toBe(1)
  return { co, aquarist, admin }
}

describe('company administration', () => {
  it('an admin deactivates an aquarist who is signed in elsewhere: that session stops at once', async () => {
    const { co, aquarist, admin } = await adminFindsAquaristSignedInElsewhere('browser-deactivate')
    await screenshot(admin.page, 'people-1280')
    await admin.page.getByRole('button', { name: /^Manage aquarist/ }).click()
    await admin.page.getByRole('button', { name: 'Deactivate', exact: true }).click()
    await admin.page.getByRole('button', { name: 'Yes, deactivate' }).click()
    await expect.poll(() => admin.page.getByRole('status').filter({ hasText: 'signed out everywhere' }).isVisible()).toBe(true)
    await expect.poll(() => admin.page.getByRole('list', { name: 'People' }).getByText('Deactivated', { exact: true }).isVisible()).toBe(true)

    // The aquarist's very next request is refused, and the next page they open is the sign-in page.
    expect(await aquarist.page.evaluate(async () => (await fetch('/api/tanks')).status)).toBe(401)
    await aquarist.page.goto('/clients')
    await aquarist.page.waitForURL(/\/login/)
    expect(admin.problems).toEqual([])
    expect(auditRows(co.ids.aquarist).map(r => r.action)).toEqual(['user.deactivate'])
  })

  it('an admin changes a threshold: the company\'s tanks are re-evaluated and the audit trail shows before and after', async () => {
    const co = await seedScratchCompany('browser-threshold')
    const api = await signedIn(co.emails.admin)
    for (const name of ['Harbour reef', 'Lantern reef']) {
      expect((await api.post('/api/tanks', { name, clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 }, aquaristId: co.ids.aquarist })).status).toBe(201)
    }
    const { page, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, co.emails.admin)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Company' }).click()
    await page.waitForURL(/\/admin$/)
    await page.getByRole('link', { name: /Company settings/ }).click()
    await page.waitForURL(/\/settings$/)
    await page.getByText('Zero and rise', { exact: true }).click()
    const field = page.getByRole('textbox', { name: 'Total ammonia at or below this reads as zero.' })
    await field.fill('0.9')
    await page.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => page.getByText('Give a value from 0 to 0.5 mg/L as N.').isVisible()).toBe(true)
    await field.fill('0.1')
    // Every status line the page shows, however briefly: the save answers before any tank is
    // re-evaluated, so the progress line always shows before the result.
    await page.evaluate(() => {
      const seen: string[] = []
      ;(window as unknown as { statusLines: string[] }).statusLines = seen
      new MutationObserver(() => document.querySelectorAll('[role=status]').forEach(line => seen.push(line.textContent?.trim() ?? '')))
        .observe(document.body, { subtree: true, childList: true, characterData: true })
    })
    await page.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: '2 tanks re-evaluated, 0 changed cycle phase.' }).isVisible()).toBe(true)
    const lines = await page.evaluate(() => (window as unknown as { statusLines: string[] }).statusLines)
    expect(lines.some(line => /^Re-evaluating tanks: [01] of 2$/.test(line))).toBe(true)
    await expect.poll(() => page.getByRole('button', { name: /^Reset to default \(0\.05\): Total ammonia/ }).isVisible()).toBe(true)
    await screenshot(page, 'settings-1280')

    await page.goto('/audit?action=organisation')
    const row = page.getByRole('listitem').filter({ hasText: 'Changed the company settings' })
    await expect.poll(() => row.count()).toBe(1)
    await expect.poll(() => row.getByText('limit: Total ammonia at or below this reads as zero (mg/L as N): 0.05 → 0.1').isVisible()).toBe(true)
    expect(auditRows(co.organisationId).filter(r => r.action === 'organisation.settings')).toEqual([
      expect.objectContaining({ before: { thresholds: { ammoniaZeroN: 0.05 } }, after: { thresholds: { ammoniaZeroN: 0.1 } } }),
    ])
    await screenshot(page, 'audit-1280')
    expect(problems).toEqual([])
  })

  it('an admin changes the role of an aquarist who is signed in elsewhere: that session stops at once', async () => {
    const { co, aquarist, admin } = await adminFindsAquaristSignedInElsewhere('browser-role')
    await admin.page.getByRole('button', { name: /^Manage aquarist/ }).click()
    await admin.page.locator(`#role-${co.ids.aquarist}`).selectOption('supervisor')
    await admin.page.getByRole('button', { name: 'Change role' }).click()
    await expect.poll(() => admin.page.getByRole('status').filter({ hasText: 'is now supervisor and was signed out everywhere' }).isVisible()).toBe(true)

    // The old session is gone at once: its next request is refused and its next page is the sign-in page.
    expect(await aquarist.page.evaluate(async () => (await fetch('/api/tanks')).status)).toBe(401)
    await aquarist.page.goto('/clients')
    await aquarist.page.waitForURL(/\/login/)
    // Signing in again gives the new role.
    await signInThroughForm(aquarist.page, co.emails.aquarist)
    expect(await aquarist.page.evaluate(async () => (await (await fetch('/api/_auth/session')).json()).user?.role)).toBe('supervisor')
    expect(admin.problems).toEqual([])
    expect(auditRows(co.ids.aquarist).map(r => r.action)).toEqual(['user.role-change'])
  })

  it('the audit trail filters by a tank past the first hundred, and shows times on the company\'s clock', async () => {
    const co = await seedScratchCompany('browser-audit-picker')
    const api = await signedIn(co.emails.admin)
    const db = openDatabase(inject('dbPath'))
    try {
      for (let i = 1; i <= 110; i++) db.insert(tanks).values({ organisationId: co.organisationId, clientId: co.clientId, name: `Bulk reef ${String(i).padStart(3, '0')}`, volumeLitres: 200 }).run()
    }
    finally {
      db.$client.close()
    }
    // Last by name, so no first page of tanks holds it.
    const tank = await api.post('/api/tanks', { name: 'Zostera reef', clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 } })
    expect(tank.status).toBe(201)
    const settings = (await api.get('/api/settings')).body
    // Twelve or thirteen hours from UTC: the company's clock cannot be mistaken for the browser's.
    const zone = 'Pacific/Auckland'
    expect((await api.request('PUT', '/api/settings', { name: settings.name, settings: { ...settings.settings, timeZone: zone }, version: settings.version })).status).toBe(200)

    const { page, problems } = await openPage(browser, 1280)
    await signInThroughForm(page, co.emails.admin)
    await page.goto('/audit')
    await expect.poll(() => page.getByText('Showing 50 of 111 tanks').isVisible()).toBe(true)
    const picker = page.getByLabel('Tank', { exact: true })
    await page.getByLabel('Search tanks by name').fill('Zostera')
    await expect.poll(() => picker.locator('option', { hasText: 'Zostera reef' }).count()).toBe(1)
    await picker.selectOption({ label: 'Zostera reef' })
    await page.waitForURL(url => url.searchParams.get('tankId') === tank.body.id)
    const rows = page.getByRole('list', { name: 'Audit rows, newest first' }).locator(':scope > li')
    await expect.poll(() => rows.count()).toBe(1)
    await expect.poll(() => rows.first().textContent()).toContain('Zostera reef')
    const at = await rows.first().locator('time').getAttribute('datetime')
    expect(await rows.first().locator('time').textContent()).toBe(formatStamp(Date.parse(at!), zone))
    expect(formatStamp(Date.parse(at!), zone)).not.toBe(formatStamp(Date.parse(at!), 'UTC'))
    await expect.poll(() => page.getByText('Times are in the company\'s time zone, Pacific/Auckland.').isVisible()).toBe(true)
    // The admin's top bar holds every link on one line at 1280 px, even beside a long name.
    const header = page.locator('header')
    const boxes = await header.getByRole('navigation', { name: 'Main' }).getByRole('link').evaluateAll(links => links.map((link) => {
      const r = link.getBoundingClientRect()
      return { top: r.top, height: r.height, right: r.right }
    }))
    expect(boxes).toHaveLength(9)
    expect(new Set(boxes.map(b => b.top)).size).toBe(1)
    expect(Math.max(...boxes.map(b => b.height))).toBeLessThanOrEqual(44)
    const bell = await header.locator('a[href="/notifications"]').boundingBox()
    const signOut = await header.getByRole('button', { name: 'Sign out' }).boundingBox()
    expect(Math.max(...boxes.map(b => b.right))).toBeLessThanOrEqual(bell!.x)
    expect(bell!.x + bell!.width).toBeLessThanOrEqual(signOut!.x)
    expect((await header.boundingBox())!.height).toBe(64)
    await screenshot(page, 'audit-tank-picker-1280')
    expect(problems).toEqual([])
  })

  it('an admin withdraws an invitation: its link stops working', async () => {
    const co = await seedScratchCompany('browser-withdraw')
    const email = `withdrawn-${co.organisationId.slice(0, 8)}@scratch.test`
    const { page, problems } = await openPage(browser, 375)
    await signInThroughForm(page, co.emails.admin)
    await page.goto('/people/invite')
    await page.getByLabel('Name').fill('Wren Withdrawn')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Role').selectOption('aquarist')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: `Invitation sent to ${email}` }).isVisible()).toBe(true)
    const mail = await waitForMail(`invitation to ${email}`, all => all.find(m => m.envelopeTo.includes(email) && /invitation/i.test(m.subject)))
    const token = tokenIn(mail.text, '/accept-invite')

    await page.goto('/people?status=invited')
    await expect.poll(() => page.getByText(email).isVisible()).toBe(true)
    await screenshot(page, 'people-375')
    await page.getByRole('button', { name: 'Manage Wren Withdrawn' }).click()
    await page.getByRole('button', { name: 'Withdraw the invitation' }).click()
    await page.getByRole('button', { name: 'Yes, withdraw' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'its link no longer works' }).isVisible()).toBe(true)
    await expect.poll(() => page.getByRole('list', { name: 'People' }).getByText(email).count()).toBe(0)
    expect(problems).toEqual([])

    const visitor = await openPage(browser, 375)
    await visitor.page.goto(`/accept-invite?token=${token}`)
    await expect.poll(() => visitor.page.getByText('This link has expired or has already been used.').isVisible()).toBe(true)
  })

  it('the admin home, settings and audit trail read well at phone width', async () => {
    const co = await seedScratchCompany('browser-phone')
    const { page, problems } = await openPage(browser, 375)
    await signInThroughForm(page, co.emails.admin)
    await page.goto('/admin')
    await expect.poll(() => page.getByRole('heading', { name: 'Needs your attention' }).isVisible()).toBe(true)
    await screenshot(page, 'admin-home-375')
    await page.goto('/settings')
    await expect.poll(() => page.getByRole('heading', { name: 'Cycle and safety limits' }).isVisible()).toBe(true)
    await screenshot(page, 'settings-375')
    await page.goto('/audit')
    await expect.poll(() => page.getByRole('heading', { name: 'Audit trail' }).isVisible()).toBe(true)
    await screenshot(page, 'audit-375')
    expect(problems).toEqual([])
  })
})
