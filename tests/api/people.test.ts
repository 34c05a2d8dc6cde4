import { describe, expect, it } from 'vitest'
import { auditRows, seedScratchCompany } from '../support/company'
import { ApiClient, signedIn } from '../support/http'
import type { CaughtMail } from '../../scripts/mail-catcher'
import { tokenIn, waitForMail } from '../support/mail'

/** The invitation answer names no account (it reads the same for a known address), so the id comes from the people list. */
async function invitedId(api: ApiClient, email: string): Promise<string> {
  const found = await api.get(`/api/people?q=${encodeURIComponent(email)}`)
  expect(found.body.items).toHaveLength(1)
  return found.body.items[0].id
}

describe('GET /api/people', () => {
  it('lists staff and client accounts with role, status and units, searched and filtered, one page at a time', async () => {
    const co = await seedScratchCompany('people-list', 'us')
    const admin = await signedIn(co.emails.admin)
    const all = await admin.get(`/api/people?pageSize=2`)
    expect(all.status).toBe(200)
    expect(all.body.total).toBe(5)
    expect(all.body.items).toHaveLength(2)
    const second = await admin.get(`/api/people?pageSize=2&page=3`)
    expect(second.body.items).toHaveLength(1)
    const clientsOnly = await admin.get('/api/people?role=client')
    expect(clientsOnly.body.items.map((p: { email: string }) => p.email).sort()).toEqual([co.emails.client, co.emails.otherClient].sort())
    const found = await admin.get(`/api/people?q=${encodeURIComponent('supervisor-')}`)
    expect(found.body.items).toHaveLength(1)
    expect(found.body.items[0]).toMatchObject({ role: 'supervisor', status: 'active', units: 'us', lastSignInAt: null, openTanks: 0 })
    // The admin signed in above, so their last sign-in is known.
    const me = await admin.get(`/api/people?q=${encodeURIComponent(co.emails.admin)}`)
    expect(me.body.items[0].lastSignInAt).toEqual(expect.any(String))
  })

  it('shows an aquarist the client accounts only, and refuses bad filters with 400', async () => {
    const co = await seedScratchCompany('people-aquarist')
    const aquarist = await signedIn(co.emails.aquarist)
    const list = await aquarist.get('/api/people')
    expect(list.body.items.every((p: { role: string }) => p.role === 'client')).toBe(true)
    expect(list.body.total).toBe(2)
    expect((await aquarist.get('/api/people?status=sleeping')).status).toBe(400)
    expect((await aquarist.get('/api/people?pageSize=1000')).status).toBe(400)
  })
})

describe('invitations: resend and withdraw', () => {
  it('resends a fresh link (the old one stops working) and withdrawing makes the link dead', async () => {
    const co = await seedScratchCompany('people-invite')
    const admin = await signedIn(co.emails.admin)
    const email = `invitee-${co.organisationId.slice(0, 8)}@scratch.test`
    const invited = await admin.post('/api/invitations', { email, name: 'Odile Marsh', role: 'aquarist' })
    expect(invited.status).toBe(201)
    const id = await invitedId(admin, email)
    const inviteTokens = (mails: CaughtMail[]) => mails.filter(m => m.envelopeTo.includes(email) && /invitation/i.test(m.subject)).map(m => tokenIn(m.text, '/accept-invite'))
    const first = await waitForMail(`invitation to ${email}`, all => inviteTokens(all)[0])
    const pending = await admin.get(`/api/people?status=invited`)
    expect(pending.body.items.map((p: { id: string }) => p.id)).toContain(id)

    const resent = await admin.post(`/api/invitations/${id}/resend`)
    expect(resent.status).toBe(200)
    const visitor = new ApiClient()
    expect((await visitor.get(`/api/auth/token?token=${first}`)).status).toBe(404)
    const second = await waitForMail(`second invitation to ${email}`, all => inviteTokens(all).find(t => t !== first))
    expect((await visitor.get(`/api/auth/token?token=${second}`)).status).toBe(200)

    const withdrawn = await admin.delete(`/api/invitations/${id}`)
    expect(withdrawn.status).toBe(200)
    expect((await visitor.get(`/api/auth/token?token=${second}`)).status).toBe(404)
    expect((await visitor.post('/api/auth/accept-invite', { token: second, password: 'a-long-enough-password' })).status).toBe(410)
    expect(auditRows(id).map(r => r.action)).toEqual(['user.invite', 'user.invite-resend', 'user.invite-withdraw'])
    // The address is free again.
    expect((await admin.post('/api/invitations', { email, name: 'Odile Marsh', role: 'aquarist' })).status).toBe(201)
  })

  it('refuses to withdraw an accepted invitation (409) and keeps an aquarist to client invitations', async () => {
    const co = await seedScratchCompany('people-withdraw')
    const admin = await signedIn(co.emails.admin)
    expect((await admin.delete(`/api/invitations/${co.ids.aquarist}`)).status).toBe(409)
    const staffEmail = `staff-${co.organisationId.slice(0, 8)}@scratch.test`
    expect((await admin.post('/api/invitations', { email: staffEmail, name: 'Pell Staff', role: 'supervisor' })).status).toBe(201)
    const staffId = await invitedId(admin, staffEmail)
    const aquarist = await signedIn(co.emails.aquarist)
    expect((await aquarist.post(`/api/invitations/${staffId}/resend`)).status).toBe(404)
    expect((await aquarist.delete(`/api/invitations/${staffId}`)).status).toBe(404)
    const clientEmail = `cl-${co.organisationId.slice(0, 8)}@scratch.test`
    const clientInvite = await aquarist.post('/api/invitations', { email: clientEmail, name: 'Cora Client', role: 'client', clientId: co.otherClientId })
    expect(clientInvite.status).toBe(201)
    expect((await aquarist.delete(`/api/invitations/${await invitedId(aquarist, clientEmail)}`)).status).toBe(200)
  })
})

