import { beforeAll, describe, expect, it } from 'vitest'
import type { TankForecastView } from '../../shared/types/forecast'
import type { TankList } from '../../shared/types/tanks'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { NITRITE_FALLING, seedCyclingTank } from '../support/forecast-tanks'
import { signedIn } from '../support/http'

const DAY = 86_400_000
let company: ScratchCompany
let falling: string
let threeTests: string

beforeAll(async () => {
  company = await seedScratchCompany('forecast')
  falling = seedCyclingTank(company, 'Falling nitrite reef', NITRITE_FALLING)
  threeTests = seedCyclingTank(company, 'Three tests reef', { ammonia: [1.6, 1.2, 0.6], nitrite: [0.3, 0.9, 1.2], nitrate: [0, 0, 0.1] })
})

describe('GET /api/tanks/:id/forecast', () => {
  it('gives a cycling tank with nitrite falling a range for completion and for each group, all ahead of now', async () => {
    const api = await signedIn(company.emails.client)
    const { status, body } = await api.get<TankForecastView>(`/api/tanks/${falling}/forecast`)
    expect(status).toBe(200)
    const { forecast } = body
    expect(forecast.status).toBe('forecast')
    expect(forecast.basis.fits.map(f => f.series)).toEqual(['nitrite'])
    const now = Date.parse(body.computedAt)
    const from = Date.parse(forecast.completion!.from)
    const to = Date.parse(forecast.completion!.to)
    expect(from).toBeGreaterThan(now)
    expect(to).toBeGreaterThanOrEqual(from)
    expect(to - now).toBeLessThan(30 * DAY)
    expect(forecast.groups.fish).toEqual(forecast.completion)
    // Stony corals wait after completion (the engine's own wait, 30 days by default).
    expect(Date.parse(forecast.groups['lps-coral']!.from) - from).toBe(30 * DAY)
  })

  it('says not enough data for a tank with three tests', async () => {
    const api = await signedIn(company.emails.aquarist)
    const { body } = await api.get<TankForecastView>(`/api/tanks/${threeTests}/forecast`)
    expect(body.forecast).toMatchObject({ status: 'not-enough-data', gap: 'sparse', completion: null })
  })

  it('is computed for now: the same falling curve with its last test a week ago is stale', async () => {
    const weekOld = seedCyclingTank(company, 'Quiet week reef', NITRITE_FALLING, new Date(Date.now() - 7 * DAY))
    const api = await signedIn(company.emails.client)
    const { body } = await api.get<TankForecastView>(`/api/tanks/${weekOld}/forecast`)
    expect(body.forecast).toMatchObject({ status: 'not-enough-data', gap: 'stale' })
  })

  it('is 404 for a tank of another client, and 400 for a malformed id', async () => {
    const other = await signedIn(company.emails.otherClient)
    expect((await other.get(`/api/tanks/${falling}/forecast`)).status).toBe(404)
    expect((await other.get('/api/tanks/not-a-uuid/forecast')).status).toBe(400)
  })
})

describe('GET /api/tanks with forecasts', () => {
  it('carries each cycling tank\'s forecast for the tank card', async () => {
    const api = await signedIn(company.emails.client)
    const { body } = await api.get<TankList>('/api/tanks')
    const byId = new Map(body.items.map(t => [t.id, t]))
    expect(byId.get(falling)?.forecast?.status).toBe('forecast')
    expect(byId.get(threeTests)?.forecast?.status).toBe('not-enough-data')
  })
})
