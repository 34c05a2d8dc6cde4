import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedIn } from '../support/http'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import { nitrogenFraction } from '../../shared/chemistry/nitrogen'
import { blockerRule } from '../../shared/readings/readiness-words'
import type { ChartData, EventList, EventView, ImportPreview, ReadingList, ReadingSaved, VerdictView } from '../../shared/types/readings'
import type { TankView } from '../../shared/types/tanks'

const { demo, other } = inject('fixtures')
const lounge = demo.tanks.lounge
let db: Database.Database
beforeAll(() => { db = new Database(inject('dbPath')) })
/** The demo nano's seeded tests (its simulated history: a morning test and, on proof days, one after the dose). */
const nanoReadings = () => (db.prepare('SELECT count(*) AS n FROM readings WHERE tank_id = ?').get(demo.tanks.nano) as { n: number }).n
afterAll(() => db?.close())

const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000).toISOString()
const reading = (over: Record<string, unknown> = {}) => ({
  takenAt: hoursAgo(1),
  ammonia: 0.25,
  nitrite: 0.5,
  nitrate: 10,
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  pH: 8.1,
  temperature: 77,
  temperatureUnit: 'F',
  salinity: 1.025,
  salinityMode: 'sg',
  sgBasis: '25/25C',
  ...over,
})
const auditCount = (action: string, entityId: string) =>
  (db.prepare('SELECT count(*) AS n FROM audit_log WHERE action = ? AND entity_id = ?').get(action, entityId) as { n: number }).n

