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
