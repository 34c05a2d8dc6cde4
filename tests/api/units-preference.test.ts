/**
 * Each person chooses the units they read and type in (Your account): the choice is kept on
 * their account, reaches their session at once, is audited, and only US or metric is taken.
 */
import { describe, expect, it } from 'vitest'
import { auditRows, seedScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

describe('PUT /api/me/units', () => {
  it('keeps a client\'s choice on the account and in the session, audited with before and after', async () => {
    const company = await seedScratchCompany('units-choice', 'metric')
    const client = await new ApiClient().signIn(company.emails.client)
    const me = await client.get<{ id: string, units: string }>('/api/me')
    expect(me.body.units).toBe('metric')

    const saved = await client.request('PUT', '/api/me/units', { units: 'us' })
    expect(saved.status).toBe(200)
    expect(saved.body).toEqual({ units: 'us' })
    expect((await client.get<{ units: string }>('/api/me')).body.units).toBe('us')
    const session = await client.get<{ user?: { units: string } }>('/api/_auth/session')
    expect(session.body.user?.units).toBe('us')
    // The choice outlives the session: a new sign-in reads it from the account.
    expect((await (await new ApiClient().signIn(company.emails.client)).get<{ units: string }>('/api/me')).body.units).toBe('us')

    const rows = auditRows(me.body.id).filter(r => r.action === 'preferences.units')
    expect(rows).toEqual([{ action: 'preferences.units', actorId: me.body.id, before: { units: 'metric' }, after: { units: 'us' } }])
    // Saving the same choice again changes nothing and writes no second row.
    expect((await client.request('PUT', '/api/me/units', { units: 'us' })).status).toBe(200)
    expect(auditRows(me.body.id).filter(r => r.action === 'preferences.units')).toHaveLength(1)
  })

  it('refuses anything but US or metric with a message beside the field, and signed-out requests', async () => {
    const company = await seedScratchCompany('units-refused', 'us')
    const client = await new ApiClient().signIn(company.emails.client)
    const bad = await client.request('PUT', '/api/me/units', { units: 'imperial' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([{ field: 'units', message: 'Choose US or metric units.' }])
    expect((await client.get<{ units: string }>('/api/me')).body.units).toBe('us')
    expect((await new ApiClient().request('PUT', '/api/me/units', { units: 'metric' })).status).toBe(401)
  })
})

describe('units on invitation', () => {
  it('gives the invited person the units chosen, or the company\'s default when none is', async () => {
    const company = await seedScratchCompany('units-invite', 'us')
    const admin = await new ApiClient().signIn(company.emails.admin)
    const settings = (await admin.get<{ name: string, settings: Record<string, unknown>, version: number }>('/api/settings')).body
    expect((await admin.request('PUT', '/api/settings', { name: settings.name, settings: { ...settings.settings, defaultUnits: 'us' }, version: settings.version })).status).toBe(200)
    const tag = company.emails.admin.split('@')[0]
    const chosen = await admin.post('/api/invitations', { name: 'Metric aquarist', email: `metric-${tag}@example.test`, role: 'aquarist', units: 'metric' })
    const defaulted = await admin.post('/api/invitations', { name: 'Default aquarist', email: `default-${tag}@example.test`, role: 'aquarist' })
    expect([chosen.status, defaulted.status]).toEqual([201, 201])
    const people = (await admin.get<{ items: { email: string, units: string }[] }>(`/api/people?q=${tag}`)).body.items
    expect(people.find(p => p.email === `metric-${tag}@example.test`)?.units).toBe('metric')
    expect(people.find(p => p.email === `default-${tag}@example.test`)?.units).toBe('us')
    const bad = await admin.post('/api/invitations', { name: 'Odd units', email: `odd-${tag}@example.test`, role: 'aquarist', units: 'imperial' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([{ field: 'units', message: 'Choose US or metric units.' }])
  })
})
