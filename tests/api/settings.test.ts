import { describe, expect, it } from 'vitest'
import { DEFAULT_THRESHOLDS } from '../../shared/cycle/thresholds'
import { auditRows, seedScratchCompany } from '../support/company'
import { signedIn } from '../support/http'

describe('GET and PUT /api/settings', () => {
  it('reads the defaults, saves every field, and bumps the version', async () => {
    const co = await seedScratchCompany('settings-save')
    const admin = await signedIn(co.emails.admin)
    const loaded = await admin.get('/api/settings')
    expect(loaded.status).toBe(200)
    expect(loaded.body).toMatchObject({ version: 0, settings: { timeZone: 'UTC', escalationMinutes: 60, thresholds: {} } })
    const settings = {
      ...loaded.body.settings,
      contact: { email: 'Office@Reefworks.test', phone: '+1 (555) 010-2030', address: '12 Harbour Row' },
      timeZone: 'America/Chicago',
      defaultUnits: 'us',
      escalationMinutes: 30,
      reminders: { enabled: false, graceMinutes: 90, missedDays: 3 },
      signOff: { requesterMayApprove: true },
    }
    const saved = await admin.request('PUT', '/api/settings', { name: 'Reefworks Ltd', settings, version: 0 })
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ name: 'Reefworks Ltd', version: 1, reevaluated: { tanks: 0, phaseChanged: 0 } })
    expect(saved.body.settings.contact.email).toBe('office@reefworks.test')
    const again = await admin.get('/api/settings')
    expect(again.body.settings).toMatchObject({ timeZone: 'America/Chicago', defaultUnits: 'us', escalationMinutes: 30, reminders: { enabled: false, graceMinutes: 90, missedDays: 3 } })
    const [row] = auditRows(co.organisationId).filter(r => r.action === 'organisation.settings')
    expect(row).toMatchObject({ actorId: co.ids.admin, before: { name: expect.any(String), timeZone: 'UTC' }, after: { name: 'Reefworks Ltd', timeZone: 'America/Chicago' } })
  })

  it('refuses a save made from an older version with 409 and a clear message, leaving the other save in place', async () => {
    const co = await seedScratchCompany('settings-conflict')
    const admin = await signedIn(co.emails.admin)
    const { body } = await admin.get('/api/settings')
    const first = await admin.request('PUT', '/api/settings', { name: 'First save', settings: { ...body.settings, escalationMinutes: 20 }, version: body.version })
    expect(first.status).toBe(200)
    const late = await admin.request('PUT', '/api/settings', { name: 'Late save', settings: { ...body.settings, escalationMinutes: 90 }, version: body.version })
    expect(late.status).toBe(409)
    expect(late.body.statusMessage).toMatch(/saved the company settings after you opened them/)
    const now = await admin.get('/api/settings')
    expect(now.body).toMatchObject({ name: 'First save', settings: { escalationMinutes: 20 } })
  })

  it('refuses bad values with a message per field, a threshold outside its range with the range', async () => {
    const co = await seedScratchCompany('settings-bad')
    const admin = await signedIn(co.emails.admin)
    const { body } = await admin.get('/api/settings')
    const bad = await admin.request('PUT', '/api/settings', {
      name: '',
      settings: { ...body.settings, timeZone: 'Atlantis/Lost', escalationMinutes: 0, contact: { ...body.settings.contact, email: 'nope' }, thresholds: { temperatureMaxC: 80, madeUp: 1 } },
      version: body.version,
    })
    expect(bad.status).toBe(400)
    const fields = Object.fromEntries(bad.body.data.issues.map((i: { field: string, message: string }) => [i.field, i.message]))
    expect(Object.keys(fields).sort()).toEqual(['name', 'settings.contact.email', 'settings.escalationMinutes', 'settings.thresholds.madeUp', 'settings.thresholds.temperatureMaxC', 'settings.timeZone'])
    expect(fields['settings.thresholds.temperatureMaxC']).toBe('Give a value from 0 to 40 (°C).')
    expect((await admin.get('/api/settings')).body.version).toBe(0)
  })

  it('re-evaluates the company\'s tanks when a threshold changes, and audits the before and after', async () => {
    const co = await seedScratchCompany('settings-thresholds')
    const admin = await signedIn(co.emails.admin)
    for (const name of ['Threshold reef A', 'Threshold reef B']) {
      const tank = await admin.post('/api/tanks', { name, clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 } })
      expect(tank.status).toBe(201)
    }
    const { body } = await admin.get('/api/settings')
    const saved = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: { ammoniaZeroN: 0.1 } }, version: body.version })
    expect(saved.status).toBe(200)
    expect(saved.body.reevaluated.tanks).toBe(2)
    const [row] = auditRows(co.organisationId).filter(r => r.action === 'organisation.settings')
    expect(row).toMatchObject({ before: { thresholds: { ammoniaZeroN: DEFAULT_THRESHOLDS.ammoniaZeroN } }, after: { thresholds: { ammoniaZeroN: 0.1 } } })
    // Back to the default: stored as no override, audited as the default value.
    const reset = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: {} }, version: saved.body.version })
    expect(reset.status).toBe(200)
    expect(reset.body.settings.thresholds).toEqual({})
    expect(reset.body.reevaluated.tanks).toBe(2)
  })

  it('is for admins: other roles 403, signed out 401, and one company\'s save never touches another', async () => {
    const co = await seedScratchCompany('settings-access')
    const other = await seedScratchCompany('settings-access-other')
    for (const role of ['aquarist', 'supervisor', 'client'] as const) {
      const person = await signedIn(co.emails[role])
      expect((await person.get('/api/settings')).status).toBe(403)
    }
    const admin = await signedIn(co.emails.admin)
    const { body } = await admin.get('/api/settings')
    await admin.request('PUT', '/api/settings', { name: 'Only mine', settings: body.settings, version: body.version })
    const otherAdmin = await signedIn(other.emails.admin)
    expect((await otherAdmin.get('/api/settings')).body.name).not.toBe('Only mine')
  })
})
