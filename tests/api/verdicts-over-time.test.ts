/**
 * The verdict as the server keeps it: of two tests taken in the same minute the one
 * entered last is the latest; a temperature danger with animals in opens an alert; and
 * time alone changes a verdict, both when it is read and on the worker's round. Runs on a
 * server of its own, because it moves that server's clock (x-tidewright-test-now and
 * POST /api/dev/worker-tick) and writes dangers into the demo tanks.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEFAULT_THRESHOLDS } from '../../shared/cycle/thresholds'
import type { Verdict } from '../../shared/cycle/types'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

const HOUR = 3_600_000
const NOW_HEADER = 'x-tidewright-test-now'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer({ NUXT_TEST_HOOKS: '1', NUXT_VERDICT_INTERVAL_MS: String(15 * 60_000) })
})
afterAll(async () => {
  await own?.cleanup()
})

const as = (email: string) => new ApiClient(own.server.baseURL).signIn(email)
const minuteAgo = (hours: number) => {
  const t = new Date(Date.now() - hours * HOUR)
  t.setUTCSeconds(0, 0)
  return t.toISOString()
}

interface VerdictView { verdict: Verdict, evaluatedAt: string }

/** A test as the client types it (kit reads as NH3/NO2/NO3), with the usual water values. */
const test = (takenAt: string, values: { ammonia: number, nitrite?: number, temperature?: number }) => ({
  takenAt,
  ammonia: values.ammonia,
  nitrite: values.nitrite ?? 0,
  nitrate: 10,
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  pH: 8.1,
  temperature: values.temperature ?? 25.5,
  temperatureUnit: 'C',
  salinity: 35,
  salinityMode: 'practical',
})

describe('two tests taken in the same minute', () => {
  it('reads the one entered last as the latest, whichever way round', async () => {
    // The study reef has fish in: total ammonia of 1.5 ppm as NH3 is past the action level.
    const tank = own.fixtures.demo.tanks.study
    const client = await as('client3@tidewright.test')
    const verdictNow = async () => (await client.get<VerdictView>(`/api/tanks/${tank}/verdict`)).body.verdict
    const action = (v: Verdict) => v.findings.find(f => f.ruleId === 'ammonia.action-threshold')

    const first = minuteAgo(0.5)
    const clean = await client.post(`/api/tanks/${tank}/readings`, test(first, { ammonia: 0 }))
    const dirty = await client.post(`/api/tanks/${tank}/readings`, test(first, { ammonia: 1.5 }))
    expect([clean.status, dirty.status]).toEqual([201, 201])
    const afterDirty = await verdictNow()
    expect(action(afterDirty)?.severity).toBe('danger')
    expect(action(afterDirty)?.readingIds).toContain(dirty.body.reading.id)

    // The other way round a minute later: the re-test, entered last, reads zero.
    const second = minuteAgo(0.25)
    const danger = await client.post(`/api/tanks/${tank}/readings`, test(second, { ammonia: 1.5 }))
    const retest = await client.post(`/api/tanks/${tank}/readings`, test(second, { ammonia: 0 }))
    expect([danger.status, retest.status]).toEqual([201, 201])
    const afterRetest = await verdictNow()
    expect(action(afterRetest)).toBeUndefined()
  })
})

describe('a temperature danger with animals in', () => {
  it('opens one alert for the tank, named for temperature', async () => {
    const tank = own.fixtures.demo.tanks.study
    const client = await as('client3@tidewright.test')
    const aquarist = await as('aquarist2@tidewright.test')
    const hot = await client.post(`/api/tanks/${tank}/readings`, test(minuteAgo(0.1), { ammonia: 0, temperature: 31.5 }))
    expect(hot.status).toBe(201)
    const verdict = (await client.get<VerdictView>(`/api/tanks/${tank}/verdict`)).body.verdict
    expect(verdict.findings.find(f => f.ruleId === 'temperature.range')?.severity).toBe('danger')
    const alerts = (await aquarist.get<{ items: { tankId: string, kind: string, status: string }[] }>('/api/alerts')).body.items
    const temperature = alerts.filter(a => a.tankId === tank && a.kind === 'temperature.range' && a.status !== 'resolved')
    expect(temperature).toHaveLength(1)
  })
})

