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
import { evaluateCycle } from '../../shared/cycle/engine'
import { eq } from 'drizzle-orm'
import { openDatabase } from '../../server/db/connection'
import { signOffInputs } from '../../server/db/schema'
import { LONG_HISTORY_TESTS } from '../../server/domain/tanks/long-history'
import { CHART_MAX_TESTS } from '../../shared/readings/limits'
import type { ChartData, ReadingList } from '../../shared/types/readings'
import type { CycleInput } from '../../shared/cycle/types'
import type { Evidence, SignOffRecordWithSnapshot } from '../../shared/types/sign-off'
import { ApiClient } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'
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

/** The values of an ordinary test (ammonia, nitrite, nitrate, pH, temperature, salinity), by its place in the file. */
const ordinaryTest = (i: number) => `0.5,0.2,${2 + (i % 10) / 10},8.1,25,35`

/** `count` tests, half an hour apart, ending `hoursAgo` hours ago, imported into the tank through the CSV import. */
async function importHistory(tank: string, count: number, hoursAgo: number, values = ordinaryTest): Promise<void> {
  const end = Math.floor((Date.now() - hoursAgo * 3_600_000) / HALF_HOUR) * HALF_HOUR
  const rows = Array.from({ length: count }, (_, i) => `${new Date(end - (count - 1 - i) * HALF_HOUR).toISOString()},${values(i)}`)
  const imported = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,nitrite,nitrate,pH,temperature,salinity\n${rows.join('\n')}`, dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' })
  expect(imported.status, JSON.stringify(imported.body).slice(0, 300)).toBe(200)
  expect(imported.body.inserted).toBe(count)
}

/** A tank holding `count` ordinary tests, half an hour apart, ending `hoursAgo` hours ago (through the CSV import). */
async function tankWithHistory(name: string, count: number, hoursAgo = 2): Promise<string> {
  const created = await api.post('/api/tanks', { name, clientId: own.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } })
  expect(created.status).toBe(201)
  const tank = created.body.id as string
  await importHistory(tank, count, hoursAgo)
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

describe('a sign-off on a tank with a long history', { timeout: 180_000 }, () => {
  /**
   * A copy of the demo nano (its cycle complete, the engine says) with LONG_HISTORY_TESTS + 1 older
   * tests at zero imported before its cycle began: the engine still judges it complete, and its
   * request and decision are evaluated in the heavy-work pool.
   */
  async function longCompleteTank(name: string): Promise<string> {
    const db = openDatabase(own.dbPath)
    try {
      const tank = copyTank(db, own.fixtures.demo.tanks.nano, name, { status: 'cycling' })
      const startedDaysAgo = (Date.now() - Date.parse(db.$client.prepare('select cycle_started_at from tanks where id = ?').pluck().get(tank) as string)) / 86_400_000
      await importHistory(tank, LONG_HISTORY_TESTS + 1, Math.ceil(startedDaysAgo + 2) * 24, () => '0,0,0.5,8.1,25,35')
      return tank
    }
    finally {
      db.$client.close()
    }
  }
  /** The engine input a decision was made from, as stored beside it. */
  function storedInput(signOffId: string): CycleInput {
    const db = openDatabase(own.dbPath)
    try {
      return db.select().from(signOffInputs).where(eq(signOffInputs.signOffId, signOffId)).get()!.input
    }
    finally {
      db.$client.close()
    }
  }
  const asked = (tank: string) => api.post(`/api/tanks/${tank}/sign-off-requests`, { note: 'Imported log and the cycle since.' })

  it('asks and approves end to end; the signed input holds every test and re-runs to its verdict; the answer is small', async () => {
    const tank = await longCompleteTank('Long signed reef')
    const request = await asked(tank)
    expect(request.status, JSON.stringify(request.body).slice(0, 300)).toBe(201)
    expect(request.body.status).toBe('requested')
    const supervisor = await new ApiClient(own.server.baseURL).signIn('supervisor@tidewright.test')
    const { status, body } = await supervisor.post<SignOffRecordWithSnapshot>(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve' })
    expect(status, JSON.stringify(body).slice(0, 300)).toBe(200)
    expect(body).toMatchObject({ status: 'approved', override: false })
    // The answer holds the verdict and the tank as signed, not the input of every test (megabytes).
    expect(body.snapshot).not.toHaveProperty('input')
    expect(JSON.stringify(body).length).toBeLessThan(64 * 1024)
    const snapshot = body.snapshot!
    expect(snapshot.verdict.phase).toBe('complete')
    const input = storedInput(body.id)
    expect(input.now).toBe(body.decidedAt)
    expect(input.readings.length).toBeGreaterThan(LONG_HISTORY_TESTS)
    expect(evaluateCycle(input)).toEqual(snapshot.verdict)
    // The evidence shows the decision without it too.
    const evidence = await supervisor.get<Evidence>(`/api/tanks/${tank}/evidence`)
    expect(evidence.status).toBe(200)
    expect(evidence.body.signOffs[0]).toMatchObject({ id: body.id, status: 'approved', snapshot: { verdict: snapshot.verdict } })
    expect(evidence.body.signOffs[0]!.snapshot).not.toHaveProperty('input')
    expect(evidence.body.lockedUntil).toBe(body.decidedAt)
  })

  it('answers a decision refused in the pool as the loop answers it: status, message, field and data', async () => {
    const tank = await longCompleteTank('Long refused reef')
    const supervisor = await new ApiClient(own.server.baseURL).signIn('supervisor@tidewright.test')
    const none = await supervisor.post(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve' })
    expect(none.status).toBe(409)
    expect(none.body.statusMessage).toBe('No sign-off request is waiting for this tank')
    expect((await asked(tank)).status).toBe(201)
    // Ammonia back at 2 mg/L after the request: approving now goes against the engine and needs a written reason.
    const save = await api.post(`/api/tanks/${tank}/readings`, { takenAt: new Date(Date.now() - 5 * 60_000).toISOString(), ammonia: 2, nitrite: 0, nitrate: 5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' })
    expect(save.status).toBe(201)
    const noReason = await supervisor.post(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve', note: '' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.issues).toEqual([{ field: 'note', message: expect.stringContaining('write why') }])
    expect(noReason.body.data.overrideGrounds.join(' ')).toMatch(/not complete/)
    const asker = await api.post(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve', note: 'Looks fine.' })
    expect(asker.status).toBe(403)
  })

  it('answers a decision with a test saved meanwhile either with a verdict that holds the test, or a 409; never an approval without it', async () => {
    const tank = await longCompleteTank('Long contested reef')
    expect((await asked(tank)).status).toBe(201)
    const supervisor = await new ApiClient(own.server.baseURL).signIn('supervisor@tidewright.test')
    // Sent together: ammonia back at 2 mg/L undoes the cycle; the written reason lets an approval against the engine through.
    const [decision, save] = await Promise.all([
      supervisor.post(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve', note: 'Approved as the evidence stands.' }),
      api.post(`/api/tanks/${tank}/readings`, { takenAt: new Date(Date.now() - 5 * 60_000).toISOString(), ammonia: 2, nitrite: 0, nitrate: 5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' }),
    ])
    expect([200, 409]).toContain(decision.status)
    expect([201, 409]).toContain(save.status)
    if (decision.status === 200 && save.status === 201) {
      // The save came first: the approval holds it, and so is against the engine.
      const snapshot = (decision.body as SignOffRecordWithSnapshot).snapshot!
      const input = storedInput(decision.body.id)
      expect(input.readings.map(r => r.id)).toContain(save.body.reading.id)
      expect(snapshot.verdict.phase).not.toBe('complete')
      expect(decision.body.override).toBe(true)
      expect(evaluateCycle(input)).toEqual(snapshot.verdict)
    }
    else if (decision.status === 200) {
      // The approval came first: the test, dated inside the signed period, is refused.
      expect(save.body.statusMessage).toMatch(/signed off/)
    }
    else {
      expect(decision.body.statusMessage).toBe('The tank\'s tests or settings changed while the sign-off was being checked. Try again.')
      expect(save.status).toBe(201)
    }
  })
})
