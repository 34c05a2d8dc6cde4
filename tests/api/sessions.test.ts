/**
 * Server-side sessions: the sealed cookie names a row in `sessions`, and that row decides.
 * A cookie copied before sign-out, a password reset, deactivation or a role change is
 * refused afterwards; idle and absolute lifetimes hold; a person sees and ends their own
 * sessions and nobody else's.
 */
import { describe, expect, it } from 'vitest'
import { seedScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { PASSWORD } from '../support/fixtures'
import { tokenIn, waitForMail } from '../support/mail'

const NOW_HEADER = 'x-tidewright-test-now'
const HOUR = 3_600_000

describe('sign-out', () => {
  it('ends the session on the server: the copied cookie is refused afterwards', async () => {
    const company = await seedScratchCompany('signout')
    const api = await new ApiClient().signIn(company.emails.aquarist)
    const stolen = api.copy()
    expect((await stolen.get('/api/me')).status).toBe(200)
    expect((await api.post('/api/auth/logout')).status).toBe(200)
    expect((await stolen.get('/api/me')).status).toBe(401)
    expect((await stolen.get('/api/tanks')).status).toBe(401)
  })

  it('ends the session through the sign-out the header button uses (DELETE /api/_auth/session)', async () => {
    const company = await seedScratchCompany('signout-button')
    const api = await new ApiClient().signIn(company.emails.client)
    const stolen = api.copy()
    expect((await api.delete('/api/_auth/session')).status).toBe(200)
    expect((await stolen.get('/api/me')).status).toBe(401)
  })

  it('hands the browser the person from the database, never the session id', async () => {
    const company = await seedScratchCompany('session-view')
    const api = await new ApiClient().signIn(company.emails.supervisor)
    const view = await api.get('/api/_auth/session')
    expect(view.status).toBe(200)
    expect(view.body.user).toMatchObject({ id: company.ids.supervisor, role: 'supervisor', organisationId: company.organisationId })
    expect(view.body.secure).toBeUndefined()
    const sessions = await api.get('/api/me/sessions')
    const current = sessions.body.items.find((s: { current: boolean }) => s.current)
    expect(JSON.stringify(view.body)).not.toContain(current.id)
    const stolen = api.copy()
    await api.post('/api/auth/logout')
    expect((await stolen.get('/api/_auth/session')).body.user).toBeUndefined()
  })
})

describe('password reset', () => {
  it('ends every session of the person, including ones on other devices', async () => {
    const company = await seedScratchCompany('reset')
    const email = company.emails.client
    const phone = await new ApiClient().signIn(email)
    const laptop = await new ApiClient().signIn(email)
    const stolen = laptop.copy()
    expect((await new ApiClient().post('/api/auth/forgot-password', { email })).status).toBe(200)
    const mail = await waitForMail('reset e-mail', all => all.find(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject)))
    const visitor = new ApiClient()
    expect((await visitor.post('/api/auth/reset-password', { token: tokenIn(mail.text, '/reset-password'), password: 'a-fresh-reef-password-2026' })).status).toBe(200)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await laptop.get('/api/me')).status).toBe(401)
    expect((await stolen.get('/api/me')).status).toBe(401)
    // The reset itself signs the person in on a new session.
    expect((await visitor.get('/api/me')).status).toBe(200)
  })
})

