import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../server/db/connection'
import { evaluateCycle } from '../../../shared/cycle'
import { events, planStages, readings, signOffs, tanks } from '../../../server/db/schema'
import { cycleInputFor } from '../../../server/db/verdicts'
import { seedDemo } from '../../../server/db/seed/demo'
import { checkedStageData, checkedTank } from '../../../server/db/seed/checked'
import { demoHistory, loungePlan, simulate, studyPlan } from '../../../server/db/seed/histories'
import { toCanonicalEvent, MAX_DOSE_N } from '../../../shared/readings/events'
import { entryFromStored, toCanonicalReading } from '../../../shared/readings/entry'
import { ENTRY_NOTES_MAX } from '../../../shared/readings/fields'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-demo-seed-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('the demo company', () => {
  // Early morning is before the usual test hours of every demo client (08:00 and 19:00 UTC),
  // so a history laid out by calendar day would put today's tests in the future.
  it.each(['05:10', '08:05', '19:20'])('seeded at %s UTC shows no test from the future', async (clock) => {
    const db = openDatabase(join(dir, `demo-${clock.replace(':', '')}.sqlite`))
    migrateDatabase(db)
    const now = new Date(`2026-12-02T${clock}:00.000Z`)
    await seedDemo(db, now)
    const taken = db.select({ takenAt: readings.takenAt }).from(readings).all().map(r => r.takenAt)
    expect(taken.length).toBeGreaterThan(40)
    expect(taken.filter(t => t > now.toISOString())).toEqual([])
    db.$client.close()
  })

  // Every moment the demo shows (tests, events, finished stages and their ticks, stage values,
  // the sign-off request) lies in the past of the moment it was seeded.
  it.each(['05:10', '08:05', '19:20'])('seeded at %s UTC dates nothing after now', async (clock) => {
    const db = openDatabase(join(dir, `demo-dates-${clock.replace(':', '')}.sqlite`))
    migrateDatabase(db)
    const now = new Date(`2026-12-02T${clock}:00.000Z`).toISOString()
    await seedDemo(db, new Date(now))
    const moments: [string, string][] = [
      ...db.select().from(events).all().map(e => [`${e.kind} event`, e.at] as [string, string]),
      ...db.select().from(signOffs).all().map(s => ['sign-off request', s.requestedAt] as [string, string]),
      ...db.select().from(tanks).all().flatMap(t => (t.cycleStartedAt ? [[`${t.name} cycle start`, t.cycleStartedAt] as [string, string]] : [])),
      ...db.select().from(planStages).all().flatMap(s => [
        ...(s.completedAt ? [[`${s.key} completed`, s.completedAt] as [string, string]] : []),
        ...s.checklist.flatMap(item => (item.doneAt ? [[`${s.key} checklist`, item.doneAt] as [string, string]] : [])),
        ...Object.entries(s.data).filter(([, v]) => typeof v === 'string' && /^\d{4}-\d\d-\d\dT/.test(v)).map(([k, v]) => [`${s.key} ${k}`, v as string] as [string, string]),
      ]),
    ]
    expect(moments.length).toBeGreaterThan(40)
    expect(moments.filter(([, at]) => at > now)).toEqual([])
    db.$client.close()
  })
})

describe('the demo tanks tell a true story', async () => {
  const now = new Date('2026-12-02T08:05:00.000Z')
  const db = openDatabase(join(dir, 'demo-story.sqlite'))
  migrateDatabase(db)
  await seedDemo(db, now)
  const allTanks = db.select().from(tanks).all()
  const stagesOf = (tankId: string) => db.select().from(planStages).all().filter(s => s.tankId === tankId).sort((a, b) => a.position - b.position)
  afterAll(() => db.$client.close())

  it.each(allTanks.map(t => [t.name, t] as const))('%s: finished stages are dated in plan order, ticks no later than their stage', (_name, tank) => {
    const done = stagesOf(tank.id).filter(s => s.status === 'done')
    const dates = done.map(s => s.completedAt!)
    expect(dates).toEqual([...dates].sort())
    for (const stage of done) {
      for (const item of stage.checklist) expect(item.doneAt! <= stage.completedAt!, `${stage.key}: ${item.label}`).toBe(true)
    }
  })

  it.each(allTanks.filter(t => t.cycleStartedAt).map(t => [t.name, t] as const))('%s: the stages before cycling finish before the cycle starts; the cycling stage only after it is judged complete', (_name, tank) => {
    const stages = stagesOf(tank.id)
    const cycling = stages.findIndex(s => s.key === 'cycling')
    for (const stage of stages.slice(0, cycling)) {
      expect(stage.status, stage.key).toBe('done')
      expect(stage.completedAt! <= tank.cycleStartedAt!, `${stage.key} completed ${stage.completedAt}, cycle started ${tank.cycleStartedAt}`).toBe(true)
    }
    const verdict = evaluateCycle(cycleInputFor(db, tank.id, now)!)
    const stage = stages[cycling]!
    if (stage.status === 'done') {
      expect(verdict.completedOn).not.toBeNull()
      expect(stage.completedAt! >= verdict.completedOn!, `cycling completed ${stage.completedAt}, engine judged complete ${verdict.completedOn}`).toBe(true)
      expect(stage.completedAt! > tank.cycleStartedAt!).toBe(true)
    }
    else expect(verdict.phase).not.toBe('complete')
  })

  it.each(allTanks.map(t => [t.name, t] as const))('%s: its status is the one the engine\'s verdict gives', (_name, tank) => {
    const verdict = evaluateCycle(cycleInputFor(db, tank.id, now)!)
    const tested = db.select().from(readings).all().some(r => r.tankId === tank.id)
    if (tank.status === 'planned') expect({ tested, cycleStartedAt: tank.cycleStartedAt }).toEqual({ tested: false, cycleStartedAt: null })
    else if (tank.status === 'cycled') expect(verdict.phase).toBe('complete')
    else expect({ status: tank.status, phase: verdict.phase === 'complete' ? 'complete' : 'not yet' }).toEqual({ status: 'cycling', phase: 'not yet' })
  })
})

