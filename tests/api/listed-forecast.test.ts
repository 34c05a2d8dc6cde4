/**
 * The forecast the tank list shows is the tank's own forecast: the list reads the one kept
 * with the stored verdict, so every path that changes the tank's tests (a new test, a
 * correction, a deletion) and time alone must make it again. Runs on a server of its own,
 * because it moves that server's clock (x-tidewright-test-now).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { CycleForecast } from '../../shared/cycle/forecast'
import type { TankForecastView } from '../../shared/types/forecast'
import type { TankList } from '../../shared/types/tanks'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { NITRITE_FALLING, seedCyclingTank } from '../support/forecast-tanks'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

const MINUTE = 60_000
const DAY = 86_400_000
const NOW_HEADER = 'x-tidewright-test-now'
const TANK_NAME = 'Listed forecast reef'

let own: OwnServer
let company: ScratchCompany
let tankId: string
beforeAll(async () => {
  // Sessions outlive the days the clock is moved on (the default idle lifetime is three days).
  own = await startOwnServer({ NUXT_TEST_HOOKS: '1', NUXT_VERDICT_INTERVAL_MS: String(15 * MINUTE), NUXT_SESSION_LIFETIME_IDLE_MINUTES: String(6 * 24 * 60) })
  company = await seedScratchCompany('listed-forecast', 'metric', own.dbPath)
  tankId = seedCyclingTank(company, TANK_NAME, NITRITE_FALLING, new Date(), own.dbPath)
})
afterAll(async () => {
  await own?.cleanup()
})

const minutesAgo = (minutes: number) => {
  const t = new Date(Date.now() - minutes * MINUTE)
  t.setUTCSeconds(0, 0)
  return t.toISOString()
}

/** A test as the client types it (kit reads as NH3/NO2/NO3). */
const test = (takenAt: string, nitrite: number) => ({
  takenAt, ammonia: 0, nitrite, nitrate: 10, basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  pH: 8.1, temperature: 25.5, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
})

/** The tank's own forecast and the list's, both asked at `at` (the server's clock when not given). */
async function bothForecasts(api: ApiClient, at?: Date): Promise<{ own: CycleForecast, listed: CycleForecast | null | undefined }> {
  const headers: Record<string, string> = at ? { [NOW_HEADER]: at.toISOString() } : {}
  const list = await api.request<TankList>('GET', `/api/tanks?q=${encodeURIComponent(TANK_NAME)}`, undefined, headers)
  const single = await api.request<TankForecastView>('GET', `/api/tanks/${tankId}/forecast`, undefined, headers)
  expect([list.status, single.status]).toEqual([200, 200])
  return { own: single.body.forecast, listed: list.body.items.find(t => t.id === tankId)?.forecast }
}

describe('GET /api/tanks forecast beside the tank\'s own', () => {
  it('stays the same after a new test, a correction, a deletion and time passing', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn(company.emails.aquarist)
    const seen: CycleForecast[] = []
    const expectSame = async (step: string, at?: Date) => {
      const { own: forecast, listed } = await bothForecasts(api, at)
      expect(listed, step).toEqual(forecast)
      seen.push(forecast)
    }

    await expectSame('as seeded')
    expect(seen[0]!.status).toBe('forecast')

    const added = await api.post<{ reading: { id: string } }>(`/api/tanks/${tankId}/readings`, test(minutesAgo(20), 0.1))
    expect(added.status).toBe(201)
    await expectSame('after a new test')

    const corrected = await api.post(`/api/tanks/${tankId}/readings/${added.body.reading.id}/corrections`, { nitriteN: 0.4, reason: 'Read the wrong card' })
    expect(corrected.status).toBe(201)
    await expectSame('after a correction')

    const extra = await api.post<{ reading: { id: string } }>(`/api/tanks/${tankId}/readings`, test(minutesAgo(10), 0.2))
    expect(extra.status).toBe(201)
    await expectSame('after a second new test')
    expect((await api.delete(`/api/tanks/${tankId}/readings/${extra.body.reading.id}`)).status).toBe(204)
    await expectSame('after deleting it')

    // Each step changed the forecast itself, so a list that kept an old one would have failed above.
    expect(seen[1]).not.toEqual(seen[0])
    expect(seen[2]).not.toEqual(seen[1])
    expect(seen[3]).not.toEqual(seen[2])
    expect(seen[4]).toEqual(seen[2])

    // Four days with no test (more than twice the 36-hour test interval): the curve is unknown again, on the list as on the tank.
    await expectSame('four days later', new Date(Date.now() + 4 * DAY))
    expect(seen[5]).toMatchObject({ status: 'not-enough-data', gap: 'stale' })
  })
})