describe('deactivation and role change', () => {
  it('deactivating a person refuses their cookie at once; reactivating lets them sign in again, not the old cookie', async () => {
    const company = await seedScratchCompany('deactivate')
    const admin = await new ApiClient().signIn(company.emails.admin)
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    const stolen = aquarist.copy()
    const off = await admin.post(`/api/people/${company.ids.aquarist}/deactivate`)
    expect(off.status).toBe(200)
    expect(off.body.person).toMatchObject({ id: company.ids.aquarist, active: false })
    expect((await aquarist.get('/api/tanks')).status).toBe(401)
    expect((await stolen.get('/api/tanks')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/login', { email: company.emails.aquarist, password: PASSWORD })).status).toBe(401)
    expect((await admin.post(`/api/people/${company.ids.aquarist}/reactivate`)).status).toBe(200)
    expect((await stolen.get('/api/tanks')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/login', { email: company.emails.aquarist, password: PASSWORD })).status).toBe(200)
  })

  it('a role change ends the person\'s sessions so the new role applies from the next sign-in', async () => {
    const company = await seedScratchCompany('role')
    const admin = await new ApiClient().signIn(company.emails.admin)
    const supervisor = await new ApiClient().signIn(company.emails.supervisor)
    const changed = await admin.patch(`/api/people/${company.ids.supervisor}/role`, { role: 'aquarist' })
    expect(changed.status).toBe(200)
    expect(changed.body.person).toMatchObject({ id: company.ids.supervisor, role: 'aquarist' })
    expect((await supervisor.get('/api/me')).status).toBe(401)
    const again = await new ApiClient().signIn(company.emails.supervisor)
    expect((await again.get('/api/me')).body.role).toBe('aquarist')
  })

  it('never leaves a company without an active admin, and an admin does not deactivate themself', async () => {
    const company = await seedScratchCompany('last-admin')
    const admin = await new ApiClient().signIn(company.emails.admin)
    expect((await admin.patch(`/api/people/${company.ids.admin}/role`, { role: 'aquarist' })).status).toBe(409)
    expect((await admin.post(`/api/people/${company.ids.admin}/deactivate`)).status).toBe(409)
    expect((await admin.get('/api/me')).status).toBe(200)
  })

  it('refuses role changes into or out of a client account, and people of another company are not found', async () => {
    const company = await seedScratchCompany('role-rules')
    const other = await seedScratchCompany('role-rules-other')
    const admin = await new ApiClient().signIn(company.emails.admin)
    expect((await admin.patch(`/api/people/${company.ids.client}/role`, { role: 'aquarist' })).status).toBe(409)
    expect((await admin.patch(`/api/people/${company.ids.aquarist}/role`, { role: 'client' })).status).toBe(400)
    expect((await admin.post(`/api/people/${other.ids.aquarist}/deactivate`)).status).toBe(404)
    expect((await admin.patch(`/api/people/${other.ids.aquarist}/role`, { role: 'supervisor' })).status).toBe(404)
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    expect((await aquarist.post(`/api/people/${company.ids.supervisor}/deactivate`)).status).toBe(403)
  })
})

describe('lifetimes', () => {
  it('ends a session left idle past the idle lifetime, and any session past its absolute lifetime', async () => {
    const company = await seedScratchCompany('idle')
    const api = await new ApiClient().signIn(company.emails.client)
    // Defaults: 3 days idle, 7 days absolute (nuxt.config runtimeConfig.sessionLifetime).
    const at = (days: number) => ({ [NOW_HEADER]: new Date(Date.now() + days * 24 * HOUR).toISOString() })
    // Used every two days: never idle for long, so only the absolute lifetime can end it.
    for (const day of [2, 4, 6]) expect((await api.request('GET', '/api/me', undefined, at(day))).status).toBe(200)
    expect((await api.request('GET', '/api/me', undefined, at(7.5))).status).toBe(401)

    const idle = await new ApiClient().signIn(company.emails.client)
    const kept = idle.copy()
    expect((await idle.request('GET', '/api/me', undefined, at(3.5))).status).toBe(401)
    // Once refused, the session stays ended even back in the present.
    expect((await kept.get('/api/me')).status).toBe(401)
  })
})

describe('GET /api/me/sessions and ending them', () => {
  it('lists the person\'s live sessions with the current one marked, and ends one or all the others', async () => {
    const company = await seedScratchCompany('my-sessions')
    const email = company.emails.aquarist
    const first = await new ApiClient().signIn(email)
    const second = await new ApiClient().signIn(email)
    const third = await new ApiClient().signIn(email)
    const mine = await third.get('/api/me/sessions')
    expect(mine.status).toBe(200)
    expect(mine.body.items).toHaveLength(3)
    expect(mine.body.items.filter((s: { current: boolean }) => s.current)).toHaveLength(1)
    for (const s of mine.body.items) expect(Object.keys(s).sort()).toEqual(['address', 'createdAt', 'current', 'expiresAt', 'id', 'lastSeenAt', 'userAgent'].sort())

    const firstId = (await first.get('/api/me/sessions')).body.items.find((s: { current: boolean }) => s.current).id
    expect((await third.post(`/api/me/sessions/${firstId}/end`)).status).toBe(200)
    expect((await first.get('/api/me')).status).toBe(401)
    expect((await third.post(`/api/me/sessions/${firstId}/end`)).status).toBe(404)

    const others = await third.post('/api/me/sessions/end-others')
    expect(others.status).toBe(200)
    expect(others.body).toEqual({ ended: 1 })
    expect((await second.get('/api/me')).status).toBe(401)
    expect((await third.get('/api/me')).status).toBe(200)
    expect((await third.get('/api/me/sessions')).body.items).toHaveLength(1)
  })

  it('does not let a person end someone else\'s session', async () => {
    const company = await seedScratchCompany('not-mine')
    const client = await new ApiClient().signIn(company.emails.client)
    const admin = await new ApiClient().signIn(company.emails.admin)
    const clientSession = (await client.get('/api/me/sessions')).body.items[0].id
    expect((await admin.post(`/api/me/sessions/${clientSession}/end`)).status).toBe(404)
    expect((await client.get('/api/me')).status).toBe(200)
  })
})
