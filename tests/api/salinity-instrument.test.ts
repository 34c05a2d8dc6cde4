/**
 * Each person's salinity instrument is remembered per tank on the server, so the daily form
 * opens in their mode and scale on any device: one tank may take a hydrometer, another a
 * refractometer or a conductivity probe, and the aquarist's instrument is not the client's.
 */
import { describe, expect, it } from 'vitest'
import { auditRows, seedScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'

type Remembered = { instrument: { mode: string, sgBasis: string } | null }

async function companyWithTwoTanks(label: string) {
  const company = await seedScratchCompany(label, 'us')
  const aquarist = await new ApiClient().signIn(company.emails.aquarist)
  const tank = async (name: string) => {
    const made = await aquarist.post<{ id: string }>('/api/tanks', { name, clientId: company.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
    expect(made.status).toBe(201)
    return made.body.id
  }
  return { company, aquarist, hydrometerTank: await tank('Hydrometer reef'), probeTank: await tank('Probe reef') }
}

describe('PUT and GET /api/tanks/:id/salinity-instrument', () => {
  it('keeps each tank\'s instrument for the person, apart from other tanks and other people, audited once per change', async () => {
    const { company, aquarist, hydrometerTank, probeTank } = await companyWithTwoTanks('instrument-kept')
    const client = await new ApiClient().signIn(company.emails.client)
    expect((await client.get<Remembered>(`/api/tanks/${hydrometerTank}/salinity-instrument`)).body).toEqual({ instrument: null })

    const saved = await client.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '77/60F' })
    expect(saved.status).toBe(200)
    expect(saved.body).toEqual({ instrument: { mode: 'sg', sgBasis: '77/60F' } })
    expect((await client.request('PUT', `/api/tanks/${probeTank}/salinity-instrument`, { mode: 'conductivity', sgBasis: '25/25C' })).status).toBe(200)

    // A second device is a second sign-in: it reads the same answer from the server.
    const laptop = await new ApiClient().signIn(company.emails.client)
    expect((await laptop.get<Remembered>(`/api/tanks/${hydrometerTank}/salinity-instrument`)).body).toEqual({ instrument: { mode: 'sg', sgBasis: '77/60F' } })
    expect((await laptop.get<Remembered>(`/api/tanks/${probeTank}/salinity-instrument`)).body).toEqual({ instrument: { mode: 'conductivity', sgBasis: '25/25C' } })
    // The aquarist's own instrument is theirs: nothing remembered for them yet.
    expect((await aquarist.get<Remembered>(`/api/tanks/${hydrometerTank}/salinity-instrument`)).body).toEqual({ instrument: null })

    const changes = (tankId: string) => auditRows(tankId).filter(r => r.action === 'preferences.salinity-instrument')
    expect(changes(hydrometerTank)).toEqual([{ action: 'preferences.salinity-instrument', actorId: company.ids.client, before: null, after: { mode: 'sg', sgBasis: '77/60F' } }])
    expect(changes(probeTank)).toEqual([{ action: 'preferences.salinity-instrument', actorId: company.ids.client, before: null, after: { mode: 'conductivity', sgBasis: '25/25C' } }])
    // The same choice again writes no second row; a change is recorded with what it replaced.
    expect((await laptop.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '77/60F' })).status).toBe(200)
    expect((await laptop.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '60/60F' })).status).toBe(200)
    const after = changes(hydrometerTank)
    expect(after).toHaveLength(2)
    expect(after[1]).toEqual({ action: 'preferences.salinity-instrument', actorId: company.ids.client, before: { mode: 'sg', sgBasis: '77/60F' }, after: { mode: 'sg', sgBasis: '60/60F' } })
  })

  it('refuses an unknown mode or scale beside its field, and people who do not test the tank', async () => {
    const { company, hydrometerTank } = await companyWithTwoTanks('instrument-refused')
    const client = await new ApiClient().signIn(company.emails.client)
    const bad = await client.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'density', sgBasis: '70/70F' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([
      { field: 'mode', message: 'Choose how salinity is measured.' },
      { field: 'sgBasis', message: 'Choose the scale printed on the instrument.' },
    ])
    expect((await client.get<Remembered>(`/api/tanks/${hydrometerTank}/salinity-instrument`)).body).toEqual({ instrument: null })
    expect((await new ApiClient().request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '25/25C' })).status).toBe(401)
    const supervisor = await new ApiClient().signIn(company.emails.supervisor)
    expect((await supervisor.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '25/25C' })).status).toBe(403)
    const otherClient = await new ApiClient().signIn(company.emails.otherClient)
    expect((await otherClient.request('PUT', `/api/tanks/${hydrometerTank}/salinity-instrument`, { mode: 'sg', sgBasis: '25/25C' })).status).toBe(404)
    expect((await otherClient.request('GET', `/api/tanks/${hydrometerTank}/salinity-instrument`)).status).toBe(404)
  })
})