describe('the demo seed keeps the rules the forms keep', () => {
  const now = new Date('2026-12-02T12:00:00.000Z')

  it('refuses a simulated test the test form would refuse, naming the field', () => {
    const sim = simulate(loungePlan(now))
    const impossible = { ...sim, tests: sim.tests.map((t, i) => (i === 2 ? { ...t, pH: 15 } : t)) }
    expect(() => demoHistory(impossible, now)).toThrow(/pH must be between 0 and 14/)
  })

  it('refuses a simulated event the event form would refuse, naming the field', () => {
    const sim = simulate(studyPlan(now))
    const impossible = { ...sim, events: [...sim.events, { day: 1, at: sim.events[0]!.at, kind: 'ammonia-dose' as const, amount: MAX_DOSE_N * 2 }] }
    expect(() => demoHistory(impossible, now)).toThrow(/amount: That dose is far above any cycling dose/)
  })

  it('refuses a demo tank, client or site the forms would refuse', () => {
    expect(() => checkedTank({ name: 'x'.repeat(121), clientId: crypto.randomUUID(), shape: 'cube', dimensions: { sideMm: 450 } })).toThrow(/name: That name is too long/)
    expect(() => checkedTank({ name: 'Bow', clientId: crypto.randomUUID(), shape: 'bow-front', dimensions: { lengthMm: 1000, widthMm: 400, heightMm: 500 } })).toThrow(/bowDepthMm/)
  })

  it('refuses demo stage values the stage form or its commissioning gate would refuse', () => {
    const tank = { shape: 'cube', dimensions: { sideMm: 450 }, material: 'glass' as const, sumpLitres: 0 }
    const at = new Date('2026-11-20T09:00:00.000Z')
    const hoursBefore = (h: number) => new Date(at.getTime() - h * 3_600_000).toISOString()
    expect(() => checkedStageData('leak-test', { startedAt: hoursBefore(5), endedAt: hoursBefore(3), result: 'pass' }, { closing: true, now, tank, stages: [] })).toThrow(/data.endedAt: A leak test stands at least 24 h/)
    expect(() => checkedStageData('substrate', { depthMm: 900 }, { closing: true, now, tank, stages: [] })).toThrow(/depthMm: Sand depth is at most 300/)
    expect(() => checkedStageData('site-survey', { roomUse: 'office', shellThicknessMm: 10, colour: 'blue' }, { closing: true, now, tank, stages: [] })).toThrow(/Unknown site-survey value/)
    // Who recorded the structural check is stamped by the server, not typed: it passes.
    expect(checkedStageData('site-survey', { roomUse: 'office', structuralCheckDone: true, structuralCheckBy: 'A. Engineer', structuralCheckRecordedBy: 'Teodor', structuralCheckRecordedAt: hoursBefore(48) }, { closing: true, now, tank, stages: [] }))
      .toMatchObject({ structuralCheckRecordedBy: 'Teodor' })
  })

  it('stores what the forms would store: every seeded test and event reads back through the same rules unchanged', async () => {
    const db = openDatabase(join(dir, 'demo-rules.sqlite'))
    migrateDatabase(db)
    await seedDemo(db, now)
    const stored = db.select().from(readings).all()
    for (const row of stored) {
      const again = toCanonicalReading(entryFromStored(row, { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, 'C'), now)
      expect(again.ok, `reading at ${row.takenAt}`).toBe(true)
      if (!again.ok) continue
      expect(again.reading.values.ammoniaN).toBeCloseTo(row.ammoniaN!, 9)
      expect(again.reading.values.salinity).toBeCloseTo(row.salinity!, 9)
      expect(again.reading.notes).toBe(row.notes)
    }
    for (const row of db.select().from(events).all()) {
      const again = toCanonicalEvent({ at: row.at, kind: row.kind, amount: row.amount, doseBasis: 'N', volumeUnit: 'L', group: row.group, notes: row.notes }, now)
      expect(again.ok, `${row.kind} at ${row.at}`).toBe(true)
      expect((row.notes ?? '').length).toBeLessThanOrEqual(ENTRY_NOTES_MAX)
    }
    for (const stage of db.select().from(planStages).all()) {
      const tank = db.select().from(tanks).all().find(t => t.id === stage.tankId)!
      const stages = db.select().from(planStages).all().filter(s => s.tankId === stage.tankId)
      expect(() => checkedStageData(stage.key, stage.data, { closing: stage.status === 'done', now, tank, stages }), `${tank.name}: ${stage.key}`).not.toThrow()
    }
    // The server computes a tank's volume from its dimensions; the demo's volumes are that same figure.
    for (const tank of db.select().from(tanks).all()) {
      const { volumeLitres } = checkedTank({ name: tank.name, clientId: tank.clientId, shape: tank.shape, dimensions: tank.dimensions })
      expect(tank.volumeLitres, tank.name).toBe(volumeLitres)
    }
    db.$client.close()
  })
})
