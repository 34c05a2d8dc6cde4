/**
 * A tank with more tests than STREAMED_HISTORY_TESTS is evaluated from its history streamed from
 * the database and held for its last HISTORY_WINDOW_DAYS only (evaluateTankNow, on a real migrated
 * SQLite file). The verdict and forecast must equal the ones made from the whole input read anew,
 * whether the window settles them (two years of upkeep after a fish-in cycle: the fold is kept,
 * and tests saved later go on from it) or cannot (a tank still in its nitrite stage after years of tests: the
 * forecast's curves go back to their peak, so the whole history is read and kept, as before).
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { events, readings, tanks } from '../../../../../server/db/schema'
import { seedDemo, type DemoIds } from '../../../../../server/db/seed/demo'
import { cycleInputFor, evaluateTankNow } from '../../../../../server/db/verdicts'
import { tankDataRevisionInDb } from '../../../../../server/domain/readings/data-revision'
import { keptCopyKind, keptTestCount, noteTestAppended } from '../../../../../server/domain/readings/engine-input-cache'
import { HISTORY_WINDOW_DAYS, STREAMED_HISTORY_TESTS } from '../../../../../server/domain/tanks/long-history'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { forecastCycle } from '../../../../../shared/cycle/forecast'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-streamed-history-'))
let db: TidewrightDB
let demo: DemoIds
const now = new Date('2026-11-30T12:00:00.000Z')
const HOUR = 3_600_000
const DAY = 24 * HOUR
/** Days of history: at 28 tests a day, more than STREAMED_HISTORY_TESTS. */
const DAYS = 800
const TESTS_A_DAY = 28

beforeAll(async () => {
  db = openDatabase(join(dir, 'streamed-history.sqlite'))
  migrateDatabase(db)
  demo = await seedDemo(db, now)
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

type Values = { ammoniaN: number, nitriteN: number, nitrateN: number }

/** A fish-in tank started DAYS ago whose tests read `values(day)`, TESTS_A_DAY a day, and a water change every `changeEvery` days (0: none). */
function tankWith(name: string, values: (day: number) => Values, changeEvery: number): string {
  const started = new Date(now.getTime() - DAYS * DAY)
  const tankId = db.insert(tanks).values({ organisationId: demo.organisationId, clientId: demo.clients.lowe, name, volumeLitres: 300, cycleMethod: 'fish-in', cycleStartedAt: started.toISOString() }).returning().get().id
  db.transaction((tx) => {
    let rows: (typeof readings.$inferInsert)[] = []
    for (let day = 0; day < DAYS; day += 1) {
      for (let k = 0; k < TESTS_A_DAY; k += 1) {
        const takenAt = new Date(started.getTime() + day * DAY + (k + 1) * (DAY / (TESTS_A_DAY + 1))).toISOString()
        rows.push({ tankId, enteredBy: demo.users.client, takenAt, createdAt: takenAt, updatedAt: takenAt, pH: 8.1, temperatureC: 25.5, salinity: 34, ...values(day) })
        if (rows.length === 1_000) {
          tx.insert(readings).values(rows).run()
          rows = []
        }
      }
      if (changeEvery > 0 && day % changeEvery === changeEvery - 1) {
        tx.insert(events).values({ tankId, enteredBy: demo.users.aquarist, kind: 'water-change', at: new Date(started.getTime() + day * DAY + 12.5 * HOUR).toISOString(), amount: 40 }).run()
      }
    }
    if (rows.length > 0) tx.insert(readings).values(rows).run()
  })
  return tankId
}

/** The verdict and forecast the engine makes from the tank's whole input, read anew. */
function fullEvaluation(tankId: string, at = now) {
  const input = cycleInputFor(db, tankId, at)!
  const verdict = evaluateCycle(input)
  return { verdict, forecast: forecastCycle(input, verdict) }
}

describe('a long history streamed and held for its window', { timeout: 60_000 }, () => {
  it('is judged from its window after a cycle and years of upkeep, and later tests go on from the fold kept', () => {
    expect(DAYS * TESTS_A_DAY).toBeGreaterThan(STREAMED_HISTORY_TESTS)
    expect(HISTORY_WINDOW_DAYS).toBeLessThan(DAYS)
    const cycle = (day: number): Values => day < 12
      ? { ammoniaN: Math.min(1, day / 6), nitriteN: day < 4 ? 0 : Math.min(1.5, (day - 3) / 4), nitrateN: day / 2 }
      : day < 24 ? { ammoniaN: 0, nitriteN: Math.max(0, 1.5 - (day - 12) / 6), nitrateN: 6 + day / 4 } : { ammoniaN: 0, nitriteN: 0, nitrateN: 5 + (day % 7) * 1.5 }
    const tankId = tankWith('Long upkeep reef', cycle, 7)
    const streamed = evaluateTankNow(db, tankId, now)
    const full = fullEvaluation(tankId)
    expect(full.verdict.phase).toBe('complete')
    expect(streamed).toEqual(full)
    // The window settled it: the fold is kept, holding the window's tests, not the years'.
    expect(keptCopyKind(db, tankId)).toBe('stream')
    expect(keptTestCount(db, tankId)).toBe(DAYS * TESTS_A_DAY)
    // Tests saved as the reading route saves them go on from the fold, which stays the one kept.
    const save = (hours: number, values: Partial<Values>) => {
      const takenAt = new Date(now.getTime() + hours * HOUR).toISOString()
      const { row, revisionAfter } = db.transaction((tx) => {
        const inserted = tx.insert(readings).values({ tankId, enteredBy: demo.users.client, takenAt, createdAt: takenAt, updatedAt: takenAt, ...values }).returning().get()
        return { row: inserted, revisionAfter: tankDataRevisionInDb(tx, tankId) }
      })
      noteTestAppended(db, tankId, row, revisionAfter)
      const later = new Date(now.getTime() + (hours + 1) * HOUR)
      expect(evaluateTankNow(db, tankId, later)).toEqual(fullEvaluation(tankId, later))
    }
    save(1, { ammoniaN: 0, nitriteN: 0, nitrateN: 9 })
    save(3, { ammoniaN: 0, nitriteN: 0 })
    expect(keptCopyKind(db, tankId)).toBe('stream')
    expect(keptTestCount(db, tankId)).toBe(DAYS * TESTS_A_DAY + 2)
    // A small ammonia spike holds the completion: the forecast then reads its curves from the last
    // water change on, which the window holds, and projects from the fold.
    save(5, { ammoniaN: 0.3, nitriteN: 0 })
    expect(keptCopyKind(db, tankId)).toBe('stream')
  })

  it('is judged from the whole history when the window cannot settle it, and that copy is kept', () => {
    // Still in its nitrite stage, never a water change: the forecast's curves reach back to their peak.
    const stuck = (day: number): Values => ({ ammoniaN: 0, nitriteN: 2 + Math.sin(day / 30), nitrateN: 10 + (day % 50) / 5 })
    const tankId = tankWith('Long nitrite reef', stuck, 0)
    const evaluated = evaluateTankNow(db, tankId, now)
    const full = fullEvaluation(tankId)
    expect(full.forecast.status).not.toBe('complete')
    expect(evaluated).toEqual(full)
    expect(keptCopyKind(db, tankId)).toBe('whole')
    expect(keptTestCount(db, tankId)).toBe(DAYS * TESTS_A_DAY)
  })
})