describe('time alone', () => {
  it('changes a stored verdict when it is read after the verdict interval', async () => {
    // While a tank cycles a test is expected at least every testIntervalHours (36 h by default,
    // common practice, no published source): "overdue" is strictly more than that since the latest
    // ammonia or nitrite test. The lounge reef cycles fishless in its nitrite stage; the client tests
    // now, so the boundary is measured from a test of known time whatever the hour the suite runs.
    expect(DEFAULT_THRESHOLDS.testIntervalHours).toBe(36)
    const tank = own.fixtures.demo.tanks.lounge
    const client = await as('client@tidewright.test')
    const takenAt = minuteAgo(0.2)
    expect((await client.post(`/api/tanks/${tank}/readings`, test(takenAt, { ammonia: 0, nitrite: 2 }))).status).toBe(201)
    const now = await client.get<VerdictView>(`/api/tanks/${tank}/verdict`)
    expect(now.body.verdict.findings.map(f => f.ruleId)).not.toContain('testing.overdue')
    const latest = queryFile<{ t: string }>(own.dbPath, 'select max(taken_at) as t from readings where tank_id = ?', tank)[0]!.t
    expect(latest).toBe(takenAt)

    // Signed in at the moved clock, as a session is judged by the request's clock too.
    const atHours = (hours: number) => new Date(Date.parse(takenAt) + hours * HOUR).toISOString()
    const then = new ApiClient(own.server.baseURL)
    expect((await then.request('POST', '/api/auth/login', { email: 'client@tidewright.test', password: 'tidewright-demo' }, { [NOW_HEADER]: atHours(35) })).status).toBe(200)
    const readAt = (iso: string) => then.request<VerdictView>('GET', `/api/tanks/${tank}/verdict`, undefined, { [NOW_HEADER]: iso })

    // 35 h after the test: not yet overdue, but the verdict is made again (older than the interval).
    const early = await readAt(atHours(35))
    expect(early.status).toBe(200)
    expect(early.body.evaluatedAt).toBe(atHours(35))
    expect(early.body.verdict.findings.map(f => f.ruleId)).not.toContain('testing.overdue')

    // 37 h after it, with no new test: overdue, from time alone.
    const later = atHours(37)
    const read = await readAt(later)
    expect(read.status).toBe(200)
    expect(read.body.evaluatedAt).toBe(later)
    expect(read.body.verdict.findings.map(f => f.ruleId)).toContain('testing.overdue')

    // Within the interval the stored verdict stands: read again five minutes on, it is the same one.
    const again = await readAt(new Date(Date.parse(later) + 5 * 60_000).toISOString())
    expect(again.body.evaluatedAt).toBe(later)
  })

  it('is made again for every active tank on the worker round, and a danger is not forgotten', async () => {
    const { lobby, lounge, nano, study } = own.fixtures.demo.tanks
    const stored = () => Object.fromEntries(queryFile<{ tank_id: string, evaluated_at: string, verdict: string }>(own.dbPath, 'select tank_id, evaluated_at, verdict from tank_verdicts')
      .map(r => [r.tank_id, { evaluatedAt: r.evaluated_at, verdict: JSON.parse(r.verdict) as Verdict }]))
    const openAlerts = () => queryFile<{ kind: string }>(own.dbPath, 'select kind from alerts where tank_id = ? and status != \'resolved\'', study).map(a => a.kind).sort()
    const before = openAlerts()
    expect(before).toContain('temperature.range')

    // Four days on, nobody has read anything: the worker's round alone re-evaluates.
    const at = new Date(Date.now() + 4 * 24 * HOUR).toISOString()
    const tick = await new ApiClient(own.server.baseURL).post<{ verdicts: number }>('/api/dev/worker-tick', { now: at })
    expect(tick.status).toBe(200)
    expect(tick.body.verdicts).toBeGreaterThanOrEqual(4)
    const after = stored()
    for (const tank of [lobby, lounge, nano, study]) expect(after[tank]?.evaluatedAt).toBe(at)
    // Both cycling tanks now say four days without a test.
    for (const tank of [lounge, study]) expect(after[tank]!.verdict.findings.map(f => f.ruleId)).toContain('testing.overdue')
    // Time does not cool the water: the temperature alert stays open until a test says otherwise.
    expect(openAlerts()).toEqual(before)

    // A second round inside the interval leaves every verdict as it is.
    const again = await new ApiClient(own.server.baseURL).post<{ verdicts: number }>('/api/dev/worker-tick', { now: new Date(Date.parse(at) + 60_000).toISOString() })
    expect(again.body.verdicts).toBe(0)
  })
})
