/**
 * A tank whose history is longer than LONG_HISTORY_TESTS (an imported log of years) has its
 * verdict made in the heavy-work pool on every change, not on the request loop every company is
 * served from (reading its tests back and running the engine over them held that loop for half
 * a second after an import). The answers must not change: a test saved on such a tank answers
 * with the verdict that includes it, a correction with the verdict that includes the correction,
 * and the stored verdict is the same one. Its chart carries the latest CHART_MAX_TESTS tests
 * (drawing 100,000 meant reading them all on the loop, seconds, and megabytes to a phone) and says
 * that there are older ones.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LONG_HISTORY_TESTS } from '../../server/domain/tanks/long-history'
import { CHART_MAX_TESTS } from '../../shared/readings/limits'
import type { ChartData, ReadingList } from '../../shared/types/readings'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

let own: OwnServer
let api: ApiClient
beforeAll(async () => {
  own = await startOwnServer()
  api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
})
afterAll(async () => {
  await own?.cleanup()
})

const HALF_HOUR = 1_800_000

/** A tank holding `count` ordinary tests, half an hour apart, ending `hoursAgo` hours ago (through the CSV import). */
async function tankWithHistory(name: string, count: number, hoursAgo = 2): Promise<string> {
  const created = await api.post('/api/tanks', { name, clientId: own.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(created.status).toBe(201)
  const tank = created.body.id as string
  const end = Math.floor((Date.now() - hoursAgo * 3_600_000) / HALF_HOUR) * HALF_HOUR
  const rows = Array.from({ length: count }, (_, i) => `${new Date(end - (count - 1 - i) * HALF_HOUR).toISOString()},0.5,0.2,${2 + (i % 10) / 10},8.1,25,35`)
  const imported = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,nitrite,nitrate,pH,temperature,salinity\n${rows.join('\n')}`, dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' })
  expect(imported.status, JSON.stringify(imported.body).slice(0, 300)).toBe(200)
  expect(imported.body.inserted).toBe(count)
  return tank
}

const ruleIds = (findings: { ruleId: string }[]) => findings.map(f => f.ruleId).sort()

describe('a tank with a long history', { timeout: 120_000 }, () => {
  for (const [label, count] of [['a long history', LONG_HISTORY_TESTS + 1], ['a short history', 20]] as const) {
    it(`answers a save and a correction with the verdict that includes them (${label})`, async () => {
      const tank = await tankWithHistory(`Verdict path reef (${label})`, count)
      // 33 C is outside the company's range (22-29 C): the verdict names it.
      const hot = await api.post(`/api/tanks/${tank}/readings`, { takenAt: new Date(Date.now() - 30 * 60_000).toISOString(), ammonia: 0.5, nitrite: 0.2, nitrate: 3, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1, temperature: 33, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' })
      expect(hot.status, JSON.stringify(hot.body).slice(0, 300)).toBe(201)
      expect(hot.body.phase).not.toBeNull()
      expect(ruleIds(hot.body.findings)).toContain('temperature.range')
      const stored = await api.get(`/api/tanks/${tank}/verdict`)
      expect(stored.status).toBe(200)
      expect(ruleIds(stored.body.verdict.findings)).toContain('temperature.range')

      const corrected = await api.post(`/api/tanks/${tank}/readings/${hot.body.reading.id}/corrections`, { temperatureC: 25, reason: 'Read the thermometer in the sun' })
      expect(corrected.status, JSON.stringify(corrected.body).slice(0, 300)).toBe(201)
      const after = await api.get(`/api/tanks/${tank}/verdict`)
      expect(ruleIds(after.body.verdict.findings)).not.toContain('temperature.range')
      expect(after.body.verdict.phase).toBe(hot.body.phase)

      // The export (written in the pool for a long history) holds every current test, the corrected one as corrected.
      const exported = await fetch(`${own.server.baseURL}/api/tanks/${tank}/readings/export.csv`, { headers: { cookie: api.cookieHeader() } })
      expect(exported.status).toBe(200)
      expect(exported.headers.get('content-type')).toContain('text/csv')
      const lines = (await exported.text()).trimEnd().split('\n')
      expect(lines).toHaveLength(1 + count + 1)
      expect(lines[0]).toMatch(/^taken_at,ammonia_mg_l_n,.*,temperature_c,/)
      const temperature = lines[0]!.split(',').indexOf('temperature_c')
      expect(lines.slice(1).filter(line => line.split(',')[temperature] !== '25')).toEqual([])
    })
  }
})

describe('saves arriving together on a tank with a long history', { timeout: 120_000 }, () => {
  it('answers each with a verdict that includes it, and stores the one that includes them all', async () => {
    // The history ends two days ago, so the day of the saves has room for all of them.
    const tank = await tankWithHistory('Busy long reef', LONG_HISTORY_TESTS + 1, 48)
    // Taken at one time, each too warm (the company's range ends at 29 C): the temperature finding
    // names the latest of them, which for tests taken together is the one entered last. A verdict
    // that includes a save names it or one entered after it; one made before it, one entered before.
    const takenAt = new Date(Date.now() - 60 * 60_000).toISOString()
    const saves = await Promise.all(Array.from({ length: 8 }, (_, i) => api.post(`/api/tanks/${tank}/readings`, {
      takenAt, ammonia: 0.5, nitrite: 0.2, nitrate: 3, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1,
      temperature: 33 + i / 10, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
    })))
    for (const saved of saves) expect(saved.status, JSON.stringify(saved.body).slice(0, 300)).toBe(201)
    // The order the server entered them in: the engine's (taken, then entered, then row order).
    const list = await api.get<ReadingList>(`/api/tanks/${tank}/readings?sort=takenAt&dir=asc&pageSize=500&from=${encodeURIComponent(takenAt)}`)
    expect(list.status).toBe(200)
    const entered = list.body.items.map(r => r.id)
    expect(entered.slice().sort()).toEqual(saves.map(s => s.body.reading.id as string).sort())
    const latestNamed = (findings: { ruleId: string, readingIds: string[] }[]) => entered.indexOf(findings.find(f => f.ruleId === 'temperature.range')?.readingIds.at(-1) ?? '')
    for (const saved of saves) {
      expect(latestNamed(saved.body.findings)).toBeGreaterThanOrEqual(entered.indexOf(saved.body.reading.id))
    }
    const stored = await api.get(`/api/tanks/${tank}/verdict`)
    expect(stored.status).toBe(200)
    expect(latestNamed(stored.body.verdict.findings)).toBe(entered.length - 1)
  })
})

describe('the chart of a tank with more tests than one chart draws', { timeout: 120_000 }, () => {
  it('carries the latest CHART_MAX_TESTS tests and the events among them, and says there are older ones', async () => {
    const count = CHART_MAX_TESTS + 25
    const tank = await tankWithHistory('Long chart reef', count)
    // A dose before the first test the chart shows, and one among them.
    const end = Math.floor((Date.now() - 2 * 3_600_000) / HALF_HOUR) * HALF_HOUR
    const firstShown = end - (CHART_MAX_TESTS - 1) * HALF_HOUR
    for (const at of [firstShown - 10 * HALF_HOUR, firstShown + 10 * HALF_HOUR]) {
      const dose = await api.post(`/api/tanks/${tank}/events`, { at: new Date(at + 60_000).toISOString(), kind: 'ammonia-dose', amount: 2, doseBasis: 'N' })
      expect(dose.status, JSON.stringify(dose.body).slice(0, 300)).toBe(201)
    }
    const chart = await api.get<ChartData>(`/api/tanks/${tank}/chart`)
    expect(chart.status).toBe(200)
    expect(chart.body.t).toHaveLength(CHART_MAX_TESTS)
    expect(chart.body.nitrateN).toHaveLength(CHART_MAX_TESTS)
    expect(chart.body.tests).toEqual({ shown: CHART_MAX_TESTS, older: true })
    expect(chart.body.t[0]).toBe(firstShown / 1000)
    expect(chart.body.t.at(-1)).toBe(end / 1000)
    expect(chart.body.events.map(e => e.t)).toEqual([(firstShown + 10 * HALF_HOUR + 60_000) / 1000])

    // An ordinary tank's chart shows every test.
    const short = await tankWithHistory('Short chart reef', 30)
    const whole = await api.get<ChartData>(`/api/tanks/${short}/chart`)
    expect(whole.body.t).toHaveLength(30)
    expect(whole.body.tests).toEqual({ shown: 30, older: false })
  })
})
