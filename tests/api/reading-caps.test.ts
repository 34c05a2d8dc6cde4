/**
 * What one tank may take in: at most TESTS_PER_TANK_PER_DAY current tests per calendar day
 * (UTC) and at most MAX_IMPORT_ROWS rows per CSV import. The same cap holds on every path
 * (the form, an edit that moves a test, a correction, the CSV import, several requests at
 * once); a full day answers 429 with a clear message (and Retry-After when the day is
 * today), a file that is too long 413.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { EVIDENCE_PAGE_SIZE, MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from '../../shared/readings/limits'
import type { Evidence } from '../../shared/types/sign-off'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { READING_BODY } from './access-matrix.data'

let own: OwnServer
let api: ApiClient
beforeAll(async () => {
  own = await startOwnServer()
  api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
})
afterAll(async () => {
  await own?.cleanup()
})

/** A tank of its own, so no seeded reading shares its days. */
async function newTank(name: string): Promise<string> {
  const created = await api.post('/api/tanks', { name, clientId: own.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(created.status).toBe(201)
  return created.body.id
}

/** `count` tests on one day, a second apart from `start`, through the CSV import. */
async function fillDay(tank: string, start: Date, count: number, label: string): Promise<void> {
  const rows = Array.from({ length: count }, (_, i) => `${new Date(start.getTime() + i * 1000).toISOString()},0.25,0.1,${i},${label} ${i}`)
  const imported = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,nitrite,nitrate,notes\n${rows.join('\n')}`, dryRun: false })
  expect(imported.status).toBe(200)
  expect(imported.body.inserted).toBe(count)
}

const onDay = (tank: string, day: string) => queryFile<{ n: number }>(own.dbPath,
  `select count(*) as n from readings r where r.tank_id = ? and substr(r.taken_at, 1, 10) = ? and not exists (select 1 from readings l where l.corrects_id = r.id)`, tank, day)[0]!.n

const PAST_DAY = '2026-03-10'
const pastDayAt = (time: string) => `${PAST_DAY}T${time}Z`

describe('tests per tank per day', () => {
  it('refuses the form\'s next test on a full past day with 429 and a clear message, and no Retry-After', async () => {
    const tank = await newTank('Full past day reef')
    await fillDay(tank, new Date(pastDayAt('06:00:00')), TESTS_PER_TANK_PER_DAY, 'past day')
    const refused = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: pastDayAt('18:00:00') })
    expect(refused.status).toBe(429)
    expect(refused.body.message).toContain(`${TESTS_PER_TANK_PER_DAY} tests for ${PAST_DAY}`)
    expect(refused.headers.get('retry-after')).toBeNull()
    expect(onDay(tank, PAST_DAY)).toBe(TESTS_PER_TANK_PER_DAY)
    // The next day is free.
    const nextDay = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: '2026-03-11T08:00:00Z' })
    expect(nextDay.status).toBe(201)
  })

  it('answers a full today with Retry-After until the next UTC midnight', async () => {
    const tank = await newTank('Full today reef')
    const now = new Date()
    const midnight = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate()))
    // Just after midnight there is no room for 48 past seconds today: use the day before then.
    const start = now.getTime() - midnight.getTime() > 120_000 ? midnight : new Date(midnight.getTime() - 86_400_000)
    await fillDay(tank, start, TESTS_PER_TANK_PER_DAY, 'today')
    const refused = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: new Date(start.getTime() + 60_000).toISOString() })
    expect(refused.status).toBe(429)
    if (start === midnight) {
      const retryAfter = Number(refused.headers.get('retry-after'))
      expect(retryAfter).toBeGreaterThan(0)
      expect(retryAfter).toBeLessThanOrEqual(86_400)
    }
  })

  it('refuses an edit that moves a test into a full day, and keeps the test where it was', async () => {
    const tank = await newTank('Edit into full day reef')
    await fillDay(tank, new Date(pastDayAt('06:00:00')), TESTS_PER_TANK_PER_DAY, 'edit target')
    const other = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: '2026-03-12T09:00:00Z' })
    expect(other.status).toBe(201)
    const moved = await api.patch(`/api/tanks/${tank}/readings/${other.body.reading.id}`, { takenAt: pastDayAt('20:00:00') })
    expect(moved.status).toBe(429)
    expect(onDay(tank, PAST_DAY)).toBe(TESTS_PER_TANK_PER_DAY)
    expect(onDay(tank, '2026-03-12')).toBe(1)
    // An edit that stays on its full day changes the value, not the count.
    const inside = queryFile<{ id: string }>(own.dbPath, `select id from readings where tank_id = ? and substr(taken_at, 1, 10) = ? limit 1`, tank, PAST_DAY)[0]!.id
    const edited = await api.patch(`/api/tanks/${tank}/readings/${inside}`, { takenAt: pastDayAt('23:00:00') })
    expect(edited.status).toBe(200)
  })

  it('lets a correction replace a test on a full day without raising the count', async () => {
    const tank = await newTank('Correction on full day reef')
    await fillDay(tank, new Date(pastDayAt('06:00:00')), TESTS_PER_TANK_PER_DAY, 'corrected')
    const target = queryFile<{ id: string }>(own.dbPath, `select id from readings where tank_id = ? order by taken_at limit 1`, tank)[0]!.id
    const corrected = await api.post(`/api/tanks/${tank}/readings/${target}/corrections`, { temperatureC: 25.5, reason: 'Read the wrong thermometer' })
    expect(corrected.status).toBe(201)
    expect(onDay(tank, PAST_DAY)).toBe(TESTS_PER_TANK_PER_DAY)
  })

  it('imports a CSV up to the cap and reports each row past it, in the preview and on write', async () => {
    const tank = await newTank('Import past full day reef')
    await fillDay(tank, new Date(pastDayAt('06:00:00')), TESTS_PER_TANK_PER_DAY - 2, 'nearly full')
    const rows = Array.from({ length: 5 }, (_, i) => `${pastDayAt(`12:0${i}:00`)},0.5,0.2,${i},over the cap ${i}`)
    const csv = `takenAt,ammonia,nitrite,nitrate,notes\n${rows.join('\n')}`
    const preview = await api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun: true })
    expect(preview.status).toBe(200)
    expect(preview.body.valid).toBe(2)
    expect(preview.body.errorRows).toBe(3)
    expect(preview.body.errors.map((e: { row: number }) => e.row)).toEqual([4, 5, 6])
    expect(preview.body.errors[0].field).toBe('takenAt')
    expect(preview.body.errors[0].message).toContain(PAST_DAY)
    const written = await api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun: false })
    expect(written.status).toBe(200)
    expect(written.body.inserted).toBe(2)
    expect(written.body.errorRows).toBe(3)
    expect(onDay(tank, PAST_DAY)).toBe(TESTS_PER_TANK_PER_DAY)
  })

  it('holds with many requests at once: one room left, one test saved', async () => {
    const tank = await newTank('Race for the last test reef')
    await fillDay(tank, new Date(pastDayAt('06:00:00')), TESTS_PER_TANK_PER_DAY - 1, 'race')
    const clients = await Promise.all(Array.from({ length: 3 }, () => new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')))
    const answers = await Promise.all([
      ...clients.flatMap((c, i) => [0, 1].map(j => c.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: pastDayAt(`2${i}:0${j}:00`) }))),
      api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,notes\n${pastDayAt('22:30:00')},0.25,race import`, dryRun: false }),
    ])
    const formStatuses = answers.slice(0, 6).map(a => a.status).sort()
    const imported = answers[6]!.body.inserted as number
    expect(formStatuses.filter(s => s === 201).length + imported).toBe(1)
    expect(formStatuses.filter(s => s !== 201).every(s => s === 429)).toBe(true)
    expect(onDay(tank, PAST_DAY)).toBe(TESTS_PER_TANK_PER_DAY)
  })
})

