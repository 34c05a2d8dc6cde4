/**
 * Reads keep what they learned from a session cookie for a short while (the unsealed cookie,
 * prepared statements), so a cookie that has just been used is the one a cache would wrongly
 * trust. Every test here uses the cookie on the tank reads first, then ends access some way,
 * and expects the very next request with that same cookie to be refused: sign-out, the
 * person ending the session, a password reset, deactivation, a role change, an archived
 * client record and both lifetimes. A change of units shows on the very next read too.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { eq } from 'drizzle-orm'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { users } from '../../server/db/schema'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { tokenIn, waitForMail } from '../support/mail'
import { copyTank } from '../support/sign-off-tanks'

const NOW_HEADER = 'x-tidewright-test-now'
const DAY = 86_400_000

let db: TidewrightDB
beforeAll(() => {
  db = openDatabase(inject('dbPath'))
})
afterAll(() => db?.$client.close())

/** A scratch company with one tank of its first client, copied from a demo tank. */
async function companyWithTank(label: string): Promise<{ company: ScratchCompany, tankId: string }> {
  const company = await seedScratchCompany(label)
  const tankId = copyTank(db, inject('fixtures').demo.tanks.nano, `Cache reef ${label}`, {
    organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId,
    aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor,
  })
  return { company, tankId }
}

/** The measured reads, each twice: whatever a cache keeps for this cookie is now warm. */
async function warm(api: ApiClient, tankId: string): Promise<void> {
  for (let round = 0; round < 2; round++) {
    for (const path of ['/api/me', '/api/tanks', `/api/tanks/${tankId}`, `/api/tanks/${tankId}/readings`, `/api/tanks/${tankId}/verdict`]) {
      const response = await api.get(path)
      expect(response.status, path).toBe(200)
    }
  }
}

/** Every measured read with this cookie is refused as signed out. */
async function expectRefused(api: ApiClient, tankId: string): Promise<void> {
  for (const path of [`/api/tanks/${tankId}`, '/api/tanks', `/api/tanks/${tankId}/readings`, `/api/tanks/${tankId}/verdict`, '/api/me']) {
    expect((await api.get(path)).status, path).toBe(401)
  }
  expect((await api.get('/api/_auth/session')).body.user).toBeUndefined()
}