describe('POST /api/tanks/:id/readings', () => {
  it('stores canonical values, keeps what was typed and re-evaluates the tank', async () => {
    const api = await signedIn('client@tidewright.test')
    const before = (await api.get<VerdictView>(`/api/tanks/${lounge}/verdict`)).body.evaluatedAt
    const { status, body } = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading())
    expect(status).toBe(201)
    // 0.25 ppm NH3 x 0.8224, 0.5 ppm NO2 x 0.3045, 10 ppm NO3 x 0.2259 (IUPAC 1996 atomic weights, reference.md section 3).
    expect(body.reading.ammoniaN).toBeCloseTo(0.2056, 4)
    expect(body.reading.nitriteN).toBeCloseTo(0.1522, 4)
    expect(body.reading.nitrateN).toBeCloseTo(2.259, 3)
    expect(body.reading.temperatureC).toBeCloseTo(25, 9)
    // SG 1.02637 at 25/25 C is S 35 (computed, reference.md section 5); 1.025 is a little below.
    expect(body.reading.salinity).toBeGreaterThan(32.5)
    expect(body.reading.salinity).toBeLessThan(34)
    expect(body.reading.entered).toMatchObject({ ammonia: { value: 0.25, basis: 'NH3' }, salinity: { value: 1.025, as: 'sg', basis: '25/25C' }, temperature: { value: 77, unit: 'F' } })
    expect(body.flags).toEqual([])
    expect(body.reading.canEdit).toBe(true)
    const after = (await api.get<VerdictView>(`/api/tanks/${lounge}/verdict`)).body.evaluatedAt
    expect(after > before).toBe(true)
    expect(auditCount('reading.create', body.reading.id)).toBe(1)
  })

  it('gives every save its own row id and times, and an audit row of its own time with the row and no before (SQL NULL)', async () => {
    const api = await signedIn('client@tidewright.test')
    const saved: ReadingSaved[] = []
    for (const h of [3, 2]) {
      const started = new Date().toISOString()
      const { status, body } = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading({ takenAt: hoursAgo(h), nitrate: 10 + h }))
      expect(status).toBe(201)
      expect(body.reading.createdAt >= started).toBe(true)
      saved.push(body)
    }
    const [first, second] = saved.map(s => s.reading)
    expect(first!.id).not.toBe(second!.id)
    expect(second!.createdAt >= first!.createdAt).toBe(true)
    const audit = (id: string) => db.prepare('SELECT before, typeof(before) AS beforeType, after, at FROM audit_log WHERE action = ? AND entity_id = ?').get('reading.create', id) as { before: null, beforeType: string, after: string, at: string }
    const rows = [first!, second!].map(r => ({ stored: db.prepare('SELECT id, tank_id, taken_at, nitrate_n, created_at, updated_at FROM readings WHERE id = ?').get(r.id) as Record<string, unknown>, audit: audit(r.id), view: r }))
    for (const { stored, audit: line, view } of rows) {
      expect(stored).toEqual({ id: view.id, tank_id: lounge, taken_at: view.takenAt, nitrate_n: view.nitrateN, created_at: view.createdAt, updated_at: view.createdAt })
      expect(line.beforeType).toBe('null')
      expect(JSON.parse(line.after)).toMatchObject({ id: view.id, tankId: lounge, takenAt: view.takenAt, createdAt: view.createdAt, entered: view.entered })
      // Its own time, not the first save's: written after the row in the same transaction.
      expect(line.at >= view.createdAt).toBe(true)
    }
    for (const r of saved) await api.delete(`/api/tanks/${lounge}/readings/${r.reading.id}`)
  })

  it('accepts an alarming but possible value and flags it', async () => {
    const api = await signedIn('client@tidewright.test')
    const { status, body } = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading({ ammonia: 6, pH: 7.3 }))
    expect(status).toBe(201)
    expect(body.flags.map(f => f.field).sort()).toEqual(['ammonia', 'pH'])
    // The act-now block shows staff each finding's rule: the answer names exactly those rules.
    expect(body.findings.length).toBeGreaterThan(0)
    expect(Object.keys(body.rules).sort()).toEqual([...new Set(body.findings.map(f => f.ruleId))].sort())
    for (const [id, rule] of Object.entries(body.rules)) expect(rule.id === id && rule.description && rule.source, id).toBeTruthy()
    await api.delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)
  })

  it('refuses values outside physical bounds with a message per field, without echoing them', async () => {
    const api = await signedIn('client@tidewright.test')
    const { status, body } = await api.post(`/api/tanks/${lounge}/readings`, reading({ ammonia: -2, pH: 15.5, salinity: 1.2 }))
    expect(status).toBe(400)
    expect(body.data.issues.map((i: { field: string }) => i.field).sort()).toEqual(['ammonia', 'pH', 'salinity'])
    expect(JSON.stringify(body)).not.toContain('15.5')
    const wrongType = await api.post(`/api/tanks/${lounge}/readings`, reading({ nitrite: 'lots' }))
    expect(wrongType.status).toBe(400)
    expect(wrongType.body.data.issues[0].field).toBe('nitrite')
  })

  it('refuses a reading from the future but accepts a back-dated one', async () => {
    const api = await signedIn('client@tidewright.test')
    const future = await api.post(`/api/tanks/${lounge}/readings`, reading({ takenAt: new Date(Date.now() + 3_600_000).toISOString() }))
    expect(future.status).toBe(400)
    expect(future.body.data.issues[0].field).toBe('takenAt')
    const past = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading({ takenAt: hoursAgo(30) }))
    expect(past.status).toBe(201)
    await api.delete(`/api/tanks/${lounge}/readings/${past.body.reading.id}`)
  })

  it('remembers the kit basis on the tank when it changes', async () => {
    const api = await signedIn('client@tidewright.test')
    const basis = { ammonia: 'NH4', nitrite: 'N', nitrate: 'N' }
    const saved = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading({ basis, ammonia: 1 }))
    expect(saved.body.reading.ammoniaN).toBeCloseTo(0.7765, 4)
    expect((await api.get<TankView>(`/api/tanks/${lounge}`)).body.kitBasis).toEqual(basis)
    await api.post(`/api/tanks/${lounge}/readings`, reading())
    expect((await api.get<TankView>(`/api/tanks/${lounge}`)).body.kitBasis).toEqual({ ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' })
  })

  it('is 401 signed out, 403 for a supervisor, 404 for another client\'s or another company\'s tank', async () => {
    expect((await new ApiClient().post(`/api/tanks/${lounge}/readings`, reading())).status).toBe(401)
    expect((await (await signedIn('supervisor@tidewright.test')).post(`/api/tanks/${lounge}/readings`, reading())).status).toBe(403)
    expect((await (await signedIn('client2@tidewright.test')).post(`/api/tanks/${lounge}/readings`, reading())).status).toBe(404)
    const aquarist = await signedIn('aquarist@tidewright.test')
    expect((await aquarist.post(`/api/tanks/${other.tankId}/readings`, reading())).status).toBe(404)
    expect((await aquarist.get(`/api/tanks/${other.tankId}/readings`)).status).toBe(404)
    expect((await aquarist.get(`/api/tanks/${other.tankId}/verdict`)).status).toBe(404)
    expect((await aquarist.get(`/api/tanks/${other.tankId}/chart`)).status).toBe(404)
  })
})

