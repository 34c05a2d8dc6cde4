/**
 * A tank whose history is longer than LONG_HISTORY_TESTS (an imported log of years) has its
 * verdict made in the heavy-work pool on every change, not on the request loop every company is
 * served from (reading its tests back and running the engine over them held that loop for half
 * a second after an import). The answers must not change: a test saved on such a tank answers
 * with the verdict that includes it, a correction with the verdict that includes the correction,
 * and the stored verdict is the same one.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LONG_HISTORY_TESTS } from '../../server/domain/tanks/long-history'
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

/** A tank holding `count` ordinary tests, half an hour apart, ending two hours ago (through the CSV import). */
async function tankWithHistory(name: string, count: number): Promise<string> {
  const created = await api.post('/api/tanks', { name, clientId: own.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(created.status).toBe(201)
  const tank = created.body.id as string
  const end = Math.floor((Date.now() - 2 * 3_600_000) / HALF_HOUR) * HALF_HOUR
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
    })
  }
})
