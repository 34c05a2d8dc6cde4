/**
 * The tank's prepared history kept in memory between verdict refreshes (engine-input-cache.ts)
 * must always equal a full read of the tank's history, and the verdict and forecast made from it
 * must equal the ones the engine makes from the input read anew. Random histories of changes on a real migrated SQLite file with
 * the demo company: tests saved the way the reading route saves them (taken in any order, some
 * at the same instant as another), tests written on a second connection (as the CSV import's
 * worker thread does), corrections, edits that move a test, deletes, events and their
 * corrections, a save rolled back, and threshold changes. After every step the kept input is
 * compared with a full read and a full evaluation.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { and, eq, isNull } from 'drizzle-orm'
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { events, organisations, readings } from '../../../../../server/db/schema'
import { seedDemo, type DemoIds } from '../../../../../server/db/seed/demo'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { forecastCycle } from '../../../../../shared/cycle/forecast'
import { cycleInputFor, evaluateTankNow } from '../../../../../server/db/verdicts'
import { tankDataRevisionInDb } from '../../../../../server/domain/readings/data-revision'
import { keptHistory, noteTestAppended, readKeptHistory } from '../../../../../server/domain/readings/engine-input-cache'
import { plainPrepared } from '../../../shared/cycle/plain-history'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-engine-input-cache-'))
const dbPath = join(dir, 'engine-input-cache.sqlite')
let db: TidewrightDB
/** A second connection to the same file: the CSV import's worker thread writes on one of these. */
let other: TidewrightDB
let demo: DemoIds
const now = new Date('2026-11-30T12:00:00.000Z')
const DAY = 86_400_000

beforeAll(async () => {
  db = openDatabase(dbPath)
  migrateDatabase(db)
  demo = await seedDemo(db, now)
  other = openDatabase(dbPath)
})
afterAll(() => {
  other?.$client.close()
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

/** A few instants, so tests often share a taken time or an entry time with another. */
const instant = fc.integer({ min: 0, max: 40 }).map(n => new Date(now.getTime() - 40 * DAY + n * (DAY / 2)).toISOString())
const value = fc.option(fc.double({ min: 0, max: 5, noNaN: true }), { nil: null })
const test = fc.record({ takenAt: instant, createdAt: instant, ammoniaN: value, nitriteN: value, nitrateN: fc.double({ min: 0, max: 40, noNaN: true }) })

type TestRow = typeof test extends fc.Arbitrary<infer T> ? T : never

type Step
  = | { kind: 'save', test: TestRow, rollBack: boolean }
    | { kind: 'save-elsewhere', test: TestRow }
    | { kind: 'correct' | 'edit' | 'delete', pick: number, test: TestRow }
    | { kind: 'event', at: string, amount: number, pick: number, change: 'add' | 'correct' | 'delete' | 'elsewhere' }
    | { kind: 'thresholds', nitrateRiseN: number }

const step: fc.Arbitrary<Step> = fc.oneof(
  { weight: 6, arbitrary: fc.record({ kind: fc.constant('save' as const), test, rollBack: fc.boolean() }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('save-elsewhere' as const), test }) },
  { weight: 3, arbitrary: fc.record({ kind: fc.constantFrom('correct' as const, 'edit' as const, 'delete' as const), pick: fc.nat(), test }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('event' as const), at: instant, amount: fc.double({ min: 0.5, max: 4, noNaN: true }), pick: fc.nat(), change: fc.constantFrom('add' as const, 'correct' as const, 'delete' as const, 'elsewhere' as const) }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('thresholds' as const), nitrateRiseN: fc.double({ min: 0.5, max: 5, noNaN: true }) }) },
)

const currentReadingIds = (tankId: string) => db.select({ id: readings.id }).from(readings)
  .where(eq(readings.tankId, tankId)).all().map(r => r.id)
  .filter(id => !db.select({ id: readings.id }).from(readings).where(eq(readings.correctsId, id)).get())
const currentEventIds = (tankId: string) => db.select({ id: events.id }).from(events)
  .where(and(eq(events.tankId, tankId), isNull(events.correctsId))).all().map(r => r.id)
  .filter(id => !db.select({ id: events.id }).from(events).where(eq(events.correctsId, id)).get())

