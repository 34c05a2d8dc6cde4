import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { localClock } from '../../server/db/reminders'
import { formatMoment } from '../../shared/readings/reader-words'
import { seedScratchCompany } from '../support/company'
import { signedIn } from '../support/http'

const reading = (at: Date, ammonia: number) => ({
  takenAt: at.toISOString(), ammonia, nitrite: 0, nitrate: 5, basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, temperatureUnit: 'C', salinityMode: 'practical',
})

async function companyWithHistory(label: string) {
  const co = await seedScratchCompany(label)
  const admin = await signedIn(co.emails.admin)
  const make = async (name: string, supervisorId: string | null) => {
    const tank = await admin.post('/api/tanks', { name, clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 }, aquaristId: co.ids.aquarist, supervisorId })
    expect(tank.status).toBe(201)
    return tank.body.id as string
  }
  const supervised = await make('Supervised reef', co.ids.supervisor)
  const unsupervised = await make('Other reef', null)
  const aquarist = await signedIn(co.emails.aquarist)
  const entered = await aquarist.post(`/api/tanks/${supervised}/readings`, reading(new Date(Date.now() - 3_600_000), 0.5))
  expect(entered.status, JSON.stringify(entered.body)).toBe(201)
  const edited = await aquarist.patch(`/api/tanks/${supervised}/readings/${entered.body.reading.id}`, { ...reading(new Date(Date.now() - 3_600_000), 0.25), notes: 'Re-read the card' })
  expect(edited.status, JSON.stringify(edited.body)).toBe(200)
  await admin.patch(`/api/tanks/${unsupervised}`, { name: 'Other reef, renamed' })
  return { co, admin, supervised, unsupervised }
}

describe('GET /api/audit', () => {
  it('shows admins who did what on which tank, with the change in plain words, newest first', async () => {
    const { co, admin, supervised } = await companyWithHistory('audit-admin')
    const trail = await admin.get('/api/audit')
    expect(trail.status).toBe(200)
    const actions = trail.body.items.map((r: { action: string }) => r.action)
    expect(actions.slice(0, 4)).toEqual(['tank.update', 'reading.update', 'reading.create', 'tank.create'])
    const edit = trail.body.items.find((r: { action: string }) => r.action === 'reading.update')
    expect(edit).toMatchObject({ actorId: co.ids.aquarist, actorName: `aquarist ${co.emails.aquarist.slice('aquarist-'.length, co.emails.aquarist.indexOf('@'))}`, actionLabel: 'Edited a test', tankId: supervised, tankName: 'Supervised reef' })
    expect(edit.changes).toEqual(expect.arrayContaining([expect.objectContaining({ label: 'notes', before: '—', after: 'Re-read the card' })]))
    const rename = trail.body.items.find((r: { action: string }) => r.action === 'tank.update')
    expect(rename.changes).toEqual([expect.objectContaining({ label: 'name', before: 'Other reef', after: 'Other reef, renamed' })])
  })

  it('filters by tank, person, action group and day, and pages', async () => {
    const { co, admin, supervised } = await companyWithHistory('audit-filter')
    const byTank = await admin.get(`/api/audit?tankId=${supervised}`)
    expect(byTank.body.items.every((r: { tankId: string }) => r.tankId === supervised)).toBe(true)
    expect(byTank.body.total).toBe(3)
    const byPerson = await admin.get(`/api/audit?actorId=${co.ids.aquarist}`)
    expect(byPerson.body.items.map((r: { action: string }) => r.action)).toEqual(['reading.update', 'reading.create'])
    const byAction = await admin.get('/api/audit?action=reading')
    expect(byAction.body.total).toBe(2)
    const exact = await admin.get('/api/audit?action=reading.create')
    expect(exact.body.total).toBe(1)
    const today = new Date().toISOString().slice(0, 10)
    expect((await admin.get(`/api/audit?from=${today}&to=${today}`)).body.total).toBe(5)
    expect((await admin.get('/api/audit?from=2001-01-01&to=2001-01-02')).body.total).toBe(0)
    const paged = await admin.get('/api/audit?pageSize=2&page=2')
    expect(paged.body).toMatchObject({ page: 2, pageSize: 2, total: 5 })
    expect(paged.body.items).toHaveLength(2)
    expect((await admin.get('/api/audit?from=2026-13-01')).status).toBe(400)
    expect((await admin.get('/api/audit?from=2026-02-02&to=2026-02-01')).status).toBe(400)
    expect((await admin.get('/api/audit?action=DROP TABLE')).status).toBe(400)
  })

  it('shows a supervisor only the rows of the tanks they supervise; aquarists and clients 403', async () => {
    const { co, supervised } = await companyWithHistory('audit-supervisor')
    const supervisor = await signedIn(co.emails.supervisor)
    const trail = await supervisor.get('/api/audit')
    expect(trail.status).toBe(200)
    expect(trail.body.total).toBe(3)
    expect(trail.body.items.every((r: { tankId: string }) => r.tankId === supervised)).toBe(true)
    expect((await (await signedIn(co.emails.aquarist)).get('/api/audit')).status).toBe(403)
    expect((await (await signedIn(co.emails.client)).get('/api/audit')).status).toBe(403)
  })

  it('never shows another company\'s rows', async () => {
    const { co } = await companyWithHistory('audit-tenant')
    const other = await seedScratchCompany('audit-tenant-other')
    const otherAdmin = await signedIn(other.emails.admin)
    const trail = await otherAdmin.get('/api/audit')
    expect(JSON.stringify(trail.body)).not.toContain(co.organisationId)
    expect(trail.body.total).toBe(0)
    const wrongTank = await otherAdmin.get(`/api/audit?actorId=${co.ids.aquarist}`)
    expect(wrongTank.body.total).toBe(0)
  })
})