describe('a just-used cookie stops working on the very next request', () => {
  it('after sign-out', async () => {
    const { company, tankId } = await companyWithTank('cache-signout')
    const api = await new ApiClient().signIn(company.emails.client)
    await warm(api, tankId)
    const stolen = api.copy()
    expect((await api.post('/api/auth/logout')).status).toBe(200)
    await expectRefused(stolen, tankId)
  })

  it('after the person ends that session from another device', async () => {
    const { company, tankId } = await companyWithTank('cache-ended')
    const laptop = await new ApiClient().signIn(company.emails.aquarist)
    const phone = await new ApiClient().signIn(company.emails.aquarist)
    await warm(laptop, tankId)
    const laptopSession = (await laptop.get('/api/me/sessions')).body.items.find((s: { current: boolean }) => s.current).id
    expect((await phone.post(`/api/me/sessions/${laptopSession}/end`)).status).toBe(200)
    await expectRefused(laptop, tankId)
    expect((await phone.get(`/api/tanks/${tankId}`)).status).toBe(200)
  })

  it('after "end all my other sessions"', async () => {
    const { company, tankId } = await companyWithTank('cache-others')
    const laptop = await new ApiClient().signIn(company.emails.supervisor)
    const phone = await new ApiClient().signIn(company.emails.supervisor)
    await warm(laptop, tankId)
    expect((await phone.post('/api/me/sessions/end-others')).body).toEqual({ ended: 1 })
    await expectRefused(laptop, tankId)
  })

  it('after a password reset', async () => {
    const { company, tankId } = await companyWithTank('cache-reset')
    const email = company.emails.client
    const api = await new ApiClient().signIn(email)
    await warm(api, tankId)
    expect((await new ApiClient().post('/api/auth/forgot-password', { email })).status).toBe(200)
    const mail = await waitForMail('reset e-mail', all => all.find(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject)))
    expect((await new ApiClient().post('/api/auth/reset-password', { token: tokenIn(mail.text, '/reset-password'), password: 'a-fresh-reef-password-2026' })).status).toBe(200)
    await expectRefused(api, tankId)
  })

  it('after deactivation', async () => {
    const { company, tankId } = await companyWithTank('cache-deactivate')
    const admin = await new ApiClient().signIn(company.emails.admin)
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    await warm(aquarist, tankId)
    expect((await admin.post(`/api/people/${company.ids.aquarist}/deactivate`)).status).toBe(200)
    await expectRefused(aquarist, tankId)
  })

  it('after deactivation written straight into the database, with no session ended', async () => {
    const { company, tankId } = await companyWithTank('cache-inactive-row')
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    await warm(aquarist, tankId)
    db.update(users).set({ active: false }).where(eq(users.id, company.ids.aquarist)).run()
    await expectRefused(aquarist, tankId)
  })

  it('after a role change', async () => {
    const { company, tankId } = await companyWithTank('cache-role')
    const admin = await new ApiClient().signIn(company.emails.admin)
    const supervisor = await new ApiClient().signIn(company.emails.supervisor)
    await warm(supervisor, tankId)
    expect((await admin.patch(`/api/people/${company.ids.supervisor}/role`, { role: 'aquarist' })).status).toBe(200)
    await expectRefused(supervisor, tankId)
  })

  it('applies a role written straight into the database on the next request', async () => {
    const { company, tankId } = await companyWithTank('cache-role-row')
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    await warm(aquarist, tankId)
    expect((await aquarist.get('/api/settings')).status).toBe(403)
    db.update(users).set({ role: 'admin' }).where(eq(users.id, company.ids.aquarist)).run()
    expect((await aquarist.get('/api/settings')).status).toBe(200)
    db.update(users).set({ role: 'aquarist' }).where(eq(users.id, company.ids.aquarist)).run()
    expect((await aquarist.get('/api/settings')).status).toBe(403)
  })

  it('after the client record is archived (the client company removed)', async () => {
    const { company, tankId } = await companyWithTank('cache-archive')
    const client = await new ApiClient().signIn(company.emails.client)
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    await warm(client, tankId)
    expect((await aquarist.post(`/api/clients/${company.clientId}/archive`, { archived: true })).status).toBe(200)
    await expectRefused(client, tankId)
  })

  it('after the absolute lifetime, and after the idle lifetime', async () => {
    const { company, tankId } = await companyWithTank('cache-lifetimes')
    const at = (days: number) => ({ [NOW_HEADER]: new Date(Date.now() + days * DAY).toISOString() })
    const old = await new ApiClient().signIn(company.emails.client)
    await warm(old, tankId)
    for (const day of [2, 4, 6]) expect((await old.request('GET', `/api/tanks/${tankId}`, undefined, at(day))).status).toBe(200)
    expect((await old.request('GET', `/api/tanks/${tankId}`, undefined, at(7.5))).status).toBe(401)
    await expectRefused(old, tankId)

    const idle = await new ApiClient().signIn(company.emails.client)
    await warm(idle, tankId)
    expect((await idle.request('GET', `/api/tanks/${tankId}/readings`, undefined, at(3.5))).status).toBe(401)
    await expectRefused(idle, tankId)
  })
})

describe('what a read knows of the person', () => {
  it('shows a change of units on the very next read', async () => {
    const { company, tankId } = await companyWithTank('cache-units')
    const api = await new ApiClient().signIn(company.emails.aquarist)
    await warm(api, tankId)
    expect((await api.request('PUT', '/api/me/units', { units: 'us' })).status).toBe(200)
    expect((await api.get('/api/_auth/session')).body.user.units).toBe('us')
    expect((await api.get('/api/me')).body.units).toBe('us')
  })

  it('still refuses a cookie that was tampered with, and answers the same cookie again once it is whole', async () => {
    const { company, tankId } = await companyWithTank('cache-tamper')
    const api = await new ApiClient().signIn(company.emails.client)
    await warm(api, tankId)
    // The sealed cookie with its last characters changed: same length, no longer whole.
    const cookies = api.cookieHeader().split('; ')
    const session = cookies.find(c => c.startsWith('tidewright-session='))!
    const changed = session.slice(0, -4) + (session.endsWith('AAAA') ? 'BBBB' : 'AAAA')
    const tampered = cookies.map(c => (c === session ? changed : c)).join('; ')
    expect((await fetch(`${api.baseURL}/api/tanks/${tankId}`, { headers: { cookie: tampered } })).status).toBe(401)
    expect((await api.get(`/api/tanks/${tankId}`)).status).toBe(200)
  })
})
