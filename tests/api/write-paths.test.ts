/**
 * One rule, every path: the form and the CSV import refuse the same values. A note longer
 * than the form allows, a day that does not exist (2026-02-30 is not rolled into March),
 * a number written in hex, and a header row that names a column twice. JSON times (create,
 * edit, list and chart ranges, audit days) are read by the same rule as CSV times. A conductivity
 * outside what PSS-78 converts is refused on the salinity field by the form, an edit and each
 * CSV row alike.
 */
import { describe, expect, inject, it } from 'vitest'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { READING_BODY } from './access-matrix.data'

const count = (sql: string, ...params: unknown[]) => queryFile<{ n: number }>(inject('dbPath'), sql, ...params)[0]!.n

describe('readings through the form and through CSV', () => {
  it('refuses a 50,000-character note on both paths', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const note = `long note ${'x'.repeat(50_000)}`
    const form = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: '2026-02-10T09:00:00Z', notes: note })
    expect(form.status).toBe(400)
    expect(form.body.data.issues[0].field).toBe('notes')
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,notes\n2026-02-10T09:00:00Z,0.25,${note}\n2026-02-10T10:00:00Z,0.25,a short note`, dryRun: false })
    expect(csv.status).toBe(200)
    expect(csv.body.errorRows).toBe(1)
    expect(csv.body.errors[0]).toMatchObject({ row: 2, field: 'notes' })
    expect(csv.body.inserted).toBe(1)
    const stored = count(`select count(*) as n from readings where tank_id = ? and length(notes) > 2000`, tank)
    console.log(`[write paths] 50,000-character note through CSV: ${stored} stored`)
    expect(stored).toBe(0)
  })

  it('refuses 2026-02-30 on both paths instead of storing 2 March', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const form = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: '2026-02-30T09:00:00Z' })
    expect(form.status).toBe(400)
    expect(form.body.data.issues[0].field).toBe('takenAt')
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: 'takenAt,ammonia,notes\n2026-02-30 09:00,0.5,impossible day\n2026-02-31,0.5,impossible day', dryRun: false })
    expect(csv.body.errorRows).toBe(2)
    expect(csv.body.errors.every((e: { field: string }) => e.field === 'takenAt')).toBe(true)
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'impossible day'`, tank)).toBe(0)
  })

  it('reads only the documented date forms from CSV, with a message per row that says them', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    // 03/04/2026 is 4 March to a US reader and 3 April to most others: it is refused, not guessed.
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: 'takenAt,ammonia,notes\n03/04/2026 09:00,0.5,ambiguous day\nMarch 5 2026,0.5,ambiguous day\n2026-03-06 09:00,0.5,plain day', dryRun: false })
    expect(csv.status).toBe(200)
    expect(csv.body.errorRows).toBe(2)
    expect(csv.body.errors.map((e: { row: number, field: string }) => [e.row, e.field])).toEqual([[2, 'takenAt'], [3, 'takenAt']])
    expect(csv.body.errors[0].message).toContain('2026-03-14 08:30')
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'ambiguous day'`, tank)).toBe(0)
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'plain day' and taken_at = '2026-03-06T09:00:00.000Z'`, tank)).toBe(1)
  })

  it('reads only plain decimal numbers from CSV: 0x1 is not a number', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: 'takenAt,ammonia,nitrite,notes\n2026-02-11T09:00:00Z,0x1,0.1,hex ammonia\n2026-02-11T10:00:00Z,1e-1,.05,decimal forms', dryRun: true })
    expect(csv.body.errorRows).toBe(1)
    expect(csv.body.errors[0]).toMatchObject({ row: 2, field: 'ammonia' })
    expect(csv.body.valid).toBe(1)
  })

  it('refuses a file whose header row names a column twice', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: 'takenAt,ammonia,Ammonia,notes\n2026-02-12T09:00:00Z,0.25,2.5,which ammonia', dryRun: false })
    expect(csv.status).toBe(400)
    expect(csv.body.data.issues[0].field).toBe('csv')
    expect(csv.body.data.issues[0].message).toContain('column 3')
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'which ammonia'`, tank)).toBe(0)
  })
})

describe('conductivity outside the PSS-78 range on every path', () => {
  // PSS-78 converts practical salinity 2 to 42 (Fofonoff & Millard 1983, UNESCO TP44): 3.797 to
  // 62.358 mS/cm at 25 C. 1 mS/cm (S about 0.5) used to throw inside the conversion: a 500 from
  // the form, a failed file from the import.
  const RANGE_MESSAGE = 'Conductivity at 25 °C must be between 3.8 and 62.3 mS/cm (practical salinity 2 to 42).'
  const conductivity = (salinity: number) => ({ ...READING_BODY(), salinity, salinityMode: 'conductivity' })

  it('answers the form\'s POST with 400 and a message on salinity, below, above and far above the range', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    for (const value of [1, 0, 70, 200]) {
      const refused = await api.post(`/api/tanks/${tank}/readings`, { ...conductivity(value), notes: 'conductivity out of range' })
      expect(refused.status, `${value} mS/cm`).toBe(400)
      expect(refused.body.data.issues, `${value} mS/cm`).toEqual([{ field: 'salinity', message: RANGE_MESSAGE }])
    }
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'conductivity out of range'`, tank)).toBe(0)
    const taken = await api.post(`/api/tanks/${tank}/readings`, conductivity(53))
    expect(taken.status).toBe(201)
    expect(taken.body.reading.salinity).toBeGreaterThan(34)
    expect(taken.body.reading.salinity).toBeLessThan(36)
  })

  it('answers an edit to 1 mS/cm with 400 on salinity and keeps the reading as it was', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const saved = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), notes: 'conductivity edit target' })
    expect(saved.status).toBe(201)
    const refused = await api.patch(`/api/tanks/${tank}/readings/${saved.body.reading.id}`, { salinity: 1, salinityMode: 'conductivity' })
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues).toEqual([{ field: 'salinity', message: RANGE_MESSAGE }])
    expect(count(`select count(*) as n from readings where id = ? and salinity = 35`, saved.body.reading.id)).toBe(1)
  })

  it('refuses each out-of-range row of a CSV import with its message and imports the others', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const rows = ['53', '1', '200', '0', '-3', 'NaN', '52.5'].map((value, i) => `2026-02-13T0${i}:00:00Z,${value},conductivity row ${i + 2}`)
    const csv = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,conductivity,notes\n${rows.join('\n')}`, salinityMode: 'conductivity', dryRun: false })
    expect(csv.status).toBe(200)
    expect(csv.body.inserted).toBe(2)
    expect(csv.body.errorRows).toBe(5)
    expect(csv.body.errors).toEqual([
      { row: 3, field: 'salinity', message: RANGE_MESSAGE },
      { row: 4, field: 'salinity', message: RANGE_MESSAGE },
      { row: 5, field: 'salinity', message: RANGE_MESSAGE },
      { row: 6, field: 'salinity', message: RANGE_MESSAGE },
      { row: 7, field: 'salinity', message: 'Not a number.' },
    ])
    expect(count(`select count(*) as n from readings where tank_id = ? and notes like 'conductivity row %'`, tank)).toBe(2)
    expect(count(`select count(*) as n from readings where tank_id = ? and notes in ('conductivity row 2', 'conductivity row 8') and salinity between 34 and 36`, tank)).toBe(2)
  })
})

describe('times on the JSON path read like CSV times', () => {
  // Date.parse rolls 24:00 into the next day and +002026-02-30 into March, and guesses at
  // 03/04/2026; shared/readings/fields.ts parseIsoTime refuses all three on every path.
  const LOOSE_TIMES = ['2026-03-04T24:00:00Z', '+002026-02-30T10:00:00Z', '03/04/2026 09:00']

  it('refuses them when a reading or an event is created or changed, storing nothing', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const reading = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), notes: 'time target' })
    expect(reading.status).toBe(201)
    const event = await api.post(`/api/tanks/${tank}/events`, { at: '2026-03-04T09:00:00Z', kind: 'note', notes: 'time target event' })
    expect(event.status).toBe(201)
    for (const time of LOOSE_TIMES) {
      const results = {
        readingCreate: await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: time, notes: 'loose time' }),
        readingPatch: await api.patch(`/api/tanks/${tank}/readings/${reading.body.reading.id}`, { takenAt: time }),
        eventCreate: await api.post(`/api/tanks/${tank}/events`, { at: time, kind: 'note', notes: 'loose time' }),
        eventPatch: await api.patch(`/api/tanks/${tank}/events/${event.body.id}`, { at: time }),
      }
      console.log(`[write paths] ${time}: ${Object.entries(results).map(([path, r]) => `${path} ${r.status}`).join(', ')}`)
      for (const [path, response] of Object.entries(results)) {
        expect(response.status, `${path} with ${time}`).toBe(400)
        expect(response.body.data.issues[0].field, `${path} with ${time}`).toMatch(/^(takenAt|at)$/)
      }
    }
    expect(count(`select count(*) as n from readings where tank_id = ? and notes = 'loose time'`, tank)).toBe(0)
    expect(count(`select count(*) as n from events where tank_id = ? and notes = 'loose time'`, tank)).toBe(0)
    expect(count(`select count(*) as n from events where id = ? and at = '2026-03-04T09:00:00.000Z'`, event.body.id)).toBe(1)
  })

  it('refuses days that do not exist in the chart, history and audit filters', async () => {
    const admin = await new ApiClient().signIn('admin@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const results = {
      chart: await admin.get(`/api/tanks/${tank}/chart?from=2026-02-30`),
      readings: await admin.get(`/api/tanks/${tank}/readings?from=2026-03-04T24:00:00Z`),
      events: await admin.get(`/api/tanks/${tank}/events?to=%2B002026-02-30T10:00:00Z`),
      audit: await admin.get(`/api/audit?from=2026-02-30`),
    }
    console.log(`[write paths] impossible days in filters: ${Object.entries(results).map(([path, r]) => `${path} ${r.status}`).join(', ')}`)
    for (const [path, response] of Object.entries(results)) expect(response.status, path).toBe(400)
    expect((await admin.get(`/api/tanks/${tank}/chart?from=2026-02-28&to=2026-03-01T12:00:00Z`)).status).toBe(200)
    expect((await admin.get(`/api/audit?from=2026-02-28&to=2026-03-01`)).status).toBe(200)
  })
})