describe('the audit trail on the company\'s clock', () => {
  it('gives the company\'s time zone with the rows, and the CSV writes each moment on that clock beside its exact time', async () => {
    const { admin, supervised } = await companyWithHistory('audit-clock')
    const zone = 'Pacific/Auckland'
    const { body } = await admin.get('/api/settings')
    expect((await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, timeZone: zone }, version: body.version })).status).toBe(200)
    const trail = await admin.get(`/api/audit?tankId=${supervised}`)
    expect(trail.status).toBe(200)
    expect(trail.body.timeZone).toBe(zone)
    const csv = await admin.get(`/api/audit/export.csv?tankId=${supervised}`)
    const [header, ...rows] = Papa.parse<string[]>(String(csv.body).trim()).data
    expect(header![0]).toBe(`When (${zone})`)
    expect(header!.at(-1)).toBe('At (ISO 8601, UTC)')
    expect(rows).toHaveLength(trail.body.items.length)
    for (const [i, row] of rows.entries()) {
      const at = trail.body.items[i].at as string
      expect(row.at(-1)).toBe(at)
      // Twelve or thirteen hours from UTC: the company's clock, not the server's.
      expect(row[0]).toBe(formatMoment(Date.parse(at), zone))
      expect(row[0]).not.toBe(formatMoment(Date.parse(at), 'UTC'))
    }
  })
})

describe('the audit trail\'s days', () => {
  it('are the company\'s days: a row falls on the date the company\'s clock showed', async () => {
    const { admin, unsupervised } = await companyWithHistory('audit-days')
    const [row] = (await admin.get(`/api/audit?tankId=${unsupervised}&pageSize=1`)).body.items
    const at = new Date(row.at)
    // A zone whose date differs from UTC's at that moment, whatever the hour the test runs.
    const zone = at.getUTCHours() >= 10 ? 'Pacific/Kiritimati' : 'Pacific/Pago_Pago'
    const localDay = localClock(at, zone).date
    expect(localDay).not.toBe(row.at.slice(0, 10))
    const { body } = await admin.get('/api/settings')
    expect((await admin.request('PUT', '/api/settings', { name: body.name, settings: { ...body.settings, timeZone: zone }, version: body.version })).status).toBe(200)
    const ids = async (day: string) => (await admin.get(`/api/audit?tankId=${unsupervised}&from=${day}&to=${day}`)).body.items.map((r: { id: number }) => r.id)
    expect(await ids(localDay)).toContain(row.id)
    expect(await ids(row.at.slice(0, 10))).not.toContain(row.id)
  })
})

describe('GET /api/audit/export.csv', () => {
  it('exports the filtered rows as CSV in words, with spreadsheet formulas defused', async () => {
    const { admin, supervised } = await companyWithHistory('audit-csv')
    await admin.patch(`/api/tanks/${supervised}`, { name: '=HYPERLINK("x")' })
    const csv = await admin.get(`/api/audit/export.csv?tankId=${supervised}`)
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/)
    expect(csv.headers.get('content-disposition')).toMatch(/attachment; filename="audit-trail-/)
    const lines = String(csv.body).trim().split('\n')
    expect(lines[0]).toBe('When (UTC),Who,What,Action code,Tank,Changes (before -> after),"At (ISO 8601, UTC)"')
    expect(lines).toHaveLength(5)
    expect(String(csv.body)).toContain('Edited a test')
    // The renamed tank's name opens a cell, so it is defused; inside the changes cell it cannot run.
    expect(String(csv.body)).toContain(',tank.update,"\'=HYPERLINK(""x"")",')
    expect(String(csv.body)).not.toMatch(/,"?=HYPERLINK/)
  })
})