/** A test inserted as the reading route inserts it: the count read in the same transaction, right after the insert. */
function insertLikeTheRoute(tankId: string, t: TestRow, rollBack = false) {
  return db.transaction(() => {
    const row = db.insert(readings).values({ tankId, enteredBy: demo.users.aquarist, ...t, createdAt: t.createdAt, updatedAt: t.createdAt }).returning().get()
    const revisionAfterInsert = tankDataRevisionInDb(db, tankId)
    if (rollBack) throw new Error('the day is full')
    return { row, revisionAfterInsert }
  })
}

/** A test saved as the reading route saves it: insert, count read in the same transaction, the kept copy told after the commit. */
function saveLikeTheRoute(tankId: string, t: TestRow, rollBack: boolean): void {
  try {
    const { row, revisionAfterInsert } = insertLikeTheRoute(tankId, t, rollBack)
    noteTestAppended(db, tankId, row, revisionAfterInsert)
    // The heavy-work pool's handle is told too (a tank with a long history is evaluated there), with the row as a thread receives it.
    noteTestAppended(other, tankId, structuredClone(row), revisionAfterInsert)
  }
  catch (error) {
    if (!rollBack) throw error
  }
}

function apply(tankId: string, s: Step, organisationId: string): void {
  switch (s.kind) {
    case 'save':
      return saveLikeTheRoute(tankId, s.test, s.rollBack)
    case 'save-elsewhere':
      other.insert(readings).values({ id: randomUUID(), tankId, enteredBy: demo.users.client, ...s.test, updatedAt: s.test.createdAt }).run()
      return
    case 'correct':
    case 'edit':
    case 'delete': {
      const ids = currentReadingIds(tankId)
      if (ids.length === 0) return
      const id = ids[s.pick % ids.length]!
      if (s.kind === 'correct') db.insert(readings).values({ tankId, enteredBy: demo.users.aquarist, ...s.test, correctsId: id, correctionReason: 'misread the card' }).run()
      else if (s.kind === 'edit') db.update(readings).set({ takenAt: s.test.takenAt, ammoniaN: s.test.ammoniaN }).where(eq(readings.id, id)).run()
      else db.delete(readings).where(eq(readings.id, id)).run()
      return
    }
    case 'event': {
      const ids = currentEventIds(tankId)
      const id = ids.length ? ids[s.pick % ids.length] : undefined
      const row = { tankId, at: s.at, kind: s.pick % 5 === 0 ? 'lighting-change' as const : 'ammonia-dose' as const, amount: s.amount, enteredBy: demo.users.aquarist }
      if (s.change === 'add' || !id) db.insert(events).values(row).run()
      else if (s.change === 'elsewhere') other.update(events).set({ amount: s.amount }).where(eq(events.id, id)).run()
      else if (s.change === 'correct') db.insert(events).values({ ...row, correctsId: id, correctionReason: 'wrong dose' }).run()
      else db.delete(events).where(eq(events.id, id)).run()
      return
    }
    case 'thresholds':
      db.update(organisations).set({ settings: { thresholds: { nitrateRiseN: s.nitrateRiseN } } as never }).where(eq(organisations.id, organisationId)).run()
  }
}