describe('GET /api/tanks/:id/readings', () => {
  it('pages, sorts and filters by time on the server', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const all = await api.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?pageSize=500&sort=takenAt&dir=asc`)
    expect(all.status).toBe(200)
    expect(all.body.total).toBe(nanoReadings())
    expect(all.body.total).toBeGreaterThan(30)
    const times = all.body.items.map(r => r.takenAt)
    expect(times).toEqual([...times].sort())
    const page2 = await api.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?pageSize=10&page=2&sort=takenAt&dir=asc`)
    expect(page2.body.items.map(r => r.id)).toEqual(all.body.items.slice(10, 20).map(r => r.id))
    const from = times[5]!
    const to = times[9]!
    const ranged = await api.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`)
    expect(ranged.body.total).toBe(5)
    const byNitrate = await api.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?sort=nitrateN&dir=desc&pageSize=500`)
    const nitrate = byNitrate.body.items.map(r => r.nitrateN ?? -1)
    expect(nitrate).toEqual([...nitrate].sort((a, b) => b - a))
  })

  it('refuses bad query values with 400', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    for (const query of ['sort=password', 'pageSize=5000', 'from=yesterday', 'page=0']) {
      const response = await api.get(`/api/tanks/${lounge}/readings?${query}`)
      expect(response.status, query).toBe(400)
    }
  })
})

