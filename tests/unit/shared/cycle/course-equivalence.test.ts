/**
 * The course made linear in the history (course.ts) against the course as it was before
 * (reference/course-full-fold.ts, which folds every dose again at every zero test), and the
 * binary search that finds a test (snapshot.ts `positionOf`) against a scan from the start.
 * Random histories: ordinary cycles and long dosing logs, with tests deleted, corrected and
 * backdated, input shuffled, time passing with no test, any clearance window and limits, either
 * 2.x version. Any difference fails.
 */

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { traceCourse } from '../../../../shared/cycle/course'
import { buildHistory } from '../../../../shared/cycle/history'
import { RULE_OPTIONS_2 } from '../../../../shared/cycle/options'
import { positionOf } from '../../../../shared/cycle/snapshot'
import { DEFAULT_THRESHOLDS, resolveThresholds } from '../../../../shared/cycle/thresholds'
import type { CycleEvent, CycleInput, CycleReading } from '../../../../shared/cycle/types'
import { historyArb, shuffled, toInput } from './arbitraries'
import { dosingHistoryArb, dosingInput } from './dosing-arbitrary'
import { traceCourse as traceCourseFullFold } from './reference/course-full-fold'
import { at } from './tank-log'

const RUNS = { seed: 20261203, numRuns: 300 }
const LIMIT_MS = 60_000
const DAY_MS = 86_400_000

/** What may happen to a log after it was written: tests deleted, corrected, backdated; time passing. */
const editsArb = fc.record({
  deleteEvery: fc.constantFrom(0, 0, 3, 7),
  correctEvery: fc.constantFrom(0, 0, 4, 9),
  backdate: fc.option(fc.record({ index: fc.nat(), hours: fc.integer({ min: 1, max: 96 }) }), { freq: 3 }),
  laterDays: fc.constantFrom(0, 0, 1, 3, 10),
  seed: fc.integer(),
  windowHours: fc.constantFrom(6, 24, 30, 30, 72),
  clearanceDays: fc.constantFrom(1, 3, 3, 5),
  options: fc.constantFrom(...RULE_OPTIONS_2),
})

type Edits = typeof editsArb extends fc.Arbitrary<infer T> ? T : never

function edited(readings: readonly CycleReading[], events: readonly CycleEvent[], now: string, e: Edits): { readings: CycleReading[], events: CycleEvent[], now: string } {
  let kept = readings.filter((_, i) => e.deleteEvery === 0 || i % e.deleteEvery !== 1)
  // A correction replaces a test's values; the engine sees only the current one.
  kept = kept.map((r, i) => (e.correctEvery !== 0 && i % e.correctEvery === 2 ? { ...r, ammoniaN: 0, nitriteN: 0, enteredAt: now } : r))
  if (e.backdate !== null && kept.length > 0) {
    const i = e.backdate.index % kept.length
    const r = kept[i]!
    // Entered now for a time long past: the log grows out of order.
    kept[i] = { ...r, takenAt: new Date(Date.parse(r.takenAt) - e.backdate.hours * 3_600_000).toISOString(), enteredAt: now }
  }
  return { readings: shuffled(kept, e.seed), events: shuffled(events, e.seed + 1), now: new Date(Date.parse(now) + e.laterDays * DAY_MS).toISOString() }
}

function expectSameCourse(input: { readings: CycleReading[], events: CycleEvent[], now: string }, method: CycleInput['tank']['cycleMethod'], startedAt: string, e: Edits): void {
  const thresholds = resolveThresholds({ ...DEFAULT_THRESHOLDS, clearanceWindowHours: e.windowHours, clearanceDays: e.clearanceDays })
  const nowMs = Date.parse(input.now)
  const history = buildHistory(input.readings, input.events, nowMs)
  const startedMs = Date.parse(startedAt)
  expect(traceCourse(history, thresholds, method, startedMs, nowMs, e.options)).toEqual(traceCourseFullFold(history, thresholds, method, startedMs, nowMs, e.options))
}

describe('the linear course', { timeout: LIMIT_MS }, () => {
  it('is the course the full fold traced, on ordinary cycles edited after the fact', () => {
    fc.assert(fc.property(historyArb, editsArb, (k, e) => {
      const input = toInput(k)
      expectSameCourse(edited(input.readings, input.events ?? [], input.now, e), input.tank.cycleMethod, input.tank.startedAt, e)
    }), RUNS)
  })

  it('is the course the full fold traced, on long dosing logs edited after the fact', () => {
    fc.assert(fc.property(dosingHistoryArb, editsArb, (k, e) => {
      const { readings, events } = dosingInput(k)
      expectSameCourse(edited(readings, events, at(k.days.length + 1, 0), e), k.fishIn ? 'fish-in' : 'fishless', at(0, 0), e)
    }), { ...RUNS, numRuns: 150 })
  })

  it('finds each test where a scan from the start finds it, ties and strangers included', () => {
    fc.assert(fc.property(historyArb, (k) => {
      const input = toInput(k)
      const { readings } = buildHistory(input.readings, input.events ?? [], Date.parse(input.now))
      for (const r of readings) expect(positionOf(readings, r)).toBe(readings.indexOf(r))
      // A test of the same time that is not in the list (another object) is not found.
      if (readings[0]) expect(positionOf(readings, { ...readings[0] })).toBe(-1)
    }), RUNS)
  })
})