describe('account follow-up by the admin', () => {
  it('finds no person of another company (404) for a reset, a resend or a withdrawal', async () => {
    const co = await seedScratchCompany('people-self')
    const other = await seedScratchCompany('people-other')
    const admin = await signedIn(co.emails.admin)
    expect((await admin.post(`/api/people/${other.ids.aquarist}/password-reset`)).status).toBe(404)
    expect((await admin.post(`/api/invitations/${other.ids.aquarist}/resend`)).status).toBe(404)
    expect((await admin.delete(`/api/invitations/${other.ids.aquarist}`)).status).toBe(404)
  })

  it('e-mails a password-reset link on the admin\'s word; the old password works until it is used', async () => {
    const co = await seedScratchCompany('people-reset')
    const admin = await signedIn(co.emails.admin)
    const sent = await admin.post(`/api/people/${co.ids.supervisor}/password-reset`)
    expect(sent.status).toBe(200)
    const mail = await waitForMail(`reset link to ${co.emails.supervisor}`, all => all.find(m => m.envelopeTo.includes(co.emails.supervisor) && /reset/i.test(m.subject)))
    const token = tokenIn(mail.text, '/reset-password')
    expect((await new ApiClient().get(`/api/auth/token?token=${token}`)).body).toMatchObject({ purpose: 'reset', email: co.emails.supervisor })
    expect((await new ApiClient().post('/api/auth/login', { email: co.emails.supervisor, password: 'tidewright-demo' })).status).toBe(200)
    expect(auditRows(co.ids.supervisor).map(r => r.action)).toContain('user.reset-sent')
  })
})

describe('GET /api/admin/attention', () => {
  it('names pending invitations, deactivated people still on open tanks and tanks with no aquarist', async () => {
    const co = await seedScratchCompany('people-attention')
    const admin = await signedIn(co.emails.admin)
    const tank = await admin.post('/api/tanks', { name: 'Attention reef', clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 }, aquaristId: co.ids.aquarist })
    expect(tank.status).toBe(201)
    await admin.post('/api/invitations', { email: `pending-${co.organisationId.slice(0, 8)}@scratch.test`, name: 'Pending Person', role: 'aquarist' })
    expect((await admin.post(`/api/people/${co.ids.aquarist}/deactivate`)).status).toBe(200)
    const attention = await admin.get('/api/admin/attention')
    expect(attention.status).toBe(200)
    expect(attention.body.pendingInvitations.map((p: { name: string }) => p.name)).toEqual(['Pending Person'])
    expect(attention.body.deactivatedWithTanks).toEqual([expect.objectContaining({ id: co.ids.aquarist, openTanks: 1 })])
    expect(attention.body.unassignedTanks).toEqual([])
    await admin.patch(`/api/tanks/${tank.body.id}`, { aquaristId: null })
    const after = await admin.get('/api/admin/attention')
    expect(after.body.unassignedTanks.map((t: { name: string }) => t.name)).toEqual(['Attention reef'])
  })
})
