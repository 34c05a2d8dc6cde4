import { describe, expect, inject, it } from 'vitest'
import { DEFAULT_THRESHOLDS } from '../../shared/cycle/thresholds'
import { openDatabase } from '../../server/db/connection'
import { REEVALUATION_BATCH } from '../../server/domain/settings/reevaluation'
import { auditRows, seedScratchCompany } from '../support/company'
import { signedIn, type ApiClient } from '../support/http'

/** The stored verdicts of some tanks, straight from the database (reading them through the API would re-evaluate them). */
function storedVerdicts(tankIds: readonly string[]): { tankId: string, phase: string, stale: number }[] {
  const db = openDatabase(inject('dbPath'))
  try {
    return tankIds.map(id => db.$client.prepare('select tank_id as tankId, phase, stale from tank_verdicts where tank_id = ?').get(id) as { tankId: string, phase: string, stale: number })
  }
  finally {
    db.$client.close()
  }
}

/** A fishless tank with one test: total ammonia `ammoniaN` mg/L as N. */
async function tankWithAmmonia(admin: ApiClient, clientId: string, name: string, ammoniaN: number): Promise<string> {
  const tank = await admin.post('/api/tanks', { name, clientId, shape: 'rectangular', dimensions: { lengthMm: 600, widthMm: 400, heightMm: 400 } })
  expect(tank.status).toBe(201)
  const test = await admin.post(`/api/tanks/${tank.body.id}/readings`, {
    takenAt: new Date(Date.now() - 3_600_000).toISOString(), ammonia: ammoniaN, nitrite: 0, nitrate: 0,
    basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical',
  })
  expect(test.status, JSON.stringify(test.body)).toBe(201)
  return tank.body.id as string
}

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
    expect(saved.body).toMatchObject({ name: 'Reefworks Ltd', version: 1, reevaluation: null })
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
    expect(saved.body.reevaluation).toMatchObject({ total: 2 })
    const [row] = auditRows(co.organisationId).filter(r => r.action === 'organisation.settings')
    expect(row).toMatchObject({ before: { thresholds: { ammoniaZeroN: DEFAULT_THRESHOLDS.ammoniaZeroN } }, after: { thresholds: { ammoniaZeroN: 0.1 } } })
    // Back to the default: stored as no override, audited as the default value.
    const reset = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: {} }, version: saved.body.version })
    expect(reset.status).toBe(200)
    expect(reset.body.settings.thresholds).toEqual({})
    expect(reset.body.reevaluation).toMatchObject({ total: 2 })
  })

  it('marks every verdict stale at the save and re-evaluates them in batches, with progress, until each follows the new limit', async () => {
    const co = await seedScratchCompany('settings-batches')
    const admin = await signedIn(co.emails.admin)
    // More tanks than two batches. Ammonia 0.08 mg/L as N is above the default zero (0.05) and
    // at or below the new one (0.1): with no dose logged, those tanks go from the ammonia
    // stage back to not started. Tanks at 0.02 read as zero under both limits.
    const risen: string[] = []
    const quiet: string[] = []
    for (let i = 0; i < REEVALUATION_BATCH * 2 + 3; i++) {
      if (i % 3 === 0) quiet.push(await tankWithAmmonia(admin, co.clientId, `Batch reef ${i}`, 0.02))
      else risen.push(await tankWithAmmonia(admin, co.clientId, `Batch reef ${i}`, 0.08))
    }
    const all = [...risen, ...quiet]
    expect(new Set(storedVerdicts(risen).map(v => v.phase))).toEqual(new Set(['ammonia']))
    expect(new Set(storedVerdicts(quiet).map(v => v.phase))).toEqual(new Set(['not-started']))

    const { body } = await admin.get('/api/settings')
    const saved = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: { ammoniaZeroN: 0.1 } }, version: body.version })
    expect(saved.status).toBe(200)
    expect(saved.body.reevaluation.total).toBe(all.length)
    expect(saved.body.reevaluation.done).toBeLessThanOrEqual(all.length)

    const seen: number[] = []
    await expect.poll(async () => {
      const progress = await admin.get('/api/settings/reevaluation')
      expect(progress.status).toBe(200)
      seen.push(progress.body.done)
      return progress.body
    }, { timeout: 20_000 }).toEqual({ total: all.length, done: all.length, phaseChanged: risen.length })
    // Progress only goes forward.
    expect(seen).toEqual([...seen].sort((a, b) => a - b))
    // Every stored verdict was made again under the new limit by the batches, not by a read.
    const after = storedVerdicts(all)
    expect(after.filter(v => v.stale)).toEqual([])
    expect(new Set(after.map(v => v.phase))).toEqual(new Set(['not-started']))
    const audit = auditRows(co.organisationId).filter(r => r.action === 'organisation.settings')
    expect(audit).toEqual([expect.objectContaining({ after: { thresholds: { ammoniaZeroN: 0.1 } } })])
  })

  it('judges the very next test under thresholds just saved, and under the defaults again once they are reset', async () => {
    const co = await seedScratchCompany('settings-next-save')
    const admin = await signedIn(co.emails.admin)
    // 0.08 mg/L as N: above the default zero (0.05), at or below 0.1, so a first test reads as the
    // ammonia stage under the default and as not started under 0.1.
    const phaseOfNewTank = async (name: string) => {
      const tankId = await tankWithAmmonia(admin, co.clientId, name, 0.08)
      return storedVerdicts([tankId])[0]?.phase
    }
    expect(await phaseOfNewTank('Next save reef A')).toBe('ammonia')
    const { body } = await admin.get('/api/settings')
    const saved = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: { ammoniaZeroN: 0.1 } }, version: body.version })
    expect(saved.status).toBe(200)
    expect(await phaseOfNewTank('Next save reef B')).toBe('not-started')
    const reset = await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, thresholds: {} }, version: saved.body.version })
    expect(reset.status).toBe(200)
    expect(await phaseOfNewTank('Next save reef C')).toBe('ammonia')
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