describe('the engine input kept between refreshes', () => {
  it('equals a full read, and gives the full evaluation\'s verdict and forecast, after any history of changes', () => {
    const tankId = demo.tanks.lobby
    const organisationId = db.select({ id: organisations.id }).from(organisations).get()!.id
    let appendedInPlace = 0
    let appendedInPool = 0
    fc.assert(fc.property(fc.array(step, { minLength: 1, maxLength: 25 }), (steps) => {
      for (const s of steps) {
        const before = keptHistory(db, tankId).history.readings
        const poolBefore = keptHistory(other, tankId).history.readings
        apply(tankId, s, organisationId)
        const kept = keptHistory(db, tankId)
        const full = readKeptHistory(db, tankId, 0)
        // The same objects as before the save: the copy was extended in place, not read again.
        if (s.kind === 'save' && !s.rollBack && before.length > 0 && kept.history.readings.includes(before[0]!)) appendedInPlace++
        expect(plainPrepared(kept.history)).toEqual(plainPrepared(full.history))
        expect(kept.tests).toBe(full.tests)
        const input = cycleInputFor(db, tankId, now)!
        const verdict = evaluateCycle(input)
        expect(evaluateTankNow(db, tankId, now)).toEqual({ verdict, forecast: forecastCycle(input, verdict) })
        const pool = keptHistory(other, tankId)
        if (s.kind === 'save' && !s.rollBack && poolBefore.length > 0 && pool.history.readings.includes(poolBefore[0]!)) appendedInPool++
        expect(plainPrepared(pool.history)).toEqual(plainPrepared(full.history))
        expect(evaluateTankNow(other, tankId, now)).toEqual({ verdict, forecast: forecastCycle(input, verdict) })
      }
    }), { numRuns: 60, seed: 20261203 })
    // The copy did take tests in place (not only re-read every time), so the comparison above covers that path.
    expect(appendedInPlace).toBeGreaterThan(0)
    expect(appendedInPool).toBeGreaterThan(0)
  })

  it('takes a test saved like the route in place, without reading the history again', () => {
    const tankId = demo.tanks.nano
    const before = keptHistory(db, tankId)
    saveLikeTheRoute(tankId, { takenAt: now.toISOString(), createdAt: now.toISOString(), ammoniaN: 0, nitriteN: 0, nitrateN: 4 }, false)
    const after = keptHistory(db, tankId)
    expect(after).not.toBe(before)
    expect(after.tests).toBe(before.tests + 1)
    expect(after.history.readings.length).toBe(before.history.readings.length + 1)
    // The same objects for every older test: the copy was extended, not read again.
    expect(after.history.readings.filter(r => before.history.readings.includes(r)).length).toBe(before.history.readings.length)
    expect(plainPrepared(after.history)).toEqual(plainPrepared(readKeptHistory(db, tankId, 0).history))
  })

  it('keeps a copy read after a test when told of that test late, as saves that overtook each other reach the pool', () => {
    const tankId = demo.tanks.nano
    const at = (minutes: number) => new Date(now.getTime() - minutes * 60_000).toISOString()
    const first = insertLikeTheRoute(tankId, { takenAt: at(30), createdAt: at(1), ammoniaN: 0, nitriteN: 0, nitrateN: 5 })
    const second = insertLikeTheRoute(tankId, { takenAt: at(20), createdAt: at(1), ammoniaN: 0, nitriteN: 0, nitrateN: 6 })
    // The pool's handle read the history after both saves (for the first save's refresh), then hears of each.
    const read = keptHistory(other, tankId)
    noteTestAppended(other, tankId, structuredClone(first.row), first.revisionAfterInsert)
    noteTestAppended(other, tankId, structuredClone(second.row), second.revisionAfterInsert)
    expect(keptHistory(other, tankId)).toBe(read)
    expect(plainPrepared(read.history)).toEqual(plainPrepared(readKeptHistory(other, tankId, 0).history))
  })

  it('drops a copy labelled with the count read before a test it holds, when told of that test', () => {
    // The pool read the tank's count, a save committed on the loop, then the pool read the rows
    // (evaluateTankNow reads the count once, before all its rows): its copy holds the test under
    // the count before it. A test with no ammonia or nitrite is the one only the readings can tell.
    const tankId = demo.tanks.study
    const countBefore = tankDataRevisionInDb(other, tankId)
    const saved = insertLikeTheRoute(tankId, { takenAt: new Date(now.getTime() - DAY / 3).toISOString(), createdAt: now.toISOString(), ammoniaN: null, nitriteN: null, nitrateN: 7 })
    const read = keptHistory(other, tankId, countBefore)
    expect(read.revision).toBe(countBefore)
    expect(read.history.readings.filter(r => r.id === saved.row.id)).toHaveLength(1)
    noteTestAppended(other, tankId, structuredClone(saved.row), saved.revisionAfterInsert)
    expect(plainPrepared(keptHistory(other, tankId).history)).toEqual(plainPrepared(readKeptHistory(other, tankId, 0).history))
  })

  it('reads again after a write on another connection', () => {
    const tankId = demo.tanks.nano
    const before = keptHistory(db, tankId)
    other.insert(readings).values({ id: randomUUID(), tankId, takenAt: new Date(now.getTime() - DAY).toISOString(), nitrateN: 9 }).run()
    const after = keptHistory(db, tankId)
    expect(after.revision).toBe(before.revision + 1)
    expect(after.tests).toBe(before.tests + 1)
    expect(plainPrepared(after.history)).toEqual(plainPrepared(readKeptHistory(db, tankId, 0).history))
  })
})