describe('PATCH and DELETE /api/tanks/:id/readings/:readingId', () => {
  it('lets a client fix their own entry of the last 24 h, with the audit log', async () => {
    const api = await signedIn('client@tidewright.test')
    const { body } = await api.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading())
    const patched = await api.patch<ReadingSaved>(`/api/tanks/${lounge}/readings/${body.reading.id}`, { nitrite: 1 })
    expect(patched.status).toBe(200)
    expect(patched.body.reading.nitriteN).toBeCloseTo(0.3045, 4)
    // What was typed for the other values is kept.
    expect(patched.body.reading.ammoniaN).toBeCloseTo(body.reading.ammoniaN!, 9)
    expect(patched.body.reading.salinity).toBeCloseTo(body.reading.salinity!, 9)
    expect(auditCount('reading.update', body.reading.id)).toBe(1)
    const bad = await api.patch(`/api/tanks/${lounge}/readings/${body.reading.id}`, { pH: 99 })
    expect(bad.status).toBe(400)
    expect((await api.delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)).status).toBe(204)
    expect(auditCount('reading.delete', body.reading.id)).toBe(1)
    expect((await api.delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)).status).toBe(404)
  })

  it('leaves older entries and other people\'s entries to staff (403 for the client)', async () => {
    const client = await signedIn('client@tidewright.test')
    const { body } = await client.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading())
    db.prepare('UPDATE readings SET created_at = ? WHERE id = ?').run(hoursAgo(25), body.reading.id)
    expect((await client.patch(`/api/tanks/${lounge}/readings/${body.reading.id}`, { nitrite: 0 })).status).toBe(403)
    expect((await client.delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)).status).toBe(403)
    const aquarist = await signedIn('aquarist@tidewright.test')
    const own = await aquarist.post<ReadingSaved>(`/api/tanks/${lounge}/readings`, reading())
    expect((await client.patch(`/api/tanks/${lounge}/readings/${own.body.reading.id}`, { nitrite: 0 })).status).toBe(403)
    expect((await aquarist.patch(`/api/tanks/${lounge}/readings/${body.reading.id}`, { nitrite: 0 })).status).toBe(200)
    expect((await (await signedIn('supervisor@tidewright.test')).delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)).status).toBe(403)
    expect((await aquarist.delete(`/api/tanks/${lounge}/readings/${body.reading.id}`)).status).toBe(204)
    expect((await aquarist.delete(`/api/tanks/${lounge}/readings/${own.body.reading.id}`)).status).toBe(204)
  })

  it('is 404 for a reading of another tank and another company', async () => {
    const aquarist = await signedIn('aquarist@tidewright.test')
    const nanoReading = (await aquarist.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?pageSize=1`)).body.items[0]!
    expect((await aquarist.patch(`/api/tanks/${lounge}/readings/${nanoReading.id}`, { nitrite: 0 })).status).toBe(404)
    const theirs = await signedIn(OTHER_AQUARIST_EMAIL)
    expect((await theirs.delete(`/api/tanks/${demo.tanks.nano}/readings/${nanoReading.id}`)).status).toBe(404)
    expect((await aquarist.patch(`/api/tanks/${lounge}/readings/not-an-id`, {})).status).toBe(400)
  })
})

describe('events', () => {
  it('stores an ammonia dose as N and a water change in litres, lists, edits and deletes them', async () => {
    const api = await signedIn('client@tidewright.test')
    const dose = await api.post<EventView>(`/api/tanks/${lounge}/events`, { at: hoursAgo(2), kind: 'ammonia-dose', amount: 2, doseBasis: 'NH3' })
    expect(dose.status).toBe(201)
    expect(dose.body.amount).toBeCloseTo(2 * 0.8224, 3)
    const change = await api.post<EventView>(`/api/tanks/${lounge}/events`, { at: hoursAgo(1), kind: 'water-change', amount: 10, volumeUnit: 'usgal' })
    // US gallon = 3.785411784 L exactly (reference.md section 7).
    expect(change.body.amount).toBeCloseTo(37.85411784, 8)
    const list = await api.get<EventList>(`/api/tanks/${lounge}/events?sort=at&dir=desc`)
    // The seeded history logs its own events at a fixed hour of each day, which may fall between these two: only their order is this test's.
    const ours = new Set([change.body.id, dose.body.id])
    expect(list.body.items.map(e => e.id).filter(id => ours.has(id))).toEqual([change.body.id, dose.body.id])
    const edited = await api.patch<EventView>(`/api/tanks/${lounge}/events/${change.body.id}`, { amount: 20, volumeUnit: 'L' })
    expect(edited.body.amount).toBe(20)
    expect(auditCount('event.update', change.body.id)).toBe(1)
    expect((await api.delete(`/api/tanks/${lounge}/events/${change.body.id}`)).status).toBe(204)
    expect((await api.delete(`/api/tanks/${lounge}/events/${dose.body.id}`)).status).toBe(204)
  })

  it('refuses incomplete events and the future, and keeps to roles and scope', async () => {
    const api = await signedIn('client@tidewright.test')
    const noGroup = await api.post(`/api/tanks/${lounge}/events`, { at: hoursAgo(1), kind: 'livestock-added', amount: 2 })
    expect(noGroup.status).toBe(400)
    expect(noGroup.body.data.issues[0].field).toBe('group')
    expect((await api.post(`/api/tanks/${lounge}/events`, { at: hoursAgo(-2), kind: 'note', notes: 'x' })).status).toBe(400)
    expect((await api.post(`/api/tanks/${lounge}/events`, { at: hoursAgo(1), kind: 'flood' })).status).toBe(400)
    const fish = await api.post<EventView>(`/api/tanks/${lounge}/events`, { at: hoursAgo(1), kind: 'livestock-added', amount: 2, group: 'fish' })
    expect(fish.status).toBe(201)
    expect((await (await signedIn('supervisor@tidewright.test')).post(`/api/tanks/${lounge}/events`, { at: hoursAgo(1), kind: 'note', notes: 'x' })).status).toBe(403)
    expect((await (await signedIn('client2@tidewright.test')).get(`/api/tanks/${lounge}/events`)).status).toBe(404)
    const seeded = (await (await signedIn('aquarist@tidewright.test')).get<EventList>(`/api/tanks/${lounge}/events?sort=at&dir=asc`)).body.items[0]!
    expect((await api.delete(`/api/tanks/${lounge}/events/${seeded.id}`)).status).toBe(403)
    expect((await (await signedIn(OTHER_AQUARIST_EMAIL)).delete(`/api/tanks/${lounge}/events/${fish.body.id}`)).status).toBe(404)
    expect((await api.delete(`/api/tanks/${lounge}/events/${fish.body.id}`)).status).toBe(204)
  })
})

describe('GET /api/tanks/:id/verdict and /chart', () => {
  it('returns the stored verdict with rule sources and the readings it rests on', async () => {
    const api = await signedIn('client3@tidewright.test')
    const { status, body } = await api.get<VerdictView>(`/api/tanks/${demo.tanks.study}/verdict`)
    expect(status).toBe(200)
    expect(body.verdict.phase).toBeTruthy()
    expect(body.verdict.findings.length).toBeGreaterThan(0)
    for (const finding of body.verdict.findings) {
      expect(body.rules[finding.ruleId]?.source, finding.ruleId).toBeTruthy()
      for (const id of finding.readingIds) expect(body.readings[id]?.takenAt, id).toBeTruthy()
    }
    const stored = db.prepare('SELECT phase FROM tank_verdicts WHERE tank_id = ?').get(demo.tanks.study) as { phase: string }
    expect(stored.phase).toBe(body.verdict.phase)
  })

  it('names exactly the rules its findings and livestock blockers cite, each with description and source', async () => {
    const { body } = await (await signedIn('client3@tidewright.test')).get<VerdictView>(`/api/tanks/${demo.tanks.study}/verdict`)
    const blockerRules = Object.values(body.verdict.readiness).flatMap(g => g.blockers.map(blockerRule)).filter(id => id !== null)
    expect(blockerRules.length).toBeGreaterThan(0)
    const cited = new Set([...body.verdict.findings.map(f => f.ruleId), ...blockerRules])
    expect(Object.keys(body.rules).sort()).toEqual([...cited].sort())
    for (const [id, rule] of Object.entries(body.rules)) expect(rule.id === id && rule.description && rule.source, id).toBeTruthy()
  })

  it('names the rules of the verdict made after a new test, not those of the verdict read before it', async () => {
    const api = await signedIn('client@tidewright.test')
    const citedBy = (body: VerdictView) => [...new Set([...body.verdict.findings.map(f => f.ruleId),
      ...Object.values(body.verdict.readiness).flatMap(g => g.blockers.map(blockerRule)).filter(id => id !== null)])].sort()
    const ruleSets: string[][] = []
    // Nitrite at the top of common kits brings the advice to lower the doses; a usual test takes it away again.
    for (const nitrite of [6, 0.5]) {
      const before = (await api.get<VerdictView>(`/api/tanks/${lounge}/verdict`)).body
      expect(Object.keys(before.rules).sort()).toEqual(citedBy(before))
      expect((await api.post(`/api/tanks/${lounge}/readings`, reading({ takenAt: new Date().toISOString(), nitrite }))).status).toBe(201)
      const after = (await api.get<VerdictView>(`/api/tanks/${lounge}/verdict`)).body
      expect(after.evaluatedAt > before.evaluatedAt).toBe(true)
      expect(Object.keys(after.rules).sort()).toEqual(citedBy(after))
      ruleSets.push(Object.keys(after.rules).sort())
    }
    // The two verdicts cite different rules, so an answer holding on to the rules read before would show.
    expect(ruleSets[0]).toContain('dosing.lower')
    expect(ruleSets[1]).not.toContain('dosing.lower')
  })

  it('evaluates a tank that has no stored verdict yet', async () => {
    db.prepare('DELETE FROM tank_verdicts WHERE tank_id = ?').run(demo.tanks.nano)
    const { status, body } = await (await signedIn('client2@tidewright.test')).get<VerdictView>(`/api/tanks/${demo.tanks.nano}/verdict`)
    expect(status).toBe(200)
    expect(body.verdict.ruleSetVersion).toBeTruthy()
    expect(db.prepare('SELECT count(*) AS n FROM tank_verdicts WHERE tank_id = ?').get(demo.tanks.nano)).toEqual({ n: 1 })
  })

  it('sends the chart as parallel arrays with events and limits', async () => {
    const { status, body } = await (await signedIn('client2@tidewright.test')).get<ChartData>(`/api/tanks/${demo.tanks.nano}/chart`)
    expect(status).toBe(200)
    expect(body.t).toHaveLength(nanoReadings())
    for (const key of ['ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity'] as const) expect(body[key]).toHaveLength(nanoReadings())
    expect(body.events.map(e => e.kind)).toContain('ammonia-dose')
    expect(body.limits.ammoniaZeroN).toBeGreaterThan(0)
  })
})

const csvOf = (rows: number, startHoursAgo: number) => {
  const lines = ['Date,NH3,NO2,NO3,pH,Temp,Salinity,Notes']
  for (let i = 0; i < rows; i++) {
    const at = new Date(Date.now() - (startHoursAgo - i) * 3_600_000).toISOString()
    lines.push(`${at},${(i % 8) / 4},${(i % 5) / 4},${i % 40},8.${i % 3},25.${i % 10},35.${i % 2},row ${i}`)
  }
  return `${lines.join('\n')}\n`
}

describe('CSV import and export', () => {
  const lobby = demo.tanks.lobby
  const count = () => (db.prepare('SELECT count(*) AS n FROM readings WHERE tank_id = ?').get(lobby) as { n: number }).n

  it('previews without writing, reports row errors, writes on confirm and adds nothing twice', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const csv = `${csvOf(50, 200)}not a date,1,1,1,8,25,35,bad\n${new Date().toISOString()},-1,0,0,8,25,35,negative\n`
    const before = count()
    const options = { basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, temperatureUnit: 'C', salinityMode: 'practical' }
    const dry = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv, ...options, dryRun: true })
    expect(dry.status).toBe(200)
    expect(dry.body).toMatchObject({ rows: 52, valid: 50, errorRows: 2, dryRun: true, inserted: 0 })
    expect(dry.body.mapping).toMatchObject({ takenAt: 'Date', ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3', pH: 'pH', temperature: 'Temp', salinity: 'Salinity', notes: 'Notes' })
    expect(dry.body.errors.map(e => [e.row, e.field])).toEqual([[52, 'takenAt'], [53, 'ammonia']])
    expect(dry.body.preview[1]!.ammoniaN).toBeCloseTo(0.25 * 0.8224, 4)
    expect(count()).toBe(before)
    const verdictBefore = (await api.get<VerdictView>(`/api/tanks/${lobby}/verdict`)).body.evaluatedAt
    // Other files' imports into the lobby reef share this server: count this import's audit line only.
    const importsBefore = auditCount('reading.import', lobby)
    const done = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv, ...options, dryRun: false })
    expect(done.body.inserted).toBe(50)
    // The verdict is refreshed once after the import.
    expect((await api.get<VerdictView>(`/api/tanks/${lobby}/verdict`)).body.evaluatedAt > verdictBefore).toBe(true)
    expect(auditCount('reading.import', lobby)).toBe(importsBefore + 1)
    expect(count()).toBe(before + 50)
    const again = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv, ...options, dryRun: false })
    expect(again.body).toMatchObject({ inserted: 0, duplicates: 50 })
    expect(count()).toBe(before + 50)
  })

  it('reads a file in the tank\'s remembered kit basis unless told otherwise, and says which', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const kit = (await api.get<{ kitBasis: { ammonia: string, nitrite: string, nitrate: string } }>(`/api/tanks/${lobby}`)).body.kitBasis
    const csv = `Date,Ammonia,Nitrite,Nitrate\n${hoursAgo(30)},1,1,10\n`
    const dry = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv, dryRun: true })
    expect(dry.status).toBe(200)
    expect(dry.body.basis).toEqual(kit)
    // The same kit reading typed in the form with the tank's basis is stored the same (IUPAC molar masses).
    expect(dry.body.preview[0]!.ammoniaN).toBeCloseTo(kit.ammonia === 'N' ? 1 : nitrogenFraction(kit.ammonia as 'NH3' | 'NH4'), 6)
    const chosen = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, dryRun: true })
    expect(chosen.body.basis).toEqual({ ammonia: 'N', nitrite: 'N', nitrate: 'N' })
    expect(chosen.body.preview[0]!.ammoniaN).toBeCloseTo(1, 9)
  })

  it('exports CSV that imports back into another tank unchanged', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const exported = await api.get<string>(`/api/tanks/${demo.tanks.nano}/readings/export.csv`)
    expect(exported.status).toBe(200)
    expect(exported.headers.get('content-type')).toContain('text/csv')
    const lines = exported.body.trim().split('\n')
    expect(lines[0]).toBe('taken_at,ammonia_mg_l_n,nitrite_mg_l_n,nitrate_mg_l_n,ph,temperature_c,salinity_practical,alkalinity_dkh,calcium_mg_l,magnesium_mg_l,phosphate_mg_l,notes')
    expect(lines).toHaveLength(nanoReadings() + 1)
    // Values read as numbers, not float noise: at most nine significant digits (the precision the import key compares).
    const numbers = lines.slice(1).flatMap(line => line.split(',').slice(1, 11)).filter(cell => cell !== '')
    expect(numbers.filter(cell => cell.replace(/^-?[0.]*/, '').replace('.', '').length > 9)).toEqual([])
    const dry = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv: exported.body, dryRun: true })
    expect(dry.body).toMatchObject({ rows: nanoReadings(), valid: nanoReadings(), errorRows: 0 })
    const nano = (await api.get<ReadingList>(`/api/tanks/${demo.tanks.nano}/readings?sort=takenAt&dir=asc&pageSize=1`)).body.items[0]!
    expect(dry.body.preview[0]!.nitrateN).toBeCloseTo(nano.nitrateN!, 9)
    expect((await (await signedIn('client@tidewright.test')).get(`/api/tanks/${demo.tanks.nano}/readings/export.csv`)).status).toBe(404)
  })

  it('imports 20,000 rows in one go and refuses an oversize body with 413', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const before = count()
    const big = await api.post<ImportPreview>(`/api/tanks/${lobby}/readings/import`, { csv: csvOf(20_000, 30_000), dryRun: false })
    expect(big.status).toBe(200)
    expect(big.body.inserted).toBe(20_000)
    expect(count()).toBe(before + 20_000)
    const huge = `taken_at,ammonia_mg_l_n\n${'2026-01-01T00:00:00Z,0.1\n'.repeat(1_100_000)}`
    const refused = await api.post(`/api/tanks/${lobby}/readings/import`, { csv: huge, dryRun: true })
    expect(refused.status).toBe(413)
  })

  it('keeps import to its roles and scope', async () => {
    const csv = csvOf(2, 10)
    expect((await (await signedIn('supervisor@tidewright.test')).post(`/api/tanks/${lobby}/readings/import`, { csv })).status).toBe(403)
    expect((await (await signedIn(OTHER_AQUARIST_EMAIL)).post(`/api/tanks/${lobby}/readings/import`, { csv })).status).toBe(404)
    expect((await (await signedIn('client2@tidewright.test')).post(`/api/tanks/${lobby}/readings/import`, { csv })).status).toBe(404)
    const noDate = await (await signedIn('aquarist@tidewright.test')).post(`/api/tanks/${lobby}/readings/import`, { csv: 'a,b\n1,2\n' })
    expect(noDate.status).toBe(400)
    expect(noDate.body.data.issues[0].field).toBe('mapping.takenAt')
  })
})

describe('the signed-off period', () => {
  it('locks readings and events up to the sign-off: edits, deletes and back-dated entries are 409', async () => {
    const api = await signedIn(OTHER_AQUARIST_EMAIL)
    const tank = other.tankId
    const old = await api.post<ReadingSaved>(`/api/tanks/${tank}/readings`, reading({ takenAt: hoursAgo(3) }))
    const oldEvent = await api.post<EventView>(`/api/tanks/${tank}/events`, { at: hoursAgo(3), kind: 'note', notes: 'before sign-off' })
    const signOffId = crypto.randomUUID()
    db.prepare(`INSERT INTO sign_offs (id, organisation_id, tank_id, requested_at, status, decided_at, created_at, updated_at) VALUES (?, ?, ?, ?, 'approved', ?, ?, ?)`)
      .run(signOffId, other.organisationId, tank, hoursAgo(2), hoursAgo(1), hoursAgo(1), hoursAgo(1))
    try {
      expect((await api.patch(`/api/tanks/${tank}/readings/${old.body.reading.id}`, { nitrite: 0 })).status).toBe(409)
      expect((await api.delete(`/api/tanks/${tank}/readings/${old.body.reading.id}`)).status).toBe(409)
      expect((await api.delete(`/api/tanks/${tank}/events/${oldEvent.body.id}`)).status).toBe(409)
      expect((await api.post(`/api/tanks/${tank}/readings`, reading({ takenAt: hoursAgo(2) }))).status).toBe(409)
      const listed = await api.get<ReadingList>(`/api/tanks/${tank}/readings`)
      expect(listed.body.items.find(r => r.id === old.body.reading.id)?.canEdit).toBe(false)
      const fresh = await api.post<ReadingSaved>(`/api/tanks/${tank}/readings`, reading({ takenAt: hoursAgo(0.5) }))
      expect(fresh.status).toBe(201)
      expect((await api.patch(`/api/tanks/${tank}/readings/${fresh.body.reading.id}`, { takenAt: hoursAgo(2) })).status).toBe(409)
      const csv = `taken_at,ammonia_mg_l_n\n${hoursAgo(5)},0.1\n${hoursAgo(0.2)},0.1\n`
      const dry = await api.post<ImportPreview>(`/api/tanks/${tank}/readings/import`, { csv, dryRun: true })
      expect(dry.body).toMatchObject({ valid: 1, errorRows: 1 })
      expect(dry.body.errors[0]).toMatchObject({ row: 2, field: 'takenAt' })
    }
    finally {
      db.prepare('DELETE FROM sign_offs WHERE id = ?').run(signOffId)
    }
  })
})