describe('rows per import', () => {
  it(`answers 413 to a file of more than ${MAX_IMPORT_ROWS.toLocaleString('en')} rows, before writing anything`, async () => {
    const tank = await newTank('Too long a file reef')
    const start = Date.parse('2015-01-01T00:00:00Z')
    const rows = Array.from({ length: MAX_IMPORT_ROWS + 1 }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},0.25`)
    const csv = `takenAt,ammonia\n${rows.join('\n')}`
    for (const dryRun of [true, false]) {
      const refused = await api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun })
      expect(refused.status).toBe(413)
      expect(refused.body.message).toContain('Split it into smaller files')
    }
    expect(queryFile<{ n: number }>(own.dbPath, 'select count(*) as n from readings where tank_id = ?', tank)[0]!.n).toBe(0)
  })
})

describe('the evidence answer', () => {
  it('carries a page of readings, newest first by page and oldest first within it, with the total', async () => {
    const tank = await newTank('Long history evidence reef')
    const total = EVIDENCE_PAGE_SIZE + 150
    const start = Date.parse('2025-01-01T00:00:00Z')
    const rows = Array.from({ length: total }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},0.25,0.1,${i % 40}`)
    const imported = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,nitrite,nitrate\n${rows.join('\n')}`, dryRun: false })
    expect(imported.body.inserted).toBe(total)
    const first = await api.get<Evidence>(`/api/tanks/${tank}/evidence`)
    expect(first.status).toBe(200)
    expect(first.body.readingsTotal).toBe(total)
    expect(first.body.readings).toHaveLength(EVIDENCE_PAGE_SIZE)
    expect(first.body.readings.at(-1)!.takenAt).toBe(new Date(start + (total - 1) * 3_600_000).toISOString())
    expect(Date.parse(first.body.readings[0]!.takenAt)).toBeLessThan(Date.parse(first.body.readings[1]!.takenAt))
    const second = await api.get<Evidence>(`/api/tanks/${tank}/evidence?page=2`)
    expect(second.body.readings).toHaveLength(150)
    expect(second.body.readings[0]!.takenAt).toBe(new Date(start).toISOString())
    expect((await api.get(`/api/tanks/${tank}/evidence?page=0`)).status).toBe(400)
  })
})
